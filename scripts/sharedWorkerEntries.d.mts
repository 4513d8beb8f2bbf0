import type { Plugin } from 'vite';
export function sharedWorkerEntries(): Plugin;
