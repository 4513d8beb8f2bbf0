// What the page loads before its first result and what it loads on first use (issue 11): the
// built-ins' documentation and the readers of measurement files stay out of the start, and the
// Reference tab, once opened, shows each built-in's documentation exactly as the engine defines it
// (allBuiltins() run in this process is the reference).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { allBuiltins } from '../../src/builtins/index';
import { buildAndServe, type ServedApp } from './appServer';
import { cellValueText } from './pageHelpers';
import { Sheet } from '../../src/sheet/sheet';
import { formatValue } from '../../src/sheet/formatValue';
import { browserAvailability, launchChromium, type LaunchedBrowser } from './chromiumBrowser';

const availability = browserAvailability();
if (!availability.ok) console.warn(availability.reason + (availability.required ? ' STRAINSHEET_REQUIRE_BROWSER=1, so this fails.' : ''));
const runSuite = availability.ok || availability.required;

/** File names (without the content hash) of the scripts the page has loaded so far. */
async function loadedScripts(page: Page): Promise<string[]> {
  const urls = await page.evaluate(() => performance.getEntriesByType('resource').map((e) => e.name));
  return urls.filter((u) => /\.js$/.test(u)).map((u) => u.replace(/^.*\//, '').replace(/-[A-Za-z0-9_-]{8}\.js$/, ''));
}

describe.runIf(runSuite)('loading on first use', { timeout: 60_000 }, () => {
  let app: ServedApp;
  let chromium: LaunchedBrowser;
  let page: Page;
  const pageErrors: string[] = [];

  beforeAll(async () => {
    if (!availability.ok) throw new Error(availability.reason);
    app = await buildAndServe();
    chromium = await launchChromium();
    page = await chromium.context.newPage();
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await page.goto(app.url);
    await page.evaluate(() => localStorage.clear());
    await page.reload();
    await page.waitForFunction(() => performance.getEntriesByName('strainsheet:first-A_yr', 'mark').length > 0);
  }, 120_000);

  afterAll(async () => {
    await chromium?.close();
    await app?.close();
  });

  it('starts without the built-ins’ documentation and the file readers, on the shared engine chunks', async () => {
    const loaded = await loadedScripts(page);
    expect(loaded).toEqual(expect.arrayContaining(['index', 'mathjs', 'sheetEngine']));
    expect(loaded).not.toContain('builtinDocs');
    expect(loaded).not.toContain('measurementCells');
  });

  it('evaluates the demo with every built-in loaded by the time its recalculation is complete, with no error', async () => {
    await page.waitForFunction(() => !document.querySelector('[data-recalculating]'));
    const loaded = await loadedScripts(page);
    for (const group of ['builtinGroup-cosmology', 'builtinGroup-population', 'builtinGroup-realisations', 'builtinGroup-freeSpectrum']) expect(loaded).toContain(group);
    expect(await page.$$eval('.cell-row.status-error', (xs) => xs.map((x) => x.getAttribute('data-cell')))).toEqual([]);
  });

  it('evaluates formulas naming mathjs’s solvers (loaded after the first result) as the engine does here', async () => {
    // Reference: the same formulas evaluated by the engine in this process (every function loaded).
    const formulas = { solved: 'lusolve([[2, 1], [1, 3]], [1, 2])', normed: 'norm([[1, 2], [3, 4]], 2)', ranged: 'iscoFrequency(2e9 Msun)' };
    const reference = new Sheet();
    for (const [name, formula] of Object.entries(formulas)) reference.setCell({ name, formula });
    for (const [name, formula] of Object.entries(formulas)) {
      const box = page.locator('form.add-cell input[name="formula"]');
      await page.fill('form.add-cell input[name="name"]', name);
      await box.fill(formula);
      await box.press('Enter');
      await page.waitForSelector(`[data-cell="${name}"].status-ok`);
      expect(await cellValueText(page, name)).toBe(formatValue(reference.value(name)));
    }
    expect(await loadedScripts(page)).toContain('mathjsSolvers');
    expect(pageErrors).toEqual([]);
  });

  it('loads the documentation when the Reference tab opens and shows each built-in as the engine defines it', async () => {
    await page.click('[data-tab="reference"]');
    await page.waitForSelector('.reference-entry');
    expect(await loadedScripts(page)).toContain('builtinDocs');
    const builtins = allBuiltins();
    expect(await page.$$eval('.reference-entry', (e) => e.length)).toBe(builtins.length);
    for (const name of ['amplitudeAtYear', 'mergerPopulation', 'frequencyGrid']) {
      const b = builtins.find((x) => x.name === name)!;
      const entry = page.locator(`.reference-entry[data-builtin="${name}"]`);
      expect(await entry.locator('.sig-summary').textContent()).toBe(b.summary);
      expect(((await entry.locator('.sig-source').textContent()) ?? '').replace(/^Source:\s*/, '')).toBe(b.source);
      expect(await entry.locator('.sig-arg').count()).toBe(b.args.length);
    }
    expect(pageErrors).toEqual([]);
  });
});
