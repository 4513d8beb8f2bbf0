// Convergence: A_yr and h_c at the default resolution against HIGH_RESOLUTION (16 x 24 x 8 panels of
// 10 points, about 3e6 nodes) for the demo population and every test population; the brief asks
// for 0.1%, and issue 11 for 1e-4 in A_yr. The reference is the same scheme refined (independent
// checks: backgroundScipy.test.ts, and kinkedDensities.test.ts for densities with kinks).
import { describe, expect, it } from 'vitest';
import { F_YR_HZ, KM_S_MPC_SI } from '../../src/physics/constants';
import { characteristicStrainSquared, HIGH_RESOLUTION } from '../../src/physics/backgroundIntegral';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { galaxyMergerPopulation } from '../../src/physics/galaxyMergerPopulation';
import { KORMENDY_HO_2013 } from '../../src/physics/blackHoleBulgeRelation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import type { BinaryPopulation } from '../../src/physics/populationTypes';
import type { PopulationValue } from '../../src/builtins/populationValue';
import { buildPopulation, fixturePopulations } from './populations';
import { loadDemo, siValues } from './demoSheet';

const cosmo = new FlatLambdaCdm({ hubbleSI: 70 * KM_S_MPC_SI, omegaM: 0.3 });
export const galaxyTestPopulation: BinaryPopulation = galaxyMergerPopulation({
  massFunction: { log10PhiStar0: -3, log10PhiStarSlope: -0.3, mStar: 1e11, alpha0: -1.1, alphaSlope: -0.1 },
  pairFraction0: 0.03,
  betaPair: 0.8,
  mergerTime0Gyr: 1,
  betaTau: -0.5,
  galaxyMassRatio: powerLawMassRatio(0, 0.25),
  bulgeFraction: 0.6,
  relation: KORMENDY_HO_2013,
  zMax: 5,
  log10MMin: 6,
  log10MMax: 11,
  cosmology: cosmo,
});

const demo = loadDemo();
const demoFreqs = siValues(demo.value('freqs'));
// The galaxy route's density costs a 20-node scatter integral per call, so its reference is a
// lower (still 4x denser in every direction than the default) resolution on every fourth frequency.
const GALAXY_REFERENCE = { zPanels: 8, log10MPanels: 16, qPanels: 4, order: 6 };
const cases: [string, BinaryPopulation, typeof HIGH_RESOLUTION, number][] = [
  ['demo (examples/demo.json)', (demo.value('pop') as PopulationValue).population, HIGH_RESOLUTION, 1],
  ...fixturePopulations.map((p) => [`test population ${p.label}`, buildPopulation(p), HIGH_RESOLUTION, 1] as [string, BinaryPopulation, typeof HIGH_RESOLUTION, number]),
  ['galaxy-merger route (Kormendy & Ho 2013 relation)', galaxyTestPopulation, GALAXY_REFERENCE, 4],
];

describe('A_yr and h_c converge to 0.1% of a high-resolution reference', () => {
  for (const [label, pop, reference, stride] of cases) {
    it(label, () => {
      const freqs = [F_YR_HZ, ...demoFreqs.filter((_, i) => i % stride === 0)];
      const lo = characteristicStrainSquared(pop, freqs);
      const hi = characteristicStrainSquared(pop, freqs, { resolution: reference });
      for (let i = 0; i < freqs.length; i++) {
        const err = Math.abs(Math.sqrt(lo[i] / hi[i]) - 1);
        // A_yr (f_yr, i = 0) within 1e-4 (issue 11), every h_c within 1e-3
        expect(err, `${label} at f = ${freqs[i]} Hz: h_c ${Math.sqrt(lo[i])} vs ${Math.sqrt(hi[i])}, error ${err.toExponential(2)}`).toBeLessThan(i === 0 ? 1e-4 : 1e-3);
      }
    });
  }
});
