// Eccentric spectrum of the demo population (examples/demo.json) on its 40-frequency grid, e0 = 0.9 at
// a rest-frame orbital start frequency f0 = 0.1 nHz, default integrator resolution. Target: 50 ms median.
// "warm": the e0 = 0.9 harmonic-sum table is cached (as in a sheet after the first evaluation);
// "cold": the table cache is cleared first, so the figure includes building the table.
// Also the stellar-environment spectrum and the finite-number bins of the same population.
import { readFileSync } from 'node:fs';
import { bench, describe } from 'vitest';
import type { Matrix, Unit } from 'mathjs';
import { Sheet } from '../src/sheet/sheet';
import { characteristicStrainSquared } from '../src/physics/backgroundIntegral';
import { circularGwKernel } from '../src/physics/circularKernel';
import { M_SUN_KG, PC_M, YEAR_S } from '../src/physics/constants';
import { clearHarmonicSumTables, eccentricEmissionKernel } from '../src/physics/eccentricKernel';
import { stellarEmissionKernel } from '../src/physics/stellarHardening';
import { finiteBinaryBins } from '../src/physics/finiteBinaries';
import type { PopulationValue } from '../src/builtins/populationValue';

const sheet = Sheet.fromFile(readFileSync(new URL('../examples/demo.json', import.meta.url), 'utf8'));
const demo = sheet.value('pop') as PopulationValue;
const freqs = Float64Array.from(((sheet.value('freqs') as Matrix).toArray() as unknown as Unit[]).map((u) => (u as Unit & { value: number }).value));
if (freqs.length !== 40) throw new Error(`the demo grid has ${freqs.length} frequencies, expected 40`);
const start = { e0: 0.9, f0OrbitalHz: 1e-10 };
// An invented nucleus for the environment benchmark.
const env = { densityKgM3: (100 * M_SUN_KG) / PC_M ** 3, dispersionMS: 200e3, hardeningRate: 16 };

describe('eccentric spectrum, demo population, 40 frequencies, e0 = 0.9', () => {
  bench('warm (table cached)', () => {
    characteristicStrainSquared(demo.population, freqs, { kernel: eccentricEmissionKernel(circularGwKernel, start) });
  });
  bench(
    'cold (table built)',
    () => {
      clearHarmonicSumTables();
      characteristicStrainSquared(demo.population, freqs, { kernel: eccentricEmissionKernel(circularGwKernel, start) });
    },
    { iterations: 5 },
  );
  bench('stellar environment (circular)', () => {
    characteristicStrainSquared(demo.population, freqs, { kernel: stellarEmissionKernel(circularGwKernel, env) });
  });
  bench(
    'finite-number bins (counts, thinned h_c, loudest strain), 14 yr span',
    () => {
      if (!demo.cosmology) throw new Error('the demo population has no cosmology');
      const r = finiteBinaryBins(demo.population, demo.cosmology, freqs, 14 * YEAR_S);
      // the GW-driven cuts and loudest binaries are computed when first read: read them
      if (!(r.thinnedHc[0] >= 0 && r.loudestStrain[0] >= 0)) throw new Error('no thinned h_c or loudest strain');
    },
    { iterations: 5 },
  );
});
