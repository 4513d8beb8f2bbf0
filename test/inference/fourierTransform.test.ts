// The radix-2 FFT and the lag-product sums built on it (src/statistics/fourierTransform.ts), against the
// definition computed directly: the DFT sum X(k) = sum_j x(j) exp(-2 pi i j k / n) and
// s(t) = sum_i x(i) x(i+t), in O(n^2), on seeded random data.
import { describe, expect, it } from 'vitest';
import { fftInPlace, lagProductSums, nextPowerOfTwo } from '../../src/statistics/fourierTransform';
import { seededRandom } from '../../src/statistics/prng';

describe('fast Fourier transform', () => {
  it('equals the direct DFT sum to 1e-12 of the largest term, and the inverse (divided by n) gives the input back', () => {
    const rng = seededRandom(5);
    const n = 64;
    const x = Float64Array.from({ length: n }, () => rng.normal());
    const y = Float64Array.from({ length: n }, () => rng.normal());
    const re = Float64Array.from(x);
    const im = Float64Array.from(y);
    fftInPlace(re, im);
    const scale = x.reduce((a, v, i) => a + Math.abs(v) + Math.abs(y[i]), 0);
    for (let k = 0; k < n; k++) {
      let sRe = 0;
      let sIm = 0;
      for (let j = 0; j < n; j++) {
        const a = (-2 * Math.PI * j * k) / n;
        sRe += x[j] * Math.cos(a) - y[j] * Math.sin(a);
        sIm += x[j] * Math.sin(a) + y[j] * Math.cos(a);
      }
      expect(Math.abs(re[k] - sRe) / scale, `k = ${k}`).toBeLessThan(1e-12);
      expect(Math.abs(im[k] - sIm) / scale, `k = ${k}`).toBeLessThan(1e-12);
    }
    fftInPlace(re, im, true);
    for (let j = 0; j < n; j++) expect(Math.abs(re[j] / n - x[j]) + Math.abs(im[j] / n - y[j])).toBeLessThan(1e-12);
  });

  it('refuses a length that is not a power of two', () => {
    expect(() => fftInPlace(new Float64Array(6), new Float64Array(6))).toThrow(/power of two, got 6/);
    expect(nextPowerOfTwo(1000)).toBe(1024);
  });

  it('lag-product sums equal the direct sums sum_i x(i) x(i+t) for every lag, with no wrap-around (odd length 777)', () => {
    const rng = seededRandom(9);
    const x = Float64Array.from({ length: 777 }, () => rng.normal());
    const s = lagProductSums(x);
    for (let t = 0; t < x.length; t++) {
      let direct = 0;
      for (let i = 0; i + t < x.length; i++) direct += x[i] * x[i + t];
      expect(Math.abs(s[t] - direct), `lag ${t}: ${s[t]} vs ${direct}`).toBeLessThan(1e-9 * s[0]);
    }
  });
});
