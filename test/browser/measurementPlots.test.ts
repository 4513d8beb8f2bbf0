// The free-spectrum and (A, gamma) plots in a real browser (Debian's chromium through playwright-core)
// on the production build: drawn (not blank), the axis switch, pinned curves on both, and the exports
// (CSV numbers against the engine run headless in this process, SVG read by chromium's XML parser,
// PNG header). Conventions: docs/freeSpectrum.md.
import { mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { Sheet } from '../../src/sheet/sheet';
import { buildAndServe, PROJECT_ROOT, type ServedApp } from './appServer';
import { browserAvailability, launchChromium, type LaunchedBrowser } from './chromiumBrowser';
import { canvasInk, download } from './pageHelpers';
import type { FreeSpectrumData } from '../../src/statistics/freeSpectrum';
import { runChunkedJob } from '../../src/jobs/runChunks';
import { spectrumSampleJob } from '../../src/statistics/spectrumMonteCarloJob';
import { spectrumSampleOptions } from '../../web/plots/spectrumMonteCarlo';

const availability = browserAvailability();
const runSuite = availability.ok || availability.required;
const ARTIFACTS = join(PROJECT_ROOT, 'test-artifacts');
const DEMO_TEXT = readFileSync(join(PROJECT_ROOT, 'examples/demo.json'), 'utf8');
const FS = '[data-plot="free-spectrum"]';
const AG = '[data-plot="amplitude-gamma"]';

describe.runIf(runSuite)('free-spectrum and (A, gamma) plots in the browser', { timeout: 60_000 }, () => {
  let app: ServedApp;
  let chromium: LaunchedBrowser;
  let page: Page;
  const pageErrors: string[] = [];

  beforeAll(async () => {
    if (!availability.ok) throw new Error(availability.reason);
    mkdirSync(ARTIFACTS, { recursive: true });
    app = await buildAndServe();
    chromium = await launchChromium();
    page = await chromium.context.newPage();
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await page.goto(app.url);
    await page.evaluate(() => localStorage.clear());
    await page.reload();
    await page.waitForSelector('[data-key-value="A_yr"]');
    await page.waitForFunction(() => !document.querySelector('[data-recalculating]'));
  }, 180_000);

  afterAll(async () => {
    await chromium?.close();
    await app?.close();
  });

  const legend = async (sel: string): Promise<string[]> => JSON.parse((await page.getAttribute(sel, 'data-legend')) ?? '[]');

  it('draws the demo free spectrum as violins with the model spectra, and the (A, gamma) plane, neither blank', async () => {
    await page.waitForSelector(`${FS} canvas`);
    await page.waitForSelector(`${AG} canvas`);
    await page.waitForFunction((s) => (document.querySelector(s) as HTMLElement | null)?.dataset.legend?.includes('spectrum'), FS);
    expect(await legend(FS)).toEqual(expect.arrayContaining(['measured_free_spectrum: posterior per bin (density)', 'spectrum']));
    const ag = await legend(AG);
    expect(ag).toEqual(expect.arrayContaining(['measured_A_gamma: 68% highest-density region', 'measured_A_gamma: 95% highest-density region']));
    // The demo's own cell (effective_A_gamma) puts its spectrum on the 98.7% contour: the plot says the same.
    const headless = Sheet.fromFile(DEMO_TEXT);
    const cellText = (headless.value('effective_A_gamma') as { describe(): string }).describe();
    const level = /on the ([\d.]+)% contour/.exec(cellText)![1];
    expect(ag).toContain(`spectrum (on the ${level}% contour)`);
    for (const sel of [FS, AG]) {
      await page.locator(sel).scrollIntoViewIfNeeded();
      const ink = await canvasInk(page, `${sel} canvas`);
      expect(ink.inked / ink.total, sel).toBeGreaterThan(0.01);
      expect(ink.colours, sel).toBeGreaterThan(3);
    }
    await page.locator(FS).screenshot({ path: join(ARTIFACTS, 'free-spectrum.png') });
    await page.locator(AG).screenshot({ path: join(ARTIFACTS, 'amplitude-gamma.png') });
    expect(pageErrors).toEqual([]);
  });

  it('switches the vertical axis to rho_k: the CSV medians are the samples’ medians in seconds, the y ticks follow', async () => {
    const before = await page.getAttribute(FS, 'data-y-ticks');
    await page.check('input[name="free-spectrum-axis"][value="rho"]');
    await page.waitForFunction(([s, b]) => document.querySelector(s!)?.getAttribute('data-y-ticks') !== b, [FS, before]);
    const csv = await download(page, () => page.click(`${FS} [data-action="export-csv"]`));
    const lines = csv.bytes.toString('utf8').trim().split('\r\n');
    expect(lines[0]).toContain('residual amplitude rho_k (s)');
    const medians = lines.slice(1).map((l) => l.split(',')).filter((f) => f[0] === 'measured_free_spectrum: posterior median per bin');
    // Independent path: the engine headless, the raw samples of log10 rho_k, their median.
    const data = (Sheet.fromFile(DEMO_TEXT).value('measured_free_spectrum') as unknown as { data: FreeSpectrumData }).data;
    expect(medians.length).toBe(data.frequencyHz.length);
    medians.forEach((f, k) => {
      const s = Float64Array.from(data.samples[k]).sort();
      const n = s.length;
      const med = n % 2 ? s[(n - 1) / 2] : 0.5 * (s[n / 2 - 1] + s[n / 2]);
      expect(Number(f[1])).toBeCloseTo(data.frequencyHz[k] * 1e9, 9);
      expect(Math.abs(Number(f[2]) / 10 ** med - 1)).toBeLessThan(1e-12);
    });
    const svg = await download(page, () => page.click(`${FS} [data-action="export-svg"]`));
    const parsed = await page.evaluate((t) => {
      const doc = new DOMParser().parseFromString(t, 'image/svg+xml');
      return { error: doc.getElementsByTagName('parsererror').length, text: doc.documentElement.textContent ?? '' };
    }, svg.bytes.toString('utf8'));
    expect(parsed.error).toBe(0);
    expect(parsed.text).toContain('residual amplitude ρk (s)');
    await page.check('input[name="free-spectrum-axis"][value="hc"]');
  });

  it('a pinned curve appears on the free spectrum and as its own point on the (A, gamma) plane; both export as PNG', async () => {
    await page.click('[data-action="pin"]');
    await page.waitForSelector('.pin');
    await page.waitForFunction((s) => (document.querySelector(s) as HTMLElement | null)?.dataset.legend?.includes('(pinned)'), FS);
    await page.waitForFunction((s) => (document.querySelector(s) as HTMLElement | null)?.dataset.legend?.includes('(pinned)'), AG);
    expect((await legend(AG)).some((l) => /^spectrum: as now \(pinned\) \(on the [\d.]+% contour\)$/.test(l))).toBe(true);
    for (const sel of [FS, AG]) {
      await page.selectOption(`${sel} select[data-figure-size]`, 'column');
      const png = await download(page, () => page.click(`${sel} [data-action="export-png"]`));
      // PNG signature and IHDR (W3C PNG specification, sections 5.2 and 11.2.2); 3.4 in at 300 dpi = 1020 px.
      expect([...png.bytes.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
      expect(png.bytes.readUInt32BE(16)).toBe(1020);
    }
    expect(pageErrors).toEqual([]);
  });
  it('Open data asks for the prior of the free-spectrum analysis and stores it with the data; a reversed range is refused in the dialog', async () => {
    await page.click('[data-action="open-data"]');
    await page.waitForSelector('dialog[data-dialog="open-data"][open]');
    // The demo's cell has a prior: offered as it is, and chosen by default.
    expect(await page.isChecked('input[name="data-prior"][value="keep"]')).toBe(true);
    await page.fill('input[data-prior="lower"]', '-3');
    await page.fill('input[data-prior="upper"]', '-9.5');
    await page.click('[data-action="choose-data-file"]');
    await page.waitForSelector('dialog[data-dialog="open-data"] .form-error');
    expect(await page.textContent('dialog[data-dialog="open-data"] .form-error')).toContain("the prior's lower end (-3) must be below its upper end (-9.5)");
    await page.fill('input[data-prior="lower"]', '-9.5');
    await page.fill('input[data-prior="upper"]', '-3');
    expect(await page.isChecked('input[name="data-prior"][value="uniform"]')).toBe(true);
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.click('[data-action="choose-data-file"]')]);
    await chooser.setFiles({ name: 'two-bins.csv', mimeType: 'text/csv', buffer: Buffer.from('2.26 nHz,4.52 nHz\n-6.5,-7.0\n-6.6,-7.1\n-6.4,-7.2\n') });
    await page.waitForFunction(() => document.querySelector('[data-value="measured_free_spectrum"]')?.getAttribute('data-raw')?.includes('2 bins'));
    // The engine reads the stated prior back from the stored cell.
    expect(await page.getAttribute('[data-value="measured_free_spectrum"]', 'data-raw')).toContain('prior uniform in log10 rho -9.5 to -3');
    expect(await page.isVisible('dialog[data-dialog="open-data"][open]')).toBe(false);
    // The free-spectrum plot follows: two violins now (two medians in its data export).
    await page.waitForFunction((s) => (document.querySelector(s) as HTMLElement | null)?.dataset.xTicks !== undefined, FS);
    const csv = await download(page, () => page.click(`${FS} [data-action="export-csv"]`));
    const medians = csv.bytes.toString('utf8').trim().split('\r\n').filter((l) => l.startsWith('measured_free_spectrum: posterior median per bin,'));
    expect(medians.length).toBe(2);
    expect(pageErrors).toEqual([]);
  });
  it('runs a Monte Carlo of the spectrum: its band on the free spectrum and its cloud on the (A, gamma) plane, the numbers of the same job in node for the same seed', async () => {
    await page.evaluate(() => localStorage.clear());
    await page.reload();
    await page.waitForSelector(`[data-measurement-plot="free-spectrum"] [data-monte-carlo]`);
    await page.fill('[data-field="mc-draws"]', '40');
    await page.fill('[data-field="mc-seed"]', '7');
    await page.click('[data-action="run-monte-carlo"]');
    await page.waitForSelector('[data-mc-state]', { timeout: 60_000 });
    await page.waitForFunction((s) => (document.querySelector(s) as HTMLElement | null)?.dataset.legend?.includes('Monte Carlo of spectrum (40 draws, seed 7): 95%'), FS);
    await page.waitForFunction((s) => (document.querySelector(s) as HTMLElement | null)?.dataset.legend?.includes('Monte Carlo of spectrum (40 draws, seed 7): fitted (A, γ)'), AG);
    const csv = await download(page, () => page.click(`${FS} [data-action="export-csv"]`));
    // The label holds a comma, so the CSV quotes it (RFC 4180); the numbers follow it.
    const head = '"Monte Carlo of spectrum (40 draws, seed 7): 95%",';
    const rows = csv.bytes.toString('utf8').trim().split('\r\n').filter((l) => l.startsWith(head)).map((l) => ['', ...l.slice(head.length).split(',')]);
    // The same job run headless in this process (Node's V8) on the demo, seed 7.
    const sheet = Sheet.fromFile(DEMO_TEXT);
    const reader = { cells: sheet.cells(), valueOf: (n: string) => sheet.value(n), stateOf: (n: string) => sheet.state(n) };
    const opts = spectrumSampleOptions(reader, 'spectrum', 40, 7);
    if ('reason' in opts) throw new Error(opts.reason);
    const r = await runChunkedJob(spectrumSampleJob, sheet, opts);
    expect(rows.length).toBe(r.frequencyHz.length);
    rows.forEach((f, k) => {
      // Equal to 1e-9: ECMA-262 leaves Math.pow's last bit to the engine (browser vs Node V8).
      expect(Math.abs(Number(f[3]) / r.lower95[k] - 1), `bin ${k + 1}`).toBeLessThan(1e-9);
      expect(Math.abs(Number(f[4]) / r.upper95[k] - 1), `bin ${k + 1}`).toBeLessThan(1e-9);
    });
    await page.locator(AG).screenshot({ path: join(ARTIFACTS, 'amplitude-gamma-monte-carlo.png') });
    await page.click('[data-action="clear-monte-carlo"]');
    await page.waitForFunction((s) => !(document.querySelector(s) as HTMLElement | null)?.dataset.legend?.includes('Monte Carlo'), FS);
    expect(pageErrors).toEqual([]);
  });

  it('draws the realisations of a realiseBackground cell with the free spectrum’s violins, following the axis switch', async () => {
    const demo = JSON.parse(DEMO_TEXT);
    const text = JSON.stringify({ ...demo, title: 'realisations plot', cells: [...demo.cells, { name: 'real', formula: 'realiseBackground(pop, freqs, array_span, 30, 2)' }] });
    await page.setInputFiles('input[data-action="open-file"]', { name: 'real.json', mimeType: 'application/json', buffer: Buffer.from(text) });
    const RE = '[data-plot="realisations"]';
    await page.waitForSelector(`${RE} canvas`, { timeout: 60_000 });
    await page.waitForFunction((sel) => (document.querySelector(sel) as HTMLElement | null)?.dataset.legend?.includes('30 realisations'), RE);
    expect(await legend(RE)).toEqual(
      expect.arrayContaining(['real (30 realisations, seed 2): 95% of realisations', '3 single realisations', 'loudest binary per bin: its own h_c (median)', 'measured_free_spectrum: posterior per bin (density)']),
    );
    await page.locator(RE).scrollIntoViewIfNeeded();
    const ink = await canvasInk(page, `${RE} canvas`);
    expect(ink.inked / ink.total).toBeGreaterThan(0.01);
    await page.locator(RE).screenshot({ path: join(ARTIFACTS, 'realisations.png') });
    const before = await page.getAttribute(RE, 'data-y-ticks');
    await page.check('input[name="free-spectrum-axis"][value="psd"]');
    await page.waitForFunction(([sel, b]) => document.querySelector(sel!)?.getAttribute('data-y-ticks') !== b, [RE, before]);
    const csv = await download(page, () => page.click(`${RE} [data-action="export-csv"]`));
    expect(csv.bytes.toString('utf8').split('\r\n')[0]).toContain('timing-residual power P(f) (s^3)');
    expect(pageErrors).toEqual([]);
  });
});
