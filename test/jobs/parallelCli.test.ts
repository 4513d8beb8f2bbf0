// Parallel scan and sample on the command line: any --workers gives the same bytes, and the parts of
// a sharded run (--shard K/N), merged, give the unsharded output byte for byte. The check is an
// independent run of the same job (one worker, no shards), compared as whole files.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import { Sheet } from '../../src/sheet/sheet';
import { TOY_CELLS } from '../statistics/toySheet';
import { SAMPLE_CHUNK } from '../../src/statistics/monteCarloJob';

const dir = mkdtempSync(join(tmpdir(), 'strainsheet-parallel-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const sheetPath = join(dir, 'toy.json');
// rate_norm is applied as a sqrt factor; slope is evaluated at every sample (A_yr goes as 1 + slope^2).
const cells = TOY_CELLS.map((c) =>
  c.name === 'rate_norm' ? { ...c, uncertainty: 'lognormalDist(1e-3 Mpc^-3 Gyr^-1, 0.3)' } : c.name === 'slope' ? { ...c, uncertainty: 'normalDist(0.7, 0.1)' } : c,
);
writeFileSync(sheetPath, new Sheet({ title: 'toy', cells }).toFileText());

async function run(...argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { out: (t) => void (out += t), err: (t) => void (err += t) });
  return { code, out, err };
}
const file = (name: string) => join(dir, name);

const SAMPLES = String(3 * SAMPLE_CHUNK + 17); // four chunks, the last one short
const sampleArgs = ['sample', sheetPath, '--samples', SAMPLES, '--seed', '11', '--output', 'A_yr', '--output', 'bent', '--against', 'measured', '--quiet'];
// A 9 x 7 map of a non-linear output over two inputs: 63 evaluations, two chunks of 32.
const mapArgs = ['scan', sheetPath, '--vary', 'slope=0.2:1.4:9', '--vary', 'K_coef=1e-27 Mpc^3 Gyr:5e-27 Mpc^3 Gyr:7', '--output', 'bent', '--against', 'measured', '--quiet'];

describe('--workers: the same result for any number of workers', () => {
  // A run with N > 1 starts a pool of N worker threads, each loading the engine bundle (seconds on a
  // loaded 2-core machine), so this file starts one pool. Maps and shards use the same runChunks;
  // runChunks.test.ts runs them with chunks finishing out of order.
  let oneWorker: Promise<{ out: string; csv: string }> | null = null;
  const reference = () =>
    (oneWorker ??= run(...sampleArgs, '--workers', '1', '--csv', file('s1.csv')).then((r) => {
      expect(r.code, r.err).toBe(0);
      return { out: r.out, csv: readFileSync(file('s1.csv'), 'utf8') };
    }));

  for (const workers of ['2']) {
    it(`sample: ${workers} worker threads write the same CSV and summary as one`, async () => {
      const ref = await reference();
      expect(ref.csv.trim().split('\n')).toHaveLength(Number(SAMPLES) + 2);
      const r = await run(...sampleArgs, '--workers', workers, '--csv', file(`s${workers}.csv`));
      expect(r.code, r.err).toBe(0);
      expect(readFileSync(file(`s${workers}.csv`), 'utf8')).toBe(ref.csv);
      expect(r.out.replace(`s${workers}.csv`, 's1.csv')).toBe(ref.out);
    });
  }
});

describe('--shard K/N and merge', () => {
  async function shardsThenMerge(args: string[], name: string, n: number): Promise<string[]> {
    const parts: string[] = [];
    for (let k = 1; k <= n; k++) {
      const part = file(`${name}-${k}-of-${n}.json`);
      const r = await run(...args, '--workers', '1', '--shard', `${k}/${n}`, '--part', part);
      expect(r.code, r.err).toBe(0);
      expect(r.out).toMatch(new RegExp(`shard ${k} of ${n}: .*wrote `));
      parts.push(part);
    }
    return parts;
  }

  it('sample: shards 1..3 merged equal the unsharded CSV byte for byte, and the same summary', async () => {
    // Shards run in this thread here; a shard on worker threads is the last test of this file.
    const whole = await run(...sampleArgs, '--workers', '1', '--csv', file('whole.csv'));
    const parts = await shardsThenMerge(sampleArgs, 'sample', 3);
    const merged = await run('merge', ...parts.reverse(), '--csv', file('merged.csv'));
    expect(merged.code, merged.err).toBe(0);
    expect(readFileSync(file('merged.csv'), 'utf8')).toBe(readFileSync(file('whole.csv'), 'utf8'));
    expect(merged.out.replace('merged.csv', 'whole.csv')).toBe(whole.out);
  });

  it('more shards than chunks: the empty shards merge too', async () => {
    const small = ['sample', sheetPath, '--samples', '40', '--seed', '3', '--output', 'A_yr', '--quiet'];
    const whole = await run(...small, '--workers', '1');
    const parts = await shardsThenMerge(small, 'small', 3);
    const merged = await run('merge', ...parts);
    expect(merged.code, merged.err).toBe(0);
    expect(merged.out).toBe(whole.out);
  });

  it('two-input map and one-input scan: shards merged equal the unsharded CSV byte for byte', async () => {
    const whole = await run(...mapArgs, '--workers', '1');
    const merged = await run('merge', ...(await shardsThenMerge(mapArgs, 'map', 2)));
    expect(merged.code, merged.err).toBe(0);
    expect(merged.out).toBe(whole.out);
    const scanArgs = ['scan', sheetPath, '--vary', 'slope=0:2:70', '--output', 'bent', '--output', 'A_yr', '--quiet'];
    const whole1 = await run(...scanArgs, '--workers', '1');
    const merged1 = await run('merge', ...(await shardsThenMerge(scanArgs, 'scan', 4)));
    expect(merged1.code, merged1.err).toBe(0);
    expect(merged1.out).toBe(whole1.out);
  });

  it('refuses parts from different sheets, seeds or options, and missing or repeated shards, saying why', async () => {
    const small = ['sample', sheetPath, '--samples', '30', '--output', 'A_yr', '--quiet', '--workers', '1'];
    const write = async (name: string, shard: string, ...extra: string[]) => {
      const r = await run(...small, '--seed', '5', ...extra, '--shard', shard, '--part', file(name));
      expect(r.code, r.err).toBe(0);
      return file(name);
    };
    const p1 = await write('r1.json', '1/2');
    const p2 = await write('r2.json', '2/2');
    const otherSeed = file('seed.json');
    expect((await run(...small, '--seed', '6', '--shard', '2/2', '--part', otherSeed)).code).toBe(0);
    const otherSheet = await write('sheet.json', '2/2', '--set', 'K_coef=3e-27 Mpc^3 Gyr');
    const otherOptions = await write('opts.json', '2/2', '--output', 'bent');
    const ofThree = await write('three.json', '2/3');

    const refused = async (re: RegExp, ...parts: string[]) => {
      const r = await run('merge', ...parts);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(re);
    };
    await refused(/has seed 6, .*r1\.json seed 5/, p1, otherSeed);
    await refused(/sheet\.json was computed from a different sheet than .*r1\.json/, p1, otherSheet);
    await refused(/opts\.json was run with different options .*outputs: \["A_yr","bent"\] against \["A_yr"\]/, p1, otherOptions);
    await refused(/missing shard 2 of 2/, p1);
    await refused(/shard 1 of 2 is given twice/, p1, p1, p2);
    await refused(/three\.json is a shard of 3, .* a shard of 2/, p1, ofThree);
    // A part whose sheet was edited by hand no longer matches its hash.
    const tampered = file('tampered.json');
    writeFileSync(tampered, readFileSync(p2, 'utf8').replace('2.5e-27', '2.6e-27'));
    await refused(/tampered\.json: the sheet it holds does not match its "sheetSha256"/, p1, tampered);
    writeFileSync(file('junk.json'), '{"format": "something else"}');
    await refused(/junk\.json: not a part file/, file('junk.json'));
    await refused(/cannot read .*nosuch\.json: no such file/, file('nosuch.json'));
    expect((await run('merge', p1, p2)).code).toBe(0);
  });

  it('refuses bad --shard, --workers and --part options', async () => {
    const base = ['sample', sheetPath, '--samples', '10', '--seed', '1', '--output', 'A_yr', '--quiet'];
    expect((await run(...base, '--shard', '0/3')).err).toMatch(/--shard K must be a whole number of at least 1/);
    expect((await run(...base, '--shard', '4/3')).err).toMatch(/K must be at most N/);
    expect((await run(...base, '--shard', 'half')).err).toMatch(/--shard needs K\/N/);
    expect((await run(...base, '--workers', '0')).err).toMatch(/--workers must be a whole number of at least 1/);
    expect((await run(...base, '--part', file('x.json'))).err).toMatch(/--part goes with --shard/);
    expect((await run(...base, '--shard', '1/2', '--csv', file('x.csv'))).err).toMatch(/--shard writes a part file/);
  });
});
