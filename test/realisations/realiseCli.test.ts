// `strainsheet realise`: one row per bin, the same bytes for any --workers and for a sharded run
// merged (an independent run of the same job is the check), refusals named.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import { REALISE_CHUNK } from '../../src/statistics/realiseJob';

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

  it('2 worker threads write the same bytes as one', async () => {
    const ref = await oneWorker();
    const two = await run(...args, '--workers', '2', '--csv', file('r2.csv'));
    expect(two.code, two.err).toBe(0);
    expect(readFileSync(file('r2.csv'), 'utf8')).toBe(ref);
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
