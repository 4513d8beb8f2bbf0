// The app's corner-plot panels (web/inference/cornerPlotModels.ts) put the contours where the draws
// are: for a correlated 2-D normal, the highest-density region holding probability p is the ellipse of
// Mahalanobis radius r^2 = -2 ln(1 - p) (the chi-square distribution with 2 degrees of freedom,
// closed form; common practice, no source), so the drawn 68.27% / 95.45% contours must lie near
// r^2 = 2.296 / 6.180, in the plotted coordinates (log10 x for a parameter sampled in ln x).
import { describe, expect, it } from 'vitest';
import { cornerModel } from '../../src/statistics/cornerPlot';
import { seededRandom } from '../../src/statistics/prng';
import { cornerHistogramModel, cornerPairModel } from '../../web/inference/cornerPlotModels';

const N = 200_000;
const RHO = 0.6;
const [MX, SX, MY, SY] = [2, 0.5, -3, 0.25];

function draws(): { x: Float64Array; y: Float64Array } {
  const rng = seededRandom(11);
  const x = new Float64Array(N);
  const y = new Float64Array(N);
  for (let i = 0; i < N; i++) {
    const a = rng.normal();
    const b = rng.normal();
    x[i] = MX + SX * a;
    // y is drawn in log10 and stored as the value itself: the corner plot bins it in log10.
    y[i] = 10 ** (MY + SY * (RHO * a + Math.sqrt(1 - RHO * RHO) * b));
  }
  return { x, y };
}

/** Mahalanobis r^2 of a point (x, log10 y) of the 2-D normal above. */
function r2(x: number, ly: number): number {
  const u = (x - MX) / SX;
  const v = (ly - MY) / SY;
  return (u * u - 2 * RHO * u * v + v * v) / (1 - RHO * RHO);
}

describe('corner plot panels', () => {
  const { x, y } = draws();
  const m = cornerModel([
    { name: 'a', unit: '', log: false, draws: x },
    { name: 'b', unit: 'Msun', log: true, draws: y },
  ]);

  it('draws the 68.27% and 95.45% contours of a correlated normal on its ellipses r^2 = -2 ln(1 - p)', () => {
    const pair = cornerPairModel(m, m.pairs[0]);
    expect(pair.y.label).toBe('log10 b (Msun)');
    for (const [id, level] of [['contour-0', m.levels[0]], ['contour-1', m.levels[1]]] as const) {
      const s = pair.series.find((q) => q.id === id)!;
      const want = -2 * Math.log(1 - level);
      // Every contour point, not only their median: a shift of the grid moves one side out and the other in.
      const off = s.x.map((px, i) => Math.abs(r2(px, s.y[i]) - want) / want).filter(Number.isFinite).sort((p, q) => p - q);
      const p90 = off[Math.floor(0.9 * off.length)];
      // 30 bins per axis over the 0.5%-99.5% range: cells of about 0.17 sigma, so some per cent in r^2 (a grid shifted by one cell gives 0.26).
      expect(p90, `${id}: 90% of contour points within ${p90} of the ellipse r^2 = ${want}`).toBeLessThan(0.12);
    }
    const med = pair.series.find((q) => q.id === 'median')!;
    expect(Math.abs(med.x[0] - MX)).toBeLessThan(0.02);
    expect(Math.abs(med.y[0] - MY)).toBeLessThan(0.01);
  });

  it('draws each histogram as steps over its bins with the median inside them', () => {
    const h = cornerHistogramModel(m, 0);
    const steps = h.series.find((q) => q.id === 'histogram')!;
    expect(steps.x).toHaveLength(2 * m.bins);
    expect(steps.y.reduce((a, b) => a + b, 0) / 2).toBe(m.axes[0].counts.reduce((a, b) => a + b, 0));
    const median = h.series.find((q) => q.id === 'median')!;
    expect(median.x[0]).toBe(m.axes[0].median);
  });
});
