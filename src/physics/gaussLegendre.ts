// Gauss-Legendre quadrature rules (Abramowitz & Stegun 1964, Handbook of Mathematical Functions, 25.4.29),
// nodes found by Newton's method on the three-term Legendre recurrence; cached per order.

export interface QuadratureRule {
  /** Nodes on [-1, 1]. */
  nodes: Float64Array;
  /** Weights summing to 2. */
  weights: Float64Array;
}

const cache = new Map<number, QuadratureRule>();

/** The n-point Gauss-Legendre rule on [-1, 1] (exact for polynomials of degree 2n - 1). */
export function gaussLegendreRule(n: number): QuadratureRule {
  if (!Number.isInteger(n) || n < 1 || n > 1000) throw new RangeError(`Gauss-Legendre order must be an integer in [1, 1000], got ${n}`);
  const cached = cache.get(n);
  if (cached) return cached;
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < Math.ceil(n / 2); i++) {
    // Initial guess: Tricomi's asymptotic form of the i-th root.
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let dp = 1;
    for (let iter = 0; iter < 100; iter++) {
      // P_n(x) and P_n'(x) by the recurrence (k+1) P_{k+1} = (2k+1) x P_k - k P_{k-1}.
      let p0 = 1;
      let p1 = x;
      for (let k = 1; k < n; k++) {
        const p2 = ((2 * k + 1) * x * p1 - k * p0) / (k + 1);
        p0 = p1;
        p1 = p2;
      }
      const pn = n === 1 ? x : p1;
      const pnm1 = n === 1 ? 1 : p0;
      dp = (n * (x * pn - pnm1)) / (x * x - 1);
      const dx = pn / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-16) break;
    }
    nodes[i] = -x;
    nodes[n - 1 - i] = x;
    const w = 2 / ((1 - x * x) * dp * dp);
    weights[i] = w;
    weights[n - 1 - i] = w;
  }
  const rule = { nodes, weights };
  cache.set(n, rule);
  return rule;
}

/**
 * Composite Gauss-Legendre nodes and weights on [a, b]: `panels` equal panels of `order` points each.
 * Returns empty arrays when b <= a.
 */
export function compositeNodes(a: number, b: number, panels: number, order: number): QuadratureRule {
  if (!(b > a)) return { nodes: new Float64Array(0), weights: new Float64Array(0) };
  const rule = gaussLegendreRule(order);
  const nodes = new Float64Array(panels * order);
  const weights = new Float64Array(panels * order);
  const h = (b - a) / panels;
  for (let p = 0; p < panels; p++) {
    const mid = a + (p + 0.5) * h;
    for (let i = 0; i < order; i++) {
      nodes[p * order + i] = mid + 0.5 * h * rule.nodes[i];
      weights[p * order + i] = 0.5 * h * rule.weights[i];
    }
  }
  return { nodes, weights };
}

/**
 * Sum of weight x f(node) over the rule compositeNodes(a, b, panels, order) would return, in the same
 * order and with the same arithmetic (so bit for bit the same), without allocating the rule's arrays;
 * 0 when b <= a. For loops that lay a new rule per point of an outer integral.
 */
export function compositeSum(a: number, b: number, panels: number, order: number, f: (x: number) => number): number {
  if (!(b > a)) return 0;
  const rule = gaussLegendreRule(order);
  const h = (b - a) / panels;
  let s = 0;
  for (let p = 0; p < panels; p++) {
    const mid = a + (p + 0.5) * h;
    for (let i = 0; i < order; i++) s += 0.5 * h * rule.weights[i] * f(mid + 0.5 * h * rule.nodes[i]);
  }
  return s;
}

/** Integral of f over [a, b] with a composite rule (a convenience for one-off integrals). */
export function integrate(f: (x: number) => number, a: number, b: number, panels = 4, order = 16): number {
  const { nodes, weights } = compositeNodes(a, b, panels, order);
  let s = 0;
  for (let i = 0; i < nodes.length; i++) s += weights[i] * f(nodes[i]);
  return s;
}
