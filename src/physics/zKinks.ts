// Break points of the spectrum's z integral at the kinks of the ISCO cut (shared by the strain and
// energy forms of backgroundIntegral.ts). At observed frequency f the mass integral stops at
// x_cut(z) = xf - log10(1+z); the z integrand has a kink where x_cut crosses log10MMax (and
// log10MMin), at 1 + z_k = 10^(xf - x_edge). There its slope jumps by J = I_edge(z_k) |dx_cut/dz| =
// I_edge / (ln10 (1+z_k)), with I_edge the integrand per unit log10M at x_edge. The Gauss rule of a
// panel of width h and the integral of a ramp of slope J both lie in [0, J h^2 / 2], so that bounds
// what the kink costs; where it exceeds KINK_TOL of the z integral, the panel is integrated again on
// sub-panels split at z_k (common practice of composite quadrature: break points at known
// singularities; Davis & Rabinowitz 1984, Methods of Numerical Integration, ch. 2).
import { gaussLegendreRule } from './gaussLegendre';
import type { PanelledRule } from './adaptiveZRule';

/** A kink's bound J h^2 / 2 relative to the z integral above which the kink becomes a break point. */
export const KINK_TOL = 1e-6;

/** One frequency's z integral, as the integrating form sees it. */
export interface ZIntegrand {
  /** The z integrand at any z (0 beyond the cut), with the weights of the form (no quadrature weight). */
  at(z: number): number;
  /** The integrand per unit log10M at log10M = x and redshift z, same units (for J). */
  edge(z: number, x: number): number;
  /** Panel p's share of the z integral already summed. */
  panelSum(p: number): number;
}

/** Redshifts z_k in (zMin, zMax) of the kinks at log10MMax and log10MMin for xf = x_cut(z = 0). */
export function kinkRedshifts(xf: number, log10MMin: number, log10MMax: number, zMin: number, zMax: number): [number, number][] {
  const out: [number, number][] = [];
  for (const xEdge of [log10MMax, log10MMin]) {
    const zk = Math.pow(10, xf - xEdge) - 1;
    if (zk > zMin && zk < zMax) out.push([zk, xEdge]);
  }
  return out;
}

/** The z integral `total` on rule zr with the significant kinks as break points. */
export function withKinkBreaks(total: number, zr: PanelledRule, order: number, kinks: [number, number][], g: ZIntegrand): number {
  const edges = zr.edges;
  const nPanels = edges.length - 1;
  const byPanel = new Map<number, number[]>();
  for (const [zk, xEdge] of kinks) {
    let p = 0;
    while (p + 1 < nPanels && edges[p + 1] <= zk) p++;
    const h = edges[p + 1] - edges[p];
    const jump = Math.abs(g.edge(zk, xEdge)) / (Math.LN10 * (1 + zk));
    if (!(0.5 * jump * h * h > KINK_TOL * Math.abs(total))) continue;
    const list = byPanel.get(p) ?? [];
    list.push(zk);
    byPanel.set(p, list);
  }
  const unit = gaussLegendreRule(order);
  for (const [p, breaks] of byPanel) {
    const points = [edges[p], ...breaks.sort((x, y) => x - y), edges[p + 1]];
    let s = 0;
    for (let j = 0; j + 1 < points.length; j++) {
      const mid = 0.5 * (points[j] + points[j + 1]);
      const half = 0.5 * (points[j + 1] - points[j]);
      for (let i = 0; i < order; i++) s += half * unit.weights[i] * g.at(mid + half * unit.nodes[i]);
    }
    total += s - g.panelSum(p);
  }
  return total;
}
