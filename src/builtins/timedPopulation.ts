// A population whose density checks the clock where a cell that runs out of time is handed off
// (the app's page, evaluationBudget.ts): a spectrum of a slow population (the galaxy route with a
// scatter draw for each hole takes seconds) then stops on the page and is evaluated in a worker.
// Elsewhere (the command line, workers) the check does nothing: built-ins' loops run to the end.
import type { BinaryPopulation } from '../physics/populationTypes';
import { checkTimeIfHandingOff } from '../sheet/evaluationBudget';

export function timedPopulation(pop: BinaryPopulation): BinaryPopulation {
  // defineProperty: the population may be frozen (its properties read-only, so not assignable on top).
  const density: BinaryPopulation['density'] = (z, log10M, q) => {
    checkTimeIfHandingOff();
    return pop.density(z, log10M, q);
  };
  const timed = Object.create(pop, { density: { value: density, enumerable: true } }) as BinaryPopulation;
  const zIntegral = pop.zIntegral;
  if (zIntegral) {
    const timedZ: NonNullable<BinaryPopulation['zIntegral']> = (log10M, q, weight, zTop, rule) => {
      checkTimeIfHandingOff();
      return zIntegral.call(pop, log10M, q, weight, zTop, rule);
    };
    Object.defineProperty(timed, 'zIntegral', { value: timedZ, enumerable: true });
  }
  return timed;
}
