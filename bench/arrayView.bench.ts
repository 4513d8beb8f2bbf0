// Speed of the array view. Target (issue 7): the expected S/N of the demo spectrum over a 50-value
// span scan in under 200 ms. Run with `npm run bench`.
//
// The spectrum stands in for the demo sheet's `spectrum` cell: an invented phenomenological population
// (Middleton et al. 2016 form, values made up for the demo, not fitted to any measurement) through the
// circular background integral, on 60 log-spaced frequencies from 0.5 nHz to 1 uHz. It is built once,
// outside the timed functions; only the array-view work is timed.
import { bench, describe } from 'vitest';
import { backgroundSpectrum } from '../src/physics/backgroundIntegral';
import { FlatLambdaCdm } from '../src/physics/cosmology';
import { logFrequencyGrid } from '../src/physics/frequencyGrid';
import { phenomenologicalPopulation } from '../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../src/physics/populationShapes';
import { DAY_S, KM_S_MPC_SI, YEAR_S } from '../src/physics/constants';
import { detectionSnr, detectionSpan } from '../src/physics/detectionSnr';
import { arraySensitivity } from '../src/physics/arraySensitivity';
import { spectrumModel } from '../src/physics/strainOnBins';
import type { PulsarArray } from '../src/physics/pulsarArray';
import { mulberry32, unitSphere } from '../test/arrayView/seededRandom';

const cosmology = new FlatLambdaCdm({ hubbleSI: 70 * KM_S_MPC_SI, omegaM: 0.3 });
const population = phenomenologicalPopulation({
  rateNorm: 1e-3,
  alpha: 0,
  cutoffMass: 3e9,
  beta: 2,
  z0: 1.5,
  zMax: 5,
  log10MMin: 7,
  log10MMax: 11,
  massRatio: powerLawMassRatio(0, 0.1),
  cosmology,
});
const spectrum = backgroundSpectrum(population, logFrequencyGrid(0.5e-9, 1e-6, 60));
const model = spectrumModel(spectrum);

// The invented demo array: 45 pulsars, 150 ns every 14 days.
const pulsar = { precisionS: 150e-9, cadenceS: 14 * DAY_S, redAmplitude: 0, redGamma: 0 };
const skyAveraged: PulsarArray = { pulsars: Array.from({ length: 45 }, () => pulsar), spanS: 15 * YEAR_S, positions: null };
const rand = mulberry32(2026);
const positions: Array<[number, number]> = Array.from({ length: 100 }, () => {
  const v = unitSphere(rand);
  return [Math.atan2(v[1], v[0]), Math.asin(v[2])];
});
const onSky: PulsarArray = { pulsars: positions.map(() => pulsar), spanS: 15 * YEAR_S, positions };

// 50 spans from 3 to 60 yr (1/60 yr = 0.53 nHz, inside the spectrum's grid).
const spans = Array.from({ length: 50 }, (_, i) => (3 + (57 * i) / 49) * YEAR_S);

describe('array view', () => {
  bench('detectionSnr over a 50-span scan, 45 pulsars sky-averaged (target < 200 ms)', () => {
    for (const t of spans) detectionSnr(skyAveraged, model, t);
  });
  bench('detectionSnr over a 50-span scan, 100 pulsars with positions (4950 pairs)', () => {
    for (const t of spans) detectionSnr(onSky, model, t);
  });
  bench('detectionSpan to S/N 5, 45 pulsars sky-averaged', () => {
    detectionSpan(skyAveraged, model, 5, 60 * YEAR_S);
  });
  bench('arraySensitivity, 45 pulsars over 15 yr', () => {
    arraySensitivity(skyAveraged);
  });
});
