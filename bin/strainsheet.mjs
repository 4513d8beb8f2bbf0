#!/usr/bin/env node
// Command-line entry. Uses the bundled CLI (scripts/buildCli.mjs) when it is newer than every
// source file; otherwise runs the TypeScript sources through tsx's loader, so it is never stale.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
const bundle = `${root}dist-cli/strainsheet.mjs`;

function newestSourceMtime(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = `${dir}/${entry.name}`;
    const t = entry.isDirectory() ? newestSourceMtime(path) : statSync(path).mtimeMs;
    if (t > newest) newest = t;
  }
  return newest;
}

let main;
if (existsSync(bundle) && statSync(bundle).mtimeMs >= Math.max(...['src', 'web/plots', 'web/engine'].map((d) => newestSourceMtime(`${root}${d}`)))) {
  ({ main } = await import(bundle));
} else {
  const { register } = await import('tsx/esm/api');
  register();
  ({ main } = await import('../src/cli/main.ts'));
}
process.exitCode = await main(process.argv.slice(2));
