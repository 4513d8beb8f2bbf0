// Bundles the command line into one file (dist-cli/strainsheet.cjs) and its worker thread's entry
// (dist-cli/chunkWorker.cjs, for parallel jobs) so it starts without transpiling every module
// through tsx at each start. Run by `npm install` (prepare) and before the tests;
// bin/strainsheet.mjs falls back to tsx when the bundle is missing or older than any file under src/.
import { build } from 'esbuild';
import { fileURLToPath } from 'node:url';
import { cliBuildOptions } from './cliBuildOptions.mjs';

const root = fileURLToPath(new URL('..', import.meta.url));
await build(cliBuildOptions(`${root}dist-cli`));
