// One built app, one chromium and one page for a browser test file, plus a fresh start on the demo.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { buildAndServe, PROJECT_ROOT, type ServedApp } from './appServer';
import { launchChromium, type LaunchedBrowser } from './chromiumBrowser';

export const ARTIFACTS = join(PROJECT_ROOT, 'test-artifacts');

export interface AppSession {
  page: Page;
  url: string;
  /** Uncaught errors of the page so far. */
  pageErrors: string[];
  /** Reload on the demo with no autosave and no pins, and wait for A_yr. */
  freshDemo(): Promise<void>;
  /** freshDemo, then open a sheet file's text as `fileName`, wait for `cell`'s row and show side-panel tab `tab`. */
  openSheetInTab(fileName: string, text: string, cell: string, tab: string): Promise<void>;
  close(): Promise<void>;
}

export async function startAppSession(viewport = { width: 1400, height: 900 }): Promise<AppSession> {
  mkdirSync(ARTIFACTS, { recursive: true });
  const app: ServedApp = await buildAndServe();
  let chromium: LaunchedBrowser | undefined;
  try {
    chromium = await launchChromium(viewport);
  } catch (err) {
    await app.close();
    throw err;
  }
  const page = await chromium.context.newPage();
  const pageErrors: string[] = [];
  page.on('pageerror', (e) => pageErrors.push(e.message));
  await page.goto(app.url);
  await page.waitForSelector('[data-key-value="A_yr"]');
  const browser = chromium;
  const freshDemo = async (): Promise<void> => {
    await page.evaluate(() => localStorage.clear());
    await page.reload();
    await page.waitForSelector('[data-key-value="A_yr"]');
    await page.waitForFunction(() => document.querySelector('[data-key-value="A_yr"]')?.getAttribute('data-raw')?.match(/\d/));
    // A_yr comes first (its inputs are evaluated before the rest); then wait for every other cell.
    await page.waitForFunction(() => !document.querySelector('[data-recalculating]'));
  };
  return {
    page,
    url: app.url,
    pageErrors,
    freshDemo,
    async openSheetInTab(fileName, text, cell, tab) {
      await freshDemo();
      await page.setInputFiles('input[data-action="open-file"]', { name: fileName, mimeType: 'application/json', buffer: Buffer.from(text) });
      await page.waitForSelector(`[data-cell="${cell}"]`);
      await page.click(`[data-tab="${tab}"]`);
    },
    async close() {
      await browser.close();
      await app.close();
    },
  };
}

/** Whether the element's centre is on screen and the element (or something inside it) is what is drawn there. */
export async function visibleAtCentre(page: Page, selector: string): Promise<boolean> {
  // Panels load their code on first show: wait until the element exists ($eval does not wait).
  await page.waitForSelector(selector, { state: 'attached' });
  return page.$eval(selector, (el) => {
    const r = el.getBoundingClientRect();
    const x = r.left + r.width / 2;
    const y = r.top + r.height / 2;
    if (r.width === 0 || r.height === 0 || x < 0 || y < 0 || x > window.innerWidth || y > window.innerHeight) return false;
    const top = document.elementFromPoint(x, y);
    return !!top && (top === el || el.contains(top));
  });
}
