#!/usr/bin/env node
// Command-line entry: runs the TypeScript CLI through tsx's loader (no build step needed).
import { register } from 'tsx/esm/api';
register();
const { main } = await import('../src/cli/main.ts');
process.exitCode = await main(process.argv.slice(2));
