import type { Plugin } from 'vite';
export function builtinDocsInApp(): Plugin;
export function withoutBuiltinDocs(code: string, file: string): string | null;
