// Slow formulas in chromium (issue 10, item 1, the app): a cell that runs out of the page's budget
// (APP_PAGE_CELL_SECONDS) is evaluated in a worker, its row says so while it runs, its value is the
// command line's, and no main-thread task of the page takes more than 200 ms of the thread's own
// time (CPU time from chromium's trace, so that other work on the machine does not count).
// Cancel gives a 'limit' error; a slow formula in the autosave does not hold the next start.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { browserAvailability } from './chromiumBrowser';
import { startAppSession, type AppSession } from './appSession';
import { PROJECT_ROOT } from './appServer';
import { mainThreadTasks } from './mainThreadTasks';
import { Sheet } from '../../src/sheet/sheet';

const DEMO_TEXT = readFileSync(join(PROJECT_ROOT, 'examples/demo.json'), 'utf8');

const availability = browserAvailability();
const runSuite = availability.ok || availability.required;

/** The target of issue 10: no main-thread task over 200 ms caused by a formula. */
const LONGEST_TASK_MS = 200;

/** The command line's text for each cell of a sheet file (a long budget, so that a loaded machine does not stop it). */
function commandLineTexts(cells: Array<{ name: string; formula: string }>): Record<string, string> {
  const dir = mkdtempSync(join(tmpdir(), 'strainsheet-offpage-'));
  const file = join(dir, 'slow.strainsheet.json');
  writeFileSync(file, JSON.stringify({ format: 'strainsheet', version: 2, title: '', notes: '', cells }));
  const out = execFileSync(process.execPath, [join(PROJECT_ROOT, 'bin/strainsheet.mjs'), 'evaluate', file, '--json', '--cell-budget', '120'], { encoding: 'utf8' });
  const parsed = JSON.parse(out) as { cells: Array<{ name: string; text: string; error: string | null }> };
  return Object.fromEntries(parsed.cells.map((c) => [c.name, c.error ?? c.text]));
}

async function addCell(page: Page, name: string, formula: string): Promise<void> {
  await page.fill('form.add-cell input[name="name"]', name);
  await page.fill('form.add-cell input[name="formula"]', formula);
  await page.click('form.add-cell button[type="submit"]');
}

/** A fresh start, then the sheet of `cells` opened as a file; waits for the row of `cell`. */
async function openSheet(s: AppSession, cells: Array<{ name: string; formula: string }>, cell: string): Promise<void> {
  await s.freshDemo();
  await s.page.setInputFiles('input[data-action="open-file"]', { name: 'slow.strainsheet.json', mimeType: 'application/json', buffer: Buffer.from(sheetText(cells)) });
  await s.page.waitForSelector(`[data-cell="${cell}"]`);
}

const shown = (page: Page, name: string) => page.getAttribute(`[data-value="${name}"]`, 'data-raw');

// Four function calls per element, a million elements, ten times: several seconds, past the
// command line's budget of 5 s per cell on this machine.
const ENDLESS = [
  { name: 'step', formula: 'step(x) = x + 1' },
  { name: 'steps', formula: 'steps(x) = step(step(step(step(x))))' },
  { name: 'endless', formula: Array(10).fill('sum(map(1:1e6, steps))').join(' + ') },
  { name: 'reader', formula: 'endless + 1' },
];
const sheetText = (cells: Array<{ name: string; formula: string }>) => JSON.stringify({ format: 'strainsheet', version: 2, title: 'slow', notes: '', cells });

describe.runIf(runSuite)('slow formulas are evaluated off the page', { timeout: 120_000 }, () => {
  let s: AppSession;
  beforeAll(async () => {
    if (!availability.ok) throw new Error(availability.reason);
    s = await startAppSession();
  }, 120_000);
  afterAll(async () => {
    await s?.close();
  });

  it('a slow formula typed in goes off the page, holds no task over 200 ms and gets the command line\'s value', async () => {
    const { page } = s;
    // A small sheet, so that the tasks measured are the formula's and not the demo's plots redrawn.
    await openSheet(s, [{ name: 'free', formula: '1' }], 'free');
    // heavy(x) = sum(1:1e6) (issue 10's example); twelve calls take about 0.3 s of CPU here, past the page's budget.
    const cells = [
      { name: 'heavy', formula: 'heavy(x) = sum(1:1e6)' },
      { name: 'slowsum', formula: 'sum(map(1:12, heavy)) / 7' },
    ];
    await addCell(page, cells[0].name, cells[0].formula);
    await page.waitForSelector('[data-cell="heavy"]');
    // Whether the row ever said it was evaluating off the page (watched from now on).
    await page.evaluate(() => {
      const w = window as unknown as { __sawOffPage: boolean };
      w.__sawOffPage = false;
      new MutationObserver(() => {
        if (document.querySelector('[data-off-page="slowsum"]')) w.__sawOffPage = true;
      }).observe(document.body, { subtree: true, childList: true, attributes: true });
    });
    const tasks = await mainThreadTasks(page, async () => {
      await addCell(page, cells[1].name, cells[1].formula);
      await page.waitForFunction(() => /\d/.test(document.querySelector('[data-value="slowsum"]')?.getAttribute('data-raw') ?? ''), undefined, { timeout: 60_000 });
    });
    const longest = tasks.reduce((a, t) => (t.threadMs > a.threadMs ? t : a));
    console.log(`longest main-thread task while typing and evaluating the slow formula: ${longest.threadMs.toFixed(0)} ms of thread time (${longest.wallMs.toFixed(0)} ms wall), ${tasks.length} tasks`);
    expect(await page.evaluate(() => (window as unknown as { __sawOffPage: boolean }).__sawOffPage)).toBe(true);
    expect(longest.threadMs).toBeLessThan(LONGEST_TASK_MS);
    // The same text the command line prints for the same cells (formatValue on both sides).
    expect(await shown(page, 'slowsum')).toBe(commandLineTexts(cells).slowsum);
    expect(s.pageErrors).toEqual([]);
  });

  it('a slow spectrum (the galaxy route with a scatter draw for each hole) is held off the page; its readers get the command line\'s values', async () => {
    const { page } = s;
    // Invented parameters (as bench/galaxyPairs.bench.ts); the spectrum integral takes about 1 s of CPU here.
    const cells = [
      { name: 'cosmo', formula: 'flatCosmology(70 km/s/Mpc, 0.3)' },
      { name: 'smf', formula: 'stellarMassFunction(10^-2.8 Mpc^-3, -0.25, 10^10.9 Msun, -1.2, -0.05)' },
      { name: 'pop', formula: 'galaxyPairPopulation(cosmo, smf, pairFraction(0.025, 0.2, 1), mergerTimeScale(0.8 Gyr, -0.3, -0.3, -0.5), massRatioPowerLaw(-0.5, 0.2), 0.5, kormendyHoRelation(), 0.5)' },
      { name: 'freqs', formula: 'frequencyGrid(14 yr, 21 day, 40)' },
      { name: 'spectrum', formula: 'strainSpectrum(pop, freqs)' },
      { name: 'A_yr', formula: 'amplitudeAtYear(spectrum)' },
      { name: 'twice_A', formula: '2 * A_yr' },
    ];
    await s.freshDemo();
    const tasks = await mainThreadTasks(page, async () => {
      await page.setInputFiles('input[data-action="open-file"]', { name: 'galaxy.strainsheet.json', mimeType: 'application/json', buffer: Buffer.from(sheetText(cells)) });
      await page.waitForSelector('[data-off-page="spectrum"]');
      await page.waitForFunction(() => /\d/.test(document.querySelector('[data-value="twice_A"]')?.getAttribute('data-raw') ?? ''), undefined, { timeout: 60_000 });
    });
    const longest = Math.max(...tasks.map((t) => t.threadMs));
    console.log(`longest main-thread task while opening the galaxy-route sheet and evaluating it: ${longest.toFixed(0)} ms of thread time`);
    expect(longest).toBeLessThan(LONGEST_TASK_MS);
    expect(await shown(page, 'spectrum')).toMatch(/^spectrum, 40 frequencies, .* \(held off the page\)$/);
    const cli = commandLineTexts(cells);
    expect(await shown(page, 'A_yr')).toBe(cli.A_yr);
    expect(await shown(page, 'twice_A')).toBe(cli.twice_A);
    expect(s.pageErrors).toEqual([]);
  });

  it("a built-in's own slow loop (binariesPerBin with an environment, per bin) is handed off; its value is the command line's", async () => {
    const { page } = s;
    // The demo's population, span and stellar environment with 200 bins: the residence factor per bin
    // makes the call take about a second of CPU here, nearly all of it in the per-bin loop (before the
    // loop checked the clock, the page ran it to the end in one task).
    const demoCells = (JSON.parse(Sheet.fromFile(DEMO_TEXT, { evaluateOnRead: true }).closureText(['pop', 'array_span', 'array_cadence', 'stellar_environment'])) as { cells: Array<{ name: string; formula: string }> }).cells;
    const cells = [
      ...demoCells.map((c) => ({ name: c.name, formula: c.formula })),
      { name: 'many_freqs', formula: 'frequencyGrid(array_span, array_cadence, 200)' },
      { name: 'bins_env', formula: 'binariesPerBin(pop, many_freqs, array_span, stellar_environment)' },
      { name: 'most', formula: 'max(bins_env)' },
    ];
    await s.freshDemo();
    const tasks = await mainThreadTasks(page, async () => {
      await page.setInputFiles('input[data-action="open-file"]', { name: 'bins.strainsheet.json', mimeType: 'application/json', buffer: Buffer.from(sheetText(cells)) });
      await page.waitForSelector('[data-off-page="bins_env"]');
      await page.waitForFunction(() => /\d/.test(document.querySelector('[data-value="most"]')?.getAttribute('data-raw') ?? ''), undefined, { timeout: 60_000 });
    });
    const longest = Math.max(...tasks.map((t) => t.threadMs));
    console.log(`longest main-thread task while opening the binariesPerBin sheet and evaluating it: ${longest.toFixed(0)} ms of thread time`);
    expect(longest).toBeLessThan(LONGEST_TASK_MS);
    const cli = commandLineTexts(cells);
    expect(await shown(page, 'bins_env')).toBe(cli.bins_env);
    expect(await shown(page, 'most')).toBe(cli.most);
    expect(s.pageErrors).toEqual([]);
  });

  it('Cancel stops an evaluation off the page with a limit error that says so; its reader gets an input error', async () => {
    const { page } = s;
    await openSheet(s, ENDLESS, 'endless');
    await page.waitForSelector('[data-off-page="endless"]');
    expect(await page.textContent('[data-cell="reader"] .off-page')).toContain('waits for endless');
    await page.click('[data-off-page="endless"] [data-action="cancel-off-page"]');
    await page.waitForSelector('[data-cell="endless"].status-error');
    expect(await page.textContent('[data-cell="endless"]')).toMatch(/the evaluation off the page was cancelled after \d+\.\d s/);
    await page.waitForSelector('[data-cell="reader"].status-error');
    expect(await page.textContent('[data-cell="reader"] .badge')).toBe('input');
  });

  it('a slow formula in the autosave does not hold the next start: the page comes up while it is evaluated off the page', async () => {
    const { page } = s;
    await page.evaluate((text) => localStorage.setItem('strainsheet:autosave:v1', text), sheetText(ENDLESS));
    await page.reload();
    // The evaluation takes seconds off the page (past 5 s it stops with a limit error); the row is
    // there, saying so, while it runs.
    await page.waitForSelector('[data-off-page="endless"]');
    expect(await page.textContent('[data-cell="step"] .cell-value')).toContain('step(x)');
    await page.click('[data-off-page="endless"] [data-action="cancel-off-page"]');
    await page.waitForSelector('[data-cell="endless"].status-error');
    expect(s.pageErrors).toEqual([]);
  });
});
