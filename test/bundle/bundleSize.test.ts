// Sizes of what users download and start: the app's chunks (production build, minified, not
// gzipped) and the command-line bundle. Each is reported, and the test fails when one grows more
// than 10% over its entry in budget.json (issue 11). Chunks are named by their file name without
// the content hash; a chunk the budget does not name is held to the "other chunks" entry. When a
// change rightly makes a chunk larger, update budget.json in the same commit and say why.
// Besides single chunks, what each start needs is reported and held to budget.json's "loads": the
// JavaScript the page loads before its first result (the main chunk and everything it imports
// statically; panels and plots load later; and, as a row of its own, with the groups of built-ins
// the demo's A_yr needs, which the page loads before evaluating it), and what each Web Worker loads
// (before the groups of built-ins its sheet names). The demo sheet is fetched as data and reported apart. The workers share
// the page's engine chunks (scripts/sharedWorkerEntries.mjs), so a chunk may count in several.
import { mkdtempSync, readFileSync, readdirSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build as viteBuild, type Rolldown } from 'vite';
import { build as esbuild } from 'esbuild';
import { cliBuildOptions } from '../../scripts/cliBuildOptions.mjs';
import { groupsOfIndex } from '../../scripts/builtinGroupsInApp.mjs';
import { Sheet } from '../../src/sheet/sheet';

const ROOT = resolve(import.meta.dirname, '../..');
const GROWTH = 1.1;
const OTHER = 'other chunks';

interface Budget {
  app: Record<string, number>;
  loads: Record<string, number>;
  cli: Record<string, number>;
}
const budget = JSON.parse(readFileSync(join(ROOT, 'test/bundle/budget.json'), 'utf8')) as Budget;

/** A file's name without the content hash and extension: 'assets/index-AbCd1234.js' -> 'index'. */
function chunkName(fileName: string): string {
  return fileName.replace(/^.*\//, '').replace(/\.[mc]?js$/, '').replace(/-[A-Za-z0-9_-]{8}$/, '');
}

/** Sizes in bytes of the .js/.mjs/.cjs files of a folder, by name without the content hash. */
function sizes(dir: string): Map<string, number> {
  const out = new Map<string, number>();
  for (const f of readdirSync(dir)) {
    if (!/\.[mc]?js$/.test(f)) continue;
    const name = chunkName(f);
    out.set(name, (out.get(name) ?? 0) + statSync(join(dir, f)).size);
  }
  return out;
}

/** Bytes of an entry file and every file it imports statically, directly or not (dynamic imports load later). */
function staticClosure(output: Rolldown.OutputBundle[string][], entries: string | string[]): { bytes: number; files: string[] } {
  const byFile = new Map(output.map((o) => [o.fileName, o]));
  const seen = new Set<string>();
  const stack = typeof entries === 'string' ? [entries] : [...entries];
  while (stack.length > 0) {
    const f = stack.pop()!;
    if (seen.has(f)) continue;
    seen.add(f);
    const o = byFile.get(f);
    if (o?.type === 'chunk') stack.push(...o.imports);
  }
  const size = (f: string) => {
    const o = byFile.get(f)!;
    return Buffer.byteLength(o.type === 'chunk' ? o.code : o.source);
  };
  return { bytes: [...seen].reduce((sum, f) => sum + size(f), 0), files: [...seen].map(chunkName) };
}

/**
 * The groups of built-ins (scripts/builtinGroupsInApp.mjs) the demo's first result needs: those
 * named by the formulas of A_yr (the page's FIRST_RESULTS) and of the cells it reads, which the
 * page loads before evaluating them.
 */
async function firstResultModules(): Promise<string[]> {
  const sheet = Sheet.fromFile(readFileSync(join(ROOT, 'examples/demo.json'), 'utf8'), { evaluateOnRead: true });
  const seen = new Set<string>();
  const stack = ['A_yr'];
  while (stack.length > 0) {
    const n = stack.pop()!;
    if (seen.has(n)) continue;
    seen.add(n);
    stack.push(...sheet.dependencies(n));
  }
  const ids = new Set([...seen].flatMap((n) => sheet.get(n)!.formula.match(/[A-Za-z_$][\w$]*/g) ?? []));
  const files: string[] = [];
  for (const { exportName, file } of groupsOfIndex(readFileSync(join(ROOT, 'src/builtins/index.ts'), 'utf8'))) {
    const list = (await import(`../../src/builtins/${file}.ts`))[exportName] as Array<{ name: string }>;
    if (list.some((b) => ids.has(b.name))) files.push(`/src/builtins/${file}.ts`);
  }
  return files;
}

/** What each start loads: the page before its first result, and each Web Worker. */
function loads(output: Rolldown.OutputBundle[string][], firstGroups: string[]): Map<string, { bytes: number; files: string[] }> {
  const file = (test: (o: Rolldown.OutputBundle[string]) => boolean, what: string) => {
    const found = output.find(test);
    if (!found) throw new Error(`the build has no ${what}`);
    return found.fileName;
  };
  const entryNamed = (name: string) => (o: Rolldown.OutputBundle[string]) => o.type === 'chunk' && o.isEntry && o.name === name;
  const main = file((o) => o.type === 'chunk' && o.isEntry && /index\.html$/.test(o.facadeModuleId ?? ''), 'main entry');
  const groupChunks = firstGroups.map((m) => file((o) => o.type === 'chunk' && o.moduleIds.some((id) => id.endsWith(m)), `chunk of ${m}`));
  return new Map([
    ['page before its first result', staticClosure(output, [main])],
    ['page with first-result built-ins', staticClosure(output, [main, ...groupChunks])],
    ['job worker', staticClosure(output, file(entryNamed('jobWorker'), 'job worker entry'))],
    ['chunk worker', staticClosure(output, file(entryNamed('chunkWebWorker'), 'chunk worker entry'))],
    ['off-page worker', staticClosure(output, file(entryNamed('offPageWorker'), 'off-page worker entry'))],
    ['parse worker', staticClosure(output, file((o) => /parseWorker-[^/]*\.js$/.test(o.fileName), 'parse worker'))],
  ]);
}

function report(title: string, measured: Map<string, number>, limits: Record<string, number>): string {
  const rows = [...measured].sort((a, b) => b[1] - a[1]).map(([name, bytes]) => {
    const limit = limits[name] ?? limits[OTHER];
    const shown = limit === undefined ? 'none' : `${limit} bytes (+10%)`;
    return `  ${name.padEnd(28)} ${String(bytes).padStart(9)} bytes (${(bytes / 1000).toFixed(1)} kB)   budget ${shown}`;
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
  let started = new Map<string, { bytes: number; files: string[] }>();
  let cli = new Map<string, number>();

  beforeAll(async () => {
    const outDir = join(dir, 'app');
    // vitest sets NODE_ENV=test, under which Vite builds libraries' development forms; measure
    // what `npm run build` ships.
    const nodeEnv = process.env.NODE_ENV;
    process.env.NODE_ENV = 'production';
    const result = await viteBuild({ configFile: join(ROOT, 'vite.config.ts'), root: join(ROOT, 'web'), logLevel: 'error', build: { outDir, emptyOutDir: true } }).finally(() => {
      process.env.NODE_ENV = nodeEnv;
    });
    const outputs = (Array.isArray(result) ? result : [result]) as Rolldown.RolldownOutput[];
    started = loads(outputs.flatMap((r) => r.output), await firstResultModules());
    const demoData = outputs.flatMap((r) => r.output).find((o) => o.type === 'asset' && /(^|\/)demo-[^/]*\.json$/.test(o.fileName));
    app = sizes(join(outDir, 'assets'));
    await esbuild(cliBuildOptions(join(dir, 'cli')));
    cli = sizes(join(dir, 'cli'));
    const startRows = new Map([...started].map(([k, v]) => [k, v.bytes]));
    const startFiles = [...started].map(([k, v]) => `  ${k}: ${v.files.join(', ')}`).join('\n');
    console.log(
      `${report('app chunks (minified)', app, budget.app)}\n${report('JavaScript loaded at each start', startRows, budget.loads)}\n${startFiles}\n` +
        `  and the demo sheet, fetched as data (not JavaScript): ${demoData ? Buffer.byteLength(demoData.type === 'asset' ? demoData.source : '') : 'none'} bytes\n` +
        report('command-line bundle', cli, budget.cli),
    );
  }, 180_000);

  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('the app has its main chunk (index) and the job worker', () => {
    expect(app.has('index')).toBe(true);
    expect([...app.keys()].some((n) => /worker/i.test(n))).toBe(true);
  });

  it('no app chunk grows more than 10% over budget.json', () => {
    expect(overBudget(app, budget.app)).toEqual([]);
  });

  it('the JavaScript the page loads before its first result, and each worker loads, grows no more than 10% over budget.json', () => {
    expect(overBudget(new Map([...started].map(([k, v]) => [k, v.bytes])), budget.loads)).toEqual([]);
  });

  it('the workers load the engine chunks the page loads, not copies of their own', () => {
    const page = new Set(started.get('page before its first result')!.files);
    for (const worker of ['job worker', 'chunk worker']) {
      expect(started.get(worker)!.files.filter((f) => page.has(f))).toEqual(expect.arrayContaining(['mathjs', 'sheetEngine']));
    }
  });

  it('the command-line bundle grows no more than 10% over budget.json', () => {
    expect(cli.has('strainsheet')).toBe(true);
    expect(overBudget(cli, budget.cli)).toEqual([]);
  });
});
