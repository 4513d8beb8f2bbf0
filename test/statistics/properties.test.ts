// Property tests (fast-check): invariants that must hold for any valid input.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { normalCdf, normalQuantile } from '../../src/statistics/normal';
import { measurementCdf, measurementFromInterval, measurementQuantileLog10 } from '../../src/statistics/measurement';
import { hpdThresholds } from '../../src/statistics/credibleRegion';
import { binsFromCsv } from '../../src/statistics/binnedSpectrum';
import { brentRoot } from '../../src/statistics/rootFinding';

const runs = { numRuns: 200, seed: 20261201 };

describe('properties', () => {
  it('Phi(Phi^-1(p)) = p for p in (0,1)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-300, max: 1 - 1e-12, noNaN: true }), (p) => {
        const back = normalCdf(normalQuantile(p));
        return Math.abs(back - p) <= 1e-12 * Math.max(p, 1e-3) + 1e-300;
      }),
      runs,
    );
  });
  it('a measurement from any valid interval reproduces its ends and median, and its cdf inverts its quantile', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -16, max: -13, noNaN: true }),
        fc.double({ min: 0.01, max: 1, noNaN: true }),
        fc.double({ min: 0.01, max: 1, noNaN: true }),
        fc.double({ min: 0.05, max: 0.995, noNaN: true }),
        fc.double({ min: 0.001, max: 0.999, noNaN: true }),
        (lm, dlo, dhi, level, p) => {
          const med = 10 ** lm;
          const m = measurementFromInterval(med, med / 10 ** dlo, med * 10 ** dhi, level);
          const lo = 10 ** measurementQuantileLog10(m, 0.5 - level / 2);
          const hi = 10 ** measurementQuantileLog10(m, 0.5 + level / 2);
          const x = 10 ** measurementQuantileLog10(m, p);
          return (
            Math.abs(lo / (med / 10 ** dlo) - 1) < 1e-9 &&
            Math.abs(hi / (med * 10 ** dhi) - 1) < 1e-9 &&
            Math.abs(measurementCdf(m, x) - p) < 1e-9
          );
        },
      ),
      runs,
    );
  });
  it('HPD regions enclose at least their level, larger levels need lower thresholds', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 2, maxLength: 300 }), (xs) => {
        if (xs.every((x) => x === 0)) return true;
        const r = hpdThresholds(Float64Array.from(xs), [0.5, 0.68, 0.95]);
        const inside = (t: number) => r.posterior.reduce((s, v) => (v >= t ? s + v : s), 0);
        return (
          r.enclosed.every((e, k) => e >= [0.5, 0.68, 0.95][k] - 1e-12) &&
          r.thresholds[0] >= r.thresholds[1] &&
          r.thresholds[1] >= r.thresholds[2] &&
          inside(r.thresholds[2]) >= 0.95 - 1e-12
        );
      }),
      runs,
    );
  });
  it('CSV written from any valid bins reads back to the same numbers', () => {
    const row = fc
      .tuple(fc.double({ min: 1e-3, max: 1, noNaN: true }), fc.double({ min: 1e-16, max: 1e-13, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 1, max: 10, noNaN: true }))
      .map(([df, v, a, b]) => ({ df, v, lo: v * a, hi: v * b }));
    fc.assert(
      fc.property(fc.array(row, { minLength: 1, maxLength: 20 }), (rows) => {
        let f = 1;
        const text = ['# property test', 'f_nHz;hc;lo;hi', ...rows.map((r) => `${(f += r.df)};${r.v};${r.lo};${r.hi}`)].join('\n');
        const b = binsFromCsv(text, 0.9);
        return rows.every((r, i) => b.value[i] === r.v && b.lower[i] === r.lo && b.upper[i] === r.hi);
      }),
      runs,
    );
  });
  it("Brent finds the root of any increasing cubic bracketed around it", () => {
    fc.assert(
      fc.property(fc.double({ min: -100, max: 100, noNaN: true }), fc.double({ min: 0.01, max: 10, noNaN: true }), (root, s) => {
        const fun = (x: number) => s * (x - root) + (x - root) ** 3;
        const r = brentRoot(fun, root - 7, root + 13);
        return Math.abs(r.x - root) <= 1e-12 * Math.max(1, Math.abs(root));
      }),
      runs,
    );
  });
});
