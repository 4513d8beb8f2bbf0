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

/** Int_a^h f on `panels` equal panels of [a, b] (0 when h <= a; h is taken as b above b). */
export function panelledIntegral(f: (x: number) => number, a: number, b: number, panels: number, order: number, h: number): number {
  if (!(h > a)) return 0;
  const width = (b - a) / panels;
  const top = Math.min(h, b);
  let s = 0;
  let k = 0;
  for (; k < panels && a + (k + 1) * width <= top; k++) s += panelSum(f, a + k * width, a + (k + 1) * width, order);
  const start = a + k * width;
  return k < panels && top > start ? s + panelSum(f, start, top, order) : s;
}

/** panelledIntegral of one f for many h, its whole panels summed once (the same numbers, bit for bit). */
export function cumulativeIntegral(f: (x: number) => number, a: number, b: number, panels: number, order: number): (h: number) => number {
  const width = (b - a) / panels;
  const below = new Float64Array(panels + 1); // below[k]: panels 0 .. k-1, added in order
  for (let k = 0; k < panels; k++) below[k + 1] = below[k] + panelSum(f, a + k * width, a + (k + 1) * width, order);
  return (h) => {
    if (!(h > a)) return 0;
    const top = Math.min(h, b);
    let k = 0;
    while (k < panels && a + (k + 1) * width <= top) k++;
    const start = a + k * width;
    return k < panels && top > start ? below[k] + panelSum(f, start, top, order) : below[k];
  };
}
