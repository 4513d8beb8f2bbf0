// Root finding for goal seek: Brent's method (Brent 1973, Algorithms for Minimization without
// Derivatives, Prentice-Hall, ch. 4: bisection, secant and inverse quadratic interpolation) on a
// bracket, and a bracket search that widens geometrically (in log space for positive quantities).

export class NoRootError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'NoRootError';
  }
}

export interface RootResult {
  x: number;
  fx: number;
  evaluations: number;
}

/** Brent's zero finder on [a, b] where f(a), f(b) have opposite signs (or one is zero). */
export function brentRoot(
  f: (x: number) => number,
  a: number,
  b: number,
  opts: { xTol?: number; relTol?: number; maxEvaluations?: number; fa?: number; fb?: number } = {},
): RootResult {
  const xTol = opts.xTol ?? 0;
  const relTol = opts.relTol ?? 4 * Number.EPSILON;
  const maxEval = opts.maxEvaluations ?? 200;
  let evaluations = 0;
  const F = (x: number) => {
    evaluations++;
    const y = f(x);
    if (Number.isNaN(y)) throw new NoRootError(`the function is not a number at x = ${x}`);
    return y;
  };
  let fa = opts.fa ?? F(a);
  let fb = opts.fb ?? F(b);
  if (fa === 0) return { x: a, fx: 0, evaluations };
  if (fb === 0) return { x: b, fx: 0, evaluations };
  if (Math.sign(fa) === Math.sign(fb)) {
    throw new NoRootError(`no sign change between ${a} (f = ${fa}) and ${b} (f = ${fb})`);
  }
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  while (evaluations < maxEval) {
    if (Math.sign(fb) === Math.sign(fc)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * relTol * Math.abs(b) + 0.5 * xTol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) return { x: b, fx: fb, evaluations };
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      let p: number;
      let q: number;
      const s = fb / fa;
      if (a === c) {
        p = 2 * m * s; // secant
        q = 1 - s;
      } else {
        const qq = fa / fc; // inverse quadratic interpolation
        const r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = F(b);
  }
  throw new NoRootError(`no convergence after ${maxEval} evaluations (last x = ${b})`);
}

export interface BracketOptions {
  /** Search only positive x, widening by factors (log space). */
  positive?: boolean;
  /** Hard limits of the search. */
  lo?: number;
  hi?: number;
  /** Widening factor per step (default 2 in log space, i.e. x * 2^k, or 1.6 times the width linearly). */
  factor?: number;
  maxSteps?: number;
}

/**
 * Finds [a, b] with a sign change of f around x0, widening outwards on both sides.
 * Positive quantities are widened as x0 * factor^(+-k) (never crossing zero); others linearly.
 */
export function findBracket(
  f: (x: number) => number,
  x0: number,
  opts: BracketOptions = {},
): { a: number; b: number; fa: number; fb: number; evaluations: number } {
  const positive = opts.positive ?? x0 > 0;
  if (positive && !(x0 > 0)) throw new NoRootError(`the starting value must be positive for a search in log space, got ${x0}`);
  const lo = opts.lo ?? (positive ? 0 : -Infinity);
  const hi = opts.hi ?? Infinity;
  const maxSteps = opts.maxSteps ?? 60;
  let evaluations = 0;
  const F = (x: number) => {
    evaluations++;
    return f(x);
  };
  const clamp = (x: number) => Math.min(hi, Math.max(lo, x));
  const factor = opts.factor ?? 2;
  let a = x0;
  let b = x0;
  if (x0 < lo || x0 > hi) throw new NoRootError(`the starting value ${x0} lies outside the search range [${lo}, ${hi}]`);
  let fa = F(x0);
  if (!Number.isFinite(fa)) throw new NoRootError(`the function has no finite value at the starting value ${x0}`);
  if (fa === 0) return { a, b, fa, fb: fa, evaluations };
  let fb = fa;
  let width = x0 !== 0 ? Math.abs(x0) * 0.1 : 1;
  const tried: number[] = [x0];
  for (let k = 1; k <= maxSteps; k++) {
    const na = positive ? clamp(x0 / Math.pow(factor, k)) : clamp(x0 - width);
    const nb = positive ? clamp(x0 * Math.pow(factor, k)) : clamp(x0 + width);
    width *= 1.6;
    if (na !== a) {
      const fna = F(na);
      if (Number.isFinite(fna) && Math.sign(fna) !== Math.sign(fa)) return { a: na, b: a, fa: fna, fb: fa, evaluations };
      if (Number.isFinite(fna)) {
        a = na;
        fa = fna;
      }
    }
    if (nb !== b) {
      const fnb = F(nb);
      if (Number.isFinite(fnb) && Math.sign(fnb) !== Math.sign(fb)) return { a: b, b: nb, fa: fb, fb: fnb, evaluations };
      if (Number.isFinite(fnb)) {
        b = nb;
        fb = fnb;
      }
    }
    tried.push(na, nb);
    if (na === clamp(lo) && nb === clamp(hi)) break;
  }
  const min = Math.min(...tried);
  const max = Math.max(...tried);
  throw new NoRootError(`no solution between ${min} and ${max}: the function keeps the same sign (${Math.sign(fa) > 0 ? 'above' : 'below'} the target) everywhere tried`);
}
