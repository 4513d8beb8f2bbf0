// Bessel functions of the first kind J_n(x), integer order, by Miller's backward recurrence
// (Miller 1952, British Association Mathematical Tables vol. X; stability analysis in Gautschi 1967,
// SIAM Review 9, 24), normalised with the sum-of-squares identity J_0^2 + 2 sum_k J_k^2 = 1
// (Abramowitz & Stegun 1964, 9.1.76). The sign comes from J_0 + 2 sum_k J_2k = 1 (A&S 9.1.46).
// Backward recurrence is stable for the minimal solution J_n, so values in the decaying region
// (n > x) keep their relative accuracy even when they are tiny; intermediate values are rescaled
// (exponents tracked) so nothing overflows.

/** Largest argument accepted: the recurrence costs about x + n steps. */
export const BESSEL_X_LIMIT = 1e7;

const RESCALE_ABOVE = 1e100;
const RESCALE_BY = 1e-100;

/** Index the backward recurrence starts from, for orders up to nTop at argument x. */
function startIndex(nTop: number, x: number): number {
  const big = Math.max(nTop, x, 1);
  // Margin grows like sqrt(big) (covers the Airy transition width ~ big^(1/3) with room); tested
  // against scipy.special.jv for n up to 2000 and x up to 2000 (test/orbits/bessel.test.ts).
  let m = Math.ceil(big) + 30 + Math.ceil(Math.sqrt(40 * big));
  if (m % 2 === 1) m += 1;
  return m;
}

let scalesScratch = new Int32Array(8);

/**
 * J_k(x) for k = nLo, ..., nLo + count - 1 (nLo >= 0), written into out[0..count-1], from one
 * backward-recurrence pass. x must be finite and 0 <= x <= BESSEL_X_LIMIT.
 */
export function besselJWindow(nLo: number, count: number, x: number, out: Float64Array): Float64Array {
  if (!Number.isInteger(nLo) || nLo < 0 || !Number.isInteger(count) || count < 1) {
    throw new RangeError(`besselJWindow: orders must be integers >= 0, got nLo=${nLo}, count=${count}`);
  }
  if (!(x >= 0) || x > BESSEL_X_LIMIT) throw new RangeError(`besselJWindow: x must lie in [0, ${BESSEL_X_LIMIT}], got ${x}`);
  const nHi = nLo + count - 1;
  if (x === 0) {
    // J_0(0) = 1, J_k(0) = 0 for k >= 1 (A&S 9.1.10).
    for (let i = 0; i < count; i++) out[i] = nLo + i === 0 ? 1 : 0;
    return out;
  }
  const m = startIndex(nHi, x);
  const twoOverX = 2 / x;
  // Stored values carry the number of rescales applied after they were stored (scratch kept between calls).
  if (scalesScratch.length < count) scalesScratch = new Int32Array(count);
  const scalesAtStore = scalesScratch;
  let scales = 0;
  let jNext = 0; // J_{k+1}, unnormalised
  let j = 1; // J_k at k = m (any non-zero seed works; only ratios matter before normalising)
  let sumSq = 0; // 2 sum_{k>=1} J_k^2 (J_0 added at the end)
  let sumEven = 0; // 2 sum_{k>=1} J_2k
  for (let k = m; k >= 1; k--) {
    if (k <= nHi && k >= nLo) {
      out[k - nLo] = j;
      scalesAtStore[k - nLo] = scales;
    }
    sumSq += 2 * j * j;
    if ((k & 1) === 0) sumEven += 2 * j;
    // J_{k-1} = (2k/x) J_k - J_{k+1} (A&S 9.1.27).
    const jPrev = k * twoOverX * j - jNext;
    jNext = j;
    j = jPrev;
    if (Math.abs(j) > RESCALE_ABOVE) {
      j *= RESCALE_BY;
      jNext *= RESCALE_BY;
      sumSq *= RESCALE_BY * RESCALE_BY;
      sumEven *= RESCALE_BY;
      scales++;
    }
  }
  // Now j = J_0 (unnormalised).
  if (nLo === 0) {
    out[0] = j;
    scalesAtStore[0] = scales;
  }
  sumSq += j * j;
  sumEven += j;
  const norm = Math.sqrt(sumSq) * (sumEven < 0 ? -1 : 1);
  for (let i = 0; i < count; i++) {
    const missing = scales - scalesAtStore[i];
    out[i] = missing === 0 ? out[i] / norm : (out[i] / norm) * Math.pow(RESCALE_BY, missing);
  }
  return out;
}

const one = new Float64Array(1);

/** J_n(x) for integer n (any sign) and real x with |x| <= BESSEL_X_LIMIT. */
export function besselJ(n: number, x: number): number {
  if (!Number.isInteger(n)) throw new RangeError(`besselJ: order must be an integer, got ${n}`);
  if (!Number.isFinite(x)) throw new RangeError(`besselJ: x must be finite, got ${x}`);
  // J_{-n}(x) = (-1)^n J_n(x) and J_n(-x) = (-1)^n J_n(x) (A&S 9.1.5).
  let sign = 1;
  let order = n;
  let arg = x;
  if (order < 0) {
    order = -order;
    if (order & 1) sign = -sign;
  }
  if (arg < 0) {
    arg = -arg;
    if (order & 1) sign = -sign;
  }
  return sign * besselJWindow(order, 1, arg, one)[0];
}
