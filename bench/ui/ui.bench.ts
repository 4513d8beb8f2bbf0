// UI benchmark (run with `npm run bench:ui`): the production build in chromium.
//  - edit -> plot: an edit of the merger-rate cell (committed with Enter) until the spectrum plot
//    has been redrawn, read from the app's own performance marks ('strainsheet:edit' to
//    'strainsheet:plot-drawn:spectrum'); target < 100 ms.
//  - load -> A_yr: navigation start to the first computed A_yr ('strainsheet:first-A_yr'), on a
//    fresh profile with no autosave; target <= 0.4 s (issue 11).
// tinybench times each whole iteration from node (including playwright's round trips); the
// in-app figures are collected alongside and printed as medians at the end.
import { bench, describe } from 'vitest';
import type { Page } from 'playwright-core';
import { buildAndServe, type ServedApp } from '../../test/browser/appServer';
import { browserAvailability, launchChromium, type LaunchedBrowser } from '../../test/browser/chromiumBrowser';

const availability = browserAvailability();
if (!availability.ok) console.warn(availability.reason);

const inApp = { editToPlot: [] as number[], recalculate: [] as number[], loadToAyr: [] as number[] };
let app: ServedApp;
let chromium: LaunchedBrowser;
let page: Page;
let flip = false;
let measuring = false;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const n = s.length;
  return n === 0 ? NaN : n % 2 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
}

async function openFresh(): Promise<number> {
  await page.evaluate(() => localStorage.clear());
  await page.goto(app.url, { waitUntil: 'load' });
  await page.waitForFunction(() => performance.getEntriesByName('strainsheet:first-A_yr', 'mark').length > 0, undefined, { timeout: 60_000 });
  return page.evaluate(() => performance.getEntriesByName('strainsheet:first-A_yr', 'mark')[0].startTime);
}

// vitest's bench mode does not run beforeAll/afterAll hooks, so the app and browser start on the
// first (warm-up) iteration and stop in the last benchmark's teardown.
let ready: Promise<void> | null = null;
function ensureReady(): Promise<void> {
  ready ??= (async () => {
    if (!availability.ok) throw new Error(availability.reason);
    app = await buildAndServe();
    chromium = await launchChromium();
    page = await chromium.context.newPage();
    await page.goto(app.url);
    await openFresh();
  })();
  return ready;
}

async function finish(): Promise<void> {
  console.log(
    `\nin-app medians: edit -> plot ${median(inApp.editToPlot).toFixed(1)} ms (n=${inApp.editToPlot.length}, target < 100 ms); ` +
      `load -> first A_yr ${median(inApp.loadToAyr).toFixed(0)} ms (n=${inApp.loadToAyr.length}, target <= 400 ms)\n` +
      `  of edit -> plot, the engine's recalculation: median ${median(inApp.recalculate).toFixed(1)} ms\n` +
      `edit -> plot samples (ms): ${inApp.editToPlot.map((x) => x.toFixed(1)).join(', ')}\n` +
      `load -> A_yr samples (ms): ${inApp.loadToAyr.map((x) => x.toFixed(0)).join(', ')}`,
  );
  await chromium?.close();
  await app?.close();
}

describe.runIf(availability.ok)('web app', () => {
  bench(
    'edit rate_norm -> spectrum plot redrawn',
    async () => {
      await ensureReady();
      flip = !flip;
      const formula = flip ? '2.4e-3 Mpc^-3 Gyr^-1' : '1.2e-3 Mpc^-3 Gyr^-1';
      await page.evaluate(() => {
        performance.clearMarks();
        performance.clearMeasures();
      });
      const box = page.locator('input[data-formula="rate_norm"]');
      await box.fill(formula);
      await box.press('Enter');
      await page.waitForFunction(() => performance.getEntriesByName('strainsheet:edit-to-plot:spectrum', 'measure').length > 0, undefined, { timeout: 30_000 });
      const ms = await page.evaluate(() => [
        performance.getEntriesByName('strainsheet:edit-to-plot:spectrum', 'measure')[0].duration,
        performance.getEntriesByName('strainsheet:recalculate', 'measure')[0]?.duration ?? NaN,
      ]);
      if (measuring) {
        inApp.editToPlot.push(ms[0]);
        inApp.recalculate.push(ms[1]);
      }
    },
    {
      iterations: 12,
      warmupIterations: 2,
      time: 0,
      warmupTime: 0,
      setup: (_task, mode) => {
        measuring = mode === 'run';
      },
    },
  );

  bench(
    'load production build -> first A_yr',
    async () => {
      await ensureReady();
      const ms = await openFresh();
      if (measuring) inApp.loadToAyr.push(ms);
    },
    {
      iterations: 6,
      warmupIterations: 1,
      time: 0,
      warmupTime: 0,
      setup: (_task, mode) => {
        measuring = mode === 'run';
      },
      teardown: async (_task, mode) => {
        if (mode === 'run') await finish();
      },
    },
  );
});
