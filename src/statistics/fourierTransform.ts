// Fast Fourier transform, iterative radix-2 (Cooley & Tukey 1965, Math. Comp. 19, 297), in place on
// separate real and imaginary arrays whose length is a power of two. Used for autocovariances in
// O(n log n) (Wiener-Khinchin: the inverse transform of |X(k)|^2 of the zero-padded series).

/** Smallest power of two >= n. */
export function nextPowerOfTwo(n: number): number {
  let p = 1;
  while (p < n) p *= 2;
  return p;
}

/** In-place DFT X(k) = sum_j x(j) exp(-2 pi i j k / n); `inverse` uses exp(+...) and no 1/n. */
export function fftInPlace(re: Float64Array, im: Float64Array, inverse = false): void {
  const n = re.length;
  if (im.length !== n) throw new RangeError('real and imaginary parts must have the same length');
  if (n & (n - 1)) throw new RangeError(`length must be a power of two, got ${n}`);
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      let t = re[i];
      re[i] = re[j];
      re[j] = t;
      t = im[i];
      im[i] = im[j];
      im[j] = t;
    }
  }
  const sign = inverse ? 1 : -1;
  for (let len = 2; len <= n; len *= 2) {
    const angle = (sign * 2 * Math.PI) / len;
    const wRe = Math.cos(angle);
    const wIm = Math.sin(angle);
    const half = len >> 1;
    for (let start = 0; start < n; start += len) {
      let uRe = 1;
      let uIm = 0;
      for (let k = 0; k < half; k++) {
        const a = start + k;
        const b = a + half;
        const tRe = re[b] * uRe - im[b] * uIm;
        const tIm = re[b] * uIm + im[b] * uRe;
        re[b] = re[a] - tRe;
        im[b] = im[a] - tIm;
        re[a] += tRe;
        im[a] += tIm;
        const next = uRe * wRe - uIm * wIm;
        uIm = uRe * wIm + uIm * wRe;
        uRe = next;
      }
    }
  }
}

/**
 * Sums s(t) = sum_{i=0}^{n-1-t} x(i) x(i+t) for t = 0..n-1 (the unnormalised autocovariance of an
 * already centred series), through a transform of length >= 2n so that the circular sums do not wrap.
 */
export function lagProductSums(x: ArrayLike<number>): Float64Array {
  const n = x.length;
  const size = nextPowerOfTwo(2 * n);
  const re = new Float64Array(size);
  const im = new Float64Array(size);
  for (let i = 0; i < n; i++) re[i] = x[i];
  fftInPlace(re, im);
  for (let k = 0; k < size; k++) {
    re[k] = re[k] * re[k] + im[k] * im[k];
    im[k] = 0;
  }
  fftInPlace(re, im, true);
  const out = new Float64Array(n);
  for (let t = 0; t < n; t++) out[t] = re[t] / size;
  return out;
}
