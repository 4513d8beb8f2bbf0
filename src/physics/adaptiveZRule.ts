// The redshift rule of the spectrum integrals with error control: composite Gauss-Legendre on the
// given panels, where each panel is checked against the sum of the same rule on its two halves
// (the estimate of the coarse panel's error, as in adaptive quadrature: Davis & Rabinowitz 1984,
// Methods of Numerical Integration, ch. 6). A panel whose estimate exceeds tol x the integral is
// replaced by its halves, recursively, so a non-smooth point (a power z^a with a < 2 at z = 0, a kink)
// gets small panels while a smooth integrand keeps the plain composite nodes unchanged.
import { gaussLegendreRule } from './gaussLegendre';

export interface PanelledRule {
  nodes: Float64Array;
  weights: Float64Array;
  /** Panel edges, ascending (panels + 1 values). */
  edges: Float64Array;
  /** First node of each panel (panels + 1 values; the last is nodes.length). */
  starts: Int32Array;
  /** The integrand g at each node. */
  values: Float64Array;
}

/** Deepest halving of a base panel, and the most panels in all. */
const MAX_DEPTH = 10;
const MAX_PANELS = 64;

/**
 * Composite order-point Gauss-Legendre rule on [a, b] starting from `panels` equal panels, refined
 * where |I(panel) - I(left half) - I(right half)| > tol x sum |I(panel)| for the integrand g.
 * g is evaluated once at every node of every panel tried; its values at the nodes kept are returned.
 */
export function adaptiveZRule(a: number, b: number, panels: number, order: number, g: (z: number) => number, tol: number): PanelledRule {
  const unit = gaussLegendreRule(order);
  // a panel tried: its edges, its rule's sum and g at its nodes
  type Panel = { lo: number; hi: number; sum: number; values: Float64Array };
  const panelOf = (lo: number, hi: number): Panel => {
    const mid = 0.5 * (lo + hi);
    const half = 0.5 * (hi - lo);
    const values = new Float64Array(order);
    let s = 0;
    for (let i = 0; i < order; i++) s += unit.weights[i] * (values[i] = g(mid + half * unit.nodes[i]));
    return { lo, hi, sum: half * s, values };
  };
  const h = (b - a) / panels;
  const base: Panel[] = [];
  let scale = 0;
  for (let p = 0; p < panels; p++) {
    const panel = panelOf(a + p * h, p === panels - 1 ? b : a + (p + 1) * h);
    base.push(panel);
    scale += Math.abs(panel.sum);
  }
  const accepted: Panel[] = [];
  let count = panels;
  const refine = (panel: Panel, depth: number): void => {
    if (depth < MAX_DEPTH && count < MAX_PANELS) {
      const mid = 0.5 * (panel.lo + panel.hi);
      const left = panelOf(panel.lo, mid);
      const right = panelOf(mid, panel.hi);
      if (Math.abs(left.sum + right.sum - panel.sum) > tol * scale) {
        count++;
        refine(left, depth + 1);
        refine(right, depth + 1);
        return;
      }
    }
    accepted.push(panel);
  };
  for (const panel of base) refine(panel, 0);

  const n = accepted.length;
  const nodes = new Float64Array(n * order);
  const weights = new Float64Array(n * order);
  const values = new Float64Array(n * order);
  const edges = new Float64Array(n + 1);
  const starts = new Int32Array(n + 1);
  for (let p = 0; p < n; p++) {
    const { lo, hi } = accepted[p];
    const mid = 0.5 * (lo + hi);
    const half = 0.5 * (hi - lo);
    edges[p] = lo;
    starts[p] = p * order;
    values.set(accepted[p].values, p * order);
    for (let i = 0; i < order; i++) {
      nodes[p * order + i] = mid + half * unit.nodes[i];
      weights[p * order + i] = half * unit.weights[i];
    }
  }
  edges[n] = b;
  starts[n] = n * order;
  return { nodes, weights, edges, starts, values };
}
