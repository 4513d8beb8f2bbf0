// The tabulated KDE with reflecting edges (src/statistics/gaussianKde1d.ts) against the exact reflected
// KDE of kde_reflected_reference.json (test/reference/generate_kde_reflected.py: the sum of kernels at
// the samples and their mirror images, scipy's Scott width, cdf and total mass by scipy.integrate.quad),
// for samples piled against prior edges. Tolerances are bounds on the binned-KDE error (kdeErrorBounds.ts).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { KERNEL_REACH_H, TABLE_STEPS_PER_H, tableCdf, tableLogDensity, tabulateKde } from '../../src/statistics/gaussianKde1d';
import { binnedPointsPerSample, cdfErrorBound, interpolationErrorBound, nodeDensityErrorBound, reflectedKde } from './kdeErrorBounds';

const ref = JSON.parse(readFileSync(new URL('../reference/kde_reflected_reference.json', import.meta.url), 'utf8'));

describe('reflected 1-D KDE table against the exact reflected KDE (kde_reflected_reference.json, scipy)', () => {
  for (const c of ref.cases) {
    const x = Float64Array.from(c.samples as number[]);
    const a: number = c.lowerEdge ?? -Infinity;
    const b: number = c.upperEdge ?? Infinity;
    const t = tabulateKde(x, { lowerEdge: a, upperEdge: b });
    const perSample = binnedPointsPerSample(x, a, b, KERNEL_REACH_H * t.h);
    // max |f'| of the exact estimate over the table's points, for the cdf's error bound
    let maxSlope = 0;
    for (let i = 0; i < t.size; i++) maxSlope = Math.max(maxSlope, Math.abs(reflectedKde(x, t.h, a, b, t.x0 + i * t.dx).slope));

    it(`${c.name}: the kernel width is scipy's (1e-12) and the grid step at most h / ${TABLE_STEPS_PER_H}`, () => {
      expect(Math.abs(t.h - c.h) / c.h).toBeLessThan(1e-12);
      expect(t.dx).toBeLessThanOrEqual(t.h / TABLE_STEPS_PER_H);
    });
    it(`${c.name}: the reference sum used below equals the fixture's pdf to 1e-12`, () => {
      c.points.forEach((p: number, i: number) => {
        const f = reflectedKde(x, c.h, a, b, p).density;
        expect(Math.abs(f - c.pdf[i]), `at ${p}`).toBeLessThanOrEqual(1e-12 * c.pdf[i]);
      });
    });
    it(`${c.name}: each edge with samples within reach is a grid point; zero density beyond it`, () => {
      if (Number.isFinite(a) && Math.min(...x) < a + KERNEL_REACH_H * t.h) {
        expect(t.x0).toBe(a);
        expect(tableCdf(t, a)).toBe(0);
        expect(tableLogDensity(t, a)).toBeGreaterThan(-Infinity);
        expect(tableLogDensity(t, a - 1e-9)).toBe(-Infinity);
      }
      if (Number.isFinite(b) && Math.max(...x) > b - KERNEL_REACH_H * t.h) {
        const end = t.x0 + (t.size - 1) * t.dx;
        expect(Math.abs(end - b)).toBeLessThan(1e-12 * Math.max(1, Math.abs(b)));
        expect(tableLogDensity(t, b)).toBeGreaterThan(-Infinity);
        expect(tableLogDensity(t, b + 1e-9)).toBe(-Infinity);
        expect(tableCdf(t, b + 1)).toBe(t.cdf[t.size - 1]);
      }
    });
    it(`${c.name}: the density at every grid point within the binning bound of the exact estimate`, () => {
      const tol = nodeDensityErrorBound(t.dx, t.h, perSample);
      for (let i = 0; i < t.size; i++) {
        const want = reflectedKde(x, t.h, a, b, t.x0 + i * t.dx).density;
        expect(Math.abs(Math.exp(t.logDensity[i]) - want), `at grid point ${i}`).toBeLessThan(tol);
      }
    });
    it(`${c.name}: the density between grid points within the binning and interpolation bounds of the fixture`, () => {
      c.points.forEach((p: number, i: number) => {
        const u = (p - t.x0) / t.dx;
        if (u < 0 || u > t.size - 1) {
          // a far edge, off the table: zero there, where the exact estimate is below the kernel cut's share
          expect(tableLogDensity(t, p)).toBe(-Infinity);
          expect(c.pdf[i]).toBeLessThan(nodeDensityErrorBound(t.dx, t.h, perSample));
          return;
        }
        const j = Math.min(Math.floor(u), t.size - 2);
        const tol = 2 * nodeDensityErrorBound(t.dx, t.h, perSample) + interpolationErrorBound(Math.exp(t.logDensity[j]), Math.exp(t.logDensity[j + 1]));
        const got = Math.exp(tableLogDensity(t, p));
        expect(Math.abs(got - c.pdf[i]), `at ${p}: ${got} vs ${c.pdf[i]}`).toBeLessThan(tol);
      });
    });
    it(`${c.name}: the cdf within its error bound of scipy's quad, and the total mass 1 (quad: ${c.mass})`, () => {
      const tol = cdfErrorBound(t.dx, t.h, perSample, maxSlope);
      c.points.forEach((p: number, i: number) => {
        expect(Math.abs(tableCdf(t, p) - c.cdf[i]), `cdf at ${p}`).toBeLessThan(tol);
      });
      expect(Math.abs(t.cdf[t.size - 1] - c.mass)).toBeLessThan(tol);
      expect(Math.abs(t.cdf[t.size - 1] - 1)).toBeLessThan(tol);
    });
  }
});
