// Argument checks at the boundary between formulas and the plain physics functions:
// units are converted to SI numbers here, and every failure names the function and argument.
import type { Unit, Matrix } from 'mathjs';
import { BuiltinError } from '../sheet/cellError';
import { math, isUnit } from '../sheet/mathInstance';
import { isSheetObject, type SheetObject } from '../sheet/sheetObject';

/** Dimensions a built-in argument can require, with an example unit for messages. */
export const DIMENSIONS = {
  dimensionless: '',
  mass: 'Msun',
  length: 'Mpc',
  time: 'Gyr',
  frequency: 'nHz',
  velocity: 'km/s',
  hubble: 'km/s/Mpc',
  density: 'Msun/pc^3',
  numberDensity: 'Mpc^-3',
  rateDensity: 'Mpc^-3 Gyr^-1',
} as const;
export type Dimension = keyof typeof DIMENSIONS;

const reference: Partial<Record<Dimension, Unit>> = {};
function referenceUnit(dim: Dimension): Unit {
  return (reference[dim] ??= math.unit(DIMENSIONS[dim]));
}

/** The dimension a quantity has, by name ("rateDensity"), or null when it is none of DIMENSIONS. */
export function dimensionOf(u: Unit): Dimension | null {
  if (u.dimensions.every((d: number) => d === 0)) return 'dimensionless';
  for (const dim of Object.keys(DIMENSIONS) as Dimension[]) if (dim !== 'dimensionless' && u.equalBase(referenceUnit(dim))) return dim;
  return null;
}

/** Where an argument is: "argument H0 of cosmologyFlat". */
export function where(fn: string, arg: string): string {
  return `argument ${arg} of ${fn}`;
}

/** A scalar argument in SI. Plain numbers are accepted only for dimensionless arguments. */
export function scalarSI(v: unknown, dim: Dimension, fn: string, arg: string): number {
  let x: number;
  if (typeof v === 'number') {
    if (dim !== 'dimensionless') {
      throw new BuiltinError(
        `${where(fn, arg)} needs a unit of ${dim} (for example ${DIMENSIONS[dim]}), got the plain number ${v}`,
        'unit',
      );
    }
    x = v;
  } else if (isUnit(v)) {
    const u = v as Unit & { value: number | null };
    if (dim === 'dimensionless') {
      if (!u.dimensions.every((d: number) => d === 0)) {
        throw new BuiltinError(`${where(fn, arg)} must be dimensionless, got ${u.formatUnits()}`, 'unit');
      }
    } else if (!u.equalBase(referenceUnit(dim))) {
      throw new BuiltinError(
        `${where(fn, arg)} needs a unit of ${dim} (for example ${DIMENSIONS[dim]}), got ${u.formatUnits() || 'no unit'}`,
        'unit',
      );
    }
    if (u.value === null) throw new BuiltinError(`${where(fn, arg)} is a unit without a value`, 'domain');
    x = u.value;
  } else if (typeof v === 'boolean') {
    throw new BuiltinError(`${where(fn, arg)} must be a number, got a boolean`, 'domain');
  } else {
    throw new BuiltinError(`${where(fn, arg)} must be a ${dim === 'dimensionless' ? 'number' : `quantity of ${dim}`}, got ${kindOf(v)}`, 'domain');
  }
  if (!Number.isFinite(x)) throw new BuiltinError(`${where(fn, arg)} is not finite (${x})`, 'domain');
  return x;
}

/** A vector argument (matrix or array of scalars) in SI. */
export function vectorSI(v: unknown, dim: Dimension, fn: string, arg: string): Float64Array {
  const items = math.isMatrix(v) ? ((v as Matrix).toArray() as unknown[]) : Array.isArray(v) ? v : null;
  if (items === null) return Float64Array.of(scalarSI(v, dim, fn, arg));
  const flat = (items as unknown[]).flat(Infinity as 1);
  const out = new Float64Array(flat.length);
  for (let i = 0; i < flat.length; i++) out[i] = scalarSI(flat[i], dim, fn, `${arg}[${i + 1}]`);
  return out;
}

/** Checks a number lies in a range; bounds are inclusive unless marked open. */
export function requireRange(
  x: number,
  fn: string,
  arg: string,
  lo: number,
  hi: number,
  opts: { loOpen?: boolean; hiOpen?: boolean; unitText?: string } = {},
): number {
  const belowLo = opts.loOpen ? x <= lo : x < lo;
  const aboveHi = opts.hiOpen ? x >= hi : x > hi;
  if (belowLo || aboveHi) {
    const l = opts.loOpen ? '(' : '[';
    const r = opts.hiOpen ? ')' : ']';
    throw new BuiltinError(`${where(fn, arg)} must lie in ${l}${lo}, ${hi}${r}${opts.unitText ? ' ' + opts.unitText : ''}, got ${x}`);
  }
  return x;
}

/** A SheetObject of the given kind (population, spectrum, cosmology, ...). */
export function objectOf<T extends SheetObject>(v: unknown, kind: string, fn: string, arg: string): T {
  if (!isSheetObject(v) || v.kind !== kind) {
    throw new BuiltinError(`${where(fn, arg)} must be a ${kind}, got ${kindOf(v)}`, 'domain');
  }
  return v as T;
}

/** A function cell (or built-in) to be called with plain numbers. */
export function functionOf(v: unknown, arity: number, fn: string, arg: string): (...xs: unknown[]) => unknown {
  if (typeof v !== 'function') throw new BuiltinError(`${where(fn, arg)} must be a function cell, got ${kindOf(v)}`, 'domain');
  const declared = (v as { syntax?: string; length: number }).length;
  if (declared !== arity && declared !== 0) {
    throw new BuiltinError(`${where(fn, arg)} must take ${arity} argument${arity === 1 ? '' : 's'}, the function given takes ${declared}`, 'domain');
  }
  return v as (...xs: unknown[]) => unknown;
}

/** Short description of what a value is, for messages. */
export function kindOf(v: unknown): string {
  if (v === undefined || v === null) return 'nothing';
  if (typeof v === 'number') return `the number ${v}`;
  if (isUnit(v)) return `the quantity ${(v as Unit).toString()}`;
  if (math.isMatrix(v) || Array.isArray(v)) return 'a list';
  if (typeof v === 'function') return 'a function';
  if (isSheetObject(v)) return `a ${v.kind}`;
  if (typeof v === 'string') return 'text';
  return typeof v;
}
