// The scan and sample commands, run in-process through main() with captured output.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import { Sheet } from '../../src/sheet/sheet';
import { TOY_CELLS, toyAmplitude } from './toySheet';

const dir = mkdtempSync(join(tmpdir(), 'strainsheet-stats-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const sheetPath = join(dir, 'toy.json');
const cells = TOY_CELLS.map((c) => (c.name === 'rate_norm' ? { ...c, uncertainty: 'lognormalDist(1e-3 Mpc^-3 Gyr^-1, 0.3)' } : c));
writeFileSync(sheetPath, new Sheet({ title: 'toy', cells }).toFileText());
const original = readFileSync(sheetPath, 'utf8');

async function run(...argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { out: (t) => void (out += t), err: (t) => void (err += t) });
  return { code, out, err };
}
function dataRows(csv: string): string[][] {
  return csv
    .trim()
    .split('\n')
    .filter((l) => !l.startsWith('#'))
    .map((l) => l.split(','));
}

describe('strainsheet scan', () => {
  it('one input: header with units, one row per point, values equal the closed form', async () => {
    const r = await run('scan', sheetPath, '--vary', 'rate_norm=1e-4:1e-2:5:log', '--output', 'A_yr', '--against', 'measured', '--quiet');
    expect(r.code).toBe(0);
    const rows = dataRows(r.out);
    expect(rows[0]).toEqual(['rate_norm [Mpc^-3 Gyr^-1]', 'A_yr']);
    expect(rows).toHaveLength(6);
    for (const row of rows.slice(1)) expect(Number(row[1]) / toyAmplitude(Number(row[0]))).toBeCloseTo(1, 10);
    expect(r.out).toMatch(/# measured at 1\/yr: median 3.*e-15, 90% interval 2e-15 to 4.5e-15/);
  });
  it('two inputs with --against: likelihood, posterior and region columns; --csv writes the file', async () => {
    const out = join(dir, 'map.csv');
    const r = await run('scan', sheetPath, '--vary', 'slope=0:1.5:4', '--vary', 'rate_norm=1e-4 Mpc^-3 Gyr^-1:1e-2 Mpc^-3 Gyr^-1:3:log', '--output', 'A_yr', '--against', 'measured', '--csv', out, '--quiet');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/wrote .*map.csv/);
    const rows = dataRows(readFileSync(out, 'utf8'));
    expect(rows[0]).toEqual(['slope', 'rate_norm [Mpc^-3 Gyr^-1]', 'A_yr', 'likelihood', 'posterior', 'in68', 'in95']);
    expect(rows).toHaveLength(13);
    const total = rows.slice(1).reduce((s, row) => s + Number(row[4]), 0);
    expect(total).toBeCloseTo(1, 12);
  });
  it('bad ranges and options exit 2 with the problem named, and the file is unchanged', async () => {
    const reversed = await run('scan', sheetPath, '--vary', 'slope=1:0:5', '--output', 'A_yr', '--quiet');
    expect(reversed.code).toBe(2);
    expect(reversed.err).toMatch(/scan of slope: the range is reversed/);
    const empty = await run('scan', sheetPath, '--vary', 'slope=1:1:5', '--output', 'A_yr', '--quiet');
    expect(empty.err).toMatch(/the range is empty/);
    const badN = await run('scan', sheetPath, '--vary', 'slope=0:1:many', '--output', 'A_yr');
    expect(badN.code).toBe(2);
    expect(badN.err).toMatch(/number of points must be a whole number/);
    const noOutput = await run('scan', sheetPath, '--vary', 'slope=0:1:3');
    expect(noOutput.err).toMatch(/give an --output cell/);
    const noCell = await run('scan', sheetPath, '--vary', 'nosuch=0:1:3', '--output', 'A_yr', '--quiet');
    expect(noCell.err).toMatch(/input nosuch: there is no cell/);
    expect(readFileSync(sheetPath, 'utf8')).toBe(original);
  });
  it('--help documents the options', async () => {
    const r = await run('scan', '--help');
    expect(r.code).toBe(0);
    for (const opt of ['--vary', '--output', '--csv', '--against', '--prior', '--set', '--quiet']) expect(r.out).toContain(opt);
  });
});

describe('strainsheet sample', () => {
  it('writes one row per sample; the same seed gives the same CSV', async () => {
    const a = await run('sample', sheetPath, '--samples', '50', '--seed', '7', '--output', 'A_yr', '--quiet');
    const b = await run('sample', sheetPath, '--samples', '50', '--seed', '7', '--output', 'A_yr', '--quiet');
    expect(a.code).toBe(0);
    expect(a.out).toBe(b.out);
    const rows = dataRows(a.out);
    expect(rows[0]).toEqual(['sample', 'rate_norm [Mpc^-3 Gyr^-1]', 'A_yr']);
    expect(rows).toHaveLength(51);
    // Each row: A_yr is the toy closed form of its drawn rate.
    for (const row of rows.slice(1)) expect(Number(row[2]) / toyAmplitude(Number(row[1]))).toBeCloseTo(1, 10);
    expect(a.err).toMatch(/A_yr: median .* \(Monte Carlo error\), from 50 samples/);
  });
  it('refuses bad counts and seeds', async () => {
    expect((await run('sample', sheetPath, '--samples', '0', '--seed', '1', '--output', 'A_yr')).err).toMatch(/--samples must be a whole number of at least 1/);
    expect((await run('sample', sheetPath, '--samples', '10', '--seed', '-3', '--output', 'A_yr')).err).toMatch(/--seed must be a whole number/);
    expect((await run('sample', sheetPath, '--samples', '10', '--output', 'A_yr')).err).toMatch(/give --seed/);
  });
});
