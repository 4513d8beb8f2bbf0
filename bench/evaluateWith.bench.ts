// The sheet's hot path on the demo (examples/demo.json, an invented scenario): change mass_slope
// and cutoff_mass, read A_yr, as every sample of a Monte Carlo or a scan does. Target (issue 11):
// median <= 0.06 ms. The second benchmark calls the same two built-ins directly with the same
// values (no sheet), so the difference is what the engine itself costs; the spectrum's own speed
// is benchmarked in spectrum.bench.ts. Run with `npm run bench`.
import { readFileSync } from 'node:fs';
import { bench, describe } from 'vitest';
import type { Unit } from 'mathjs';
import { Sheet } from '../src/sheet/sheet';
import { lockedMath } from '../src/sheet/lockedMath';

const sheet = Sheet.fromFile(readFileSync(new URL('../examples/demo.json', import.meta.url), 'utf8'));
if (sheet.state('A_yr').status !== 'value') throw new Error('demo A_yr has no value');
const cutoff = sheet.value('cutoff_mass') as Unit & { value: number };
// Ten slopes and ten cutoffs, made before timing (a sampler hands the sheet ready values).
const slopes = Array.from({ length: 10 }, (_, i) => 0.2 + 0.01 * i);
const cutoffs = Array.from({ length: 10 }, (_, i) => {
  const u = cutoff.clone() as Unit & { value: number };
  u.value = cutoff.value * (0.8 + 0.04 * i);
  return u;
});

const builtins = lockedMath().builtins;
const population = builtins.get('mergerPopulation')!.fn;
const amplitude = builtins.get('amplitudeAtYear')!.fn;
const popArgs = ['cosmo', 'rate_norm', 'mass_slope', 'cutoff_mass', 'z_shape', 'q_shape', 'min_mass', 'max_mass'].map((n) => sheet.value(n));

describe('evaluateWith on the demo sheet', () => {
  let k = 0;
  bench(
    'mass_slope and cutoff_mass changed, A_yr read (target <= 0.06 ms)',
    () => {
      k = (k + 1) % 100;
      const r = sheet.evaluateWith({ mass_slope: slopes[k % 10], cutoff_mass: cutoffs[(k / 10) | 0] }, ['A_yr']);
      if (r.A_yr.status !== 'value') throw new Error('A_yr failed');
    },
    { time: 3000, warmupIterations: 50 },
  );
  let j = 0;
  bench(
    'the same two built-ins called directly (mergerPopulation, amplitudeAtYear), no sheet',
    () => {
      j = (j + 1) % 100;
      popArgs[2] = slopes[j % 10];
      popArgs[3] = cutoffs[(j / 10) | 0];
      amplitude(population(...popArgs));
    },
    { time: 3000, warmupIterations: 50 },
  );
});
