// Worker-thread entry of the command line's parallel jobs (src/jobs/nodeWorkerPool.ts). Like
// bin/strainsheet.mjs: the bundled worker (dist-cli/chunkWorker.cjs) when it is newer than every
// source file, otherwise the TypeScript sources through tsx's loader.
import { freshBundle } from './bundleFreshness.mjs';

const bundle = freshBundle('chunkWorker.cjs', ['src']);
if (bundle) {
  await import(bundle);
} else {
  const { register } = await import('tsx/esm/api');
  register();
  await import('../src/jobs/nodeChunkWorker.ts');
}
