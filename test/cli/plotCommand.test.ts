// `strainsheet plot`: the app's spectrum figure written without a browser, as SVG and as PDF, read
// back with independent parsers (an XML parser for the SVG, a PDF reader for the PDF) and checked
// for what a journal figure needs: the size, decade ticks labelled 10^n with superscripts, minor
// ticks, legend boxes inside the page and clear of each other and of the axes, fonts embedded.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { plotCommand } from '../../src/cli/plotCommand';
import { UsageError } from '../../src/cli/optionParsing';
import { inspectPdf } from '../support/pdfInspect';
import { inside, overlap, readSvgFigure } from '../support/svgFigure';
import { plotFigure } from '../../web/plots/svgWriter';
import type { PlotModel } from '../../web/plots/plotModel';

const DEMO = join(import.meta.dirname, '../../examples/demo.json');
const dir = mkdtempSync(join(tmpdir(), 'strainsheet-plot-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(args: string[]): Promise<{ code: number; err: string }> {
  let err = '';
  const code = await plotCommand.run(args, { out: () => undefined, err: (t) => void (err += t) });
  return { code, err };
}

describe('strainsheet plot', { timeout: 60_000 }, () => {
  it('writes the spectrum at journal column width with decade ticks 10^n, minor ticks and a legend that fits', async () => {
    const svgPath = join(dir, 'column.svg');
    expect((await run([DEMO, '--plot', 'spectrum', '--size', 'column', '--svg', svgPath])).code).toBe(0);
    const fig = readSvgFigure(readFileSync(svgPath, 'utf8'));
    // A single journal column is about 3.4 in wide (common practice, no source); 72 pt per inch (PostScript, PDF).
    expect(fig.widthIn).toBe(3.4);
    expect(fig.viewBox[2]).toBeCloseTo(3.4 * 72, 6);
    const page = { x: 0, y: 0, w: fig.viewBox[2], h: fig.viewBox[3] };
    for (const axis of ['x', 'y'] as const) {
      const labelled = fig.ticks.filter((t) => t.axis === axis && t.label);
      expect(labelled.length, axis).toBeGreaterThanOrEqual(2);
      for (const t of labelled) {
        // Every labelled tick of these log axes is a power of ten, written 10 with a superscript exponent.
        const k = Math.round(Math.log10(t.value));
        expect(t.value / 10 ** k, `${axis} ${t.value}`).toBeCloseTo(1, 12);
        expect(t.label).toBe(`10${k < 0 ? '−' : ''}${Math.abs(k)}`);
        expect(t.scripts).toEqual([`${k < 0 ? '−' : ''}${Math.abs(k)}`]);
      }
      // Minor ticks at 2..9 times a power of ten.
      const minor = fig.ticks.filter((t) => t.axis === axis && !t.major);
      expect(minor.length, axis).toBeGreaterThan(4);
      for (const t of minor) {
        const m = t.value / 10 ** Math.floor(Math.log10(t.value) + 1e-12);
        expect(Math.abs(m - Math.round(m))).toBeLessThan(1e-9);
        expect(Math.round(m)).toBeGreaterThanOrEqual(2);
      }
    }
    // One legend entry per series, each inside the page, none overlapping another, the plot or the axis titles.
    expect(fig.legend.map((l) => l.label)).toEqual(['spectrum', 'spectrum_eccentric', 'spectrum_stellar', 'measured: power law γ=4.333, 90% band', 'measured: amplitude at 31.7 nHz with 90% interval', 'measured_free_spectrum: median and 90% per bin']);
    fig.legend.forEach((l, i) => {
      expect(inside(l.box, page), l.label).toBe(true);
      expect(overlap(l.box, fig.plot), l.label).toBe(false);
      expect(overlap(l.box, fig.xTitle), l.label).toBe(false);
      fig.legend.slice(i + 1).forEach((o) => expect(overlap(l.box, o.box), `${l.label} / ${o.label}`).toBe(false));
    });
    for (const b of [fig.xTitle, fig.yTitle, fig.plot]) expect(inside(b, page)).toBe(true);
    expect(overlap(fig.yTitle, fig.plot)).toBe(false);
    // The trade's notation: h with subscript c; A_yr is never upper-cased.
    expect(fig.text).toContain('characteristic strain hc');
    expect(fig.text).not.toMatch(/A_YR|A_Yr/);
  });

  it('draws a slide 10 in wide, Ω_gw on its axis in the trade’s notation', async () => {
    const svgPath = join(dir, 'slides.svg');
    expect((await run([DEMO, '--size', 'slides', '--quantity', 'omega', '--set', 'rate_norm=2e-3 Mpc^-3 Gyr^-1', '--svg', svgPath])).code).toBe(0);
    const fig = readSvgFigure(readFileSync(svgPath, 'utf8'));
    expect(fig.widthIn).toBe(10);
    expect(fig.text).toContain('energy density Ωgw(f)');
    const page = { x: 0, y: 0, w: fig.viewBox[2], h: fig.viewBox[3] };
    for (const l of fig.legend) expect(inside(l.box, page)).toBe(true);
  });

  it('writes a vector PDF of the same page size with its font embedded and every label on the page', async () => {
    const svgPath = join(dir, 'double.svg');
    const pdfPath = join(dir, 'double.pdf');
    expect((await run([DEMO, '--size', 'double', '--svg', svgPath, '--pdf', pdfPath])).code).toBe(0);
    const fig = readSvgFigure(readFileSync(svgPath, 'utf8'));
    const pdf = inspectPdf(readFileSync(pdfPath));
    expect(pdf.mediaBox[2]).toBeCloseTo(fig.viewBox[2], 6);
    expect(pdf.mediaBox[3]).toBeCloseTo(fig.viewBox[3], 6);
    expect(Object.keys(pdf.fontsUsed).length).toBeGreaterThan(0);
    for (const f of Object.values(pdf.fontsUsed)) expect(f).toEqual({ baseFont: 'DejaVu#20Sans', embedded: true });
    for (const t of pdf.texts) {
      expect(t.x, t.text).toBeGreaterThanOrEqual(0);
      expect(t.y, t.text).toBeGreaterThanOrEqual(0);
      expect(t.x + t.width, t.text).toBeLessThanOrEqual(pdf.mediaBox[2] + 1e-6);
      expect(t.y, t.text).toBeLessThanOrEqual(pdf.mediaBox[3]);
    }
    const all = pdf.texts.map((t) => t.text);
    // The y title, the minus signs of the exponents and the legend all arrive as text.
    expect(all).toContain('characteristic strain h');
    expect(all).toContain('−14');
    expect(all.some((t) => t.startsWith('measured: power law γ=4.333'))).toBe(true);
    // Exponents are set smaller and raised: '−14' is smaller than its '10'.
    const ten = pdf.texts.find((t) => t.text === '10')!;
    const exp = pdf.texts.find((t) => t.text === '−14')!;
    expect(exp.fontSize).toBeLessThan(ten.fontSize);
  });

  it('wraps a legend entry too long for a column onto more lines, inside the page', () => {
    const long = 'a pinned curve named at great length: rate_norm = 2e-3 Mpc^-3 Gyr^-1, mass_slope = 0.4, cutoff_mass = 3e9 Msun';
    const model: PlotModel = {
      id: 't',
      title: 't',
      x: { label: 'f (nHz)', scale: 'log' },
      y: { label: 'h_c', scale: 'log' },
      series: [
        { id: 'a', label: 'spectrum', kind: 'line', x: [1e-9, 1e-8], y: [1e-14, 1e-15], color: '#1d4e89' },
        { id: 'b', label: long, kind: 'line', x: [1e-9, 1e-8], y: [2e-14, 2e-15], color: '#3f8f8b', dash: [6, 4] },
      ],
      notes: [],
    };
    const fig = readSvgFigure(plotFigure(model, { size: 'column' }).svg);
    const page = { x: 0, y: 0, w: fig.viewBox[2], h: fig.viewBox[3] };
    const entry = fig.legend[1];
    expect(entry.label).toBe(long);
    expect(inside(entry.box, page)).toBe(true);
    // Wrapped: taller than one line of 6.5 pt legend text (the column size's legend font).
    expect(entry.box.h).toBeGreaterThan(2 * 6.5);
    expect(overlap(entry.box, fig.legend[0].box)).toBe(false);
  });

  it('refuses a wrong size, a missing output and an unknown plot by name', async () => {
    await expect(run([DEMO, '--size', 'poster', '--svg', join(dir, 'x.svg')])).rejects.toThrow(UsageError);
    await expect(run([DEMO, '--size', 'column'])).rejects.toThrow(/--svg OUT or --pdf OUT/);
    const r = await run([DEMO, '--plot', 'violins', '--svg', join(dir, 'x.svg')]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/no plot "violins"; it has: spectrum/);
  });
});
