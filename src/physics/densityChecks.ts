// Checked density values for the spectrum integrators: a negative or non-finite value is an error
// naming the point.
import type { BinaryPopulation } from './populationTypes';

/** Density at one node, checked. */
export function densityAt(pop: BinaryPopulation, z: number, x: number, q: number): number {
  const n = pop.density(z, x, q);
  if (!(n >= 0) || n === Infinity) throw new RangeError(`population density is ${n} at z = ${z}, log10M = ${x}, q = ${q}; it must be finite and >= 0`);
  return n;
}

/** A factor of a separable density, checked like densityAt. */
export function checkedValue(v: number, what: string, ...at: number[]): number {
  if (!(v >= 0) || v === Infinity) throw new RangeError(`population ${what} is ${v} at (${at.join(', ')}); it must be finite and >= 0`);
  return v;
}

/** The log of a mass factor, checked: finite or -Infinity (a factor of 0). */
export function checkedLog(v: number, x: number): number {
  if (!(v < Infinity)) throw new RangeError(`population ln(mass factor) is ${v} at log10M = ${x}; it must be finite or -Infinity`);
  return v;
}
