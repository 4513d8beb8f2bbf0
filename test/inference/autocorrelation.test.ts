import { describe, expect, it } from 'vitest';
import { integratedAutocorrelationTime } from '../../src/statistics/autocorrelation';
import { classicRhat, rankNormalisedSplitRhat } from '../../src/statistics/splitRhat';
import { seededRandom } from '../../src/statistics/prng';

function ar1(phi: number, n: number, seed: number): Float64Array {
  const rng = seededRandom(seed);
  const x = new Float64Array(n);
  x[0] = rng.normal() / Math.sqrt(1 - phi * phi); // stationary start
  for (let i = 1; i < n; i++) x[i] = phi * x[i - 1] + rng.normal();
  return x;
}

describe('integrated autocorrelation time', () => {
  for (const phi of [0.5, 0.9]) {
    it(`AR(1), phi = ${phi}: tau = (1 + phi)/(1 - phi) within 3 reported errors (closed form, e.g. Sokal 1997, Functional Integration, NATO ASI B 361, 131)`, () => {
      const series = Array.from({ length: 16 }, (_, k) => ar1(phi, 20000, 100 + k));
      const r = integratedAutocorrelationTime(series);
      const want = (1 + phi) / (1 - phi);
      expect(r.windowFound).toBe(true);
      expect(r.error / want).toBeLessThan(0.05); // the check has teeth
      expect(Math.abs(r.tau - want), `tau ${r.tau} +- ${r.error}, want ${want}`).toBeLessThan(3 * r.error);
    });
  }
  it('independent draws give tau = 1 within the error', () => {
    const rng = seededRandom(3);
    const iid = [Float64Array.from({ length: 50000 }, () => rng.normal())];
    const r = integratedAutocorrelationTime(iid);
    expect(Math.abs(r.tau - 1)).toBeLessThan(3 * r.error);
  });
});

describe('R-hat', () => {
  it('classic R-hat of chains [1,2,3] and [4,5,6] is sqrt(31/6) (worked by hand from Gelman et al. 2013, Bayesian Data Analysis, 3rd ed., sec. 11.4)', () => {
    expect(classicRhat([Float64Array.of(1, 2, 3), Float64Array.of(4, 5, 6)])).toBeCloseTo(Math.sqrt(31 / 6), 12);
  });
  it('well-mixed chains give R-hat < 1.01; one chain shifted by one sd, or one with twice the spread, gives R-hat > 1.01 (Vehtari et al. 2021, Bayesian Analysis 16, 667)', () => {
    const rng = seededRandom(11);
    const chains = Array.from({ length: 8 }, () => Float64Array.from({ length: 2000 }, () => rng.normal()));
    expect(rankNormalisedSplitRhat(chains).rhat).toBeLessThan(1.01);
    const shifted = chains.map((c, k) => (k === 0 ? c.map((x) => x + 1) : c));
    expect(rankNormalisedSplitRhat(shifted).bulk).toBeGreaterThan(1.01);
    // A difference in scale only: the bulk R-hat misses it, the folded one catches it.
    const wide = chains.map((c, k) => (k < 4 ? c.map((x) => 3 * x) : c));
    const r = rankNormalisedSplitRhat(wide);
    expect(r.bulk).toBeLessThan(1.01);
    expect(r.folded).toBeGreaterThan(1.01);
    expect(r.rhat).toBe(r.folded);
  });
});
