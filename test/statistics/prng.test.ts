import { describe, expect, it } from 'vitest';
import { seededRandom } from '../../src/statistics/prng';
import { reference } from './reference';

describe('xoshiro128** seeded by SplitMix64 (Blackman & Vigna 2021, ACM TOMS 47(4), 36)', () => {
  it('reproduces an independent Python transcription of the published generator (fixture)', () => {
    for (const c of reference.xoshiro128ss.cases) {
      const rng = seededRandom(c.seed);
      const got = Array.from({ length: c.outputs.length }, () => rng.nextUint32());
      expect(got, `seed ${c.seed}`).toEqual(c.outputs);
    }
  });
  it('the same seed gives the same stream; different seeds differ', () => {
    const a = seededRandom(7);
    const b = seededRandom(7);
    const c = seededRandom(8);
    const xa = Array.from({ length: 5 }, () => a.uniform());
    expect(Array.from({ length: 5 }, () => b.uniform())).toEqual(xa);
    expect(Array.from({ length: 5 }, () => c.uniform())).not.toEqual(xa);
  });
  it('uniforms lie in (0,1) with mean 1/2 and variance 1/12 within 5 standard errors (moments of U(0,1))', () => {
    const rng = seededRandom(2024);
    const n = 200_000;
    let s = 0;
    let s2 = 0;
    let outside = 0;
    for (let i = 0; i < n; i++) {
      const u = rng.uniform();
      if (!(u > 0 && u < 1)) outside++;
      s += u;
      s2 += u * u;
    }
    expect(outside).toBe(0);
    const mean = s / n;
    const variance = s2 / n - mean * mean;
    expect(Math.abs(mean - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    // Var of (U - 1/2)^2 estimator: (1/80 - 1/144)/n; 5 sigma.
    expect(Math.abs(variance - 1 / 12)).toBeLessThan(5 * Math.sqrt((1 / 80 - 1 / 144) / n));
  });
  it('normal deviates have mean 0 and variance 1 within 5 standard errors', () => {
    const rng = seededRandom(99);
    const n = 100_000;
    let s = 0;
    let s2 = 0;
    for (let i = 0; i < n; i++) {
      const z = rng.normal();
      s += z;
      s2 += z * z;
    }
    expect(Math.abs(s / n)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(s2 / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n)); // Var(z^2) = 2 for a standard normal
  });
  it('refuses a negative or fractional seed', () => {
    expect(() => seededRandom(-1)).toThrow(/seed/);
    expect(() => seededRandom(1.5)).toThrow(/seed/);
  });
});
