// Regression tests, in chromium, for issue 15's "Confusing" items finished here: the sheet's notes
// and the docs pages shipped with the app, file-open messages, map legends and breakdown titles.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { PROJECT_ROOT } from './appServer';
import { browserAvailability } from './chromiumBrowser';
import { ARTIFACTS, startAppSession, type AppSession } from './appSession';
import { download } from './pageHelpers';
import { inside, readSvgFigure } from '../support/svgFigure';
import { FIGURE_SIZES } from '../../web/plots/figureSizes';
import { richRuns, unicodeText } from '../../web/plots/figureText';

const availability = browserAvailability();
const runSuite = availability.ok || availability.required;
const DEMO = Sheet.fromFile(readFileSync(join(PROJECT_ROOT, 'examples/demo.json'), 'utf8'));
/** The first heading of a docs page as the repository has it (the shipped page must be this file). */
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
const hexRgb = (hex: string) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
const docTitle = (page: string) => /^# (.+)$/m.exec(readFileSync(join(PROJECT_ROOT, 'docs', `${page}.md`), 'utf8'))![1];

describe.runIf(runSuite)('issue 15, confusing items', { timeout: 60_000 }, () => {
  let s: AppSession;
  beforeAll(async () => {
    if (!availability.ok) throw new Error(availability.reason);
    s = await startAppSession();
  }, 120_000);
  afterAll(async () => {
    await s?.close();
  });

  it('shows the sheet’s notes, opens a docs page a row refers to (shipped with the app, under the CSP), follows links between pages, and edits the notes with undo', async () => {
    await s.freshDemo();
    const { page } = s;
    await page.evaluate(() => {
      const w = window as unknown as { cspViolations: string[] };
      w.cspViolations = [];
      document.addEventListener('securitypolicyviolation', (e) => w.cspViolations.push(`${e.violatedDirective} ${e.blockedURI}`));
    });
    expect((await page.textContent('[data-sheet-notes] .sheet-notes-text'))?.trim()).toBe(DEMO.notes);

    // The measurement's source names docs/statistics.md: the link opens that page in the Docs tab.
    const ref = page.locator('[data-cell="measured"] [data-doc-ref="statistics"]');
    await ref.click();
    await page.waitForSelector('.doc-page[data-doc="statistics"] h1');
    expect(await page.getAttribute('[data-tab="docs"]', 'aria-selected')).toBe('true');
    expect(await page.textContent('.doc-page h1')).toBe(docTitle('statistics'));
    expect(await page.evaluate(() => document.activeElement?.classList.contains('doc-page'))).toBe(true);

    // A link between pages (statistics.md links freeSpectrum.md) opens the other page here; Back returns.
    await page.click('.doc-page a[href="freeSpectrum.md"]');
    await page.waitForSelector('.doc-page[data-doc="freeSpectrum"] h1');
    expect(await page.textContent('.doc-page h1')).toBe(docTitle('freeSpectrum'));
    await page.click('.docs-back');
    await page.waitForSelector('.doc-page[data-doc="statistics"] h1');
    // A page's plain-text reference to another page ("docs/orbits.md" in physics.md) is a link too.
    await page.click('[data-doc-page="physics"]');
    await page.waitForSelector('.doc-page[data-doc="physics"] h1');
    await page.click('.doc-page a[href="orbits.md"] >> nth=0');
    await page.waitForSelector('.doc-page[data-doc="orbits"] h1');
    expect(await page.textContent('.doc-page h1')).toBe(docTitle('orbits'));
    // The side panel's tabs stay on one line each, side by side (six tabs at 1400 px).
    const tabs = await page.$$eval('[role="tab"]', (els) => els.map((e) => e.getBoundingClientRect()).map((r) => ({ top: Math.round(r.top), height: Math.round(r.height) })));
    expect(new Set(tabs.map((r) => r.top)).size, JSON.stringify(tabs)).toBe(1);
    expect(Math.max(...tabs.map((r) => r.height)), JSON.stringify(tabs)).toBeLessThan(40);
    expect(await page.evaluate(() => (window as unknown as { cspViolations: string[] }).cspViolations)).toEqual([]);

    // Editing the notes is one undoable step; Escape leaves them as they were.
    await page.click('[data-action="edit-notes"]');
    await page.fill('.sheet-notes-input', 'Scenario: see docs/orbits.md for the decoupling assumption.');
    await page.keyboard.press('Control+Enter');
    await page.waitForSelector('[data-sheet-notes] [data-doc-ref="orbits"]');
    await page.click('[data-action="edit-notes"]');
    await page.fill('.sheet-notes-input', 'typed, then abandoned');
    await page.keyboard.press('Escape');
    expect(await page.textContent('.sheet-notes-text')).toBe('Scenario: see docs/orbits.md for the decoupling assumption.');
    await page.click('[data-action="undo"]');
    await page.waitForFunction((t) => document.querySelector('.sheet-notes-text')?.textContent === t, DEMO.notes);
    expect(s.pageErrors).toEqual([]);
  });

  it('refuses a PNG opened as a sheet with a clear message (file name, what it is, no bytes of it), merges the repeat with a count, and dismisses it', async () => {
    await s.freshDemo();
    const { page } = s;
    const formulas = () => page.$$eval('input[data-formula]', (xs) => xs.map((x) => (x as HTMLInputElement).value));
    const before = await formulas();
    const png = await page.screenshot({ clip: { x: 0, y: 0, width: 40, height: 30 } });
    for (let i = 0; i < 2; i++) {
      await page.setInputFiles('input[data-action="open-file"]', { name: 'figure.png', mimeType: 'image/png', buffer: png });
      await page.waitForFunction((n) => document.querySelector('.message.error')?.getAttribute('data-message-count') === String(n), i + 1);
    }
    const errors = page.locator('.message.error');
    expect(await errors.count()).toBe(1);
    const text = (await errors.locator('.message-text').textContent()) ?? '';
    expect(text).toBe('"figure.png" was not opened: it is a PNG image, not a sheet; a sheet file is JSON text (such as name.strainsheet.json). The sheet is unchanged.');
    expect(await errors.locator('.message-count').textContent()).toBe('×2');
    // Nothing on screen holds a control character or the replacement character of undecodable bytes.
    expect(await page.evaluate(() => /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\ufffd]/.test(document.body.innerText))).toBe(false);
    expect(await formulas()).toEqual(before);
    await errors.locator('button.dismiss').click();
    await page.waitForFunction(() => document.querySelectorAll('.message.error').length === 0);
    // The same image given as a data file is refused before any parser reads it.
    await page.setInputFiles('input[data-action="open-data-file"]', { name: 'figure.png', mimeType: 'image/png', buffer: png });
    await page.waitForSelector('.message.error');
    expect(await page.textContent('.message.error .message-text')).toBe('"figure.png" was not read: it is a PNG image, not a data file (CSV or JSON). The sheet is unchanged.');
    expect(await formulas()).toEqual(before);
    await page.click('.message.error button.dismiss');
    expect(s.pageErrors).toEqual([]);
  });

  it('draws the map’s legend swatches as its contours are drawn (dash, colour, width), on screen and in the SVG figure', async () => {
    await s.freshDemo();
    const { page } = s;
    await page.click('[data-tab="scan"]');
    await page.click('[data-panel="scan"] input[name="mode"] >> nth=1');
    await page.fill('[data-panel="scan"] .axis-fields >> nth=1 >> input[type="number"] >> nth=2', '6');
    await page.selectOption('[data-panel="scan"] select[aria-label="Measurement cell"]', 'measured');
    await page.click('[data-action="run-job"]');
    const figure = '[data-panel="scan"] [data-plot="scan2"]';
    await page.waitForSelector(`${figure}[data-legend-boxes]`, { timeout: 60_000 });
    const size = 'column';
    await page.selectOption(`${figure} select[data-figure-size]`, size);
    const svg = readSvgFigure((await download(page, () => page.click(`${figure} [data-action="export-svg"]`))).bytes.toString('utf8'));
    const contours = svg.legend.filter((l) => /credible region$/.test(l.label));
    expect(contours.length, 'two credible contours').toBe(2);

    // In the figure: each swatch is stroked exactly as its contour is.
    for (const entry of contours) {
      const drawn = svg.series.find((x) => x.label === entry.label);
      expect(entry.stroke, entry.label).toEqual(drawn?.stroke);
    }
    const dashed = contours.find((c) => c.stroke!.dash !== '')!;
    const solid = contours.find((c) => c.stroke!.dash === '')!;
    expect(dashed && solid, 'one dashed and one solid contour').toBeTruthy();
    // The figure scales screen widths and dashes by its lineScale: back to screen pixels.
    const scale = FIGURE_SIZES[size].lineScale;
    const dashPx = dashed.stroke!.dash.split(/\s+/).map((d) => Number(d) / scale);
    const widthPx = { dashed: dashed.stroke!.width / scale, solid: solid.stroke!.width / scale };

    // On screen: read the swatch pixels of each legend entry on the chart's canvas.
    const labels = JSON.parse((await page.getAttribute(figure, 'data-legend')) ?? '[]') as string[];
    const boxes = JSON.parse((await page.getAttribute(figure, 'data-legend-boxes')) ?? '[]') as number[][];
    const swatch = async (label: string) => {
      const box = boxes[labels.indexOf(unicodeText(label))];
      expect(box, label).toBeDefined();
      return page.$eval(
        `${figure} canvas`,
        (el, [b, fontPx]) => {
          const canvas = el as HTMLCanvasElement;
          const r = canvas.width / canvas.clientWidth;
          const ctx = canvas.getContext('2d')!;
          const w = Math.round(fontPx * 2.4 * r);
          const x0 = Math.round(b[0] * r);
          const yMid = Math.round((b[1] + fontPx / 2) * r);
          const half = Math.round(4 * r);
          const img = ctx.getImageData(x0, yMid - half, w, 2 * half + 1);
          const dark = (i: number) => 1 - (0.299 * img.data[i] + 0.587 * img.data[i + 1] + 0.114 * img.data[i + 2]) / 255;
          // Ink along the middle row (runs of dashes) and across it (the line's width).
          const row = Array.from({ length: w }, (_, x) => dark(4 * (half * w + x)));
          const runs: number[] = [];
          let inInk = false;
          row.forEach((d) => {
            const ink = d > 0.4;
            if (ink && !inInk) runs.push(0);
            if (ink) runs[runs.length - 1]++;
            inInk = ink;
          });
          const firstInk = row.findIndex((d) => d > 0.4);
          let across = 0;
          for (let y = 0; y <= 2 * half; y++) across += dark(4 * (y * w + firstInk + 1));
          const rgb = [0, 1, 2].map((k) => img.data[4 * (half * w + firstInk + 1) + k]);
          return { runs: runs.map((n) => n / r), across: across / r, rgb, ratio: r };
        },
        [box, 12] as [number[], number],
      );
    };
    const screenDashed = await swatch(dashed.label);
    const screenSolid = await swatch(solid.label);
    // Solid: one unbroken run over the swatch; dashed: dashes and gaps of the contour's pattern.
    expect(screenSolid.runs.length, `${solid.label}: ${JSON.stringify(screenSolid)}`).toBe(1);
    expect(screenDashed.runs.length, `${dashed.label}: ${JSON.stringify(screenDashed)}`).toBeGreaterThanOrEqual(2);
    expect(Math.abs(screenDashed.runs[0] - dashPx[0]), `dash ${JSON.stringify(screenDashed.runs)} vs ${dashPx}`).toBeLessThanOrEqual(1.5);
    // Width across the line, in CSS px (ink summed over the column, so antialiasing counts by its share).
    const inkOf = (rgb: number[]) => 1 - (0.299 * rgb[0] + 0.587 * rgb[1] + 0.114 * rgb[2]) / 255;
    const ink = inkOf(hexRgb(solid.stroke!.color));
    expect(screenSolid.across / ink, 'solid width').toBeCloseTo(widthPx.solid, 0);
    expect(screenDashed.across / ink, 'dashed width').toBeCloseTo(widthPx.dashed, 0);
    expect(screenSolid.across / screenDashed.across, 'width ratio').toBeCloseTo(widthPx.solid / widthPx.dashed, 0);
    // Colour: the swatch is the contour's ink where the line is solid.
    const [r, g, b] = hexRgb(solid.stroke!.color);
    expect(Math.max(Math.abs(screenSolid.rgb[0] - r), Math.abs(screenSolid.rgb[1] - g), Math.abs(screenSolid.rgb[2] - b)), `colour ${screenSolid.rgb}`).toBeLessThanOrEqual(40);
    await page.screenshot({ path: join(ARTIFACTS, 'map-legend.png') });
    await page.click('[data-tab="plots"]');
  });

  it('never clips a breakdown plot’s long y-axis title: wrapped on screen and in the exported figure, all of its text kept', async () => {
    await s.freshDemo();
    const { page } = s;
    const figure = '[data-plot^="origin:"]';
    await page.waitForSelector(`${figure} canvas[data-y-title-lines]`);
    const plots = await page.$$eval(figure, (els) => els.map((e) => e.getAttribute('data-plot')));
    expect(plots.length, 'the demo has signal-origin breakdowns').toBeGreaterThan(0);
    for (const id of plots) {
      const sel = `[data-plot="${id}"]`;
      await page.$eval(sel, (el) => el.scrollIntoView({ block: 'center' }));
      // The re-layout after wrapping happens on the next tick: wait until the lines are stable.
      await page.waitForFunction((q) => {
        const c = document.querySelector(`${q} canvas`) as HTMLCanvasElement | null;
        const w = window as unknown as { lastLines?: string };
        const now = c?.dataset.yTitleLines;
        const same = now !== undefined && w.lastLines === now;
        w.lastLines = now;
        return same;
      }, sel, { polling: 100 });
      const lines = JSON.parse((await page.getAttribute(`${sel} canvas`, 'data-y-title-lines')) ?? '[]') as string[];
      expect(lines.join(' '), id!).toMatch(/^fraction of h_c² per (unit redshift|dex of chirp mass)$/);
      // Ink of the y title (the canvas's left strip, where nothing else is drawn) stays inside the
      // canvas: it neither touches the top nor the bottom edge.
      const ink = await page.$eval(
        `${sel} canvas`,
        (el, n) => {
          const canvas = el as HTMLCanvasElement;
          const r = canvas.width / canvas.clientWidth;
          const w = Math.round((4 + n * 17) * r);
          const img = canvas.getContext('2d')!.getImageData(0, 0, w, canvas.height);
          const rows: number[] = [];
          for (let y = 0; y < canvas.height; y++) {
            for (let x = 0; x < w; x++) {
              const i = 4 * (y * w + x);
              if (img.data[i] < 160 && img.data[i + 1] < 160 && img.data[i + 2] < 160) {
                rows.push(y);
                break;
              }
            }
          }
          return { first: rows[0] / r, last: rows.at(-1)! / r, height: canvas.height / r, inked: rows.length };
        },
        lines.length,
      );
      expect(ink.inked, `${id}: the title is drawn`).toBeGreaterThan(20);
      expect(ink.first, `${id}: ${JSON.stringify(ink)}`).toBeGreaterThan(2);
      expect(ink.last, `${id}: ${JSON.stringify(ink)}`).toBeLessThan(ink.height - 2);
      // The figure writer wraps the same title to fit the plot's height, inside the page.
      for (const size of ['column', 'double'] as const) {
        await page.selectOption(`${sel} select[data-figure-size]`, size);
        const svg = readSvgFigure((await download(page, () => page.click(`${sel} [data-action="export-svg"]`))).bytes.toString('utf8'));
        expect(svg.yTitle.h, `${id} ${size}`).toBeLessThanOrEqual(svg.plot.h + 1e-6);
        expect(inside(svg.yTitle, { x: 0, y: 0, w: svg.viewBox[2], h: svg.viewBox[3] }), `${id} ${size}`).toBe(true);
      }
    }
    await page.screenshot({ path: join(ARTIFACTS, 'breakdown-titles.png') });
  });

  it('keeps the key-results bar to one short row at 1400 and 1920 px, with A_yr whole and every full value in its card’s title', async () => {
    await s.freshDemo();
    const { page } = s;
    await page.waitForFunction(() => document.querySelector('[data-key-value="comparison"]')?.getAttribute('data-raw')?.includes(':'));
    for (const viewport of [{ width: 1400, height: 900 }, { width: 1920, height: 1080 }]) {
      await page.setViewportSize(viewport);
      const bar = await page.$eval('.key-results', (el) => {
        const cards = [...el.querySelectorAll<HTMLElement>('.key-result')];
        return {
          height: el.getBoundingClientRect().height,
          tops: new Set(cards.map((c) => Math.round(c.getBoundingClientRect().top))).size,
          ayr: (() => {
            const v = el.querySelector<HTMLElement>('[data-key-value="A_yr"]')!;
            return { clipped: v.scrollHeight > v.clientHeight + 1 || v.scrollWidth > v.clientWidth + 1 };
          })(),
          titles: cards.map((c) => ({ title: c.title, raw: c.querySelector('.key-value')?.getAttribute('data-raw'), name: c.dataset.keyResult })),
        };
      });
      expect(bar.tops, `${viewport.width} px: cards in one row`).toBe(1);
      expect(bar.height, `${viewport.width} px: bar height`).toBeLessThan(viewport.height / 6);
      expect(bar.ayr.clipped, `${viewport.width} px: A_yr shown whole`).toBe(false);
      for (const c of bar.titles) expect(c.title).toBe(`${c.name}: ${c.raw}`);
    }
    await page.setViewportSize({ width: 1400, height: 900 });
  });

  it('sets titles on screen in the trade’s notation, as the figures do: h_c and Ω_gw with subscripts, nothing upper-cased', async () => {
    await s.freshDemo();
    const { page } = s;
    const canvas = '[data-plot="spectrum"] canvas';
    await page.waitForSelector(`${canvas}[data-y-title-runs]`);
    const runsOf = async (sel: string, attr: string) => (JSON.parse((await page.getAttribute(sel, attr)) ?? '[]') as { text: string; shift: string }[][]).flat();
    // richRuns is the figure writer's notation (figureText.ts, tested in figureText.test.ts).
    expect(await runsOf(canvas, 'data-y-title-runs')).toEqual(richRuns('characteristic strain h_c'));
    await page.click('input[name="quantity"][value="omega"]');
    await page.waitForFunction((c) => document.querySelector(c)?.getAttribute('data-y-title-runs')?.includes('"gw"'), canvas);
    const omega = await runsOf(canvas, 'data-y-title-runs');
    expect(omega).toContainEqual({ text: 'gw', shift: 'sub' });
    expect(omega.map((r) => r.text).join('')).not.toMatch(/_|Omega/);
    // The switch's labels too: Ω with a subscript gw in the page's text.
    expect(await page.$eval('input[name="quantity"][value="omega"]', (el) => el.parentElement!.innerHTML)).toMatch(/Ω<sub>gw<\/sub>/);
    await page.click('input[name="quantity"][value="hc"]');
    // Breakdown plot titles: "h_c²" as h with subscript c and the square.
    const origin = '[data-plot^="origin:"] canvas';
    await page.waitForSelector(`${origin}[data-title-runs]`);
    const title = (JSON.parse((await page.getAttribute(origin, 'data-title-runs')) ?? '[]') as { text: string; shift: string }[]);
    expect(title).toContainEqual({ text: 'c', shift: 'sub' });
    // ... while a cell name in it stays as written (z_origin, mc_origin).
    expect(title.filter((r) => r.shift === 'normal').map((r) => r.text).join('')).toMatch(/\((z|mc)_origin\)$/);
    // Its legend's "central 90% of h_c²" too.
    const legend = JSON.parse((await page.getAttribute(origin, 'data-legend-runs')) ?? '[]') as { text: string; shift: string }[][];
    expect(legend.length).toBeGreaterThan(0);
    for (const entry of legend) expect(entry).toContainEqual({ text: 'c', shift: 'sub' });
  });

  it('has no serious or critical axe-core violations with a docs page open, the notes being edited and a merged message shown', async () => {
    await s.freshDemo();
    const { page } = s;
    await page.click('[data-tab="docs"]');
    await page.waitForSelector('.doc-page h1');
    await page.click('[data-action="edit-notes"]');
    await page.setInputFiles('input[data-action="open-file"]', { name: 'a.png', mimeType: 'image/png', buffer: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]) });
    await page.setInputFiles('input[data-action="open-file"]', { name: 'a.png', mimeType: 'image/png', buffer: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0]) });
    await page.waitForSelector('.message.error[data-message-count="2"]');
    const violations = (await page.evaluate(async (src) => {
      // axe-core is evaluated through the DevTools protocol, which the page's CSP does not govern.
      (0, eval)(src);
      const axe = (window as unknown as { axe: { run(ctx: Document, opts: object): Promise<{ violations: { id: string; impact: string | null; nodes: { target: string[] }[] }[] }> } }).axe;
      const r = await axe.run(document, { resultTypes: ['violations'] });
      return r.violations.map((v) => ({ id: v.id, impact: v.impact, nodes: v.nodes.slice(0, 3).map((n) => n.target) }));
    }, AXE_SOURCE)) as { id: string; impact: string | null }[];
    const bad = violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
    expect(bad, JSON.stringify(bad, null, 1)).toEqual([]);
    await page.screenshot({ path: join(ARTIFACTS, 'docs-notes-messages.png') });
  });

  it('keeps the label of a chosen switch readable under the pointer (view switch at 1000 px, current docs page)', async () => {
    await s.freshDemo();
    const { page } = s;
    // WCAG 2.1 contrast ratio of two sRGB colours (W3C WCAG 2.1, relative luminance definition).
    const contrastOf = (sel: string) =>
      page.$eval(sel, (el) => {
        const rgb = (c: string) => (c.match(/\d+(\.\d+)?/g) ?? []).slice(0, 3).map(Number);
        const lum = (c: number[]) => {
          const [r, g, b] = c.map((v) => v / 255).map((v) => (v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
          return 0.2126 * r + 0.7152 * g + 0.0722 * b;
        };
        const st = getComputedStyle(el);
        const [a, b] = [lum(rgb(st.color)), lum(rgb(st.backgroundColor))].sort((x, y) => y - x);
        return (a + 0.05) / (b + 0.05);
      });
    await page.setViewportSize({ width: 1000, height: 800 });
    try {
      await page.click('[data-view-button="side"]');
      await page.hover('[data-view-button="side"]');
      // WCAG 2.1 success criterion 1.4.3: at least 4.5:1 for text.
      expect(await contrastOf('[data-view-button="side"]')).toBeGreaterThanOrEqual(4.5);
      await page.click('[data-tab="docs"]');
      await page.waitForSelector('[data-doc-page][aria-current="page"]');
      await page.hover('[data-doc-page][aria-current="page"]');
      expect(await contrastOf('[data-doc-page][aria-current="page"]')).toBeGreaterThanOrEqual(4.5);
    } finally {
      await page.setViewportSize({ width: 1400, height: 900 });
    }
  });
});
