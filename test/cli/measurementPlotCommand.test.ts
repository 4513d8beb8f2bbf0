// `strainsheet plot --plot free-spectrum | amplitude-gamma`: the figures written without a browser,
// read back with an XML parser (SVG) and a PDF reader, checked for the trade's notation (h_c, rho_k,
// A_yr, gamma as Greek letters, 10^n with superscripts), ticks and legends inside the page.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { plotCommand } from '../../src/cli/plotCommand';
import { UsageError } from '../../src/cli/optionParsing';
import { inspectPdf } from '../support/pdfInspect';
import { inside, overlap, readSvgFigure, type SvgFigure } from '../support/svgFigure';

const DEMO = join(import.meta.dirname, '../../examples/demo.json');
const SMALL = join(import.meta.dirname, '../fixtures/smallSheet.json');
const dir = mkdtempSync(join(tmpdir(), 'strainsheet-mplot-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(args: string[]): Promise<{ code: number; err: string }> {
  let err = '';
  const code = await plotCommand.run(args, { out: () => undefined, err: (t) => void (err += t) });
  return { code, err };
}

function checkLayout(fig: SvgFigure): void {
  const page = { x: 0, y: 0, w: fig.viewBox[2], h: fig.viewBox[3] };
  fig.legend.forEach((l, i) => {
    expect(inside(l.box, page), l.label).toBe(true);
    expect(overlap(l.box, fig.plot), l.label).toBe(false);
    expect(overlap(l.box, fig.xTitle), l.label).toBe(false);
    fig.legend.slice(i + 1).forEach((o) => expect(overlap(l.box, o.box), `${l.label} / ${o.label}`).toBe(false));
  });
  for (const b of [fig.xTitle, fig.yTitle, fig.plot]) expect(inside(b, page)).toBe(true);
  expect(overlap(fig.yTitle, fig.plot)).toBe(false);
}

/** Labelled ticks of a log axis: powers of ten written 10 with a superscript exponent, or m x 10^n. */
function checkLogTicks(fig: SvgFigure, axis: 'x' | 'y'): void {
  const labelled = fig.ticks.filter((t) => t.axis === axis && t.label);
  expect(labelled.length, axis).toBeGreaterThanOrEqual(1);
  for (const t of labelled) {
    const k = Math.floor(Math.log10(t.value) + 1e-12);
    const exponent = `${k < 0 ? '−' : ''}${Math.abs(k)}`;
    if (t.major) expect(t.label).toBe(`10${exponent}`);
    if (Math.abs(k) > 2) expect(t.scripts).toEqual([exponent]);
  }
}

describe('strainsheet plot: free spectrum and (A, gamma) plane', { timeout: 120_000 }, () => {
  it('free spectrum on the h_c axis: one legend entry per drawn series, h with subscript c, log ticks 10^n', async () => {
    const svgPath = join(dir, 'fs.svg');
    const r = await run([DEMO, '--plot', 'free-spectrum', '--size', 'column', '--svg', svgPath]);
    expect(r.code, r.err).toBe(0);
    const fig = readSvgFigure(readFileSync(svgPath, 'utf8'));
    expect(fig.legend.map((l) => l.label)).toEqual([
      'measured_free_spectrum: posterior per bin (density)',
      'measured_free_spectrum: posterior median per bin',
      'spectrum',
      'spectrum_eccentric',
      'spectrum_stellar',
    ]);
    expect(fig.text).toContain('characteristic strain hc(fk)');
    checkLogTicks(fig, 'y');
    checkLogTicks(fig, 'x');
    checkLayout(fig);
  });

  it('free spectrum on the rho_k axis: ρ with subscript k and seconds; residual power in s^3', async () => {
    const rho = join(dir, 'fs-rho.svg');
    expect((await run([DEMO, '--plot', 'free-spectrum', '--quantity', 'rho', '--svg', rho])).code).toBe(0);
    const fig = readSvgFigure(readFileSync(rho, 'utf8'));
    expect(fig.text).toContain('residual amplitude ρk (s)');
    checkLogTicks(fig, 'y');
    const psd = join(dir, 'fs-psd.svg');
    expect((await run([DEMO, '--plot', 'free-spectrum', '--quantity', 'psd', '--size', 'double', '--svg', psd])).code).toBe(0);
    const p = readSvgFigure(readFileSync(psd, 'utf8'));
    expect(p.text).toContain('timing-residual power P(f) (s3)');
    checkLayout(p);
  });

  it('(A, gamma) plane: A_yr with subscript yr, γ as a Greek letter, contours and model points in the legend; PDF with the same page', async () => {
    const svgPath = join(dir, 'ag.svg');
    const pdfPath = join(dir, 'ag.pdf');
    const r = await run([DEMO, '--plot', 'amplitude-gamma', '--size', 'column', '--svg', svgPath, '--pdf', pdfPath]);
    expect(r.code, r.err).toBe(0);
    const fig = readSvgFigure(readFileSync(svgPath, 'utf8'));
    expect(fig.text).toContain('amplitude Ayr at fyr = 1/yr');
    expect(fig.text).toContain('spectral index γ of the residual power');
    const labels = fig.legend.map((l) => l.label);
    expect(labels.slice(0, 2)).toEqual(['measured_A_gamma: 95% highest-density region', 'measured_A_gamma: 68% highest-density region']);
    // The demo's own cell says where its spectrum sits (effective_A_gamma): the plot says the same contour.
    expect(labels[2]).toMatch(/^spectrum \(on the 98\.7% contour\)$/);
    checkLogTicks(fig, 'y');
    // The gamma axis is linear: 1-2-5 steps, plain numbers.
    const g = fig.ticks.filter((t) => t.axis === 'x' && t.label).map((t) => t.value);
    expect(g.length).toBeGreaterThanOrEqual(3);
    const step = g[1] - g[0];
    g.forEach((v, i) => expect(v - g[0]).toBeCloseTo(i * step, 9));
    checkLayout(fig);
    const pdf = inspectPdf(readFileSync(pdfPath));
    expect(pdf.mediaBox[2]).toBeCloseTo(fig.viewBox[2], 6);
    expect(pdf.mediaBox[3]).toBeCloseTo(fig.viewBox[3], 6);
    for (const f of Object.values(pdf.fontsUsed)) expect(f).toEqual({ baseFont: 'DejaVu#20Sans', embedded: true });
    for (const t of pdf.texts) {
      expect(t.x, t.text).toBeGreaterThanOrEqual(0);
      expect(t.x + t.width, t.text).toBeLessThanOrEqual(pdf.mediaBox[2] + 1e-6);
      expect(t.y, t.text).toBeLessThanOrEqual(pdf.mediaBox[3]);
    }
    expect(pdf.texts.map((t) => t.text)).toContain('yr');
  });

  it('realisations of a realiseBackground cell with the free spectrum’s violins: legend inside the page, ρ axis', async () => {
    const svgPath = join(dir, 'real.svg');
    const r = await run([DEMO, '--plot', 'realisations', '--quantity', 'rho', '--set', 'real=realiseBackground(pop, freqs, array_span, 40, 3)', '--svg', svgPath]);
    expect(r.code, r.err).toBe(0);
    const fig = readSvgFigure(readFileSync(svgPath, 'utf8'));
    expect(fig.legend.map((l) => l.label)).toEqual([
      'real (40 realisations, seed 3): 95% of realisations',
      'real (40 realisations, seed 3): 68% of realisations',
      'real (40 realisations, seed 3): median',
      'smooth spectrum (average over universes)',
      '3 single realisations',
      'loudest binary per bin: its own h_c (median)',
      'measured_free_spectrum: posterior per bin (density)',
      'measured_free_spectrum: posterior median per bin',
    ]);
    expect(fig.text).toContain('residual amplitude ρk (s)');
    expect(fig.text).toContain('its own hc (median)');
    checkLogTicks(fig, 'y');
    checkLayout(fig);
    const none = await run([DEMO, '--plot', 'realisations', '--svg', join(dir, 'x.svg')]);
    expect(none.code).toBe(1);
    expect(none.err).toMatch(/has no cell holding realisations \(realiseBackground\)/);
  });

  it('--monte-carlo N --seed S adds the band and the cloud; the same seed writes the same figure', async () => {
    const a = join(dir, 'mc-a.svg');
    const b = join(dir, 'mc-b.svg');
    const ag = join(dir, 'mc-ag.svg');
    expect((await run([DEMO, '--plot', 'free-spectrum', '--monte-carlo', '30', '--seed', '4', '--svg', a])).code).toBe(0);
    expect((await run([DEMO, '--plot', 'free-spectrum', '--monte-carlo', '30', '--seed', '4', '--svg', b])).code).toBe(0);
    expect(readFileSync(a, 'utf8')).toBe(readFileSync(b, 'utf8'));
    const fig = readSvgFigure(readFileSync(a, 'utf8'));
    expect(fig.legend.map((l) => l.label).slice(0, 3)).toEqual([
      'Monte Carlo of spectrum (30 draws, seed 4): 95%',
      'Monte Carlo of spectrum (30 draws, seed 4): 68%',
      'Monte Carlo of spectrum (30 draws, seed 4): median',
    ]);
    checkLayout(fig);
    expect((await run([DEMO, '--plot', 'amplitude-gamma', '--monte-carlo', '30', '--seed', '4', '--svg', ag])).code).toBe(0);
    const g = readSvgFigure(readFileSync(ag, 'utf8'));
    expect(g.legend[0].label).toBe('Monte Carlo of spectrum (30 draws, seed 4): fitted (A, γ)');
    checkLayout(g);
    await expect(run([DEMO, '--plot', 'free-spectrum', '--monte-carlo', 'many', '--svg', a])).rejects.toThrow(/--monte-carlo must be a whole number/);
  });

  it('a sheet without the measurement gets a clear error, and the wrong axis for the plot is refused', async () => {
    const r = await run([SMALL, '--plot', 'free-spectrum', '--svg', join(dir, 'x.svg')]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/has no cell holding a measured free spectrum/);
    await expect(run([DEMO, '--plot', 'free-spectrum', '--quantity', 'omega', '--svg', join(dir, 'x.svg')])).rejects.toThrow(UsageError);
    await expect(run([DEMO, '--plot', 'spectrum', '--quantity', 'rho', '--svg', join(dir, 'x.svg')])).rejects.toThrow(/hc, omega, psd/);
  });
});
