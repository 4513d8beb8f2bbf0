// The app in chromium at three screen widths: exported figures that match the chart on screen
// (ticks and legend entries compared), the PDF read back, keyboard reach of the plots, landmarks,
// accessibility checked by axe-core, and screenshots written to test-artifacts/.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { browserAvailability } from './chromiumBrowser';
import { ARTIFACTS, startAppSession, visibleAtCentre, type AppSession } from './appSession';
import { download } from './pageHelpers';
import { inspectPdf } from '../support/pdfInspect';
import { inside, overlap, readSvgFigure } from '../support/svgFigure';
import { unicodeText } from '../../web/plots/figureText';

const availability = browserAvailability();
const runSuite = availability.ok || availability.required;
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[] }[];
}

describe.runIf(runSuite)('screens, figures and accessibility', { timeout: 90_000 }, () => {
  let s: AppSession;
  beforeAll(async () => {
    if (!availability.ok) throw new Error(availability.reason);
    s = await startAppSession();
  }, 120_000);
  afterAll(async () => {
    await s?.close();
  });

  it('exports an SVG whose ticks and legend entries are the chart’s on screen', async () => {
    await s.freshDemo();
    const { page } = s;
    for (const size of ['column', 'double', 'slides']) {
      await page.selectOption('[data-plot="spectrum"] select[data-figure-size]', size);
      const file = await download(page, () => page.click('[data-plot="spectrum"] [data-action="export-svg"]'));
      expect(file.name.endsWith(`-${size}.svg`)).toBe(true);
      const fig = readSvgFigure(file.bytes.toString('utf8'));
      for (const axis of ['x', 'y'] as const) {
        const onScreen = JSON.parse((await page.getAttribute('[data-plot="spectrum"]', `data-${axis}-ticks`)) ?? '[]') as number[];
        const inFigure = fig.ticks.filter((t) => t.axis === axis && t.label).map((t) => t.value);
        expect(inFigure.length, `${size} ${axis}`).toBe(onScreen.length);
        inFigure.forEach((v, i) => expect(v / onScreen[i], `${size} ${axis} tick ${i}`).toBeCloseTo(1, 10));
      }
      const legendOnScreen = JSON.parse((await page.getAttribute('[data-plot="spectrum"]', 'data-legend')) ?? '[]') as string[];
      expect(fig.legend.map((l) => unicodeText(l.label)), size).toEqual(legendOnScreen);
      const pageBox = { x: 0, y: 0, w: fig.viewBox[2], h: fig.viewBox[3] };
      fig.legend.forEach((l, i) => {
        expect(inside(l.box, pageBox), `${size} ${l.label}`).toBe(true);
        fig.legend.slice(i + 1).forEach((o) => expect(overlap(l.box, o.box)).toBe(false));
      });
    }
  });

  it('exports a vector PDF with its font embedded and every label on the page', async () => {
    const { page } = s;
    await page.selectOption('[data-plot="spectrum"] select[data-figure-size]', 'column');
    const svg = readSvgFigure((await download(page, () => page.click('[data-plot="spectrum"] [data-action="export-svg"]'))).bytes.toString('utf8'));
    const file = await download(page, () => page.click('[data-plot="spectrum"] [data-action="export-pdf"]'));
    expect(file.bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const pdf = inspectPdf(file.bytes);
    expect(pdf.mediaBox[2]).toBeCloseTo(3.4 * 72, 6);
    expect(pdf.mediaBox[3]).toBeCloseTo(svg.viewBox[3], 6);
    for (const f of Object.values(pdf.fontsUsed)) expect(f).toEqual({ baseFont: 'DejaVu#20Sans', embedded: true });
    expect(pdf.texts.length).toBeGreaterThan(10);
    for (const t of pdf.texts) {
      expect(t.x, t.text).toBeGreaterThanOrEqual(0);
      expect(t.x + t.width, t.text).toBeLessThanOrEqual(pdf.mediaBox[2] + 1e-6);
      expect(t.y, t.text).toBeGreaterThanOrEqual(0);
      expect(t.y, t.text).toBeLessThanOrEqual(pdf.mediaBox[3]);
    }
    expect(pdf.texts.map((t) => t.text)).toContain('characteristic strain h');
  });

  it('reaches the plots from the keyboard in two key presses (skip link), with a landmark per region', async () => {
    await s.freshDemo();
    const { page } = s;
    await page.keyboard.press('Tab');
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).toBe('Skip to the plots');
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => document.activeElement?.id === 'plots-region');
    expect(await page.getAttribute('[data-tab="plots"]', 'aria-selected')).toBe('true');
    expect(await visibleAtCentre(page, '[data-plot="spectrum"] canvas')).toBe(true);
    const landmarks = await page.$$eval('header, main, aside[aria-label], section[aria-label], nav[aria-label]', (xs) => xs.map((x) => x.getAttribute('aria-label') ?? x.tagName.toLowerCase()));
    for (const name of ['header', 'main', 'Key results', 'Sheet', 'Plots and tools', 'Plots', 'File and history']) expect(landmarks).toContain(name);
  });

  for (const width of [1000, 1400, 1920]) {
    it(`has no serious or critical axe-core violations at ${width} px, and writes a screenshot`, async () => {
      const { page } = s;
      const height = width === 1920 ? 1080 : width === 1400 ? 900 : 800;
      await page.setViewportSize({ width, height });
      try {
        await s.freshDemo();
        await page.screenshot({ path: join(ARTIFACTS, `screen-${width}.png`) });
        const violations = (await page.evaluate(async (src) => {
          // axe-core is evaluated through the DevTools protocol, which the page's CSP does not govern.
          (0, eval)(src);
          const axe = (window as unknown as { axe: { run(ctx: Document, opts: object): Promise<{ violations: AxeViolation[] }> } }).axe;
          const r = await axe.run(document, { resultTypes: ['violations'] });
          return r.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.slice(0, 3).map((n) => ({ target: n.target })) }));
        }, AXE_SOURCE)) as AxeViolation[];
        const bad = violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
        expect(bad, JSON.stringify(bad, null, 1)).toEqual([]);
        if (width === 1000) {
          await page.click('[data-view-button="side"]');
          await page.screenshot({ path: join(ARTIFACTS, `screen-${width}-plots.png`) });
        } else {
          await page.$eval('.sheet-pane', (el) => (el.scrollTop = el.scrollHeight / 2));
          await page.screenshot({ path: join(ARTIFACTS, `screen-${width}-scrolled.png`) });
        }
      } finally {
        await page.setViewportSize({ width: 1400, height: 900 });
      }
    });
  }
});
