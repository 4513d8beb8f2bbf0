// Small general-purpose built-ins the sheet needs: frequency and mass grids keeping their unit.
import type { Unit } from 'mathjs';
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { math } from '../sheet/mathInstance';
import { where } from './args';

/** Most points a grid built-in makes (the sheet's list size limit is larger; grids are inputs). */
export const MAX_GRID_POINTS = 100_000;

interface GridEnds {
  lo: number;
  hi: number;
  /** A unit to give the points (null for plain numbers), with values in SI. */
  unit: Unit | null;
}

function gridEnds(fn: string, lo: unknown, hi: unknown): GridEnds {
  const asNumber = (v: unknown, arg: string): { x: number; unit: Unit | null } => {
    if (typeof v === 'number') return { x: v, unit: null };
    if (math.isUnit(v)) {
      const u = v as Unit & { value: number | null };
      if (u.value === null) throw new BuiltinError(`${where(fn, arg)} is a unit without a value`);
      return { x: u.value, unit: u };
    }
    throw new BuiltinError(`${where(fn, arg)} must be a number or a quantity, got ${typeof v === 'string' ? 'text' : math.typeOf(v)}`);
  };
  const a = asNumber(lo, 'lo');
  const b = asNumber(hi, 'hi');
  if ((a.unit === null) !== (b.unit === null) || (a.unit && b.unit && !a.unit.equalBase(b.unit))) {
    throw new BuiltinError(`${where(fn, 'hi')} must have the same dimension as lo`, 'unit');
  }
  if (!Number.isFinite(a.x)) throw new BuiltinError(`${where(fn, 'lo')} is not finite`);
  if (!Number.isFinite(b.x)) throw new BuiltinError(`${where(fn, 'hi')} is not finite`);
  return { lo: a.x, hi: b.x, unit: a.unit };
}

function pointCount(fn: string, n: unknown): number {
  if (typeof n !== 'number' || !Number.isInteger(n) || n < 2 || n > MAX_GRID_POINTS) {
    throw new BuiltinError(`${where(fn, 'n')} must be a whole number from 2 to ${MAX_GRID_POINTS}, got ${typeof n === 'number' ? n : math.typeOf(n)}`);
  }
  return n;
}

function withUnit(valuesSI: number[], unit: Unit | null): unknown {
  if (!unit) return math.matrix(valuesSI);
  return math.matrix(
    valuesSI.map((x) => {
      const u = unit.clone() as Unit & { value: number };
      u.value = x;
      return u;
    }),
  );
}

/** n points from lo to hi, both included, evenly spaced in log (lo, hi > 0). */
export function logGridValues(lo: number, hi: number, n: number): number[] {
  const a = Math.log(lo);
  const step = (Math.log(hi) - a) / (n - 1);
  const out = new Array<number>(n);
  for (let i = 0; i < n; i++) out[i] = Math.exp(a + i * step);
  out[0] = lo;
  out[n - 1] = hi;
  return out;
}

/** n points from lo to hi, both included, evenly spaced. */
export function linGridValues(lo: number, hi: number, n: number): number[] {
  const step = (hi - lo) / (n - 1);
  const out = new Array<number>(n);
  for (let i = 0; i < n; i++) out[i] = lo + i * step;
  out[n - 1] = hi;
  return out;
}

/** What sets one grid built-in apart from another; the arguments lo, hi, n and their checks are shared. */
interface GridSpacing {
  name: string;
  summary: string;
  /** Unit texts of lo and hi in the documentation. */
  loUnit: string;
  hiUnit: string;
  example: string;
  /** Checks of the ends that this spacing needs beyond finiteness and a common dimension. */
  checkEnds?: (fn: string, ends: GridEnds) => void;
  /** The n points from lo to hi, both included, SI. */
  values: (lo: number, hi: number, n: number) => number[];
}

/** A grid built-in: n values from lo to hi keeping the unit of lo, placed by `spacing.values`. */
function gridBuiltin(spacing: GridSpacing): Builtin {
  const fn = spacing.name;
  return {
    name: fn,
    category: 'utility',
    summary: spacing.summary,
    args: [
      { name: 'lo', unit: spacing.loUnit, description: 'first value' },
      { name: 'hi', unit: spacing.hiUnit, description: 'last value' },
      { name: 'n', unit: 'dimensionless', description: `number of values, 2 to ${MAX_GRID_POINTS}` },
    ],
    returns: { unit: 'unit of lo', description: 'list of n values' },
    source: 'common practice, no source',
    example: spacing.example,
    fn: (lo: unknown, hi: unknown, n: unknown) => {
      const ends = gridEnds(fn, lo, hi);
      const count = pointCount(fn, n);
      spacing.checkEnds?.(fn, ends);
      return withUnit(spacing.values(ends.lo, ends.hi, count), ends.unit);
    },
  };
}

export const utilityBuiltins: Builtin[] = [
  gridBuiltin({
    name: 'logGrid',
    summary: 'n values from lo to hi (both included), evenly spaced in logarithm, keeping the unit of lo',
    loUnit: 'any (positive)',
    hiUnit: 'same as lo (positive)',
    example: 'logGrid(1 nHz, 100 nHz, 3) gives [1, 10, 100] nHz',
    checkEnds: (fn, ends) => {
      if (ends.lo <= 0) throw new BuiltinError(`${where(fn, 'lo')} must be positive for a logarithmic grid`);
      if (ends.hi <= 0) throw new BuiltinError(`${where(fn, 'hi')} must be positive for a logarithmic grid`);
    },
    values: logGridValues,
  }),
  gridBuiltin({
    name: 'linGrid',
    summary: 'n values from lo to hi (both included), evenly spaced, keeping the unit of lo',
    loUnit: 'any',
    hiUnit: 'same as lo',
    example: 'linGrid(0, 1, 5) gives [0, 0.25, 0.5, 0.75, 1]',
    values: linGridValues,
  }),
  {
    name: 'inUnit',
    category: 'utility',
    summary: 'the plain number a quantity is in a given unit, e.g. for a dimensionless formula',
    args: [
      { name: 'x', unit: 'any', description: 'quantity' },
      { name: 'unitOf', unit: 'quantity of the same dimension', description: 'the unit, written as a quantity such as 1 Mpc' },
    ],
    returns: { unit: 'dimensionless', description: 'x / unitOf' },
    source: 'common practice, no source',
    example: 'inUnit(3.0857e22 m, Mpc) gives 1.0000',
    fn: (x: unknown, unitOf: unknown) => {
      if (!math.isUnit(x)) throw new BuiltinError(`${where('inUnit', 'x')} must be a quantity with a unit`, 'unit');
      if (!math.isUnit(unitOf)) throw new BuiltinError(`${where('inUnit', 'unitOf')} must be a quantity such as 1 Mpc`, 'unit');
      const a = x as Unit & { value: number | null };
      const b = unitOf as Unit & { value: number | null };
      if (!a.equalBase(b)) throw new BuiltinError(`${where('inUnit', 'unitOf')} has a different dimension from x (${a.formatUnits()} vs ${b.formatUnits()})`, 'unit');
      // A bare unit (Mpc, without a number) stands for one of it.
      const bSI = b.value ?? (math.unit(1, b.formatUnits()) as Unit & { value: number }).value;
      if (a.value === null) throw new BuiltinError(`${where('inUnit', 'x')} must be a quantity with a value, such as 3 Mpc`);
      if (bSI === 0) throw new BuiltinError(`${where('inUnit', 'unitOf')} must not be zero`);
      return a.value / bSI;
    },
  },
];
