import { describe, expect, it } from 'vitest';
import { brentRoot, findBracket, NoRootError } from '../../src/statistics/rootFinding';
import { reference } from './reference';

const FUNCTIONS: Record<string, (x: number) => number> = {
  'cos(x) - x': (x) => Math.cos(x) - x,
  'x^3 - 2x - 5': (x) => x ** 3 - 2 * x - 5,
  'exp(x) - 1e6': (x) => Math.exp(x) - 1e6,
};

describe("Brent's method (Brent 1973, ch. 4)", () => {
  it('finds the roots scipy.optimize.brentq finds (fixture), to 1e-14 relative', () => {
    for (const c of reference.brentq.cases) {
      const r = brentRoot(FUNCTIONS[c.f], c.a, c.b);
      expect(Math.abs(r.x - c.root) / c.root, c.f).toBeLessThan(1e-14);
    }
  });
  it('closed forms: cube root of 2, ln 1e6 = 6 ln 10', () => {
    expect(brentRoot((x) => x ** 3 - 2, 0, 5).x).toBeCloseTo(Math.cbrt(2), 14);
    expect(brentRoot((x) => Math.exp(x) - 1e6, 0, 40).x).toBeCloseTo(6 * Math.LN10, 13);
  });
  it('takes far fewer evaluations than bisection would on a smooth function (superlinear convergence)', () => {
    const r = brentRoot((x) => x ** 3 - 2, 0, 5);
    expect(r.evaluations).toBeLessThan(20); // bisection to 1e-15 on [0, 5] needs ~52
  });
  it('refuses an interval without a sign change', () => {
    expect(() => brentRoot((x) => x * x + 1, -1, 1)).toThrow(NoRootError);
  });
});

describe('bracket search', () => {
  it('widens in log space from a positive guess (root at 1e-9 from 1)', () => {
    const b = findBracket((x) => Math.log10(x) + 9, 1);
    expect(b.a).toBeGreaterThan(0);
    expect(b.a <= 1e-9 && 1e-9 <= b.b).toBe(true);
    const r = brentRoot((x) => Math.log10(x) + 9, b.a, b.b, { fa: b.fa, fb: b.fb });
    expect(r.x / 1e-9).toBeCloseTo(1, 12);
  });
  it('widens linearly for quantities that may be negative', () => {
    const f = (x: number) => x + 250;
    const b = findBracket(f, 3, { positive: false });
    expect(b.a <= -250 && -250 <= b.b).toBe(true);
  });
  it('says clearly when there is no solution in the range', () => {
    expect(() => findBracket((x) => x * x + 1, 2, { positive: false, lo: -10, hi: 10 })).toThrow(/no solution between -10 and 10/);
    expect(() => findBracket((x) => Math.sqrt(x) + 1, 1)).toThrow(/no solution/);
  });
  it('refuses a start outside the range or where the function has no value', () => {
    expect(() => findBracket((x) => x, 20, { lo: 0, hi: 10 })).toThrow(/outside the search range/);
    expect(() => findBracket(() => NaN, 1)).toThrow(/no finite value/);
  });
});
