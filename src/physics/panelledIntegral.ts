// Int_a^h f for upper limits h in [a, b] on one fixed set of panels: [a, b] split into equal panels,
// those below h summed whole and the one holding h up to h, each by an order-point Gauss-Legendre rule
// (Abramowitz & Stegun 1964, Handbook of Mathematical Functions, 25.4.29). The same nodes whatever h, so
// the whole panels' sums of one f can be kept for many h (cumulativeIntegral).
import { gaussLegendreRule } from './gaussLegendre';

/** Int_lo^hi f by one order-point Gauss-Legendre rule. */
function panelSum(f: (x: number) => number, lo: number, hi: number, order: number): number {
  const rule = gaussLegendreRule(order);
  const mid = 0.5 * (lo + hi);
  const half = 0.5 * (hi - lo);
  let s = 0;
  for (let i = 0; i < order; i++) s += rule.weights[i] * f(mid + half * rule.nodes[i]);
  return half * s;
}

/** The number of whole panels of width `width` from a that lie below top (at most `panels`). */
function wholePanels(a: number, width: number, panels: number, top: number): number {
  let k = 0;
  while (k < panels && a + (k + 1) * width <= top) k++;
  return k;
}

/** `whole` (the sum over the first k panels) plus the part of panel k below top. */
function withPartialPanel(f: (x: number) => number, whole: number, a: number, width: number, panels: number, order: number, k: number, top: number): number {
  const start = a + k * width;
  return k < panels && top > start ? whole + panelSum(f, start, top, order) : whole;
}

/** Int_a^h f on `panels` equal panels of [a, b] (0 when h <= a; h is taken as b above b). */
export function panelledIntegral(f: (x: number) => number, a: number, b: number, panels: number, order: number, h: number): number {
  if (!(h > a)) return 0;
  const width = (b - a) / panels;
  const top = Math.min(h, b);
  const k = wholePanels(a, width, panels, top);
  let s = 0;
  for (let p = 0; p < k; p++) s += panelSum(f, a + p * width, a + (p + 1) * width, order);
  return withPartialPanel(f, s, a, width, panels, order, k, top);
}

/** panelledIntegral of one f for many h, its whole panels summed once (the same numbers, bit for bit). */
export function cumulativeIntegral(f: (x: number) => number, a: number, b: number, panels: number, order: number): (h: number) => number {
  const width = (b - a) / panels;
  const below = new Float64Array(panels + 1); // below[k]: panels 0 .. k-1, added in order
  for (let k = 0; k < panels; k++) below[k + 1] = below[k] + panelSum(f, a + k * width, a + (k + 1) * width, order);
  return (h) => {
    if (!(h > a)) return 0;
    const top = Math.min(h, b);
    const k = wholePanels(a, width, panels, top);
    return withPartialPanel(f, below[k], a, width, panels, order, k, top);
  };
}
