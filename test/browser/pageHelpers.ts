// Small helpers for driving the app in chromium: reading values, typing formulas, downloads.
import { readFileSync } from 'node:fs';
import type { Download, Page } from 'playwright-core';

/** The value column text of a cell as the engine formatted it (data-raw holds formatValue's text). */
export async function cellValueText(page: Page, name: string): Promise<string> {
  // Once the recalculation is complete (a sheet put in place by undo or a reload is recalculated in
  // slices) and no cell is evaluated off the page (on a loaded machine a cell may run past the page's budget).
  await page.waitForFunction(() => !document.querySelector('[data-recalculating], [data-off-page], [data-waits-for]'), undefined, { timeout: 60_000 });
  return (await page.getAttribute(`[data-value="${name}"]`, 'data-raw')) ?? '';
}

/** Status badge of a cell ('ok', 'computing' or the error kind). */
export async function cellStatus(page: Page, name: string): Promise<string> {
  return ((await page.textContent(`[data-cell="${name}"] .badge`)) ?? '').trim();
}

/** Replaces a cell's formula and commits it by leaving the box (blur commits at once). */
export async function setFormula(page: Page, name: string, formula: string): Promise<void> {
  const box = page.locator(`input[data-formula="${name}"]`);
  await box.click();
  await box.fill(formula);
  await box.evaluate((el) => (el as HTMLInputElement).blur());
}

/** The first number in a text such as "2.41e-15" or "0.00169 Mpc^-3 Gyr^-1". */
export function firstNumber(text: string): number {
  const m = /-?\d+(?:\.\d+)?(?:e[+-]?\d+)?/i.exec(text);
  return m ? Number(m[0]) : NaN;
}

/** Clicks something that starts a download and returns the downloaded bytes and file name. */
export async function download(page: Page, click: () => Promise<void>): Promise<{ name: string; bytes: Buffer }> {
  const [dl]: [Download, void] = await Promise.all([page.waitForEvent('download', { timeout: 15_000 }), click()]);
  const path = await dl.path();
  return { name: dl.suggestedFilename(), bytes: readFileSync(path) };
}

/** Pixels of the spectrum canvas that are not white, and the number of distinct colours seen. */
export async function canvasInk(page: Page, selector: string): Promise<{ inked: number; total: number; colours: number }> {
  return page.$eval(selector, (el) => {
    const canvas = el as HTMLCanvasElement;
    const ctx = canvas.getContext('2d');
    if (!ctx) return { inked: 0, total: 0, colours: 0 };
    const { data, width, height } = ctx.getImageData(0, 0, canvas.width, canvas.height);
    let inked = 0;
    const colours = new Set<number>();
    for (let i = 0; i < data.length; i += 4) {
      const r = data[i];
      const g = data[i + 1];
      const b = data[i + 2];
      if (r < 245 || g < 245 || b < 245) inked++;
      colours.add(((r >> 4) << 8) | ((g >> 4) << 4) | (b >> 4));
    }
    return { inked, total: width * height, colours: colours.size };
  });
}

/** A fingerprint of a canvas's pixels (changes when anything drawn changes). */
export async function canvasFingerprint(page: Page, selector: string): Promise<string> {
  return page.$eval(selector, (el) => {
    const canvas = el as HTMLCanvasElement;
    const ctx = canvas.getContext('2d')!;
    const { data } = ctx.getImageData(0, 0, canvas.width, canvas.height);
    let h1 = 0x811c9dc5;
    for (let i = 0; i < data.length; i++) h1 = Math.imul(h1 ^ data[i], 0x01000193) >>> 0;
    return h1.toString(16);
  });
}

/** Opens a row's details (inputs, dependents, actions): its name button toggles them. */
export async function openRowDetails(page: Page, name: string): Promise<void> {
  const details = page.locator(`[data-cell="${name}"] .row-details`);
  for (let attempt = 0; attempt < 3; attempt++) {
    if (await details.isVisible()) return;
    await page.click(`[data-cell="${name}"] .name-button`);
    await details.waitFor({ state: 'visible', timeout: 2000 }).catch(() => undefined);
  }
  await details.waitFor({ state: 'visible', timeout: 2000 });
}
