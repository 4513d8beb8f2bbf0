// The eccentric harmonic-sum factor Phi(x = f_r/f0; e0) (Enoki & Nagashima 2007, PTP 117, 241) and its table.
import { describe, expect, it } from 'vitest';
import { HarmonicSumTable, harmonicSumDirect } from '../../src/physics/eccentricHarmonicSum';
import { eccentricityEnhancement, harmonicCut, harmonicPower } from '../../src/physics/petersMathews';
import fixture from '../reference/harmonic_sum.json';

/** Park & Miller 1988 (CACM 31, 1192) minimal standard generator, seeded: reproducible test points. */
function parkMiller(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

describe('Phi by direct summation against an independent scipy implementation (' + fixture.library_version + ')', () => {
  it('with the harmonic cut at tolerance 1e-12: agrees to 1e-12 (absolute; Phi is of order 1 or smaller)', () => {
    for (const run of fixture.runs) {
      const n = harmonicCut(run.e0, 1e-12).nMax;
      for (const p of run.points) {
        const v = harmonicSumDirect(p.x, run.e0, n);
        expect(Math.abs(v - p.phi), `e0 ${run.e0}, x ${p.x}: expected ${p.phi}, got ${v}`).toBeLessThan(1e-12);
      }
    }
  });

  it('with the default cut (1e-7) the error stays within the stated bound (2/N)^(2/3) x 1e-7', () => {
    for (const run of fixture.runs) {
      const n = harmonicCut(run.e0, 1e-7).nMax;
      const bound = Math.pow(2 / n, 2 / 3) * 1e-7 + 1e-14;
      for (const p of run.points) expect(Math.abs(harmonicSumDirect(p.x, run.e0, n) - p.phi)).toBeLessThanOrEqual(bound);
    }
  });

  it('the bound assumes g(n, e)/F(e) grows with e for harmonics above the cut: checked on a grid of e below e0', () => {
    for (const e0 of [0.5, 0.9]) {
      const n0 = harmonicCut(e0, 1e-7).nMax;
      for (let n = n0 + 1; n <= n0 + 40; n += 3) {
        let prev = 0;
        for (let k = 1; k <= 20; k++) {
          const e = (e0 * k) / 20;
          const v = harmonicPower(n, e) / eccentricityEnhancement(e);
          expect(v).toBeGreaterThanOrEqual(prev);
          prev = v;
        }
      }
    }
  });
});

describe('HarmonicSumTable', () => {
  const tables = new Map<number, HarmonicSumTable>();
  const table = (e0: number) => tables.get(e0) ?? tables.set(e0, new HarmonicSumTable(e0)).get(e0)!;

  it('reproduces the scipy fixture within 3e-5 below x = 64 (integer intervals) and 1.5e-3 above (log grid)', () => {
    for (const run of fixture.runs) {
      for (const p of run.points) {
        const v = table(run.e0).at(p.x);
        const err = p.phi === 0 ? Math.abs(v) : Math.abs(v / p.phi - 1);
        expect(err, `e0 ${run.e0}, x ${p.x}: expected ${p.phi}, got ${v}`).toBeLessThan(p.x < 64 ? 3e-5 : 1.5e-3);
      }
    }
  });

  it('on [16, 64), where it interpolates the harmonic sums at the integers, reproduces the scipy fixture within 3e-7', () => {
    for (const run of fixture.smooth_runs) {
      const t = table(run.e0);
      for (const p of run.points) {
        const v = t.at(p.x);
        expect(Math.abs(v / p.phi - 1), `e0 ${run.e0}, x ${p.x}: expected ${p.phi}, got ${v}`).toBeLessThan(3e-7);
      }
    }
  });

  it('matches direct summation at 150 seeded random x in [1, 1e6] per e0 within the same bounds', () => {
    for (const e0 of [0.3, 0.9]) {
      const rand = parkMiller(20070117 + Math.round(e0 * 10));
      const t = table(e0);
      for (let i = 0; i < 150; i++) {
        const x = Math.exp(Math.log(1e6) * rand());
        const d = harmonicSumDirect(x, e0, t.harmonicsKept[0]);
        const err = Math.abs(t.at(x) / d - 1);
        expect(err, `e0 ${e0}, x ${x}: direct ${d}, table ${t.at(x)}`).toBeLessThan(x < 64 ? 3e-5 : 1.5e-3);
      }
    }
  });

  it('averaged over ln x on [64, 256] (as a population average does) the log-grid error is below 1e-5', () => {
    const e0 = 0.9;
    const t = table(e0);
    let sumTable = 0;
    let sumDirect = 0;
    const points = 600;
    for (let i = 0; i < points; i++) {
      const x = 64 * Math.pow(4, (i + 0.5) / points);
      sumTable += t.at(x);
      sumDirect += harmonicSumDirect(x, e0, t.harmonicsKept[0]);
    }
    expect(Math.abs(sumTable / sumDirect - 1)).toBeLessThan(1e-5);
  });

  it('circular limit e0 = 0: Phi is exactly 0 below x = 2 and exactly 1 from x = 2 on (Peters & Mathews 1963: only n = 2 radiates)', () => {
    const t = table(0);
    for (const x of [0.5, 1, 1.5, 1.999999]) expect(t.at(x)).toBe(0);
    for (const x of [2, 2.0001, 3.3, 63.9, 64, 100, 1e4, 1e9]) expect(t.at(x)).toBe(1);
  });

  it('at each integer x = k below 64 (where harmonic k switches on) the table gives the direct sum over n <= k, and just below it the sum over n < k (to 1e-13; the table builds both in one pass)', () => {
    for (const e0 of [0.3, 0.6]) {
      const t = table(e0);
      const nMax = t.harmonicsKept[0];
      for (let k = 2; k < 64; k++) {
        expect(Math.abs(t.at(k) - harmonicSumDirect(k, e0, nMax)), `e0 = ${e0}, x = ${k}`).toBeLessThan(1e-13);
        expect(Math.abs(t.at(k * (1 - 1e-15)) - harmonicSumDirect(k, e0, nMax, k - 1)), `e0 = ${e0}, x just below ${k}`).toBeLessThan(1e-13);
      }
    }
  });

  it('a mixture of e0 values is the weighted sum of the single tables (linearity, to rounding)', () => {
    const mix = new HarmonicSumTable({ values: [0.3, 0.9], weights: [0.25, 0.75] });
    for (const x of [1.2, 5.5, 70, 900, 3e6]) {
      const expected = 0.25 * table(0.3).at(x) + 0.75 * table(0.9).at(x);
      expect(Math.abs(mix.at(x) - expected)).toBeLessThan(1e-12);
    }
  });

  it('the log grid grows on demand, and values do not depend on the order of queries', () => {
    const far = new HarmonicSumTable(0.6);
    const near = new HarmonicSumTable(0.6);
    const xs = [70, 300, 5000, 2e4, 1e7];
    const fromFar = [...xs].reverse().map((x) => far.at(x)).reverse();
    expect(near.at(100)).toBeGreaterThan(0);
    const sizeBefore = near.size;
    const fromNear = xs.map((x) => near.at(x));
    expect(near.size).toBeGreaterThan(sizeBefore);
    for (let i = 0; i < xs.length; i++) expect(fromNear[i]).toBe(fromFar[i]);
  });

  it('rejects e0 outside [0, 1) and mismatched weights', () => {
    expect(() => new HarmonicSumTable(1)).toThrow(/e0 must lie in \[0, 1\), got 1/);
    expect(() => new HarmonicSumTable({ values: [0.1], weights: [] })).toThrow(/equal length/);
  });
});
