// J_n(x) by Miller's backward recurrence against scipy.special.jv (fixture written by
// test/reference/generate_bessel.py with Debian's python3-scipy; library, version and call recorded in it).
import { describe, expect, it } from 'vitest';
import { besselJ, besselJWindow } from '../../src/physics/bessel';
import fixture from '../reference/bessel_jv.json';

interface Case { n: number; x: number; jv: number }
const regimes = fixture.regimes as Record<string, Case[]>;

// Error measure: relative to |J| where J is not near a zero; in the oscillating region (x > n) relative
// to the envelope sqrt(2 / (pi x)) (Abramowitz & Stegun 1964, 9.2.1), since near a zero relative error is undefined.
// A reference of exactly 0 is an underflow in scipy (true value below 1e-308): ours must be below 1e-300.
function scaledError(c: Case, value: number): number {
  if (c.jv === 0) return Math.abs(value) < 1e-300 ? 0 : Infinity;
  const envelope = c.x > c.n ? Math.sqrt(2 / (Math.PI * c.x)) : 0;
  return Math.abs(value - c.jv) / Math.max(Math.abs(c.jv), envelope);
}

describe('besselJ against scipy.special.jv (' + fixture.library_version + ')', () => {
  for (const [regime, cases] of Object.entries(regimes)) {
    it(`${regime}: ${cases.length} values within 1e-12 (relative, or of the envelope where oscillating)`, () => {
      for (const c of cases) {
        const v = besselJ(c.n, c.x);
        const err = scaledError(c, v);
        expect(err, `J_${c.n}(${c.x}): expected ${c.jv}, got ${v}, scaled error ${err}, threshold 1e-12`).toBeLessThan(1e-12);
      }
    });
  }

  it('keeps relative accuracy for tiny values deep in the decaying region (n = 1500, x = 750: J ~ 2e-296)', () => {
    const c = regimes['order above argument (decaying), x = n e'].find((k) => k.n === 1500 && Math.abs(k.x - 750) < 1e-9)!;
    expect(c.jv).toBeLessThan(1e-290);
    expect(Math.abs(besselJ(c.n, c.x) / c.jv - 1)).toBeLessThan(1e-12);
  });

  it('one window pass gives the same values as separate calls', () => {
    const out = new Float64Array(5);
    besselJWindow(998, 5, 990.5, out);
    // The start index depends on the highest order asked for, so values agree to rounding, not bitwise.
    for (let i = 0; i < 5; i++) expect(Math.abs(out[i] / besselJ(998 + i, 990.5) - 1)).toBeLessThan(1e-13);
  });
});

describe('besselJWindow reuses its scratch between calls', () => {
  it('a wide window with rescaling (30 orders at n = 1500, x = 750), then a narrow one, agree with separate calls to rounding', () => {
    const wide = besselJWindow(1500, 30, 750, new Float64Array(30));
    for (let i = 0; i < 30; i += 7) expect(Math.abs(wide[i] / besselJ(1500 + i, 750) - 1)).toBeLessThan(1e-13);
    const narrow = besselJWindow(3, 2, 2.5, new Float64Array(2));
    for (let i = 0; i < 2; i++) expect(Math.abs(narrow[i] / besselJ(3 + i, 2.5) - 1)).toBeLessThan(1e-13);
  });
});

describe('besselJ special cases (Abramowitz & Stegun 1964, 9.1.5 and 9.1.10)', () => {
  it('J_0(0) = 1 and J_n(0) = 0 for n >= 1', () => {
    expect(besselJ(0, 0)).toBe(1);
    for (const n of [1, 2, 7, 2000]) expect(besselJ(n, 0)).toBe(0);
  });
  it('J_{-n}(x) = (-1)^n J_n(x) and J_n(-x) = (-1)^n J_n(x), checked on fixture values', () => {
    for (const c of regimes['small order, small argument'].filter((k) => k.n > 0 && k.x > 0.05)) {
      const sign = c.n % 2 === 0 ? 1 : -1;
      expect(Math.abs(besselJ(-c.n, c.x) - sign * c.jv)).toBeLessThan(1e-14);
      expect(Math.abs(besselJ(c.n, -c.x) - sign * c.jv)).toBeLessThan(1e-14);
    }
  });
  it('rejects a non-integer order and non-finite or out-of-range arguments with a RangeError naming them', () => {
    expect(() => besselJ(1.5, 1)).toThrow(/order must be an integer, got 1.5/);
    expect(() => besselJ(2, NaN)).toThrow(/x must be finite, got NaN/);
    expect(() => besselJ(2, Infinity)).toThrow(/x must be finite/);
    expect(() => besselJWindow(0, 1, 2e7, new Float64Array(1))).toThrow(/x must lie in/);
    expect(() => besselJWindow(-1, 1, 2, new Float64Array(1))).toThrow(/orders must be integers >= 0/);
  });
});
