// Sizes of what users download and start: the app's chunks (production build, minified, not
// gzipped) and the command-line bundle. Each is reported, and the test fails when one grows more
// than 10% over its entry in budget.json (issue 11). Chunks are named by their file name without
// the content hash; a chunk the budget does not name is held to the "other chunks" entry. When a
// change rightly makes a chunk larger, update budget.json in the same commit and say why.
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build as viteBuild } from 'vite';
import { build as esbuild } from 'esbuild';
import { cliBuildOptions } from '../../scripts/cliBuildOptions.mjs';

const ROOT = resolve(import.meta.dirname, '../..');
const GROWTH = 1.1;
const OTHER = 'other chunks';

interface Budget {
  app: Record<string, number>;
  cli: Record<string, number>;
}
const budget = JSON.parse(readFileSync(join(ROOT, 'test/bundle/budget.json'), 'utf8')) as Budget;

/** Sizes in bytes of the .js/.mjs/.cjs files of a folder, by name without the content hash. */
function sizes(dir: string): Map<string, number> {
  const out = new Map<string, number>();
  for (const f of readdirSync(dir)) {
    if (!/\.[mc]?js$/.test(f)) continue;
    const name = f.replace(/\.[mc]?js$/, '').replace(/-[A-Za-z0-9_-]{8}$/, '');
    out.set(name, (out.get(name) ?? 0) + statSync(join(dir, f)).size);
  }
  return out;
}

function report(title: string, measured: Map<string, number>, limits: Record<string, number>): string {
  const rows = [...measured].sort((a, b) => b[1] - a[1]).map(([name, bytes]) => {
    const limit = limits[name] ?? limits[OTHER];
    const shown = limit === undefined ? 'none' : `${limit} bytes (+10%)`;
    return `  ${name.padEnd(24)} ${String(bytes).padStart(9)} bytes (${(bytes / 1000).toFixed(1)} kB)   budget ${shown}`;
  });
  return `${title}\n${rows.join('\n')}`;
}

function overBudget(measured: Map<string, number>, limits: Record<string, number>): string[] {
  const problems: string[] = [];
  for (const [name, bytes] of measured) {
    const limit = limits[name] ?? limits[OTHER];
    if (limit === undefined) problems.push(`${name}: no budget`);
    else if (bytes > GROWTH * limit) problems.push(`${name}: ${bytes} bytes is more than 10% over its budget of ${limit}`);
  }
  return problems;
}

describe('bundle sizes', () => {
  const dir = mkdtempSync(join(tmpdir(), 'strainsheet-bundle-'));
  let app = new Map<string, number>();
  let cli = new Map<string, number>();

  beforeAll(async () => {
    const outDir = join(dir, 'app');
    await viteBuild({ configFile: join(ROOT, 'vite.config.ts'), root: join(ROOT, 'web'), logLevel: 'error', build: { outDir, emptyOutDir: true } });
    app = sizes(join(outDir, 'assets'));
    await esbuild(cliBuildOptions(join(dir, 'cli')));
    cli = sizes(join(dir, 'cli'));
    console.log(`${report('app chunks (minified)', app, budget.app)}\n${report('command-line bundle', cli, budget.cli)}`);
  }, 180_000);

  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('the app has its main chunk (index) and the job worker', () => {
    expect(app.has('index')).toBe(true);
    expect([...app.keys()].some((n) => /worker/i.test(n))).toBe(true);
  });

  it('no app chunk grows more than 10% over budget.json', () => {
    expect(overBudget(app, budget.app)).toEqual([]);
  });

  it('the command-line bundle grows no more than 10% over budget.json', () => {
    expect(cli.has('strainsheet')).toBe(true);
    expect(overBudget(cli, budget.cli)).toEqual([]);
  });
});
