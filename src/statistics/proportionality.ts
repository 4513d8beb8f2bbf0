// Checks numerically that an output goes as the square root of an input (A_yr^2 linear in the
// merger-rate normalisation, Phinney 2001, astro-ph/0108028), so that scans and solves can
// scale one evaluation instead of repeating it.
import type { Sheet } from '../sheet/sheet';
import { SheetJobError, nominalInput, numericState, valueLike } from './sheetValues';

export interface ProportionalityCheck {
  proportional: boolean;
  /** The output at the input's nominal value. */
  outputAtNominal: number;
  inputNominal: number;
  /** Exponents d ln y / d ln x measured between the probes (1/2 when proportional to sqrt). */
  measuredExponents: number[];
  message: string;
}

/** Relative tolerance on the exponent 1/2 (the integrals are linear in the normalisation to rounding). */
export const EXPONENT_TOLERANCE = 1e-6;

/**
 * Two probes at x0/3 and 3 x0 (plus the nominal value): the output must scale as sqrt(x) at both,
 * i.e. y(k x0) / y(x0) = sqrt(k). `others` optionally fixes other cells while probing.
 */
export function checkSqrtProportional(sheet: Sheet, input: string, output: string, others: Record<string, unknown> = {}): ProportionalityCheck {
  const nom = nominalInput(sheet, input);
  if (!(nom.si > 0)) {
    throw new SheetJobError(`input ${input} must be positive to test whether ${output} goes as its square root, got ${nom.si}`);
  }
  const at = (k: number) => {
    const r = sheet.evaluateWith({ ...others, [input]: valueLike(nom.template, nom.si * k) }, [output]);
    return numericState(output, r[output]);
  };
  const y0 = Object.keys(others).length ? at(1) : numericState(output, sheet.state(output));
  const exps: number[] = [];
  for (const k of [1 / 3, 3]) {
    const y = at(k);
    exps.push(Math.log(Math.abs(y / y0)) / Math.log(k));
    if (Math.sign(y) !== Math.sign(y0)) exps[exps.length - 1] = NaN;
  }
  const proportional = y0 !== 0 && exps.every((e) => Math.abs(e - 0.5) <= EXPONENT_TOLERANCE);
  const message = proportional
    ? `${output} goes as sqrt(${input}) (exponents ${exps.map((e) => e.toPrecision(9)).join(', ')})`
    : `${output} is not proportional to the square root of ${input}: scaling ${input} by 1/3 and 3 changes it with exponents ${exps
        .map((e) => (Number.isFinite(e) ? e.toPrecision(4) : 'undefined'))
        .join(' and ')}, not 0.5`;
  return { proportional, outputAtNominal: y0, inputNominal: nom.si, measuredExponents: exps, message };
}

