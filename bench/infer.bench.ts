// Posterior sampling of the demo sheet (examples/demo.json), issue 14: three free population
// parameters (rate_norm, mass_slope, cutoff_mass; the last two enter the spectrum non-linearly),
// the free-spectrum likelihood (KDE per bin with the analysis prior divided out,
// freeSpectrumLogLikelihood) against the demo's invented 14-bin free spectrum, on a spectrum at those
// 14 bin frequencies, 32 walkers x 2,000 steps. Target: under 10 s on one core. Also 2 workers (the
// machine has 2 cores).
// Run with `npx vitest bench --run bench/infer.bench.ts`.
import { readFileSync } from 'node:fs';
import { bench, describe } from 'vitest';
import { Sheet } from '../src/sheet/sheet';
import { runInference } from '../src/statistics/sheetInference';
import { nodeWorkerPool } from '../src/jobs/nodeWorkerPool';

const DEMO_TEXT = readFileSync(new URL('../examples/demo.json', import.meta.url), 'utf8');

/** The demo with priors on three cells and the free-spectrum likelihood of its invented measurement. */
function inferenceDemo(): Sheet {
  const s = Sheet.fromFile(DEMO_TEXT);
  s.updateCell('rate_norm', { prior: 'logUniformDist(1e-4 Mpc^-3 Gyr^-1, 1e-1 Mpc^-3 Gyr^-1)' });
  s.updateCell('mass_slope', { prior: 'uniformDist(-0.5, 1.0)' });
  s.updateCell('cutoff_mass', { prior: 'logUniformDist(1e8 Msun, 1e10 Msun)' });
  // The model is needed only at the measured bins, k/T for k = 1..14 of the demo's 40-frequency grid.
  s.setCell({ name: 'spectrum_bins', formula: 'strainSpectrum(pop, freqs[1:14])' });
  s.setCell({ name: 'lnL_free_spectrum', formula: 'freeSpectrumLogLikelihood(spectrum_bins, measured_free_spectrum)' });
  const st = s.state('lnL_free_spectrum');
  if (st.status !== 'value') throw new Error(`likelihood cell: ${JSON.stringify(st)}`);
  return s;
}

const spec = { likelihood: 'lnL_free_spectrum', walkers: 32, steps: 2000, seed: 1 };

describe('inference on the demo sheet', () => {
  bench(
    '32 walkers x 2,000 steps, 3 free cells, free-spectrum likelihood, 1 worker (target < 10 s)',
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
