// What the page loads before its first result and what it loads on first use (issue 11): the
// built-ins' documentation and the readers of measurement files stay out of the start, and the
// Reference tab, once opened, shows each built-in's documentation exactly as the engine defines it
// (allBuiltins() run in this process is the reference).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { allBuiltins } from '../../src/builtins/index';
import { buildAndServe, type ServedApp } from './appServer';
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
