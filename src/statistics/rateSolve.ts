// The merger-rate normalisation a measured amplitude allows. A_yr^2 is linear in the
// normalisation (Phinney 2001, astro-ph/0108028: h_c^2 is linear in the number density), so
// rate = rate0 (A_target / A_yr(rate0))^2, solved directly after checking the linearity with two probes.
import type { Sheet } from '../sheet/sheet';
import { F_YR_HZ } from '../physics/constants';
import { atReferenceFrequency, measurementInterval, type AmplitudeMeasurement } from './measurement';
import { ONE_SIGMA_LEVEL } from './sampleSummary';
import { checkSqrtProportional } from './proportionality';
import { SheetJobError, nominalInput, numericState, valueLike, inOwnUnit, unitTextOf } from './sheetValues';

export interface RateSolveOptions {
  /** The normalisation cell (default rate_norm). */
  rateCell?: string;
  /** The amplitude output (default A_yr). */
  output?: string;
  measurement: AmplitudeMeasurement;
  /** Optional cell holding a quantity linear in the normalisation (e.g. the local merger-rate density). */
  densityCell?: string;
}

export interface RateValues {
  median: number;
  lower: number;
  upper: number;
}

export interface RateSolveResult {
  rateCell: string;
  output: string;
  level: number;
  /** Normalisation in SI and in the cell's own unit. */
  rateSI: RateValues;
  rate: RateValues;
  rateUnit: string;
  /** The same for the density cell, if asked (scaled linearly, after checking linearity). */
  density?: { cell: string; values: RateValues; unit: string };
  /** Amplitudes the solution matches (median, interval ends at f_yr). */
  amplitudes: RateValues;
  check: string;
}

export function solveRateForMeasurement(sheet: Sheet, opts: RateSolveOptions): RateSolveResult {
  const rateCell = opts.rateCell ?? 'rate_norm';
  const output = opts.output ?? 'A_yr';
  const nom = nominalInput(sheet, rateCell);
  const check = checkSqrtProportional(sheet, rateCell, output);
  if (!check.proportional) {
    throw new SheetJobError(`cannot solve ${rateCell} directly: ${check.message}. Use goal seek instead.`);
  }
  const a0 = check.outputAtNominal;
  if (!(a0 > 0)) throw new SheetJobError(`${output} must be positive at the nominal ${rateCell}, got ${a0}`);
  let m = opts.measurement;
  if (m.fRefHz !== F_YR_HZ) m = atReferenceFrequency(m, F_YR_HZ);
  const level = m.stated ? m.stated.level : ONE_SIGMA_LEVEL;
  const iv = m.stated ?? measurementInterval(m, level);
  const amplitudes = { median: 10 ** m.log10Median, lower: iv.lower, upper: iv.upper };
  const factor = (a: number) => (a / a0) ** 2;
  const scale = (base: number): RateValues => ({
    median: base * factor(amplitudes.median),
    lower: base * factor(amplitudes.lower),
    upper: base * factor(amplitudes.upper),
  });
  const rateSI = scale(nom.si);
  const own = (v: RateValues, t: unknown): RateValues => ({ median: inOwnUnit(t, v.median), lower: inOwnUnit(t, v.lower), upper: inOwnUnit(t, v.upper) });
  const result: RateSolveResult = {
    rateCell,
    output,
    level,
    rateSI,
    rate: own(rateSI, nom.template),
    rateUnit: unitTextOf(nom.template),
    amplitudes,
    check: check.message,
  };
  if (opts.densityCell) {
    const d = opts.densityCell;
    const d0 = numericState(d, sheet.state(d));
    // The density must be linear in the normalisation: probe at 3 x nominal.
    const r3 = sheet.evaluateWith({ [rateCell]: valueLike(nom.template, 3 * nom.si) }, [d]);
    const d3 = numericState(d, r3[d]);
    if (!(d0 !== 0 && Math.abs(d3 / d0 / 3 - 1) < 1e-6)) {
      throw new SheetJobError(`${d} is not proportional to ${rateCell} (tripling ${rateCell} multiplies it by ${(d3 / d0).toPrecision(4)}, not 3)`);
    }
    const dState = sheet.state(d);
    const template = dState.status === 'value' ? dState.value : d0;
    result.density = { cell: d, values: own(scale(d0), template), unit: unitTextOf(template) };
  }
  return result;
}
