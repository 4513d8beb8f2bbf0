// Bundles the command line into one file (dist-cli/strainsheet.mjs) so it starts in about a second
// instead of transpiling every module through tsx at each start. Run by `npm install` (prepare)
// and before the tests; bin/strainsheet.mjs falls back to tsx when the bundle is missing or older
// than any file under src/.
import { build } from 'esbuild';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
await build({
  entryPoints: [`${root}src/cli/main.ts`],
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  outfile: `${root}dist-cli/strainsheet.mjs`,
  logLevel: 'warning',
  legalComments: 'none',
  // Loaded from node_modules only by `strainsheet plot --pdf`, so other commands do not parse them.
  external: ['jspdf', 'svg2pdf.js', 'linkedom', 'dejavu-fonts-ttf'],
});
