import type { Plugin } from 'vite';
export function mathjsWithoutLatex(): Plugin;
