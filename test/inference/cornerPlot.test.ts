import { describe, expect, it } from 'vitest';
import { cornerModel } from '../../src/statistics/cornerPlot';
import { cornerSvg } from '../../src/cli/cornerSvg';
import { seededRandom } from '../../src/statistics/prng';
import { normalCdf } from '../../src/statistics/normal';

describe('corner plot', () => {
  it('2-D standard normal: the cells inside the 68.27% and 95.45% contours hold that much true probability, within 0.02 (cell masses from the normal cdf, closed form)', () => {
    const rng = seededRandom(2);
    const N = 200_000;
    const x = Float64Array.from({ length: N }, () => rng.normal());
    const y = Float64Array.from({ length: N }, () => rng.normal());
    const m = cornerModel([{ name: 'x', unit: '', log: false, draws: x }, { name: 'y', unit: '', log: false, draws: y }], 40);
    expect(m.axes[0].counts.reduce((s, c) => s + c, 0)).toBeGreaterThan(0.98 * N);
    expect(Math.abs(m.axes[0].median)).toBeLessThan(0.01);
    const p = m.pairs[0];
    const ex = m.axes[0].edges;
    const ey = m.axes[1].edges;
    m.levels.forEach((level, k) => {
      let mass = 0;
      for (let by = 0; by < m.bins; by++) {
        for (let bx = 0; bx < m.bins; bx++) {
          if (p.counts[by * m.bins + bx] < p.thresholds[k]) continue;
          mass += (normalCdf(ex[bx + 1]) - normalCdf(ex[bx])) * (normalCdf(ey[by + 1]) - normalCdf(ey[by]));
        }
      }
      expect(Math.abs(mass - level), `level ${level}: true mass ${mass}`).toBeLessThan(0.02);
    });
  });
  it('log axes bin in log10 x; the SVG names each axis and marks the medians', () => {
    const rng = seededRandom(3);
    const r = Float64Array.from({ length: 5000 }, () => 10 ** (-3 + 0.3 * rng.normal()));
    const s = Float64Array.from({ length: 5000 }, () => 0.5 + 0.1 * rng.normal());
    const m = cornerModel([{ name: 'rate_norm', unit: 'Mpc^-3 Gyr^-1', log: true, draws: r }, { name: 'slope', unit: '', log: false, draws: s }]);
    expect(Math.abs(m.axes[0].median + 3)).toBeLessThan(0.02);
    const svg = cornerSvg(m, 'test');
    expect(svg).toMatch(/log10 rate_norm \[Mpc\^-3 Gyr\^-1\]: median 0\.00/);
    expect(svg.match(/<path /g)!.length).toBe(2);
    expect(svg.match(/<circle /g)!.length).toBe(1);
  });
});
