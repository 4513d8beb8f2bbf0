// The galaxy route on the demo's 40-frequency grid at the default resolution: today's
// galaxyMergerPopulation (one scatter draw, no time shift) against galaxyPairPopulation with mass- and
// ratio-dependent pairs and time-scales, the time shift and a scatter draw for each hole (docs/galaxyRoute.md).
// Invented parameters (as test/physics/galaxyPairRoute.test.ts). Target: each case well under 200 ms, so that
// the app recomputes such a cell without a long wait (figures in README's performance section).
import { bench, describe } from 'vitest';
import { characteristicStrainSquared } from '../src/physics/backgroundIntegral';
import { KM_S_MPC_SI } from '../src/physics/constants';
import { FlatLambdaCdm } from '../src/physics/cosmology';
import { KORMENDY_HO_2013 } from '../src/physics/blackHoleBulgeRelation';
import { galaxyMergerPopulation } from '../src/physics/galaxyMergerPopulation';
import { galaxyPairRoutePopulation, type GalaxyPairRouteParams } from '../src/physics/galaxyPairRoute';
import { powerLawMassRatio } from '../src/physics/populationShapes';

const cosmology = new FlatLambdaCdm({ hubbleSI: 70 * KM_S_MPC_SI, omegaM: 0.3 });
const massFunction = { log10PhiStar0: -2.8, log10PhiStarSlope: -0.25, mStar: 10 ** 10.9, alpha0: -1.2, alphaSlope: -0.05 };
const relation = { ...KORMENDY_HO_2013, scatterDex: 0.3 };
const freqs = Float64Array.from({ length: 40 }, (_, k) => (k + 1) / (14 * 365.25 * 86400));
const today = galaxyMergerPopulation({ massFunction, pairFraction0: 0.025, betaPair: 1, mergerTime0Gyr: 0.8, betaTau: -0.3, galaxyMassRatio: powerLawMassRatio(-0.5, 0.2), bulgeFraction: 0.5, relation, zMax: 4, log10MMin: 6, log10MMax: 11, cosmology });
const full = (over: Partial<GalaxyPairRouteParams>) =>
  galaxyPairRoutePopulation({ massFunction, pair: { f0: 0.025, alpha: 0.2, beta: 1 }, time: { tau0Gyr: 0.8, alpha: -0.3, beta: -0.3, gamma: -0.5 }, galaxyMassRatio: powerLawMassRatio(-0.5, 0.2), bulgeFraction: 0.5, relation, relationZeta: 0.5, scatter: 'independent', timeShift: true, zMax: 4, log10MMin: 6, log10MMax: 11, cosmology, ...over });

describe('galaxy route, 40 frequencies, default resolution', () => {
  bench('galaxyMergerPopulation (one draw, no shift)', () => {
    characteristicStrainSquared(today, freqs);
  });
  bench('galaxyPairPopulation, one draw, time shift', () => {
    characteristicStrainSquared(full({ scatter: 'shared' }), freqs);
  });
  bench('galaxyPairPopulation, a draw for each hole, no shift', () => {
    characteristicStrainSquared(full({ timeShift: false }), freqs);
  });
  bench('galaxyPairPopulation, a draw for each hole, time shift', () => {
    characteristicStrainSquared(full({}), freqs);
  });
});
