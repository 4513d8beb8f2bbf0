// Poisson deviates (src/statistics/poisson.ts) against the Poisson probability mass function
// e^(-mu) mu^k / k! (closed form) and its moments (mean = variance = mu).
import { describe, expect, it } from 'vitest';
import { logFactorial, poissonDeviate } from '../../src/statistics/poisson';
import { seededRandom } from '../../src/statistics/prng';

describe('ln k!', () => {
  it('equals the direct sum of ln i to 1e-12 relative for k = 0 .. 300', () => {
    let direct = 0;
    for (let k = 0; k <= 300; k++) {
      if (k > 1) direct += Math.log(k);
      expect(Math.abs(logFactorial(k) - direct), `k = ${k}`).toBeLessThanOrEqual(1e-12 * Math.max(1, direct));
    }
  });
});

describe('Poisson deviates', () => {
  // Pearson chi-square of 20000 draws against the exact pmf (cells pooled until 5 are expected),
  // against its 0.9999 quantile (six fixed-seed tests: a false alarm below 0.1% for the set) by the
  // Wilson & Hilferty (1931, PNAS 17, 684) cube-root approximation; z_0.9999 = 3.7190.
  const chi2Quantile9999 = (df: number) => df * (1 - 2 / (9 * df) + 3.719 * Math.sqrt(2 / (9 * df))) ** 3;
  for (const mu of [0.3, 3.7, 9.99, 10, 25, 140]) {
    it(`mu = ${mu}: frequencies match e^(-mu) mu^k / k! (chi-square)`, () => {
      const rng = seededRandom(1000 + Math.round(mu * 100));
      const n = 20000;
      const counts = new Map<number, number>();
      for (let i = 0; i < n; i++) {
        const k = poissonDeviate(mu, rng);
        expect(Number.isInteger(k) && k >= 0).toBe(true);
        counts.set(k, (counts.get(k) ?? 0) + 1);
      }
      const pmf = (k: number) => Math.exp(-mu + k * Math.log(mu) - logFactorial(k));
      // Cells of consecutive k, each closed once 5 draws are expected; the remainder (and every k above kMax) joins the last cell.
      const obs: number[] = [];
      const exp: number[] = [];
      let poolObs = 0;
      let poolExp = 0;
      const kMax = Math.ceil(mu + 12 * Math.sqrt(mu) + 12);
      for (let k = 0; k <= kMax; k++) {
        poolObs += counts.get(k) ?? 0;
        poolExp += n * pmf(k);
        if (poolExp >= 5) {
          obs.push(poolObs);
          exp.push(poolExp);
          poolObs = 0;
          poolExp = 0;
        }
      }
      for (const [k, c] of counts) if (k > kMax) poolObs += c;
      obs[obs.length - 1] += poolObs;
      exp[exp.length - 1] += poolExp;
      const chi2 = obs.reduce((acc, o, i) => acc + (o - exp[i]) ** 2 / exp[i], 0);
      const df = obs.length - 1;
      expect(chi2, `chi-square ${chi2} with ${df} degrees of freedom`).toBeLessThan(chi2Quantile9999(df));
    });
  }

  it('mu = 1e6: the sample mean and variance of 20000 draws equal mu within 4 standard errors (Poisson moments)', () => {
    const rng = seededRandom(77);
    const mu = 1e6;
    const n = 20000;
    let s = 0;
    let s2 = 0;
    for (let i = 0; i < n; i++) {
      const k = poissonDeviate(mu, rng);
      s += k;
      s2 += k * k;
    }
    const mean = s / n;
    const variance = (s2 / n - mean * mean) * (n / (n - 1));
    expect(Math.abs(mean - mu)).toBeLessThan(4 * Math.sqrt(mu / n));
    expect(Math.abs(variance - mu)).toBeLessThan(4 * mu * Math.sqrt(2 / n));
  });

  it('refuses a negative, non-finite or too large mean', () => {
    const rng = seededRandom(1);
    expect(() => poissonDeviate(-1, rng)).toThrow(/mean/);
    expect(() => poissonDeviate(NaN, rng)).toThrow(/mean/);
    expect(() => poissonDeviate(1e16, rng)).toThrow(/mean/);
    expect(poissonDeviate(0, rng)).toBe(0);
  });
});
