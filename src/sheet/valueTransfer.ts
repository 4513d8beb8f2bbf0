// Cell values across threads. Structured clone drops the classes of mathjs values, so numbers,
// strings, booleans, Units, Complex numbers, dense matrices and lists of them are written as plain
// data and rebuilt exactly (a Unit from its unit text and its SI value, as quantity() does). Each
// rebuilt value is checked against the original (sameValue); what cannot be rebuilt exactly
// (SheetObjects, functions, other kinds) goes as its description and JSON (an OffPageValue).
import type { Matrix, Unit } from 'mathjs';
import type { CellError } from './cellError';
import type { CellState } from './types';
import { math, quantity } from './mathInstance';
import { sameValue } from './valueEquality';
import { isSheetObject } from './sheetObject';
import { formatValue, valueToJSON } from './formatValue';
import { OffPageValue } from './offPageValue';

type Plain =
  | number
  | string
  | boolean
  | null
  | { t: 'unit'; units: string; value: number | null; fixPrefix: boolean }
  | { t: 'complex'; re: number; im: number }
  | { t: 'matrix'; data: Plain[] }
  | { t: 'list'; items: Plain[] };

/** A cell's state as plain data. */
export type TransferredState =
  | { status: 'value'; value: Plain }
  | { status: 'held'; kind: string; description: string; json: unknown }
  | { status: 'error'; error: CellError }
  | { status: 'pending' };

class NotPlain extends Error {}

function toPlain(v: unknown): Plain {
  if (typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean') return v;
  if (math.isUnit(v)) {
    const u = v as Unit & { value: number | null; fixPrefix: boolean };
    return { t: 'unit', units: u.formatUnits(), value: u.value, fixPrefix: u.fixPrefix };
  }
  if (math.isComplex(v)) {
    const c = v as unknown as { re: number; im: number };
    return { t: 'complex', re: c.re, im: c.im };
  }
  if (math.isMatrix(v)) {
    if ((v as Matrix).storage() !== 'dense') throw new NotPlain();
    return { t: 'matrix', data: ((v as Matrix).valueOf() as unknown[]).map(toPlain) };
  }
  if (Array.isArray(v)) return { t: 'list', items: v.map(toPlain) };
  throw new NotPlain();
}

function fromPlain(p: Plain): unknown {
  if (typeof p !== 'object' || p === null) return p;
  if (p.t === 'unit') {
    const u = quantity(0, p.units) as unknown as { value: number | null; fixPrefix: boolean };
    u.value = p.value;
    u.fixPrefix = p.fixPrefix;
    return u;
  }
  if (p.t === 'complex') return math.complex(p.re, p.im);
  if (p.t === 'matrix') return math.matrix(p.data.map(fromPlain) as never);
  return p.items.map(fromPlain);
}

/** Writes a state as plain data; a value that does not come back exactly becomes its description. */
export function stateToTransfer(state: CellState): TransferredState {
  if (state.status === 'error') return { status: 'error', error: { ...state.error } };
  if (state.status === 'pending') return { status: 'pending' };
  const v = state.value;
  try {
    const plain = toPlain(v);
    if (sameValue(fromPlain(plain), v)) return { status: 'value', value: plain };
  } catch {
    // not plain data: described below
  }
  const kind = isSheetObject(v) ? v.kind : typeof v === 'function' ? 'function' : typeof v;
  return { status: 'held', kind, description: formatValue(v), json: valueToJSON(v) };
}

/** Rebuilds a state written by stateToTransfer (a held value as an OffPageValue stand-in). */
export function stateFromTransfer(t: TransferredState): CellState {
  if (t.status === 'value') return { status: 'value', value: fromPlain(t.value) };
  if (t.status === 'held') return { status: 'value', value: new OffPageValue(t.kind, t.description, t.json) };
  if (t.status === 'error') return { status: 'error', error: t.error };
  return { status: 'pending' };
}
