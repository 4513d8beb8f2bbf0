// Priors of the free cells of an inference run, read from the sheet: a cell's `prior` formula,
// or (the default) its `uncertainty` formula. Each gives a 'distribution' SheetObject.
//
// The sampler works in u = ln x for log-normal priors and priors bounded away from zero
// (log-uniform, truncated forms with a positive lower end) and in u = x otherwise; the log prior carries the Jacobian,
// ln p_u(u) = ln p_x(e^u) + u (change of variables).
//
// Refused, with the reason: a prior with no support; a prior on a scale parameter (a cell holding
// a positive quantity with a unit) that reaches below zero, where such a parameter has no meaning
// (a normal prior on a rate, say). Improper priors (flat in x or in ln x without bounds) cannot be
// written: uniform and log-uniform need finite ends, log-uniform a positive lower end.
import type { Unit } from 'mathjs';
import type { Sheet } from '../sheet/sheet';
import { isSheetObject } from '../sheet/sheetObject';
import { isUnit } from '../sheet/mathInstance';
import type { UncertainDistribution } from './distributions';
import { SheetJobError, siNumber } from './sheetValues';

export interface FreeParameter {
  cell: string;
  /** Which field the prior came from. */
  from: 'prior' | 'uncertainty';
  /** The formula text of the prior. */
  formula: string;
  prior: UncertainDistribution;
  /** describe() of the distribution, for tables. */
  description: string;
  /** A value of the cell's kind holding x (SI): a number or a Unit. */
  valueOf(xSI: number): unknown;
  /** True when the sampler works in ln x. */
  logScale: boolean;
  /** The cell's display unit ('' for none) and the factor from SI to it. */
  unit: string;
  toDisplay(xSI: number): number;
}

interface DistributionLike {
  kind: 'distribution';
  distribution: UncertainDistribution;
  unitTemplate: Unit | null;
  valueOf(xSI: number): unknown;
  describe(): string;
}

function isDistribution(v: unknown): v is DistributionLike {
  return isSheetObject(v) && v.kind === 'distribution' && typeof (v as unknown as DistributionLike).distribution === 'object';
}

/** The free cells: those named (prior or, failing that, uncertainty), or else every cell with a prior. */
export function freeParameters(sheet: Sheet, named?: string[]): FreeParameter[] {
  let cells: string[];
  if (named && named.length > 0) {
    cells = named;
    const seen = new Set<string>();
    for (const c of cells) {
      if (seen.has(c)) throw new SheetJobError(`free cell ${c} is named twice`);
      seen.add(c);
    }
  } else {
    cells = sheet.cells().filter((c) => c.prior && c.prior.trim() !== '').map((c) => c.name);
    if (cells.length === 0) throw new SheetJobError('no cell has a prior: give at least one input a prior (e.g. logUniformDist(...)) or name free cells that have an uncertainty');
  }
  return cells.map((c) => freeParameter(sheet, c));
}

/**
 * The free parameter of a cell, from its prior (else its uncertainty). `proposed` checks a prior text
 * before it is stored (the app's row editor): the same refusals, with that text in place of the field.
 */
export function freeParameter(sheet: Sheet, cell: string, proposed?: { prior: string }): FreeParameter {
  const spec = sheet.get(cell);
  if (!spec) throw new SheetJobError(`free cell ${cell}: there is no cell of that name`);
  const prior = proposed ? proposed.prior : spec.prior;
  const from = prior && prior.trim() !== '' ? 'prior' : spec.uncertainty && spec.uncertainty.trim() !== '' ? 'uncertainty' : null;
  if (!from) throw new SheetJobError(`free cell ${cell} has neither a prior nor an uncertainty; give it a prior such as logUniformDist(...)`);
  const formula = from === 'prior' ? prior! : spec.uncertainty!;
  let value: unknown;
  try {
    value = sheet.overridesFromFormulas({ [cell]: formula })[cell];
  } catch (e) {
    throw new SheetJobError(`the ${from} of ${cell} (${formula}): ${(e as Error).message}`);
  }
  if (!isDistribution(value)) {
    throw new SheetJobError(`the ${from} of ${cell} must give a distribution (e.g. logUniformDist(...)), got ${isSheetObject(value) ? `a ${value.kind}` : typeof value}`);
  }
  const st = sheet.state(cell);
  if (st.status === 'error') throw new SheetJobError(`free cell ${cell} has an error: ${st.error.message}`);
  if (st.status !== 'value' || siNumber(st.value) === null) throw new SheetJobError(`free cell ${cell} must hold a single number or quantity`);
  const nominal = st.value;
  const nominalSI = siNumber(nominal)!;
  const a = isUnit(nominal) ? (nominal as Unit) : null;
  const b = value.unitTemplate;
  const dimless = (u: Unit | null) => !u || u.dimensions.every((d: number) => d === 0);
  if (!(a && b ? a.equalBase(b) : dimless(a) && dimless(b))) {
    throw new SheetJobError(`the ${from} of ${cell} gives values in ${b ? b.formatUnits() || 'no unit' : 'no unit'}, but ${cell} is in ${a ? a.formatUnits() : 'no unit'}`);
  }
  const d = value.distribution;
  const [lo, hi] = d.support;
  if (!((hi === Infinity ? 1 : d.cdf(hi)) - (lo === -Infinity ? 0 : d.cdf(lo)) > 0)) throw new SheetJobError(`the ${from} of ${cell} has no support`);
  const scale = !dimless(a) && nominalSI > 0;
  if (scale && lo < 0) {
    throw new SheetJobError(
      `the ${from} of ${cell} (${value.describe()}) reaches below zero, but ${cell} is a scale parameter (a positive quantity with a unit): ` +
        'use a log-normal or log-uniform prior, or truncate it at a positive lower end with truncatedDist(...)',
    );
  }
  const logScale = lo > 0 || d.family === 'lognormal';
  const unit = spec.unit ?? '';
  const displayOf = (x: number): number => {
    const q = value.valueOf(x) as Unit;
    try {
      return q.toNumber(unit);
    } catch {
      return NaN;
    }
  };
  // Units are affine in SI (mathjs: value = (x + offset) * scale), so two conversions made once give
  // every later one without parsing the unit per sample.
  let affine: [number, number] | null = null;
  const toDisplay = (x: number): number => {
    if (!a || !unit) return x;
    if (!affine) {
      const at0 = displayOf(0);
      const at1 = displayOf(1);
      affine = Number.isFinite(at0) && Number.isFinite(at1) ? [at0, at1 - at0] : [0, 1];
    }
    return affine[0] + affine[1] * x;
  };
  return { cell, from, formula, prior: d, description: value.describe(), valueOf: (x) => value.valueOf(x), logScale, unit, toDisplay };
}

/** Sampler coordinate of a value x (SI). */
export function toSamplerCoordinate(p: FreeParameter, x: number): number {
  return p.logScale ? Math.log(x) : x;
}

/** Value x (SI) of a sampler coordinate u. */
export function fromSamplerCoordinate(p: FreeParameter, u: number): number {
  return p.logScale ? Math.exp(u) : u;
}

/** ln prior density in the sampler coordinates, summed over the parameters (-Infinity outside the support). */
export function logPriorDensity(params: FreeParameter[], u: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < params.length; i++) {
    const p = params[i];
    const x = fromSamplerCoordinate(p, u[i]);
    const dens = p.prior.density(x);
    if (!(dens > 0) || !Number.isFinite(x)) return -Infinity;
    sum += Math.log(dens) + (p.logScale ? u[i] : 0);
  }
  return sum;
}
