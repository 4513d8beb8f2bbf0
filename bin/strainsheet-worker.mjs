// Worker-thread entry of the command line's parallel jobs (src/jobs/nodeWorkerPool.ts). Like
// bin/strainsheet.mjs: the bundled worker (dist-cli/chunkWorker.mjs) when it is newer than every
// source file, otherwise the TypeScript sources through tsx's loader.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const bundle = `${root}dist-cli/chunkWorker.mjs`;

function newestSourceMtime(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = `${dir}/${entry.name}`;
    const t = entry.isDirectory() ? newestSourceMtime(path) : statSync(path).mtimeMs;
    if (t > newest) newest = t;
  }
  return newest;
}

if (existsSync(bundle) && statSync(bundle).mtimeMs >= newestSourceMtime(`${root}src`)) {
  await import(bundle);
} else {
  const { register } = await import('tsx/esm/api');
  register();
  await import('../src/jobs/nodeChunkWorker.ts');
}
