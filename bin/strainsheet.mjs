#!/usr/bin/env node
// Command-line entry. Uses the bundled CLI (scripts/buildCli.mjs) when it is newer than every
// source file, compiled with V8's code cache (codeCache.mjs); otherwise runs the TypeScript sources
// through tsx's loader, so it is never stale.
import { createRequire } from 'node:module';
import { freshBundle } from './bundleFreshness.mjs';

/**
 * Commands that load packages with import() (plot --pdf: jspdf, svg2pdf.js, linkedom): import() fails
 * in a script compiled with a code cache ("Invalid host defined options", Node issue 43663), so these
 * load the bundle through Node's own loader.
 */
const IMPORTING_COMMANDS = new Set(['plot']);

const bundle = freshBundle('strainsheet.cjs', ['src', 'web/plots', 'web/engine']);
let main;
let saveCodeCache = () => {};
if (bundle && IMPORTING_COMMANDS.has(process.argv[2])) {
  ({ main } = createRequire(import.meta.url)(bundle));
} else if (bundle) {
  const { loadWithCodeCache } = await import('./codeCache.mjs');
  const loaded = loadWithCodeCache(bundle);
  ({ main } = loaded.exports);
  saveCodeCache = loaded.save;
} else {
  const { register } = await import('tsx/esm/api');
  register();
  ({ main } = await import('../src/cli/main.ts'));
}
process.exitCode = await main(process.argv.slice(2));
saveCodeCache();
