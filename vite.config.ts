import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';
import solid from 'vite-plugin-solid';
import type { Plugin } from 'vite';

const projectRoot = fileURLToPath(new URL('.', import.meta.url));

// The Content-Security-Policy in web/index.html is the production one. The development server's
// hot reload talks over a WebSocket, so only `vite` (serve) widens connect-src with ws: and wss:.
const devServerWebSockets: Plugin = {
  name: 'strainsheet-dev-websockets',
  apply: 'serve',
  transformIndexHtml: (html) => html.replace("connect-src 'self'", "connect-src 'self' ws: wss:"),
};

// The Vite root is web/ (the app); tests and benchmarks are found from the project root.
export default defineConfig({
  root: 'web',
  base: './',
  plugins: [solid(), devServerWebSockets],
  server: { port: 5173, strictPort: false },
  build: { outDir: '../dist', emptyOutDir: true, target: 'es2022' },
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
