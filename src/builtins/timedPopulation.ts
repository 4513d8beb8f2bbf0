// A population whose density checks the clock where a cell that runs out of time is handed off
// (the app's page, evaluationBudget.ts): a spectrum of a slow population (the galaxy route with a
// scatter draw for each hole takes seconds) then stops on the page and is evaluated in a worker.
// Elsewhere (the command line, workers) the check does nothing: built-ins' loops run to the end, and
// a population built while hand-off is off is used as it is (no wrapper in the integrals' inner loops,
// no copy per Monte Carlo sample). The page turns hand-off on when its session module loads
// (web/engine/pageBudget.ts), before any sheet is built.
import type { BinaryPopulation, SeparableFactors } from '../physics/populationTypes';
import { checkTimeIfHandingOff, handOffOnTimeout } from '../sheet/evaluationBudget';

export function timedPopulation(pop: BinaryPopulation): BinaryPopulation {
  if (!handOffOnTimeout()) return pop;
  // A copy of the population's own properties (so that `{ ...pop }` still holds them all) with the
  // density and its helpers timed; the descriptors are made anew, as the population may be frozen.
  const props = Object.getOwnPropertyDescriptors(pop) as PropertyDescriptorMap;
  const set = (key: string, value: unknown) => (props[key] = { value, enumerable: true, writable: true, configurable: true });
  set('density', (z: number, log10M: number, q: number) => {
    checkTimeIfHandingOff();
    return pop.density(z, log10M, q);
  });
  const zIntegral = pop.zIntegral;
  if (zIntegral) {
    const timedZ: NonNullable<BinaryPopulation['zIntegral']> = (log10M, q, weight, zTop, rule) => {
      checkTimeIfHandingOff();
      return zIntegral.call(pop, log10M, q, weight, zTop, rule);
    };
    set('zIntegral', timedZ);
  }
  const sep = pop.separable;
  if (sep) {
    // The factors of a separable density, which the integrals call instead of the density.
    const factors: SeparableFactors = {
      ...sep,
      zMass: (z, log10M) => (checkTimeIfHandingOff(), sep.zMass(z, log10M)),
      massRatio: (q) => (checkTimeIfHandingOff(), sep.massRatio(q)),
    };
    set('separable', factors);
  }
  return Object.create(Object.getPrototypeOf(pop), props) as BinaryPopulation;
}
