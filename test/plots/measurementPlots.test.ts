// The free-spectrum and (A, gamma) plot models against independent computations: violin densities
// against scipy.stats.gaussian_kde (test/reference/kde_reference.json, written by generate_kde.py),
// violin outlines that integrate to one per bin, the axis conventions of docs/freeSpectrum.md computed
// from the raw samples, highest-density contours against a known 2-D Gaussian (closed form), and the
// fitted point of a pure power law.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { violinDensity, violinOutline } from '../../web/plots/violins';
import { axisMap, freeSpectrumPlotModel, freeSpectrumViolins, type FreeSpectrumAxis } from '../../web/plots/freeSpectrumPlotModel';
import { amplitudeGammaPlotModel, posteriorContour, regionOf } from '../../web/plots/amplitudeGammaPlotModel';
import { fitCurve } from '../../web/plots/sheetAmplitudeGammaModel';
import { freeSpectra } from '../../web/plots/sheetFreeSpectrumModel';
import { sheetSpectrumModel } from '../../web/plots/sheetSpectrumModel';
import { gaussianAmplitudeGamma, sampledAmplitudeGamma } from '../../src/statistics/amplitudeGammaPosterior';
import { F_YR_HZ } from '../../src/physics/constants';
import { loadSheet } from '../../src/cli/sheetLoading';
import { mulberry32, normal } from '../arrayView/seededRandom';

const ref = JSON.parse(readFileSync(new URL('../reference/kde_reference.json', import.meta.url), 'utf8'));
const samples1d = Float64Array.from(ref.samples1d as number[]);
const scott = ref.cases1d.find((c: { rule: string }) => c.rule === 'scott');

/** Linear interpolation of (x, y) at t; NaN outside. */
function interp(x: ArrayLike<number>, y: ArrayLike<number>, t: number): number {
  for (let i = 0; i < x.length - 1; i++) if (t >= x[i] && t <= x[i + 1]) return y[i] + ((y[i + 1] - y[i]) * (t - x[i])) / (x[i + 1] - x[i]);
  return NaN;
}

function trapezoid(x: ArrayLike<number>, y: ArrayLike<number>): number {
  let s = 0;
  for (let i = 1; i < x.length; i++) s += 0.5 * (y[i] + y[i - 1]) * (x[i] - x[i - 1]);
  return s;
}

const demo = loadSheet(join(import.meta.dirname, '../../examples/demo.json'));
const demoReader = { cells: demo.cells(), valueOf: (n: string) => demo.value(n), stateOf: (n: string) => demo.state(n) };
const demoFs = freeSpectra(demoReader)[0];

describe('violins: the density of a bin drawn as an outline', () => {
  it("match scipy.stats.gaussian_kde(samples, bw_method='scott') within 2% where the density is above 1% of its peak", () => {
    const v = violinDensity(samples1d, 1, 0);
    const peak = Math.max(...v.density);
    let checked = 0;
    scott.points.forEach((p: number, i: number) => {
      const want = Math.exp(scott.logpdf[i]);
      if (want < 0.01 * peak) return;
      const got = interp(v.log10Y, v.density, p);
      // 96 grid points over the trimmed range: linear interpolation costs up to about 1% near the peak.
      expect(Math.abs(got / want - 1), `at ${p}: ${got} vs scipy ${want}`).toBeLessThan(0.02);
      checked++;
    });
    expect(checked).toBeGreaterThan(8);
  });

  it('on a squared axis (log10 P = 2 log10 rho + c) the density per dex is halved and shifted: scipy pdf(s) / 2 at 2 s + c', () => {
    const c = Math.log10(4.4e8);
    const v = violinDensity(samples1d, 2, c);
    const peak = Math.max(...v.density);
    scott.points.forEach((p: number, i: number) => {
      const want = Math.exp(scott.logpdf[i]) / 2;
      if (want < 0.01 * peak) return;
      const got = interp(v.log10Y, v.density, 2 * p + c);
      expect(Math.abs(got / want - 1), `at ${p}`).toBeLessThan(0.02);
    });
  });

  it('every bin of the demo free spectrum integrates to 1 (within 5e-3) on each axis, read back from the drawn outline', () => {
    for (const q of ['hc', 'rho', 'psd'] as FreeSpectrumAxis[]) {
      const model = freeSpectrumPlotModel({ quantity: q, label: demoFs.name, data: demoFs.data, curves: [] });
      const outline = model.series.find((s) => s.id.endsWith(':violins'))!;
      const violins = freeSpectrumViolins(demoFs.data, q);
      // Split the drawn outline into rings at the NaN separators; one per bin.
      const rings: { x: number[]; y: number[] }[] = [{ x: [], y: [] }];
      outline.x.forEach((x, i) => {
        if (Number.isNaN(x)) rings.push({ x: [], y: [] });
        else (rings.at(-1)!.x.push(x), rings.at(-1)!.y.push(outline.y[i]));
      });
      expect(rings.length).toBe(demoFs.data.frequencyHz.length);
      rings.forEach((r, k) => {
        const v = violins[k];
        const n = (r.x.length - 1) / 2; // right side up, left side down, closing point
        const u = r.y.slice(0, n).map(Math.log10);
        const density = r.x.slice(0, n).map((x) => Math.log10(x / v.frequencyHz) / v.dexPerDensity);
        const mass = trapezoid(u, density);
        expect(Math.abs(mass - 1), `${q} bin ${k + 1}: mass ${mass}`).toBeLessThan(5e-3);
        // Mirror image: the left side at the same heights is the right side reflected in log f.
        for (let i = 0; i < n; i++) expect(Math.log10(r.x[2 * n - 1 - i] / v.frequencyHz)).toBeCloseTo(-Math.log10(r.x[i] / v.frequencyHz), 9);
      });
    }
  });

  it('places the medians by the conventions of docs/freeSpectrum.md, computed here from the raw log10 rho samples', () => {
    const d = demoFs.data;
    expect(d.quantity).toBe('log10Rho');
    const T = d.spanS;
    const median = (s: Float64Array) => {
      const x = Float64Array.from(s).sort();
      const n = x.length;
      return n % 2 ? x[(n - 1) / 2] : 0.5 * (x[n / 2 - 1] + x[n / 2]);
    };
    const at = (q: FreeSpectrumAxis) => freeSpectrumViolins(d, q).map((v) => v.median);
    const [hc, rho, psd] = (['hc', 'rho', 'psd'] as FreeSpectrumAxis[]).map(at);
    d.samples.forEach((s, k) => {
      const r = 10 ** median(s);
      const f = d.frequencyHz[k];
      // rho_k^2 = h_c^2 / (12 pi^2 f^3 T) (Lamb, Taylor & van Haasteren 2023, PRD 108, 103019); P = h_c^2 / (12 pi^2 f^3) (Thrane & Romano 2013, PRD 88, 124032).
      expect(rho[k] / r).toBeCloseTo(1, 12);
      expect(hc[k] / (r * Math.sqrt(12 * Math.PI ** 2 * f ** 3 * T))).toBeCloseTo(1, 12);
      expect(psd[k] / (r * r * T)).toBeCloseTo(1, 12);
      expect(axisMap(d, k, 'psd').scale).toBe(2);
    });
  });

  it('samples of log10 h_c give the same medians on every axis as the same samples written as log10 rho_k', () => {
    const d = demoFs.data;
    // log10 h_c = log10 rho_k + (1/2) log10(12 pi^2 f^3 T), computed here from the convention.
    const asHc = {
      ...d,
      quantity: 'log10Hc' as const,
      prior: { kind: 'none' as const },
      samples: d.samples.map((s, k) => Float64Array.from(s, (x) => x + 0.5 * Math.log10(12 * Math.PI ** 2 * d.frequencyHz[k] ** 3 * d.spanS))),
    };
    for (const q of ['hc', 'rho', 'psd'] as FreeSpectrumAxis[]) {
      const a = freeSpectrumViolins(d, q).map((v) => v.median);
      const b = freeSpectrumViolins(asHc, q).map((v) => v.median);
      a.forEach((x, k) => expect(b[k] / x, `${q} bin ${k + 1}`).toBeCloseTo(1, 10));
    }
  });

  it('on the spectrum plot, each bin shows the median and central 90% of its samples; on the residual-power axis at rho_k^2 T', () => {
    const d = demoFs.data;
    const model = sheetSpectrumModel(demoReader, 'psd');
    const s = model.series.find((x) => x.label === 'measured_free_spectrum: median and 90% per bin')!;
    expect(s.kind).toBe('interval');
    d.samples.forEach((samples, k) => {
      // Independent order: each sample to P = rho^2 T first (docs/freeSpectrum.md), then quantiles (definition 7, Hyndman & Fan 1996).
      const p = Array.from(samples, (x) => 10 ** (2 * x) * d.spanS).sort((a, b) => a - b);
      const q7 = (pr: number) => {
        const h = (p.length - 1) * pr;
        const i = Math.floor(h);
        return p[i] + (h - i) * (p[Math.min(i + 1, p.length - 1)] - p[i]);
      };
      // Interpolating in log10 rho rather than in P differs by at most the gap between neighbouring samples (1,500 per bin).
      expect(Math.abs(Math.log10(s.y[k] / q7(0.5))), `bin ${k + 1}`).toBeLessThan(0.01);
      expect(Math.abs(Math.log10(s.yLow![k] / q7(0.05)))).toBeLessThan(0.02);
      expect(Math.abs(Math.log10(s.yHigh![k] / q7(0.95)))).toBeLessThan(0.02);
    });
  });

  it('draws a model curve on the rho axis as h_c / sqrt(12 pi^2 f^3 T)', () => {
    const f = [2e-9, 5e-9, 1e-8];
    const hc = [1e-14, 6e-15, 4e-15];
    const m = freeSpectrumPlotModel({ quantity: 'rho', label: 'fs', data: demoFs.data, curves: [{ id: 'c', label: 'model', frequencyHz: f, hc }] });
    const s = m.series.find((x) => x.id === 'c')!;
    s.x.forEach((x, i) => expect(s.y[i] / (hc[f.indexOf(x)] / Math.sqrt(12 * Math.PI ** 2 * x ** 3 * demoFs.data.spanS))).toBeCloseTo(1, 12));
  });

  it('outlines are closed rings', () => {
    const v = violinDensity(samples1d, 1, 0);
    const o = violinOutline(v, 3e-9, 0.1);
    expect(o.x[0]).toBe(o.x.at(-1));
    expect(o.y[0]).toBe(o.y.at(-1));
  });
});

/** Even-odd rule over all rings: inside any odd number of rings. */
function insideRings(rings: { gamma: number[]; log10A: number[] }[], g: number, a: number): boolean {
  let inside = false;
  for (const r of rings) {
    for (let i = 0, j = r.gamma.length - 1; i < r.gamma.length; j = i++) {
      const [xi, yi, xj, yj] = [r.gamma[i], r.log10A[i], r.gamma[j], r.log10A[j]];
      if (yi > a !== yj > a && g < ((xj - xi) * (a - yi)) / (yj - yi) + xi) inside = !inside;
    }
  }
  return inside;
}

function shoelace(r: { gamma: number[]; log10A: number[] }): number {
  let s = 0;
  for (let i = 0, j = r.gamma.length - 1; i < r.gamma.length; j = i++) s += r.gamma[j] * r.log10A[i] - r.gamma[i] * r.log10A[j];
  return Math.abs(s) / 2;
}

describe('(A, gamma) contours', () => {
  // A known 2-D Gaussian in (log10 A, gamma).
  const m = { a: -14.6, g: 3.8, sa: 0.15, sg: 0.6, r: -0.7 };
  const draw = (rand: () => number) => {
    const u = normal(rand);
    const v = normal(rand);
    return { a: m.a + m.sa * u, g: m.g + m.sg * (m.r * u + Math.sqrt(1 - m.r * m.r) * v) };
  };

  it('from 4000 samples, the 68% and 95% contours hold 68% and 95% of fresh draws (within 2.5%) and have the closed-form HPD area (within 8%)', () => {
    const rand = mulberry32(20261202);
    const n = 4000;
    const a = new Float64Array(n);
    const g = new Float64Array(n);
    for (let i = 0; i < n; i++) ({ a: a[i], g: g[i] } = draw(rand));
    const region = regionOf(sampledAmplitudeGamma(a, g, F_YR_HZ));
    const fresh = Array.from({ length: 20_000 }, () => draw(rand));
    for (const level of [0.68, 0.95]) {
      const rings = posteriorContour(region, level);
      const share = fresh.filter((p) => insideRings(rings, p.g, p.a)).length / fresh.length;
      // Binomial errors: sqrt(0.68 * 0.32 / 4000) = 0.0074 for the level set from the samples, 0.0033 for the fresh draws.
      expect(Math.abs(share - level), `level ${level}: ${share}`).toBeLessThan(0.025);
      // HPD region of a 2-D Gaussian: the ellipse d^2 <= -2 ln(1 - p), area pi sa sg sqrt(1 - r^2) (-2 ln(1 - p)) (chi-square, 2 degrees of freedom).
      const want = Math.PI * m.sa * m.sg * Math.sqrt(1 - m.r * m.r) * -2 * Math.log(1 - level);
      const got = rings.reduce((s, r) => s + shoelace(r), 0);
      expect(Math.abs(got / want - 1), `level ${level}: area ${got} vs ${want}`).toBeLessThan(0.08);
    }
  });

  it('a Gaussian posterior gives the closed-form ellipse: every point at Mahalanobis d^2 = -2 ln(1 - level)', () => {
    const post = gaussianAmplitudeGamma(m.a, m.g, m.sa, m.sg, m.r);
    const region = regionOf(post);
    for (const level of [0.68, 0.95]) {
      const [ring] = posteriorContour(region, level);
      ring.gamma.forEach((gv, i) => {
        const x = (ring.log10A[i] - m.a) / m.sa;
        const y = (gv - m.g) / m.sg;
        const d2 = (x * x - 2 * m.r * x * y + y * y) / (1 - m.r * m.r);
        expect(d2).toBeCloseTo(-2 * Math.log(1 - level), 9);
      });
      expect(region.credibleLevel(ring.log10A[7], ring.gamma[7])).toBeCloseTo(level, 9);
    }
  });

  it("a pure power law's point is its own (A, gamma) to 1e-9: f^(-2/3) in h_c gives gamma = 13/3 (Phinney 2001, arXiv:astro-ph/0108028)", () => {
    const f = Array.from({ length: 40 }, (_, k) => (k + 1) * 1.5e-9);
    const setup = { frequencyHz: Float64Array.from(f.slice(0, 5)), bins: 5, description: '' };
    for (const [amp, gamma] of [
      [2.4e-15, 13 / 3],
      [7e-16, 3.2],
    ]) {
      const hc = f.map((x) => amp * (x / F_YR_HZ) ** ((3 - gamma) / 2));
      const r = fitCurve({ frequencyHz: f, hc }, setup, F_YR_HZ);
      if ('reason' in r) throw new Error(r.reason);
      expect(Math.abs(r.log10A - Math.log10(amp))).toBeLessThan(1e-9);
      expect(Math.abs(r.gamma - gamma)).toBeLessThan(1e-9);
    }
  });

  it('the plot labels each model point with the contour it sits on, and draws the Monte Carlo cloud', () => {
    const post = gaussianAmplitudeGamma(m.a, m.g, m.sa, m.sg, m.r);
    const model = amplitudeGammaPlotModel({
      label: 'measured',
      posterior: post,
      points: [{ id: 'p', label: 'spectrum', log10A: m.a, gamma: m.g, colorIndex: 0 }],
      clouds: [{ id: 'mc', label: 'Monte Carlo fits', log10A: [m.a, m.a + 0.1], gamma: [m.g, m.g - 0.2] }],
    });
    expect(model.series.map((s) => s.label)).toEqual(['Monte Carlo fits', 'measured: 95% highest-density region', 'measured: 68% highest-density region', 'spectrum (on the 0% contour)']);
    expect(model.y.label).toBe('amplitude A_yr at f_yr = 1/yr');
  });
});
