// Gaussian weights on a uniform grid and Boole's rule, for convolutions with a log-normal scatter done
// as sums over a grid (galaxyPairRoute.ts).
// Gaussian: N(x - j h; 0, sigma) for consecutive j by the recurrence v_{j+1} = v_j r_j,
// r_j = exp(h (2 d_j - h) / (2 sigma^2)), r_{j+1} = r_j exp(-h^2 / sigma^2), d_j = x - j h (algebra of
// the exponent; three exp calls for the whole row, relative rounding about n x 1e-16).
// Boole's rule: composite closed Newton-Cotes of 5 points, weights 2h/45 (7, 32, 12, 32, 14, ..., 32, 7),
// error -(2 L / 945) h^6 f^(6) (Abramowitz & Stegun 1964, Handbook of Mathematical Functions, 25.4.14).

/** out[i] = exp(-(x - (j0 + i) h)^2 / (2 sigma^2)) / (sqrt(2 pi) sigma) for i = 0..n-1. */
export function gaussianOnGrid(x: number, h: number, j0: number, n: number, sigma: number, out: Float64Array): void {
  if (n <= 0) return;
  const s2 = sigma * sigma;
  const d = x - j0 * h;
  let v = Math.exp((-0.5 * d * d) / s2) / (Math.sqrt(2 * Math.PI) * sigma);
  let r = Math.exp((h * (2 * d - h)) / (2 * s2));
  const c = Math.exp((-h * h) / s2);
  for (let i = 0; i < n; i++) {
    out[i] = v;
    v *= r;
    r *= c;
  }
}

/** Weights of composite Boole's rule on k intervals of width h (k a positive multiple of 4). */
export function booleWeights(k: number, h: number): Float64Array {
  if (!(Number.isInteger(k) && k > 0 && k % 4 === 0)) throw new RangeError(`Boole's rule needs a positive multiple of 4 intervals, got ${k}`);
  const w = new Float64Array(k + 1);
  const base = [7, 32, 12, 32];
  for (let i = 0; i < k; i++) w[i] += base[i % 4];
  for (let i = 4; i <= k; i += 4) w[i] += 7;
  for (let i = 0; i <= k; i++) w[i] *= (2 * h) / 45;
  return w;
}
