// Frequencies an array resolves: k / T for k = 1, 2, ... up to the Nyquist frequency 1 / (2 dt)
// of its cadence (common practice, no source).

/**
 * How many of the frequencies k/T lie at or below the Nyquist frequency 1/(2 dt): floor(T / (2 dt)),
 * with a tiny relative allowance so that k/T equal to the Nyquist frequency by construction is kept.
 */
export function binsBelowNyquist(spanS: number, cadenceS: number): number {
  return Math.floor((spanS / (2 * cadenceS)) * (1 + 1e-12));
}

/** k / T for k = 1 .. count, Hz. */
export function spanHarmonics(spanS: number, count: number): Float64Array {
  const out = new Float64Array(count);
  for (let k = 1; k <= count; k++) out[k - 1] = k / spanS;
  return out;
}

/** k / T, k = 1 .. floor(T / (2 dt)) (or the first maxCount of them), Hz. */
export function frequencyGridFromSpan(spanS: number, cadenceS: number, maxCount = Infinity): Float64Array {
  if (!(spanS > 0) || !Number.isFinite(spanS)) throw new RangeError(`span must be positive and finite, got ${spanS} s`);
  if (!(cadenceS > 0) || !Number.isFinite(cadenceS)) throw new RangeError(`cadence must be positive and finite, got ${cadenceS} s`);
  if (!(cadenceS < spanS / 2)) throw new RangeError(`cadence (${cadenceS} s) must be shorter than half the span (${spanS} s), or no frequency k/T lies below the Nyquist frequency`);
  const n = Math.min(binsBelowNyquist(spanS, cadenceS), maxCount);
  if (!(n >= 1)) throw new RangeError(`the grid would hold no frequency (count ${maxCount})`);
  if (n > 100_000) throw new RangeError(`the grid would hold ${n} frequencies; at most 100000 are allowed`);
  return spanHarmonics(spanS, n);
}

/** n frequencies spaced evenly in log f from fMin to fMax inclusive, Hz. */
export function logFrequencyGrid(fMinHz: number, fMaxHz: number, n: number): Float64Array {
  if (!(fMinHz > 0 && fMaxHz > fMinHz)) throw new RangeError(`need 0 < fMin < fMax, got ${fMinHz}, ${fMaxHz} Hz`);
  if (!Number.isInteger(n) || n < 2 || n > 100_000) throw new RangeError(`count must be an integer in [2, 100000], got ${n}`);
  const out = new Float64Array(n);
  const a = Math.log(fMinHz);
  const step = (Math.log(fMaxHz) - a) / (n - 1);
  for (let i = 0; i < n; i++) out[i] = Math.exp(a + i * step);
  out[0] = fMinHz;
  out[n - 1] = fMaxHz;
  return out;
}
