#!/usr/bin/env node
// Command-line entry. Uses the bundled CLI (scripts/buildCli.mjs) when it is newer than every
// source file; otherwise runs the TypeScript sources through tsx's loader, so it is never stale.
import { freshBundle } from './bundleFreshness.mjs';

const bundle = freshBundle('strainsheet.mjs', ['src', 'web/plots', 'web/engine']);
let main;
if (bundle) {
  ({ main } = await import(bundle));
} else {
  const { register } = await import('tsx/esm/api');
  register();
  ({ main } = await import('../src/cli/main.ts'));
}
process.exitCode = await main(process.argv.slice(2));
