// Circular spectra of the demo population (examples/demo.json) at the default resolution
// (DEFAULT_RESOLUTION: 2 x 4 x 1 panels of 6 Gauss-Legendre points in z, log10M, q): on its
// 40-frequency grid k/T (target 0.12 ms median, issue 11), on 640 frequencies k/T of the same span
// (target 1.5 ms) and at f_yr alone (A_yr, target 0.02 ms). The population and grid are read from the
// demo sheet, so the benchmark follows the demo.
import { readFileSync } from 'node:fs';
import { bench, describe } from 'vitest';
import { Sheet } from '../src/sheet/sheet';
import { characteristicStrainSquared, HIGH_RESOLUTION } from '../src/physics/backgroundIntegral';
import type { PopulationValue } from '../src/builtins/populationValue';
import type { Matrix, Unit } from 'mathjs';

const sheet = Sheet.fromFile(readFileSync(new URL('../examples/demo.json', import.meta.url), 'utf8'));
const demo = sheet.value('pop') as PopulationValue;
const freqs = Float64Array.from(((sheet.value("freqs") as Matrix).toArray() as unknown as Unit[]).map((u) => (u as Unit & { value: number }).value));
if (freqs.length !== 40) throw new Error(`the demo grid has ${freqs.length} frequencies, expected 40`);
const freqs640 = Float64Array.from({ length: 640 }, (_, k) => (k + 1) * freqs[0]);
const fYr = [1 / (365.25 * 86400)];

describe('circular background spectrum, demo population, 40 frequencies', () => {
  bench('default resolution (strain form, q folded)', () => {
    characteristicStrainSquared(demo.population, freqs);
  });
  bench('default resolution, 640 frequencies k/T', () => {
    characteristicStrainSquared(demo.population, freqs640);
  });
  bench('default resolution, one frequency f_yr (A_yr)', () => {
    characteristicStrainSquared(demo.population, fYr);
  });
  bench('default resolution, energy form (generic kernel path)', () => {
    characteristicStrainSquared(demo.population, freqs, { kernel: (fr, mc, m, q, z) => (Math.pow(Math.PI, 2 / 3) / 3) * Math.pow(6.6743e-11, 2 / 3) * Math.pow(mc, 5 / 3) * Math.pow(fr, 2 / 3) + 0 * (m + q + z) });
  });
  bench('high resolution reference', () => {
    characteristicStrainSquared(demo.population, freqs, { resolution: HIGH_RESOLUTION });
  }, { iterations: 3 });
});
