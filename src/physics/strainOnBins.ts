// The signal's characteristic strain on an array's frequency bins, from a predicted spectrum on its
// own grid or from a power law. Sampling policy (stated in docs/array.md):
//  - inside the spectrum's grid: linear interpolation in log f - log h_c (exact for a power law);
//  - above the grid's top: no signal (0), so the S/N counts only what the spectrum predicts;
//  - below the grid's bottom: refused, because the lowest bins carry most of the S/N of a red
//    spectrum and inventing them would change the answer.
import type { Spectrum } from './spectrum';
import { F_YR_HZ } from './constants';

/** A signal model: characteristic strain at observed GW frequency f (Hz). */
export type StrainModel = (fHz: number) => number;

/** Raised when a bin lies below the spectrum's grid; carries the numbers for the message. */
export class BelowSpectrumError extends RangeError {
  constructor(readonly binHz: number, readonly lowestHz: number) {
    super(`the array's lowest frequency bin ${binHz} Hz lies below the spectrum's lowest frequency ${lowestHz} Hz`);
    this.name = 'BelowSpectrumError';
  }
}

/** Checks a spectrum is usable: same-length arrays, >= 2 points, increasing positive f, finite h_c >= 0. */
export function spectrumProblem(s: Spectrum): string | null {
  const f = s.frequencyHz;
  const h = s.hc;
  if (f.length !== h.length) return `it has ${f.length} frequencies but ${h.length} strain values`;
  if (f.length < 2) return `it needs at least 2 frequencies, has ${f.length}`;
  for (let i = 0; i < f.length; i++) {
    if (!(f[i] > 0) || !Number.isFinite(f[i])) return `frequency ${i + 1} is ${f[i]} Hz, not a positive finite number`;
    if (i > 0 && !(f[i] > f[i - 1])) return `frequencies must increase, but frequency ${i + 1} (${f[i]} Hz) does not exceed the one before`;
    if (!(h[i] >= 0) || !Number.isFinite(h[i])) return `strain value ${i + 1} is ${h[i]}, not a finite number >= 0`;
  }
  return null;
}

/** Interpolating model of a (checked) spectrum, following the sampling policy above. */
export function spectrumModel(s: Spectrum): StrainModel {
  const f = s.frequencyHz;
  const h = s.hc;
  const n = f.length;
  const lo = f[0];
  const hi = f[n - 1];
  return (x: number) => {
    if (x < lo * (1 - 1e-12)) throw new BelowSpectrumError(x, lo);
    if (x > hi * (1 + 1e-12)) return 0;
    // Binary search for the interval [f_i, f_{i+1}] holding x.
    let a = 0;
    let b = n - 1;
    while (b - a > 1) {
      const m = (a + b) >> 1;
      if (f[m] <= x) a = m;
      else b = m;
    }
    if (x <= f[a]) return h[a];
    if (x >= f[b]) return h[b];
    if (h[a] === 0 || h[b] === 0) return h[a] + ((h[b] - h[a]) * (x - f[a])) / (f[b] - f[a]);
    const t = Math.log(x / f[a]) / Math.log(f[b] / f[a]);
    return h[a] * Math.pow(h[b] / h[a], t);
  };
}

/** Power law h_c = A (f/f_yr)^alpha; alpha = -2/3 for circular GW-driven binaries (Phinney 2001, astro-ph/0108028). */
export function powerLawModel(amplitude: number, alpha = -2 / 3): StrainModel {
  return (x: number) => amplitude * Math.pow(x / F_YR_HZ, alpha);
}
