// Helpers for the engine tests: plain-data views of cell states and an evaluation counter.
import type { Unit } from 'mathjs';
import { Sheet } from '../../src/sheet/sheet';
import type { CellSpec, CellState } from '../../src/sheet/types';
import { math } from '../../src/sheet/mathInstance';

/** A sheet from `name = formula` lines. */
export function sheetOf(lines: Record<string, string>): Sheet {
  return new Sheet({ cells: Object.entries(lines).map(([name, formula]) => ({ name, formula }) as CellSpec) });
}

/** The value in SI as a number (quantities) or the number itself. */
export function si(v: unknown): number {
  if (typeof v === 'number') return v;
  if (math.isUnit(v)) return (v as Unit & { value: number }).value;
  throw new Error(`not a number or quantity: ${String(v)}`);
}

/** A state as plain data: {value} or {error: kind}. */
export function plain(state: CellState): { value?: unknown; error?: string } {
  if (state.status === 'value') return { value: state.value };
  if (state.status === 'error') return { error: state.error.kind };
  return {};
}

/** Counts recomputations (value or error notifications) per cell and records their order. */
export function countEvaluations(sheet: Sheet): { order: string[]; count: () => number; reset: () => void } {
  const order: string[] = [];
  sheet.subscribe({ value: (n) => void order.push(n), error: (n) => void order.push(n) });
  return { order, count: () => order.length, reset: () => void order.splice(0) };
}

/**
 * fast-check settings of a property test: a fixed seed, so that CI is deterministic. A longer
 * search sets STRAINSHEET_PROPERTY_SEED (any integer) and STRAINSHEET_PROPERTY_RUNS (a multiplier).
 */
export function propertyRuns(numRuns: number, seed = 20261202): { numRuns: number; seed: number } {
  const env = typeof process === 'undefined' ? {} : process.env;
  const s = env.STRAINSHEET_PROPERTY_SEED;
  const k = Number(env.STRAINSHEET_PROPERTY_RUNS ?? 1);
  return { numRuns: Math.max(1, Math.round(numRuns * (Number.isFinite(k) && k > 0 ? k : 1))), seed: s !== undefined && s !== '' ? Number(s) | 0 : seed };
}
