// `strainsheet realise`: one row per bin; the same numbers for chunks run on other workers and for a
// sharded run merged (an independent one-thread run of the same job is the check); refusals named.
// Real worker threads are exercised by test/jobs/parallelCli.test.ts (one pool per file: start-up is slow).
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import { REALISE_CHUNK } from '../../src/statistics/realiseJob';
import { runJob } from '../../src/statistics/jobs';
import { runChunkInWorker } from '../../src/jobs/chunkRuntime';
import type { ChunkExecutor } from '../../src/jobs/runChunks';
import { Sheet } from '../../src/sheet/sheet';

const dir = mkdtempSync(join(tmpdir(), 'strainsheet-realise-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const demo = JSON.parse(readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8'));
// The demo's population and array cells only (workers rebuild and evaluate the whole sheet).
const kept = ['H0', 'omega_m', 'cosmo', 'rate_norm', 'mass_slope', 'cutoff_mass', 'z_shape', 'q_shape', 'min_mass', 'max_mass', 'pop', 'array_span', 'array_cadence'];
const withCell = {
  ...demo,
  cells: [...demo.cells.filter((c: { name: string }) => kept.includes(c.name)), { name: 'rz', formula: 'realiseBackground(pop, frequencyGrid(array_span, array_cadence, 12), array_span, 20, 1)' }],
};
const sheetPath = join(dir, 'demo-rz.json');
writeFileSync(sheetPath, JSON.stringify(withCell));
const noCell = { ...demo, cells: demo.cells.filter((c: { formula?: string }) => !String(c.formula ?? '').includes('realiseBackground')) };
const noCellPath = join(dir, 'demo-none.json');
writeFileSync(noCellPath, JSON.stringify(noCell));

async function run(...argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { out: (t) => void (out += t), err: (t) => void (err += t) });
  return { code, out, err };
}
const file = (name: string) => join(dir, name);
const COUNT = String(2 * REALISE_CHUNK + 30); // three chunks, the last one short
const args = ['realise', sheetPath, '--count', COUNT, '--seed', '5', '--quiet'];

describe('strainsheet realise', () => {
  // The one-worker run is the reference of the next tests; made once.
  let reference: Promise<string> | null = null;
  const oneWorker = () =>
    (reference ??= run(...args, '--workers', '1', '--csv', file('r1.csv')).then((r) => {
      expect(r.code, r.err).toBe(0);
      return readFileSync(file('r1.csv'), 'utf8');
    }));

  it('writes one row per bin with ordered bands, and one row per realisation and bin of loudest binaries', async () => {
    const rows = (await oneWorker()).trim().split('\n');
    expect(rows).toHaveLength(12 + 2);
    const header = rows[1].split(',');
    for (const row of rows.slice(2)) {
      const v = Object.fromEntries(row.split(',').map((x, i) => [header[i], Number(x)]));
      expect(v.lower95_hc).toBeLessThanOrEqual(v.lower68_hc);
      expect(v.lower68_hc).toBeLessThanOrEqual(v.median_hc);
      expect(v.median_hc).toBeLessThanOrEqual(v.upper68_hc);
      expect(v.upper68_hc).toBeLessThanOrEqual(v.upper95_hc);
    }
    const l = await run('realise', sheetPath, '--count', '7', '--seed', '5', '--quiet', '--workers', '1', '--csv', file('small.csv'), '--loudest-csv', file('l1.csv'));
    expect(l.code, l.err).toBe(0);
    expect(readFileSync(file('l1.csv'), 'utf8').trim().split('\n')).toHaveLength(7 * 12 + 2);
  });

  it('chunks run by 3 workers (an in-thread pool that rebuilds the sheet from its text, copies plan and results by structured clone and finishes chunks out of order) equal one thread, bit for bit', async () => {
    const sheet = Sheet.fromFile(readFileSync(sheetPath, 'utf8'));
    const spec = { kind: 'realise' as const, count: Number(COUNT), seed: 5 };
    const one = await runJob(sheet, spec, undefined, { workers: 1 });
    const pool = (): ChunkExecutor => ({
      async runChunk(kind, sheetText, plan, index) {
        await new Promise((r) => setTimeout(r, ((index * 7) % 3) * 20));
        return structuredClone(await runChunkInWorker(kind, sheetText, structuredClone(plan), index));
      },
      async close() {},
    });
    const three = await runJob(sheet, spec, undefined, { workers: 3, pool });
    if (one.kind !== 'realise' || three.kind !== 'realise') throw new Error('unexpected job kind');
    expect(Array.from(three.result.draws.hc)).toEqual(Array.from(one.result.draws.hc));
    expect(Array.from(three.result.draws.loudestChirpMassKg)).toEqual(Array.from(one.result.draws.loudestChirpMassKg));
    expect(Array.from(three.result.summary.upper95)).toEqual(Array.from(one.result.summary.upper95));
  });

  it('shards 1/2 and 2/2, merged, give the unsharded CSV byte for byte', async () => {
    const whole = await oneWorker();
    for (const k of [1, 2]) {
      const r = await run(...args, '--workers', '1', '--shard', `${k}/2`, '--part', file(`p${k}.json`));
      expect(r.code, r.err).toBe(0);
    }
    const m = await run('merge', file('p2.json'), file('p1.json'), '--csv', file('merged.csv'));
    expect(m.code, m.err).toBe(0);
    expect(readFileSync(file('merged.csv'), 'utf8')).toBe(whole);
  });

  it('refuses a sheet without a realiseBackground cell, and a bad threshold, naming what is wrong', async () => {
    const none = await run('realise', noCellPath, '--count', '10', '--seed', '1', '--quiet', '--workers', '1');
    expect(none.code).toBe(2);
    expect(none.err).toMatch(/no cell holds realisations/);
    const bad = await run(...args, '--threshold', '-3');
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--threshold/);
  });
});
