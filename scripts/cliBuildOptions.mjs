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
    // ESM builds first: jsonc-parser's CommonJS (UMD) build requires its own files at run time,
    // which a bundle cannot resolve ("Cannot find module './impl/format'").
    mainFields: ['module', 'main'],
    format: 'esm',
    target: 'node20',
    outdir,
    outExtension: { '.js': '.mjs' },
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
    // workerpool is CommonJS and requires node:worker_threads at run time: give the ESM bundle a require
    // (this real require is also why UMD builds must be avoided, see mainFields above).
    banner: { js: "import { createRequire as __strainsheetCreateRequire } from 'node:module'; const require = __strainsheetCreateRequire(import.meta.url);" },
  };
}
