// Parallel jobs (src/jobs/): the same Monte Carlo and two-input map on 1 and 2 worker threads, the
// start-up of the workers alone, and the command line end to end (also with the default --workers).
// Every run with workers starts its own pool, so the figures include worker start-up (each worker loads the engine bundle
// dist-cli/chunkWorker.cjs and builds the demo sheet from its file text). Run `npm run build:cli`
// first (npm test and npm install do) so that the workers load the bundle, not the sources.
import { readFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { bench, describe } from 'vitest';
import { Sheet } from '../src/sheet/sheet';
import { monteCarlo } from '../src/statistics/sheetMonteCarlo';
import { scan2D } from '../src/statistics/sheetScan';
import { nodeWorkerPool } from '../src/jobs/nodeWorkerPool';

const demoPath = fileURLToPath(new URL('../examples/demo.json', import.meta.url));
const demoText = readFileSync(demoPath, 'utf8');
const sheet = Sheet.fromFile(demoText);
const cliPath = fileURLToPath(new URL('../bin/strainsheet.mjs', import.meta.url));
const once = { iterations: 3, time: 0, warmupIterations: 0 };

describe('worker start-up', () => {
  bench(
    'start 2 worker threads, each loads the engine and builds the demo sheet',
    async () => {
      const pool = nodeWorkerPool(2);
      await Promise.all([pool.loadSheet(demoText), pool.loadSheet(demoText)]);
      await pool.close();
    },
    once,
  );
});

// The demo's rate_norm (sqrt factor) and mass_slope (a population per sample) are uncertain.
describe('10,000 Monte Carlo samples of A_yr, demo sheet (20 chunks of 500)', () => {
  for (const workers of [1, 2]) {
    bench(`${workers} worker${workers === 1 ? ' (this thread)' : ' threads (pool started in each run)'}`, async () => {
      await monteCarlo(sheet, { samples: 10_000, seed: 1, outputs: ['A_yr'] }, undefined, { workers, pool: nodeWorkerPool });
    }, once);
  }
});

describe('40 x 40 map of A_yr over mass_slope x cutoff_mass (1,600 evaluations, 50 chunks)', () => {
  for (const workers of [1, 2]) {
    bench(`${workers} worker${workers === 1 ? ' (this thread)' : ' threads (pool started in each run)'}`, async () => {
      const r = await scan2D(
        sheet,
        { cell: 'mass_slope', lo: -0.5, hi: 1, n: 40, log: false },
        { cell: 'cutoff_mass', lo: 1e8 * 1.98847e30, hi: 1e10 * 1.98847e30, n: 40, log: true },
        'A_yr',
        {},
        undefined,
        { workers, pool: nodeWorkerPool },
      );
      if (r.failures || r.scaledAxis) throw new Error('the map should evaluate every point without failures');
    }, once);
  }
});

/** `strainsheet sample` of the demo, a whole process, with these extra options. */
function sample(samples: number, options: string[]): void {
  const r = spawnSync(process.execPath, [cliPath, 'sample', demoPath, '--samples', String(samples), '--seed', '1', '--output', 'A_yr', '--quiet', ...options], { encoding: 'utf8', maxBuffer: 64 << 20 });
  if (r.status !== 0) throw new Error(`strainsheet sample failed: ${r.stderr}`);
}

describe('command line end to end: strainsheet sample examples/demo.json --samples 10000 (whole process)', () => {
  for (const workers of [1, 2]) bench(`--workers ${workers}`, () => sample(10_000, ['--workers', String(workers)]), once);
  // the threads start only when the work left would take over 1 s in this thread (src/cli/parallelOptions.ts)
  bench('no --workers (the cores, started when they pay)', () => sample(10_000, []), once);
});

describe('command line end to end: strainsheet sample examples/demo.json --samples 200000 (whole process)', () => {
  bench('--workers 1', () => sample(200_000, ['--workers', '1']), once);
  bench('no --workers (the cores, started when they pay)', () => sample(200_000, []), once);
});
