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
    expect(loaded).toEqual(expect.arrayContaining(['index', 'mathjs', 'sheetEngine', 'demoFirstBuiltins']));
    expect(loaded).not.toContain('builtinDocs');
    expect(loaded).not.toContain('measurementCells');
  });

  it('evaluates the demo with every built-in loaded by the time its recalculation is complete, with no error', async () => {
    await page.waitForFunction(() => !document.querySelector('[data-recalculating]'));
    const loaded = await loadedScripts(page);
    // the groups the demo's A_yr needs come in one chunk with the page (vite.config.ts), the others on their own
    for (const group of ['demoFirstBuiltins', 'builtinGroup-realisations', 'builtinGroup-freeSpectrum']) expect(loaded).toContain(group);
    expect(await page.$$eval('.cell-row.status-error', (xs) => xs.map((x) => x.getAttribute('data-cell')))).toEqual([]);
  });

  it('evaluates formulas naming mathjs’s functions loaded later (after the first result) as the engine does here', async () => {
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
    expect(await loadedScripts(page)).toContain('mathjsDeferred');
    expect(pageErrors).toEqual([]);
  });

  it('a formula naming a function loaded later, typed right after the first result, waits for its chunk and then gives the engine’s value', async () => {
    // A page of its own (fresh profile, so nothing cached) whose request for the chunk of mathjs's
    // functions loaded later is held until the formulas are in.
    const other = await launchChromium();
    try {
      const p = await other.context.newPage();
      const errors: string[] = [];
      p.on('pageerror', (e) => errors.push(e.message));
      // Held until released; a later request (a worker's) goes through.
      const held: Array<() => Promise<void>> = [];
      let holding = true;
      await p.route(/mathjsDeferred-[^/]*\.js$/, (route) => (holding ? void held.push(() => route.continue()) : route.continue()));
      await p.goto(app.url);
      await p.waitForFunction(() => performance.getEntriesByName('strainsheet:first-A_yr', 'mark').length > 0);
      // The first result came without the chunk.
      expect(await loadedScripts(p)).not.toContain('mathjsDeferred');
      const formulas = {
        rooted: 'hypot(3, 4) * 1 m + sqrt(16 m^2)',
        mapped: 'map([1, 4, 9], sqrt)',
        operators: '5! + (7 mod 3) + (5 & 3) + (1 << 3)',
        stats: 'median([3, 1, 2]) + std([1, 2, 3, 4])',
      };
      const reference = new Sheet();
      for (const [name, formula] of Object.entries(formulas)) reference.setCell({ name, formula });
      for (const [name, formula] of Object.entries(formulas)) {
        const box = p.locator('form.add-cell input[name="formula"]');
        await p.fill('form.add-cell input[name="name"]', name);
        await box.fill(formula);
        await box.press('Enter');
        await expect.poll(() => box.inputValue()).toBe('');
      }
      // The recalculation waits for the chunk; no cell has an error ('has not loaded yet' would be one).
      await expect.poll(() => held.length).toBeGreaterThan(0);
      expect(await p.$$eval('[data-recalculating]', (xs) => xs.length)).toBeGreaterThan(0);
      expect(await p.$$eval('.cell-row.status-error', (xs) => xs.map((x) => x.getAttribute('data-cell')))).toEqual([]);
      holding = false;
      for (const release of held.splice(0)) await release();
      for (const name of Object.keys(formulas)) {
        await p.waitForSelector(`[data-cell="${name}"].status-ok`);
        expect(await cellValueText(p, name), name).toBe(formatValue(reference.value(name)));
      }
      expect(await loadedScripts(p)).toContain('mathjsDeferred');
      expect(await p.$$eval('.cell-row.status-error', (xs) => xs.map((x) => x.getAttribute('data-cell')))).toEqual([]);
      expect(errors).toEqual([]);
    } finally {
      await other.close();
    }
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
