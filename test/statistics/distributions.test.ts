import { describe, expect, it } from 'vitest';
import jStat from 'jstat';
import {
  lognormalDistribution,
  loguniformDistribution,
  normalDistribution,
  uniformDistribution,
} from '../../src/statistics/distributions';
import { seededRandom } from '../../src/statistics/prng';
import { summariseSamples, fractionInside, quantileMonteCarloError, sortedQuantile } from '../../src/statistics/sampleSummary';
import { reference } from './reference';

describe('distributions for uncertain inputs', () => {
  it('normal quantiles and cdf equal jstat normal.inv / normal.cdf', () => {
    const d = normalDistribution(3, 0.5);
    for (const p of [0.01, 0.3, 0.5, 0.9]) expect(d.quantile(p)).toBeCloseTo(jStat.normal.inv(p, 3, 0.5), 10);
    for (const x of [1.5, 2.9, 4]) expect(d.cdf(x)).toBeCloseTo(jStat.normal.cdf(x, 3, 0.5), 10);
  });
  it('log-normal (median, sigma in dex) quantiles equal scipy.stats.lognorm.ppf (fixture)', () => {
    for (const c of reference.lognormal_ppf.cases) {
      const d = lognormalDistribution(c.median, c.sigma_dex);
      expect(d.quantile(c.p) / c.value).toBeCloseTo(1, 12);
    }
  });
  it('log-normal density equals jstat lognormal.pdf with mu = ln median, sigma = sigmaDex ln 10', () => {
    const d = lognormalDistribution(2e-3, 0.25);
    for (const x of [5e-4, 2e-3, 9e-3]) expect(d.density(x) / jStat.lognormal.pdf(x, Math.log(2e-3), 0.25 * Math.LN10)).toBeCloseTo(1, 10);
  });
  it('uniform and log-uniform quantiles (jstat uniform.inv; closed form for log-uniform)', () => {
    const u = uniformDistribution(2, 6);
    expect(u.quantile(0.3)).toBeCloseTo(jStat.uniform.inv(0.3, 2, 6), 12);
    const lu = loguniformDistribution(1e-4, 1e-2);
    expect(lu.quantile(0.5)).toBeCloseTo(1e-3, 15);
    expect(lu.cdf(1e-3)).toBeCloseTo(0.5, 12);
  });
  it('invalid parameters are refused with the argument named', () => {
    expect(() => normalDistribution(0, 0)).toThrow(/sd must be positive/);
    expect(() => normalDistribution(NaN, 1)).toThrow(/mean must be a finite number/);
    expect(() => lognormalDistribution(-1, 0.3)).toThrow(/median must be positive/);
    expect(() => lognormalDistribution(1, -0.3)).toThrow(/sigmaDex must be positive/);
    expect(() => uniformDistribution(3, 3)).toThrow(/hi must be greater than lo/);
    expect(() => loguniformDistribution(0, 1)).toThrow(/lo must be positive/);
  });
});

describe('Monte Carlo summaries', () => {
  it('sample quantile is definition 7 of Hyndman & Fan 1996 (worked by hand on 1..5)', () => {
    const s = Float64Array.of(1, 2, 3, 4, 5);
    expect(sortedQuantile(s, 0.5)).toBe(3);
    expect(sortedQuantile(s, 0.25)).toBe(2); // h = (5-1) 0.25 = 1 -> x[1]
    expect(sortedQuantile(s, 0.1)).toBeCloseTo(1.4, 14); // h = 0.4
  });
  it('the 68% interval of log-normal samples converges to the analytic one, error shrinking ~ 1/sqrt(N)', () => {
    const d = lognormalDistribution(1e-3, 0.3);
    const exact = d.quantile(0.5 + 0.6826894921370859 / 2);
    const errs: number[] = [];
    const mcErrs: number[] = [];
    for (const n of [1_000, 16_000, 256_000]) {
      const rng = seededRandom(11);
      const xs = new Float64Array(n);
      for (let i = 0; i < n; i++) xs[i] = d.sample(rng);
      const s = summariseSamples(xs);
      errs.push(Math.abs(s.intervals[0].upper - exact));
      mcErrs.push(s.intervals[0].upperError);
      // The actual error stays within 4 reported Monte Carlo errors.
      expect(Math.abs(s.intervals[0].upper - exact)).toBeLessThan(4 * s.intervals[0].upperError);
    }
    // Reported Monte Carlo error falls by ~4 per factor 16 in N (1/sqrt N), within 30%.
    expect(mcErrs[0] / mcErrs[1]).toBeGreaterThan(4 / 1.3);
    expect(mcErrs[0] / mcErrs[1]).toBeLessThan(4 * 1.3);
    expect(mcErrs[1] / mcErrs[2]).toBeGreaterThan(4 / 1.3);
    expect(errs[2]).toBeLessThan(errs[0]);
  });
  it('order-statistic error of the median matches the asymptotic sqrt(p(1-p)/n)/f(x_p) (e.g. Conover 1999) within 15%', () => {
    const n = 40_000;
    const rng = seededRandom(5);
    const xs = new Float64Array(n);
    for (let i = 0; i < n; i++) xs[i] = rng.normal();
    xs.sort();
    const asymptotic = Math.sqrt(0.25 / n) / (1 / Math.sqrt(2 * Math.PI));
    expect(quantileMonteCarloError(xs, 0.5) / asymptotic).toBeGreaterThan(0.85);
    expect(quantileMonteCarloError(xs, 0.5) / asymptotic).toBeLessThan(1.15);
  });
  it('a fixed seed reproduces the summary exactly', () => {
    const run = () => {
      const rng = seededRandom(123);
      const d = normalDistribution(0, 1);
      return summariseSamples(Float64Array.from({ length: 2000 }, () => d.sample(rng)));
    };
    expect(run()).toEqual(run());
  });
  it('fraction inside an interval: about 0.6827 of normal samples within 1 sigma (A&S 1964, table 26.1), binomial error', () => {
    const rng = seededRandom(8);
    const xs = Float64Array.from({ length: 50_000 }, () => rng.normal());
    const f = fractionInside(xs, -1, 1);
    expect(Math.abs(f.fraction - 0.6827)).toBeLessThan(4 * f.error);
    expect(f.error).toBeCloseTo(Math.sqrt((0.6827 * 0.3173) / 50_000), 4);
  });
});
