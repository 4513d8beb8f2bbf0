// The phenomenological hardening model (src/physics/phenomHardening.ts) on the demo population
// (examples/demo.json): the spectrum at 40 frequencies with the model's residence factor (the general
// energy form: the factor is not a function of f_r / scale), with a fresh kernel each run so its
// normalisation table is rebuilt, and the circular spectrum through the same general form for scale.
// Also the counts per bin (finiteBinaryBins) and the realisation cells with and without the model's
// residence factor, 14 yr span. No target: figures for docs/orbits.md and the README.
import { readFileSync } from 'node:fs';
import { bench, describe } from 'vitest';
import type { Matrix, Unit } from 'mathjs';
import { Sheet } from '../src/sheet/sheet';
import { characteristicStrainSquared } from '../src/physics/backgroundIntegral';
import { circularGwKernel } from '../src/physics/circularKernel';
import { GYR_S, M_SUN_KG, YEAR_S } from '../src/physics/constants';
import { PHENOM_HARDENING_DEFAULTS } from '../src/physics/phenomHardening';
import { phenomDelayedPopulation, phenomEmissionKernel, phenomResidenceFactor } from '../src/physics/phenomHardeningSpectrum';
import { finiteBinaryBins } from '../src/physics/finiteBinaries';
import { realisationCells } from '../src/physics/realisationCells';
import type { PopulationValue } from '../src/builtins/populationValue';

const sheet = Sheet.fromFile(readFileSync(new URL('../examples/demo.json', import.meta.url), 'utf8'));
const demo = sheet.value('pop') as PopulationValue;
const cosmology = demo.cosmology;
if (!cosmology) throw new Error('the demo population has no cosmology');
const freqs = Float64Array.from(((sheet.value('freqs') as Matrix).toArray() as unknown as Unit[]).map((u) => (u as Unit & { value: number }).value));
const model = { ...PHENOM_HARDENING_DEFAULTS, lifetimeS: 2 * GYR_S };
const delayed = phenomDelayedPopulation(demo.population, cosmology, model, M_SUN_KG);
characteristicStrainSquared(delayed, freqs); // the delay's redshift maps, once

describe('phenomenological hardening, demo population delayed by 2 Gyr, 40 frequencies', () => {
  bench('spectrum with the residence factor (table built each run)', () => {
    characteristicStrainSquared(delayed, freqs, { kernel: phenomEmissionKernel(model, M_SUN_KG) });
  });
  bench('circular kernel through the general energy form, for scale', () => {
    characteristicStrainSquared(delayed, freqs, { kernel: (fr, mc, m, q, z) => circularGwKernel(fr, mc, m, q, z) });
  });
});

describe('counts per bin with the residence factor, demo population delayed by 2 Gyr, 40 frequencies, 14 yr', () => {
  bench('finiteBinaryBins, GW-driven', () => {
    const r = finiteBinaryBins(delayed, cosmology, freqs, 14 * YEAR_S);
    // the cuts and loudest binaries are computed when first read (with the residence factor, in the loop): read them
    if (!(r.thinnedHc[0] >= 0 && r.loudestStrain[0] >= 0)) throw new Error('no thinned h_c or loudest strain');
  });
  bench('finiteBinaryBins with the residence factor (table built each run)', () => {
    finiteBinaryBins(delayed, cosmology, freqs, 14 * YEAR_S, {}, phenomResidenceFactor(model, M_SUN_KG));
  });
  bench('realisationCells, GW-driven', () => {
    realisationCells(delayed, cosmology, freqs, 14 * YEAR_S);
  });
  bench('realisationCells with the residence factor (table built each run)', () => {
    realisationCells(delayed, cosmology, freqs, 14 * YEAR_S, { residence: phenomResidenceFactor(model, M_SUN_KG) });
  });
});
