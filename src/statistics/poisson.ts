// Poisson deviates from a seeded uniform source: inversion by sequential search for small means
// (Devroye 1986, Non-Uniform Random Variate Generation, X.3.3), and the transformed rejection
// method PTRS for means >= 10 (Hormann 1993, Insurance: Mathematics and Economics 12, 39).
import type { RandomSource } from './prng';

/** ln k! by Stirling's series (Abramowitz & Stegun 1964, 6.1.41), exact table below 10. */
export function logFactorial(k: number): number {
  if (k < 10) return LOG_FACTORIALS[k];
  const x = k + 1;
  const inv = 1 / x;
  const inv2 = inv * inv;
  return (x - 0.5) * Math.log(x) - x + 0.5 * Math.log(2 * Math.PI) + inv * (1 / 12 - inv2 * (1 / 360 - inv2 * (1 / 1260 - inv2 / 1680)));
}
const LOG_FACTORIALS = Float64Array.from({ length: 10 }, (_, k) => {
  let s = 0;
  for (let i = 2; i <= k; i++) s += Math.log(i);
  return s;
});

/** A Poisson(mean) deviate; mean must be finite and >= 0 (means above 1e15 are refused: counts lose integer precision). */
export function poissonDeviate(mean: number, rng: RandomSource): number {
  if (!(mean >= 0) || !(mean <= 1e15)) throw new RangeError(`Poisson mean must lie in [0, 1e15], got ${mean}`);
  if (mean === 0) return 0;
  if (mean < 10) {
    // Inversion: walk the cumulative probabilities p_k = p_{k-1} mean / k until they pass u.
    const u = rng.uniform();
    let k = 0;
    let p = Math.exp(-mean);
    let cum = p;
    while (u > cum && k < 1000) {
      k++;
      p *= mean / k;
      cum += p;
    }
    return k;
  }
  // PTRS (Hormann 1993, table 1 and algorithm PTRS).
  const slam = Math.sqrt(mean);
  const logLam = Math.log(mean);
  const b = 0.931 + 2.53 * slam;
  const a = -0.059 + 0.02483 * b;
  const invAlpha = 1.1239 + 1.1328 / (b - 3.4);
  const vr = 0.9277 - 3.6224 / (b - 2);
  for (;;) {
    const u = rng.uniform() - 0.5;
    const v = rng.uniform();
    const us = 0.5 - Math.abs(u);
    const k = Math.floor(((2 * a) / us + b) * u + mean + 0.43);
    if (us >= 0.07 && v <= vr) return k;
    if (k < 0 || (us < 0.013 && v > us)) continue;
    if (Math.log(v) + Math.log(invAlpha) - Math.log(a / (us * us) + b) <= -mean + k * logLam - logFactorial(k)) return k;
  }
}
