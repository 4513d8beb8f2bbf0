// Peters & Mathews 1963 (Phys. Rev. 131, 435) harmonic power g(n, e) and its sum F(e).
import { describe, expect, it } from 'vitest';
import { eccentricityEnhancement, harmonicCut, harmonicPower, harmonicPowerBound, harmonicPowerBoundPart, kapteynBound } from '../../src/physics/petersMathews';
import fixture from '../reference/harmonic_power.json';
import besselFixture from '../reference/bessel_jv.json';

describe('g(n, e) (Peters & Mathews 1963, eq. 20)', () => {
  it('g(2, 0) = 1 and g(n, 0) = 0 for n != 2: a circular orbit radiates only at twice the orbital frequency (Peters & Mathews 1963)', () => {
    expect(harmonicPower(2, 0)).toBe(1);
    for (const n of [1, 3, 4, 10, 100]) expect(harmonicPower(n, 0)).toBe(0);
  });

  it(`agrees with g composed from scipy.special.jv (${fixture.library_version}) to 1e-11 relative, ${fixture.cases.length} cases up to n = 2000, e = 0.99`, () => {
    for (const c of fixture.cases) {
      const v = harmonicPower(c.n, c.e);
      const err = c.g === 0 ? Math.abs(v) : Math.abs(v / c.g - 1);
      // Values below 1e-280 carry scipy's own rounding of underflowing products; compare absolutely there.
      const tol = c.g < 1e-280 ? 1e-290 : 1e-11;
      expect(err, `g(${c.n}, ${c.e}): expected ${c.g}, got ${v}, error ${err}, threshold ${tol}`).toBeLessThanOrEqual(tol);
    }
  });

  it('sum over n of g(n, e) equals F(e) = (1 + 73/24 e^2 + 37/96 e^4)/(1-e^2)^(7/2) to 1e-10 for e <= 0.9 (Peters & Mathews 1963, eq. 17)', () => {
    for (const e of [0.01, 0.1, 0.3, 0.5, 0.7, 0.8, 0.9]) {
      let s = 0;
      for (let n = 1; n <= 1500; n++) s += harmonicPower(n, e);
      const F = eccentricityEnhancement(e);
      expect(Math.abs(s / F - 1), `e = ${e}: sum ${s}, F ${F}`).toBeLessThan(1e-10);
    }
  });

  it('F(e) closed form: F(0) = 1 and F(0.5) = (1 + 73/96 + 37/1536) / 0.75^3.5 (Peters & Mathews 1963, eq. 17)', () => {
    expect(eccentricityEnhancement(0)).toBe(1);
    expect(Math.abs(eccentricityEnhancement(0.5) / ((1 + 73 / 96 + 37 / 1536) / Math.pow(0.75, 3.5)) - 1)).toBeLessThan(1e-15);
  });

  it('the harmonic of peak power follows the fit n_peak = 2 (1+e)^1.1954 / (1-e^2)^1.5 of Wen 2003 (ApJ 598, 419, astro-ph/0211492: author and title checked; unverified: volume, page and the fit formula, which lies beyond the reachable abstract) within 5% for e >= 0.7', () => {
    for (const e of [0.7, 0.8, 0.9, 0.95]) {
      let best = 1;
      let bestG = 0;
      for (let n = 1; n < 1000; n++) {
        const g = harmonicPower(n, e);
        if (g > bestG) {
          bestG = g;
          best = n;
        }
      }
      const wen = (2 * Math.pow(1 + e, 1.1954)) / Math.pow(1 - e * e, 1.5);
      expect(Math.abs(best / wen - 1), `e = ${e}: peak at n = ${best}, fit ${wen}`).toBeLessThan(0.05);
    }
  });

  it('rejects e outside [0, 1) and non-integer or non-positive harmonics', () => {
    expect(() => harmonicPower(2, 1)).toThrow(/eccentricity must lie in \[0, 1\), got 1/);
    expect(() => harmonicPower(2, -0.1)).toThrow(/eccentricity/);
    expect(() => harmonicPower(0, 0.5)).toThrow(/harmonic n must be an integer >= 1, got 0/);
    expect(() => harmonicPower(2.5, 0.5)).toThrow(/harmonic n/);
  });
});

describe("Kapteyn's bound and the harmonic cut", () => {
  it("|J_n(x)| <= Kapteyn's bound for every scipy fixture value with x < n", () => {
    for (const cases of Object.values(besselFixture.regimes as Record<string, { n: number; x: number; jv: number }[]>)) {
      for (const c of cases) if (c.x < c.n) expect(Math.abs(c.jv)).toBeLessThanOrEqual(kapteynBound(c.n, c.x) * (1 + 1e-12));
    }
  });

  it('the bound on g(n, e) is never below g composed from scipy', () => {
    for (const c of fixture.cases) if (c.g > 0) expect(c.g).toBeLessThanOrEqual(harmonicPowerBound(c.n, c.e) * (1 + 1e-12));
  });

  it('harmonicCut keeps the smallest N whose omitted power 1 - sum g/F is within the tolerance (sum rule of Peters & Mathews 1963)', () => {
    for (const e of [0.2, 0.6, 0.9]) {
      for (const tol of [1e-4, 1e-8]) {
        const cut = harmonicCut(e, tol);
        let s = 0;
        for (let n = 1; n < cut.nMax; n++) s += harmonicPower(n, e);
        const F = eccentricityEnhancement(e);
        expect(1 - s / F).toBeGreaterThan(tol); // one harmonic fewer is not enough
        expect(Math.abs(1 - (s + harmonicPower(cut.nMax, e)) / F - cut.omittedFraction)).toBeLessThan(1e-15);
        expect(cut.omittedFraction).toBeLessThanOrEqual(tol);
      }
    }
  });
});

describe('the cheap part of the harmonic power bound', () => {
  it('is never above the full bound as computed (its other terms are >= 0), over n = 1 to 3000 and e in [0, 0.99]', () => {
    for (let n = 1; n <= 3000; n += n < 50 ? 1 : 37) {
      for (let e = 0; e < 0.995; e += 0.0123) expect(harmonicPowerBoundPart(n, e)).toBeLessThanOrEqual(harmonicPowerBound(n, e));
    }
  });
});
