// Conversions on plain numbers and the grid helpers.
import { describe, expect, it } from 'vitest';
import { F_YR_HZ } from '../../src/physics/constants';
import { localSpectralSlope, powerLawStrain, strainAtFrequency } from '../../src/physics/spectrumConversions';
import { frequencyGridFromSpan, logFrequencyGrid } from '../../src/physics/frequencyGrid';
import { gaussLegendreRule, integrate } from '../../src/physics/gaussLegendre';

describe('local slope and interpolation of a power law h_c = A (f/f_yr)^alpha', () => {
  const f = Float64Array.from([1e-9, 1.7e-9, 4e-9, 1.1e-8, 3e-8, 9e-8]); // uneven on purpose
  const hc = f.map((x) => powerLawStrain(x, 2e-15, -2 / 3));
  it('the slope is alpha at every point, ends included', () => {
    for (const a of localSpectralSlope({ frequencyHz: f, hc })) expect(Math.abs(a + 2 / 3)).toBeLessThan(1e-12);
  });
  it('interpolation in log-log reproduces the power law, also beyond the grid', () => {
    for (const x of [F_YR_HZ, 2.5e-9, 5e-10, 2e-7]) expect(Math.abs(strainAtFrequency({ frequencyHz: f, hc }, x) / powerLawStrain(x, 2e-15, -2 / 3) - 1)).toBeLessThan(1e-12);
  });
  it('the slope of a curved spectrum is second-order accurate on an uneven grid (h_c = exp(-(ln f)^2/50))', () => {
    const g = Float64Array.from([1e-9, 1.3e-9, 2e-9, 2.2e-9, 3e-9]);
    const h = g.map((x) => Math.exp(-(Math.log(x) ** 2) / 50));
    const s = localSpectralSlope({ frequencyHz: g, hc: h });
    for (let i = 1; i < g.length - 1; i++) expect(Math.abs(s[i] - -Math.log(g[i]) / 25)).toBeLessThan(1e-3);
  });
});

describe('grids', () => {
  it('logFrequencyGrid ends exactly at its limits, evenly spaced in log f', () => {
    const g = logFrequencyGrid(1e-9, 1e-7, 5);
    expect(g[0]).toBe(1e-9);
    expect(g[4]).toBe(1e-7);
    expect(Math.abs(g[2] / 1e-8 - 1)).toBeLessThan(1e-14);
  });
  it('frequencyGridFromSpan refuses a cadence of half the span or more', () => {
    expect(() => frequencyGridFromSpan(100, 50)).toThrow(/cadence/);
    expect(frequencyGridFromSpan(100, 10).length).toBe(5);
  });
});

describe('Gauss-Legendre rules (Abramowitz & Stegun 1964, 25.4.29)', () => {
  it('n points integrate x^(2n-1) and x^(2n-2) exactly on [-1, 1]', () => {
    for (const n of [1, 2, 5, 10, 16]) {
      const r = gaussLegendreRule(n);
      let s = 0;
      let t = 0;
      for (let i = 0; i < n; i++) {
        s += r.weights[i] * r.nodes[i] ** (2 * n - 1);
        t += r.weights[i] * r.nodes[i] ** (2 * n - 2);
      }
      expect(Math.abs(s)).toBeLessThan(1e-14);
      expect(Math.abs(t - 2 / (2 * n - 1))).toBeLessThan(1e-13);
    }
  });
  it('two-point nodes are +-1/sqrt(3)', () => {
    expect(Math.abs(gaussLegendreRule(2).nodes[1] - 1 / Math.sqrt(3))).toBeLessThan(3e-16);
  });
  it('composite integration of exp on [0, 3] gives e^3 - 1', () => {
    expect(Math.abs(integrate(Math.exp, 0, 3) / (Math.exp(3) - 1) - 1)).toBeLessThan(1e-14);
  });
});
