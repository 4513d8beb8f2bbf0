// Posterior sampling of the demo sheet (examples/demo.json), issue 14: three free population
// parameters (rate_norm, mass_slope, cutoff_mass; the last two enter the spectrum non-linearly),
// a per-bin h_c likelihood over five invented bins (ln L = -chi^2/2, binChiSquare, on a spectrum at
// the five bin frequencies), 32 walkers x
// 2,000 steps. Target: under 10 s on one core. Also 2 workers (the machine has 2 cores).
// Run with `npx vitest bench --run bench/infer.bench.ts`.
import { readFileSync } from 'node:fs';
import { bench, describe } from 'vitest';
import { Sheet } from '../src/sheet/sheet';
import { runInference } from '../src/statistics/sheetInference';
import { nodeWorkerPool } from '../src/jobs/nodeWorkerPool';

const DEMO_TEXT = readFileSync(new URL('../examples/demo.json', import.meta.url), 'utf8');

/** The demo with priors on three cells and an invented five-bin measurement near its own spectrum. */
function inferenceDemo(): Sheet {
  const s = Sheet.fromFile(DEMO_TEXT);
  s.updateCell('rate_norm', { prior: 'logUniformDist(1e-4 Mpc^-3 Gyr^-1, 1e-1 Mpc^-3 Gyr^-1)' });
  s.updateCell('mass_slope', { prior: 'uniformDist(-0.5, 1.0)' });
  s.updateCell('cutoff_mass', { prior: 'logUniformDist(1e8 Msun, 1e10 Msun)' });
  const bins = 'f_nHz,hc,lo,hi\\n2.6,1.3e-14,8e-15,2.1e-14\\n5.3,8.6e-15,5.2e-15,1.4e-14\\n7.9,6.6e-15,3.9e-15,1.1e-14\\n10.6,5.4e-15,3e-15,9.7e-15\\n13.2,4.6e-15,2.4e-15,8.8e-15';
  s.setCell({ name: 'bins_invented', formula: `binsFromText("${bins}", 68.27%)` });
  // The model is needed only at the bin frequencies: a spectrum on those five.
  s.setCell({ name: 'spectrum_bins', formula: 'strainSpectrum(pop, [2.6, 5.3, 7.9, 10.6, 13.2] * 1 nHz)' });
  s.setCell({ name: 'lnL_bins', formula: '-binChiSquare(spectrum_bins, bins_invented) / 2' });
  return s;
}

const spec = { likelihood: 'lnL_bins', walkers: 32, steps: 2000, seed: 1 };

describe('inference on the demo sheet', () => {
  bench(
    '32 walkers x 2,000 steps, 3 free cells, per-bin likelihood, 1 worker (target < 10 s)',
    async () => {
      const r = await runInference(inferenceDemo(), spec);
      console.log(`1 worker: ${r.evaluations} evaluations, acceptance ${r.diagnostics.acceptance.toFixed(3)}, verdict ${r.diagnostics.verdict}`);
    },
    { iterations: 1, warmupIterations: 0, time: 0 },
  );
  bench(
    'same, 2 worker threads',
    async () => {
      const r = await runInference(inferenceDemo(), spec, undefined, { parallel: { workers: 2, pool: nodeWorkerPool } });
      console.log(`2 workers: ${r.evaluations} evaluations`);
    },
    { iterations: 1, warmupIterations: 0, time: 0 },
  );
});
