// The grid helpers of the galaxy route's scatter sums (src/physics/gaussianOnGrid.ts) and the q rule with
// break points (src/physics/massRatioRule.ts), against closed forms.
import { describe, expect, it } from 'vitest';
import { booleWeights, gaussianOnGrid } from '../../src/physics/gaussianOnGrid';
import { compositeNodes } from '../../src/physics/gaussLegendre';
import { massRatioRule } from '../../src/physics/massRatioRule';
import type { BinaryPopulation } from '../../src/physics/populationTypes';

describe('gaussianOnGrid', () => {
  it('matches exp(-(x - j h)^2 / (2 sigma^2)) / (sqrt(2 pi) sigma) term by term to 1e-13 over 12 sigma (closed form)', () => {
    const sigma = 0.3;
    const h = 0.0675;
    const x = 9.4321;
    const j0 = Math.ceil((x - 6 * sigma) / h);
    const n = Math.floor((x + 6 * sigma) / h) - j0 + 1;
    const out = new Float64Array(n);
    gaussianOnGrid(x, h, j0, n, sigma, out);
    for (let i = 0; i < n; i++) {
      const d = x - (j0 + i) * h;
      const want = Math.exp((-0.5 * d * d) / (sigma * sigma)) / (Math.sqrt(2 * Math.PI) * sigma);
      expect(Math.abs(out[i] / want - 1), `node ${i}: want ${want}, got ${out[i]}`).toBeLessThan(1e-13);
    }
  });
  it('its trapezoid sum is 1 to 1e-12 at 4 steps per sigma (the trapezoid rule on a Gaussian; aliasing error 2 exp(-2 pi^2 16))', () => {
    const out = new Float64Array(200);
    const h = 0.3 / 4;
    gaussianOnGrid(0.0123, h, -100, 200, 0.3, out);
    expect(Math.abs(h * out.reduce((s, v) => s + v, 0) - 1)).toBeLessThan(1e-12);
  });
});

describe("Boole's rule", () => {
  it('integrates x^5 on [0.2, 1.3] exactly (degree 5, Abramowitz & Stegun 25.4.14) with 8 intervals', () => {
    const k = 8;
    const h = 1.1 / k;
    const w = booleWeights(k, h);
    let s = 0;
    for (let i = 0; i <= k; i++) s += w[i] * Math.pow(0.2 + i * h, 5);
    const exact = (Math.pow(1.3, 6) - Math.pow(0.2, 6)) / 6;
    expect(Math.abs(s / exact - 1)).toBeLessThan(1e-14);
  });
  it('refuses a number of intervals that is not a multiple of 4', () => {
    expect(() => booleWeights(6, 0.1)).toThrow(/multiple of 4/);
  });
});

describe('massRatioRule', () => {
  const pop = (qBreaks?: number[]): BinaryPopulation => ({ zMin: 0, zMax: 1, log10MMin: 6, log10MMax: 10, qMin: 0.01, qMax: 1, qBreaks, density: () => 1 });
  it('without breaks it is compositeNodes itself', () => {
    const a = massRatioRule(pop(), 2, 6);
    const b = compositeNodes(0.01, 1, 2, 6);
    expect(Array.from(a.nodes)).toEqual(Array.from(b.nodes));
    expect(Array.from(a.weights)).toEqual(Array.from(b.weights));
  });
  it('with a break at the kink of |q - 0.3| it integrates that function to rounding (closed form (0.29^2 + 0.7^2) / 2); one panel leaves more than 1e-4', () => {
    const f = (q: number) => Math.abs(q - 0.3);
    const exact = (0.29 * 0.29 + 0.7 * 0.7) / 2;
    const sum = (r: { nodes: Float64Array; weights: Float64Array }) => r.nodes.reduce((s, q, i) => s + r.weights[i] * f(q), 0);
    expect(Math.abs(sum(massRatioRule(pop([0.3, 5]), 1, 6)) / exact - 1)).toBeLessThan(1e-14);
    expect(Math.abs(sum(massRatioRule(pop(), 1, 6)) / exact - 1)).toBeGreaterThan(1e-4);
  });
});
