// Test populations: the three parametric populations of test/reference/background_scipy.json, built
// with the project's constructors from the parameters the fixture records.
import fixture from '../reference/background_scipy.json';
import { KM_S_MPC_SI } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import type { BinaryPopulation } from '../../src/physics/populationTypes';

export type FixturePopulation = (typeof fixture.populations)[number];

export function buildPopulation(p: FixturePopulation, rateScale = 1): BinaryPopulation {
  return phenomenologicalPopulation({
    rateNorm: p.rateNorm * rateScale,
    alpha: p.alpha,
    cutoffMass: p.cutoffMass,
    beta: p.beta,
    z0: p.z0,
    zMax: p.zMax,
    log10MMin: p.log10MMin,
    log10MMax: p.log10MMax,
    massRatio: powerLawMassRatio(p.gamma, p.qMin),
    cosmology: new FlatLambdaCdm({ hubbleSI: p.H0 * KM_S_MPC_SI, omegaM: p.Om0 }),
  });
}

export const fixturePopulations = fixture.populations;
export const scipyCases = fixture.cases;
