// The mass nodes of one redshift node, cut at log10M = xCut (composite Gauss-Legendre, as
// backgroundIntegral.ts): the panels of the uncut rule that lie wholly below xCut (their nodes are
// shared by every frequency, so values on them are cached), and one panel [edge, xCut] laid anew for
// the panel xCut falls in.
import { compositeNodes, gaussLegendreRule, type QuadratureRule } from './gaussLegendre';

export class MassPanels {
  readonly base: QuadratureRule;
  readonly width: number;
  /** The order-point rule on [-1, 1]. */
  readonly unit: QuadratureRule;
  constructor(
    readonly lo: number,
    readonly hi: number,
    readonly panels: number,
    readonly order: number,
  ) {
    this.base = compositeNodes(lo, hi, panels, order);
    this.width = (hi - lo) / panels;
    this.unit = gaussLegendreRule(order);
    this.scratch = { nodes: new Float64Array(order), weights: new Float64Array(order) };
  }
  /** Number of whole base panels below xCut. */
  wholePanels(xCut: number): number {
    if (xCut >= this.hi) return this.panels;
    return Math.min(this.panels, Math.max(0, Math.floor((xCut - this.lo) / this.width)));
  }
  /**
   * The partial panel from the last whole panel's edge up to xCut (empty if none). The rule returned
   * is scratch space, overwritten by the next call.
   */
  partialPanel(xCut: number): QuadratureRule {
    const p = this.wholePanels(xCut);
    const a = this.lo + p * this.width;
    const b = Math.min(xCut, this.hi);
    if (p === this.panels || !(b > a)) return EMPTY_RULE;
    const mid = 0.5 * (a + b);
    const half = 0.5 * (b - a);
    for (let i = 0; i < this.order; i++) {
      this.scratch.nodes[i] = mid + half * this.unit.nodes[i];
      this.scratch.weights[i] = half * this.unit.weights[i];
    }
    return this.scratch;
  }
  private readonly scratch: QuadratureRule;
}

export const EMPTY_RULE: QuadratureRule = { nodes: new Float64Array(0), weights: new Float64Array(0) };
