import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';
import solid from 'vite-plugin-solid';

const projectRoot = fileURLToPath(new URL('.', import.meta.url));

// The Vite root is web/ (the app); tests and benchmarks are found from the project root.
export default defineConfig({
  root: 'web',
  base: './',
  plugins: [solid()],
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
