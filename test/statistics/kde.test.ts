// The Gaussian KDEs of src/statistics/gaussianKde1d.ts and gaussianKde2d.ts against
// scipy.stats.gaussian_kde (fixture written by test/reference/generate_kde.py, which records the
// scipy version and each call), and the binned table's own accuracy against direct summation.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { KERNEL_REACH_H, kdeLogDensityDirect, kernelWidth, tableCdf, tableLogDensity, tabulateKde } from '../../src/statistics/gaussianKde1d';
import { binnedPointsPerSample, cdfErrorBound, reflectedKde } from './kdeErrorBounds';
import { kde2dDensity, tabulateKde2d } from '../../src/statistics/gaussianKde2d';

const ref = JSON.parse(readFileSync(new URL('../reference/kde_reference.json', import.meta.url), 'utf8'));
const x = Float64Array.from(ref.samples1d as number[]);

describe('1-D KDE against scipy.stats.gaussian_kde (kde_reference.json)', () => {
  for (const c of ref.cases1d) {
    const rule = c.rule as 'scott' | 'silverman';
    it(`${rule} rule: same kernel width as scipy to 1e-12`, () => {
      const h = kernelWidth(x, rule);
      expect(Math.abs(h - c.h) / c.h, `h ${h} vs scipy ${c.h}`).toBeLessThan(1e-12);
    });
    it(`${rule} rule: direct sum equals scipy's logpdf to 1e-10 (bulk, edges, tails to 4 h)`, () => {
      const h = kernelWidth(x, rule);
      c.points.forEach((p: number, i: number) => {
        const got = kdeLogDensityDirect(x, h, p);
        expect(Math.abs(got - c.logpdf[i]), `at ${p}: ${got} vs scipy ${c.logpdf[i]}`).toBeLessThan(1e-10);
      });
    });
    it(`${rule} rule: the table matches scipy's logpdf within 2e-3 (bulk and edges) and 2e-2 (tails to 4 h)`, () => {
      const t = tabulateKde(x, { rule });
      c.points.forEach((p: number, i: number) => {
        const got = tableLogDensity(t, p);
        const tail = p < c.sampleMin || p > c.sampleMax;
        // Binned-KDE error grows as ((x - x_i)/h)^2 (delta/h)^2 / 8 away from the samples (Wand & Jones 1995, Kernel Smoothing).
        const tol = tail ? 2e-2 : 2e-3;
        expect(Math.abs(got - c.logpdf[i]), `at ${p}: ${got} vs scipy ${c.logpdf[i]}`).toBeLessThan(tol);
      });
    });
    it(`${rule} rule: the table's cdf matches scipy's integrate_box_1d within 1e-3`, () => {
      const t = tabulateKde(x, { rule });
      c.points.forEach((p: number, i: number) => {
        expect(Math.abs(tableCdf(t, p) - c.cdf[i]), `cdf at ${p}`).toBeLessThan(1e-3);
      });
    });
  }
  it('off the table (beyond 6 h of the outermost sample) the density is -Infinity, not a number from nowhere', () => {
    const t = tabulateKde(x);
    expect(tableLogDensity(t, t.x0 - 1e-9)).toBe(-Infinity);
    expect(tableLogDensity(t, t.x0 + (t.size - 1) * t.dx + 1e-9)).toBe(-Infinity);
  });
  it('with a reflecting edge the table keeps unit mass inside and is zero beyond the edge (reflection method, Silverman 1986, Density Estimation)', () => {
    const lower = Math.min(...x) - 0.01;
    const t = tabulateKde(x, { lowerEdge: lower });
    expect(tableLogDensity(t, lower - 1e-9)).toBe(-Infinity);
    // The exact reflected estimate has mass 1 inside; the table within the binned-KDE cdf bound (kdeErrorBounds.ts).
    let maxSlope = 0;
    for (let i = 0; i < t.size; i++) maxSlope = Math.max(maxSlope, Math.abs(reflectedKde(x, t.h, lower, Infinity, t.x0 + i * t.dx).slope));
    const tol = cdfErrorBound(t.dx, t.h, binnedPointsPerSample(x, lower, Infinity, KERNEL_REACH_H * t.h), maxSlope);
    expect(Math.abs(t.cdf[t.size - 1] - 1)).toBeLessThan(tol);
  });
  it('refuses one sample, equal samples and non-finite samples', () => {
    expect(() => tabulateKde([1])).toThrow(/at least 2 samples/);
    expect(() => tabulateKde([1, 1, 1])).toThrow(/all samples are equal/);
    expect(() => tabulateKde([1, NaN, 2])).toThrow(/sample 2 is not a finite number/);
  });
});

describe('2-D KDE against scipy.stats.gaussian_kde (kde_reference.json)', () => {
  const u = Float64Array.from(ref.samples2d.map((p: number[]) => p[0]));
  const v = Float64Array.from(ref.samples2d.map((p: number[]) => p[1]));
  it('Scott factor n^(-1/6) as scipy', () => {
    expect(Math.abs(tabulateKde2d(u, v).factor - ref.case2d.factor)).toBeLessThan(1e-12);
  });
  it('the tabulated density matches scipy within 1% where it exceeds 1% of the peak, 5% below', () => {
    const t = tabulateKde2d(u, v);
    const peak = Math.max(...ref.case2d.pdf);
    ref.case2d.points.forEach((p: number[], i: number) => {
      const want = ref.case2d.pdf[i];
      const got = kde2dDensity(t, p[0], p[1]);
      const tol = want > 0.01 * peak ? 0.01 : 0.05;
      expect(Math.abs(got - want) / want, `at (${p}): ${got} vs scipy ${want}`).toBeLessThan(tol);
    });
  });
});
