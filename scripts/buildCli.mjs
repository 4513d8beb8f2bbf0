// Bundles the command line into one file (dist-cli/strainsheet.mjs) and its worker thread's entry
// (dist-cli/chunkWorker.mjs, for parallel jobs) so it starts in about a second
// instead of transpiling every module through tsx at each start. Run by `npm install` (prepare)
// and before the tests; bin/strainsheet.mjs falls back to tsx when the bundle is missing or older
// than any file under src/.
import { build } from 'esbuild';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
await build({
  entryPoints: { strainsheet: `${root}src/cli/main.ts`, chunkWorker: `${root}src/jobs/nodeChunkWorker.ts` },
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  outdir: `${root}dist-cli`,
  outExtension: { '.js': '.mjs' },
  logLevel: 'warning',
  legalComments: 'none',
  // Loaded from node_modules only by `strainsheet plot --pdf`, so other commands do not parse them.
  external: ['jspdf', 'svg2pdf.js', 'linkedom', 'dejavu-fonts-ttf'],
  // Whitespace and syntax only: identifiers keep their names, so stack traces stay readable.
  minifyWhitespace: true,
  minifySyntax: true,
  // workerpool is CommonJS and requires node:worker_threads at run time: give the ESM bundle a require.
  banner: { js: "import { createRequire as __strainsheetCreateRequire } from 'node:module'; const require = __strainsheetCreateRequire(import.meta.url);" },
});
