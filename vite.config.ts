import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';
import solid from 'vite-plugin-solid';
import type { Plugin } from 'vite';
import { sharedWorkerEntries } from './scripts/sharedWorkerEntries.mjs';
import { builtinDocsInApp } from './scripts/builtinDocsInApp.mjs';

const projectRoot = fileURLToPath(new URL('.', import.meta.url));

// The Content-Security-Policy in web/index.html is the production one. The development server's
// hot reload talks over a WebSocket, so only `vite` (serve) widens connect-src with ws: and wss:.
const devServerWebSockets: Plugin = {
  name: 'strainsheet-dev-websockets',
  apply: 'serve',
  transformIndexHtml: (html) => html.replace("connect-src 'self'", "connect-src 'self' ws: wss:"),
};

/**
 * Names of the chunks shared by the page and its workers (their automatic names come from whichever
 * module happens to come first): the mathjs library and the sheet engine, so that the bundle budget
 * (test/bundle/budget.json) can name them.
 */
function sharedChunkName(chunk: { name: string; moduleIds: string[] }): string {
  const has = (part: string) => chunk.moduleIds.some((id) => id.includes(part));
  if (has('/node_modules/mathjs/')) return 'mathjs';
  if (has('/src/sheet/sheet.ts')) return 'sheetEngine';
  if (has('/node_modules/workerpool/')) return 'jobRuntime';
  if (has('virtual:builtin-docs')) return 'builtinDocs';
  return chunk.name;
}

// The Vite root is web/ (the app); tests and benchmarks are found from the project root.
export default defineConfig({
  root: 'web',
  base: './',
  plugins: [solid(), devServerWebSockets, sharedWorkerEntries(), builtinDocsInApp()],
  server: { port: 5173, strictPort: false },
  build: {
    outDir: '../dist',
    emptyOutDir: true,
    target: 'es2022',
    rolldownOptions: { output: { chunkFileNames: (chunk) => `assets/${sharedChunkName(chunk)}-[hash].js` } },
  },
  worker: { format: 'es' },
  test: {
    root: projectRoot,
    environment: 'node',
    include: ['test/**/*.test.ts'],
    testTimeout: 30_000,
    reporters: ['default', './test/support/summaryReporter.ts'],
    benchmark: { include: ['bench/**/*.bench.ts'] },
  },
});
