import { describe, expect, it } from 'vitest';
import { axisPriorWeights, hpdThresholds } from '../../src/statistics/credibleRegion';
import { reference } from './reference';

// A 2-D Gaussian: the HPD region holding probability p is the ellipse chi^2 <= -2 ln(1-p)
// (chi-square with 2 degrees of freedom has cdf 1 - exp(-x/2)); 68.27% -> 2.30, 95.45% -> 6.18
// (Press et al. 2007, Numerical Recipes 3rd ed., table in sec. 15.6; scipy chi2.ppf fixture).
describe('highest-posterior-density levels on a grid', () => {
  const sx = 1.3;
  const sy = 0.4;
  const rho = 0.6;
  const n = 401;
  const half = 6;
  const xs = Float64Array.from({ length: n }, (_, i) => -half * sx + (2 * half * sx * i) / (n - 1));
  const ys = Float64Array.from({ length: n }, (_, i) => -half * sy + (2 * half * sy * i) / (n - 1));
  const chi2 = new Float64Array(n * n);
  const mass = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      const u = xs[i] / sx;
      const v = ys[j] / sy;
      const c = (u * u - 2 * rho * u * v + v * v) / (1 - rho * rho);
      chi2[j * n + i] = c;
      mass[j * n + i] = Math.exp(-0.5 * c);
    }
  }
  const levels = reference.chi2_ppf_2dof.level as number[];
  const hpd = hpdThresholds(mass, levels);

  it('the threshold lies at Delta chi^2 = 2.30 and 6.18 (closed form and scipy.stats.chi2.ppf fixture)', () => {
    levels.forEach((p, k) => {
      const peak = hpd.posterior.reduce((a, b) => Math.max(a, b), 0);
      const dchi2 = -2 * Math.log(hpd.thresholds[k] / peak);
      // Tolerance 0.02 in Delta chi^2: the grid cell is 0.03 sigma wide.
      expect(Math.abs(dchi2 - reference.chi2_ppf_2dof.value[k])).toBeLessThan(0.02);
      expect(Math.abs(dchi2 - -2 * Math.log(1 - p))).toBeLessThan(0.02);
    });
    expect(reference.chi2_ppf_2dof.value[0]).toBeCloseTo(2.30, 2);
  });
  it('the region has the ellipse area pi sx sy sqrt(1-rho^2) Delta chi^2 (area check, within 1%)', () => {
    const cell = (xs[1] - xs[0]) * (ys[1] - ys[0]);
    levels.forEach((p, k) => {
      let count = 0;
      for (let i = 0; i < mass.length; i++) if (hpd.posterior[i] >= hpd.thresholds[k]) count++;
      const area = count * cell;
      const analytic = Math.PI * sx * sy * Math.sqrt(1 - rho * rho) * -2 * Math.log(1 - p);
      expect(Math.abs(area / analytic - 1)).toBeLessThan(0.01);
    });
  });
  it('encloses at least the requested mass, by at most one cell', () => {
    levels.forEach((p, k) => {
      expect(hpd.enclosed[k]).toBeGreaterThanOrEqual(p);
      expect(hpd.enclosed[k] - p).toBeLessThanOrEqual(hpd.thresholds[k] + 1e-15);
    });
  });
  it('refuses negative or non-finite masses, an all-zero grid and levels outside (0,1)', () => {
    expect(() => hpdThresholds(Float64Array.of(1, -1), [0.68])).toThrow(/cell 1/);
    expect(() => hpdThresholds(Float64Array.of(0, 0), [0.68])).toThrow(/zero on the whole grid/);
    expect(() => hpdThresholds(Float64Array.of(1, NaN), [0.68])).toThrow(/cell 1/);
    expect(() => hpdThresholds(Float64Array.of(1, 2), [1.2])).toThrow(/credible level/);
  });
});

describe('prior weights along an axis', () => {
  const values = Float64Array.of(1, 10, 100);
  it('log grid with log-uniform prior, or linear grid with uniform prior: equal weights', () => {
    expect(Array.from(axisPriorWeights({ values, log: true, prior: 'log-uniform' }))).toEqual([1, 1, 1]);
    expect(Array.from(axisPriorWeights({ values, log: false, prior: 'uniform' }))).toEqual([1, 1, 1]);
  });
  it('log grid with uniform prior weighs by x (dx = x dln x); linear grid with log prior by 1/x', () => {
    expect(Array.from(axisPriorWeights({ values, log: true, prior: 'uniform' }))).toEqual([1, 10, 100]);
    expect(Array.from(axisPriorWeights({ values, log: false, prior: 'log-uniform' }))).toEqual([1, 0.1, 0.01]);
  });
});
