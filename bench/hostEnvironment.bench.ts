// Environments scaled by mass and hardening delays on the demo population (examples/demo.json):
// the mass-scaled stellar spectrum (40 frequencies, the integrator's fast path), the same with e0 = 0.6
// at each binary's decoupling, A_yr of the population delayed by each binary's hardening time (not
// separable: steps in z for each mass) and its stalled share. No target: figures for docs/orbits.md.
import { readFileSync } from 'node:fs';
import { bench, describe } from 'vitest';
import type { Matrix, Unit } from 'mathjs';
import { Sheet } from '../src/sheet/sheet';
import { characteristicStrainSquared } from '../src/physics/backgroundIntegral';
import { circularGwKernel } from '../src/physics/circularKernel';
import { F_YR_HZ, M_SUN_KG } from '../src/physics/constants';
import { lifetimeFunction } from '../src/physics/hardeningLifetime';
import { massScaledEnvironment, MCCONNELL_MA_2013_M_SIGMA } from '../src/physics/hostEnvironment';
import { delayedPopulationByMass, stalledFractionByMass } from '../src/physics/massDependentDelay';
import { stellarEccentricKernel, stellarEmissionKernel } from '../src/physics/stellarHardening';
import type { PopulationValue } from '../src/builtins/populationValue';

const sheet = Sheet.fromFile(readFileSync(new URL('../examples/demo.json', import.meta.url), 'utf8'));
const demo = sheet.value('pop') as PopulationValue;
const cosmology = demo.cosmology;
if (!cosmology) throw new Error('the demo population has no cosmology');
const freqs = Float64Array.from(((sheet.value('freqs') as Matrix).toArray() as unknown as Unit[]).map((u) => (u as Unit & { value: number }).value));
const env = massScaledEnvironment({ mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: 16 });
const lifetime = lifetimeFunction(env, M_SUN_KG);

describe('mass-scaled environment and hardening delays, demo population', () => {
  bench('mass-scaled stellar spectrum, 40 frequencies', () => {
    characteristicStrainSquared(demo.population, freqs, { kernel: stellarEmissionKernel(circularGwKernel, env) });
  });
  bench('mass-scaled, e0 = 0.6 at decoupling, 40 frequencies (table cached after the first run)', () => {
    characteristicStrainSquared(demo.population, freqs, { kernel: stellarEccentricKernel(circularGwKernel, env, 0.6) });
  });
  bench(
    'A_yr of the population delayed by hardening times',
    () => {
      characteristicStrainSquared(delayedPopulationByMass(demo.population, cosmology, lifetime), [F_YR_HZ]);
    },
    { iterations: 5 },
  );
  bench(
    'stalled share with hardening times',
    () => {
      stalledFractionByMass(demo.population, cosmology, lifetime);
    },
    { iterations: 5 },
  );
});
