import { describe, expect, it } from 'vitest';
import jStat from 'jstat';
import {
  atReferenceFrequency,
  measurementCdf,
  measurementFromInterval,
  measurementFromLog10,
  measurementFromSymmetric,
  measurementInterval,
  measurementQuantileLog10,
} from '../../src/statistics/measurement';
import { compareAmplitude, probabilityInsideLogNormal } from '../../src/statistics/comparison';
import { F_YR_HZ } from '../../src/physics/constants';

// Check value: Agazie et al. 2023, ApJL 951, L8 (abstract) quote A = 2.4 (+0.7, -0.6) x 1e-15 at f = 1/yr
// for an f^(-2/3) strain spectrum (gamma = 13/3), as a median with a 90% credible interval.
const PUBLISHED = { median: 2.4e-15, lower: 1.8e-15, upper: 3.1e-15, level: 0.9 };

describe('measurement from an interval (two half-normals in log10 A; common practice, no source)', () => {
  const m = measurementFromInterval(PUBLISHED.median, PUBLISHED.lower, PUBLISHED.upper, PUBLISHED.level);
  it('reproduces the stated median and interval ends as its quantiles (jstat normal.inv gives the sigma multiple)', () => {
    const k = jStat.normal.inv(0.95, 0, 1); // two-sided 90% point
    expect(m.sigmaLowDex * k).toBeCloseTo(Math.log10(2.4 / 1.8), 12);
    expect(m.sigmaHighDex * k).toBeCloseTo(Math.log10(3.1 / 2.4), 12);
    expect(10 ** measurementQuantileLog10(m, 0.5)).toBeCloseTo(2.4e-15, 27);
    expect(10 ** measurementQuantileLog10(m, 0.05) / 1.8e-15).toBeCloseTo(1, 12);
    expect(10 ** measurementQuantileLog10(m, 0.95) / 3.1e-15).toBeCloseTo(1, 12);
    expect(measurementCdf(m, 1.8e-15)).toBeCloseTo(0.05, 12);
    expect(measurementCdf(m, 3.1e-15)).toBeCloseTo(0.95, 12);
  });
  it('converts the 90% interval to a 68.27% one of 1/1.6449 the log width (A&S 1964, table 26.1)', () => {
    const i68 = measurementInterval(m, 0.6826894921370859);
    expect(Math.log10(2.4e-15 / i68.lower)).toBeCloseTo(Math.log10(2.4 / 1.8) / 1.6448536, 6);
    expect(Math.log10(i68.upper / 2.4e-15)).toBeCloseTo(Math.log10(3.1 / 2.4) / 1.6448536, 6);
  });
  it('a log-symmetric interval is a log-normal: quantiles equal jstat lognormal.inv', () => {
    const s = 0.2;
    const med = 3e-15;
    const k = jStat.normal.inv(0.84, 0, 1);
    const lm = measurementFromInterval(med, med * 10 ** (-s * k), med * 10 ** (s * k), 0.68);
    for (const p of [0.03, 0.3, 0.7, 0.97]) {
      expect(10 ** measurementQuantileLog10(lm, p) / jStat.lognormal.inv(p, Math.log(med), s * Math.LN10)).toBeCloseTo(1, 9);
    }
  });
  it('a symmetric interval in A is asymmetric in log10 A', () => {
    const sm = measurementFromSymmetric(2e-15, 1e-15, 0.68);
    expect(sm.sigmaLowDex).toBeGreaterThan(sm.sigmaHighDex);
    expect(10 ** measurementQuantileLog10(sm, 0.16) / 1e-15).toBeCloseTo(1, 2); // 0.68 level -> 0.16 quantile
  });
  it('moving the reference frequency scales A by (f/f_yr)^((3-gamma)/2) = ^(-2/3) for gamma 13/3 (Phinney 2001)', () => {
    const moved = atReferenceFrequency(m, F_YR_HZ / 10);
    expect(10 ** (moved.log10Median - m.log10Median)).toBeCloseTo(10 ** (2 / 3), 10);
    expect(moved.stated!.lower / 1.8e-15).toBeCloseTo(10 ** (2 / 3), 10);
  });
});

describe('bad measurement input names the argument', () => {
  it('lower above the median', () => {
    expect(() => measurementFromInterval(2e-15, 2.5e-15, 3e-15, 0.9)).toThrow(/lower end .* must be below the median/);
  });
  it('upper below the median', () => {
    expect(() => measurementFromInterval(2e-15, 1e-15, 1.5e-15, 0.9)).toThrow(/upper end .* must be above/);
  });
  it('level outside (0,1), including a percentage written as a plain number', () => {
    for (const level of [0, 1, -0.5, 68, NaN]) expect(() => measurementFromInterval(2e-15, 1e-15, 3e-15, level)).toThrow(/level .* fraction in \(0, 1\)/);
  });
  it('negative amplitude, zero sigma, non-positive reference frequency', () => {
    expect(() => measurementFromInterval(-2e-15, 1e-15, 3e-15, 0.9)).toThrow(/median must be a positive amplitude/);
    expect(() => measurementFromLog10(-14.6, 0)).toThrow(/sigma/);
    expect(() => measurementFromInterval(2e-15, 1e-15, 3e-15, 0.9, 13 / 3, 0)).toThrow(/reference frequency/);
    expect(() => measurementFromSymmetric(2e-15, 3e-15, 0.9)).toThrow(/halfWidth/);
  });
});

describe('comparison of a prediction with the measurement', () => {
  const m = measurementFromInterval(PUBLISHED.median, PUBLISHED.lower, PUBLISHED.upper, PUBLISHED.level);
  it('at the median: ratio 1, tension 0, percentile 1/2, inside', () => {
    const c = compareAmplitude(2.4e-15, m);
    expect(c.ratio).toBeCloseTo(1, 14);
    expect(c.tensionSigma).toBeCloseTo(0, 12);
    expect(c.percentile).toBeCloseTo(0.5, 12);
    expect(c.inside).toBe(true);
    expect(c.relativeLikelihood).toBeCloseTo(1, 12);
  });
  it('at the upper 90% end the tension is +1.6449 sigma (A&S 1964, table 26.1) and the prediction is at the 95th percentile', () => {
    const c = compareAmplitude(3.1e-15, m);
    expect(c.tensionSigma).toBeCloseTo(1.6449, 4);
    expect(c.percentile).toBeCloseTo(0.95, 10);
    const low = compareAmplitude(1.8e-15, m);
    expect(low.tensionSigma).toBeCloseTo(-1.6449, 4);
  });
  it('likelihood is the normal density in log10 A of the matching side (jstat normal.pdf)', () => {
    for (const a of [1e-15, 2e-15, 2.9e-15, 5e-15]) {
      const c = compareAmplitude(a, m);
      const s = a < 2.4e-15 ? m.sigmaLowDex : m.sigmaHighDex;
      expect(c.likelihood / jStat.normal.pdf(Math.log10(a), Math.log10(2.4e-15), s)).toBeCloseTo(1, 10);
    }
  });
  it('outside the interval below and above', () => {
    expect(compareAmplitude(1e-15, m).inside).toBe(false);
    expect(compareAmplitude(4e-15, m).inside).toBe(false);
  });
  it('probability that a log-normal prediction lies inside: equal to the normal mass within k sigma when centred (A&S 1964, 26.2.7)', () => {
    // Prediction centred on the interval's log-midpoint with width such that the ends are 1 sigma away -> 0.6827.
    const lo = 1e-15;
    const hi = 4e-15;
    const mid = Math.sqrt(lo * hi);
    expect(probabilityInsideLogNormal(mid, Math.log10(hi / mid), lo, hi)).toBeCloseTo(0.682689, 5);
  });
  it('refuses a non-positive prediction', () => {
    expect(() => compareAmplitude(0, m)).toThrow(/predicted amplitude must be positive/);
  });
});
