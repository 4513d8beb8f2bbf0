// Argument helpers shared by the cosmology, population and spectrum built-ins.
import type { Matrix } from 'mathjs';
import { BuiltinError } from '../sheet/cellError';
import { checkTimeIfHandingOff } from '../sheet/evaluationBudget';
import { math } from '../sheet/mathInstance';
import { DIMENSIONS, kindOf, objectOf, scalarSI, vectorSI, where, type Dimension } from './args';
import type { Unit } from 'mathjs';
import { isUnit } from '../sheet/mathInstance';
import type { CosmologyValue } from './cosmologyValue';
import type { PopulationValue } from './populationValue';

/** Whether v is a list (matrix or array). */
export function isList(v: unknown): boolean {
  return math.isMatrix(v) || Array.isArray(v);
}

/**
 * Applies f to a scalar argument, or to each element of a list argument (then returns a matrix).
 * Each element is checked with the dimension, and errors name the element.
 */
export function elementwise(v: unknown, dim: Dimension, fn: string, arg: string, f: (x: number, argName: string) => unknown): unknown {
  if (!isList(v)) return f(scalarSI(v, dim, fn, arg), arg);
  const xs = vectorSI(v, dim, fn, arg);
  // Each element may solve or integrate (a lifetime, a reference mass function): on the page the
  // list is timed per element (the clock read every 16th), so a long list is handed off.
  return math.matrix(Array.from(xs, (x, i) => (checkTimeIfHandingOff(), f(x, `${arg}[${i + 1}]`))) as never[]) as Matrix;
}

/** A redshift, checked to be finite and >= 0 (and <= zLimit if given). */
export function redshiftValue(z: number, fn: string, arg: string, zLimit = 1e4): number {
  if (!(z >= 0) || z > zLimit) throw new BuiltinError(`${where(fn, arg)} must be a redshift in [0, ${zLimit}], got ${z}`);
  return z;
}

export function cosmologyArg(v: unknown, fn: string, arg = 'cosmology'): CosmologyValue {
  return objectOf<CosmologyValue>(v, 'cosmology', fn, arg);
}

export function populationArg(v: unknown, fn: string, arg = 'population'): PopulationValue {
  return objectOf<PopulationValue>(v, 'population', fn, arg);
}

/** A positive quantity (strictly > 0). */
export function positiveSI(v: unknown, dim: Dimension, fn: string, arg: string): number {
  const x = scalarSI(v, dim, fn, arg);
  if (!(x > 0)) throw new BuiltinError(`${where(fn, arg)} must be positive, got ${describeValue(v, dim)}`);
  return x;
}

/** A quantity >= 0. */
export function nonNegativeSI(v: unknown, dim: Dimension, fn: string, arg: string): number {
  const x = scalarSI(v, dim, fn, arg);
  if (!(x >= 0)) throw new BuiltinError(`${where(fn, arg)} must not be negative, got ${describeValue(v, dim)}`);
  return x;
}

/** A positive integer count. */
export function countArg(v: unknown, fn: string, arg: string, max: number): number {
  const x = scalarSI(v, 'dimensionless', fn, arg);
  if (!Number.isInteger(x) || x < 1 || x > max) throw new BuiltinError(`${where(fn, arg)} must be a whole number from 1 to ${max}, got ${x}`);
  return x;
}

/** The value as the user would read it: a quantity in the dimension's example unit. */
function describeValue(v: unknown, dim: Dimension): string {
  if (isUnit(v) && dim !== 'dimensionless') {
    try {
      return (v as Unit).to(DIMENSIONS[dim]).format({ precision: 6 });
    } catch {
      // fall through to the generic description
    }
  }
  return kindOf(v).replace(/^the (number|quantity) /, '');
}

/** Runs a physics routine, turning its RangeError into a BuiltinError that names the built-in. */
export function guardedPhysics<T>(fn: string, run: () => T): T {
  try {
    return run();
  } catch (e) {
    if (e instanceof BuiltinError) throw e;
    if (e instanceof RangeError) throw new BuiltinError(`${fn}: ${e.message}`);
    throw e;
  }
}
