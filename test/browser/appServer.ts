// Builds the web app with Vite's JS API into a fresh temporary folder and serves it with Vite's
// preview server on a free local port. Used by the browser tests and the UI benchmark.
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer as createNetServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { build, preview, type PreviewServer } from 'vite';

export const PROJECT_ROOT = resolve(import.meta.dirname, '../..');

export interface ServedApp {
  url: string;
  outDir: string;
  close(): Promise<void>;
}

async function freePort(): Promise<number> {
  return new Promise((ok, fail) => {
    const s = createNetServer();
    s.once('error', fail);
    s.listen(0, '127.0.0.1', () => {
      const addr = s.address();
      const port = typeof addr === 'object' && addr ? addr.port : 0;
      s.close(() => ok(port));
    });
  });
}

export async function buildAndServe(): Promise<ServedApp> {
  const outDir = mkdtempSync(join(tmpdir(), 'strainsheet-dist-'));
  const configFile = join(PROJECT_ROOT, 'vite.config.ts');
  const root = join(PROJECT_ROOT, 'web');
  await build({ configFile, root, logLevel: 'error', build: { outDir, emptyOutDir: true } });
  const port = await freePort();
  const server: PreviewServer = await preview({
    configFile,
    root,
    logLevel: 'error',
    build: { outDir },
    preview: { port, strictPort: true, host: '127.0.0.1', open: false },
  });
  return {
    url: `http://127.0.0.1:${port}/`,
    outDir,
    async close() {
      await server.close();
      rmSync(outDir, { recursive: true, force: true });
    },
  };
}
