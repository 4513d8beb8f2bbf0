// esbuild options of the command-line bundle (scripts/buildCli.mjs writes it to dist-cli/; the
// bundle-size test builds the same into a temporary folder).
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));

/** Options for esbuild's build(), writing into `outdir`. */
export function cliBuildOptions(outdir) {
  return {
    entryPoints: { strainsheet: `${root}src/cli/main.ts`, chunkWorker: `${root}src/jobs/nodeChunkWorker.ts` },
    bundle: true,
    platform: 'node',
    // CommonJS: bin/codeCache.mjs compiles the bundle as a script (node:vm) with V8's code cache,
    // which Node 20 offers for scripts only, not for ES modules. The worker is CommonJS too, so both
    // come from one build.
    format: 'cjs',
    target: 'node20',
    outdir,
    outExtension: { '.js': '.cjs' },
    // Prefer a package's ES module build: jsonc-parser's default (UMD) build requires its own files
    // at run time, which a bundle cannot resolve; ES modules are also tree-shaken.
    mainFields: ['module', 'main'],
    logLevel: 'warning',
    legalComments: 'none',
    // Loaded from node_modules only by `strainsheet plot --pdf`, so other commands do not parse them.
    external: ['jspdf', 'svg2pdf.js', 'linkedom', 'dejavu-fonts-ttf'],
    // Whitespace and syntax only: identifiers keep their names, so stack traces stay readable.
    minifyWhitespace: true,
    minifySyntax: true,
    // import.meta does not exist in CommonJS: its url is the bundle's own file.
    define: { 'import.meta.url': '__strainsheetBundleUrl' },
    banner: { js: "var __strainsheetBundleUrl = require('node:url').pathToFileURL(__filename).href;" },
  };
}
