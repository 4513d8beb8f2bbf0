// The Realisations panel in a real browser: a run on Web Workers writes the same per-bin CSV as
// `strainsheet realise` run in this process with one worker (the same seed; an independent path to
// the same numbers), shows its progress, and a run that is long by construction cancels cleanly.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import { PROJECT_ROOT } from './appServer';
import { browserAvailability } from './chromiumBrowser';
import { startAppSession, type AppSession } from './appSession';
import { download } from './pageHelpers';

const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
const availability = browserAvailability();
const runSuite = availability.ok || availability.required;
const demo = JSON.parse(readFileSync(join(PROJECT_ROOT, 'examples/demo.json'), 'utf8'));
// The demo's population and array cells and a realisations set-up over 12 bins.
const kept = ['H0', 'omega_m', 'cosmo', 'rate_norm', 'mass_slope', 'cutoff_mass', 'z_shape', 'q_shape', 'min_mass', 'max_mass', 'pop', 'array_span', 'array_cadence'];
const SHEET_TEXT = JSON.stringify({
  ...demo,
  title: 'realisations check',
  cells: [...demo.cells.filter((c: { name: string }) => kept.includes(c.name)), { name: 'rz', formula: 'realiseBackground(pop, frequencyGrid(array_span, array_cadence, 12), array_span, 20, 1)' }],
});

describe.runIf(runSuite)('realisations in the app', { timeout: 120_000 }, () => {
  let s: AppSession;
  const dir = mkdtempSync(join(tmpdir(), 'strainsheet-realise-app-'));
  beforeAll(async () => {
    if (!availability.ok) throw new Error(availability.reason);
    s = await startAppSession();
  }, 180_000);
  afterAll(async () => {
    await s?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  async function openSheetWithRealisations(): Promise<void> {
    await s.openSheetInTab('rz.json', SHEET_TEXT, 'rz', 'realise');
    await s.page.waitForSelector('[data-realisations-panel] select[aria-label="Realisations cell"] option[value="rz"]', { state: 'attached' });
  }

  /** Runs the panel's job and gives the exported CSV text. */
  async function runAndExport(count: string, seed: string, workers: string): Promise<string> {
    const { page } = s;
    await page.fill('[data-realisations-panel] [data-field="count"]', count);
    await page.fill('[data-realisations-panel] [data-field="seed"]', seed);
    await page.fill('[data-realisations-panel] [data-field="workers"]', workers);
    await page.click('[data-action="run-realisations"]');
    await page.waitForSelector(`[data-job-result="realise"][data-workers="${workers}"] [data-realisation-table]`, { timeout: 90_000 });
    return (await download(page, () => page.click('[data-action="export-realisations-csv"]'))).bytes.toString('utf8');
  }

  it('runs on several Web Workers with the numbers of one worker and of `strainsheet realise` for the same seed', async () => {
    const { page } = s;
    await openSheetWithRealisations();
    // 250 realisations: three chunks (the last one short) spread over the workers.
    const three = await runAndExport('250', '5', '3');
    expect(await page.textContent('[data-job-result="realise"] .job-time')).toMatch(/250 realisations of rz, seed 5, on 3 workers/);
    expect(await page.$$eval('[data-realisation-table] tbody tr', (rows) => rows.length)).toBe(12);
    await page.waitForSelector('[data-job-result="realise"] [data-plot="realisation-run"] canvas');
    // Accessibility of the panel with its result (axe-core rules, serious and critical).
    const violations = (await page.evaluate(async (src) => {
      // axe-core is evaluated through the DevTools protocol, which the page's CSP does not govern.
      (0, eval)(src);
      const axe = (window as unknown as { axe: { run(ctx: Element, opts: object): Promise<{ violations: { id: string; impact: string | null; nodes: { target: string[] }[] }[] }> } }).axe;
      const r = await axe.run(document.querySelector('[data-panel="realise"]')!, { resultTypes: ['violations'] });
      return r.violations.map((v) => ({ id: v.id, impact: v.impact, nodes: v.nodes.slice(0, 3).map((n) => n.target) }));
    }, AXE_SOURCE)) as { id: string; impact: string | null }[];
    expect(violations.filter((v) => v.impact === 'serious' || v.impact === 'critical'), JSON.stringify(violations, null, 1)).toEqual([]);
    // In the browser the split over workers changes no bit.
    expect(await runAndExport('250', '5', '1')).toBe(three);

    // The command line in this process (Node's V8), one worker thread.
    const sheetPath = join(dir, 'rz.json');
    writeFileSync(sheetPath, SHEET_TEXT);
    let err = '';
    const code = await main(['realise', sheetPath, '--count', '250', '--seed', '5', '--workers', '1', '--quiet', '--csv', join(dir, 'cli.csv')], { out: () => {}, err: (t) => void (err += t) });
    expect(code, err).toBe(0);
    const cli = readFileSync(join(dir, 'cli.csv'), 'utf8').trim().split('\n');
    const app = three.trim().split('\n');
    expect(app.slice(0, 2)).toEqual(cli.slice(0, 2)); // the run's description and the columns
    expect(app).toHaveLength(cli.length);
    const columns = cli[1].split(',');
    // The draws are the same: counts of realisations (outshine) agree exactly. Continuous values
    // agree to 1e-9 relative, not to the bit: ECMA-262 leaves Math.pow's approximation to the
    // engine ("Function Properties of the Math Object"), and Chromium 150's and Node 20's V8 differ
    // in its last bit for about one argument in nine (measured), which the population integral carries.
    for (let i = 2; i < cli.length; i++) {
      const a = app[i].split(',').map(Number);
      const b = cli[i].split(',').map(Number);
      columns.forEach((col, j) => {
        const rel = Math.abs(a[j] - b[j]) / Math.max(Math.abs(b[j]), 1e-300);
        if (col.startsWith('outshine')) expect(a[j], `${col}, row ${i}`).toBe(b[j]);
        else expect(rel, `${col}, row ${i}: app ${a[j]}, cli ${b[j]}`).toBeLessThanOrEqual(1e-9);
      });
    }
  });

  it('shows progress and cancels a run that is long by construction; the next run works', async () => {
    const { page } = s;
    await openSheetWithRealisations();
    // 800,000 realisations of 12 bins (9.6 million realisation-bins, under the run limit of 10 million):
    // minutes of work on this machine, so the cancel cannot race the end.
    await page.fill('[data-realisations-panel] [data-field="count"]', '800000');
    await page.click('[data-action="run-realisations"]');
    await page.waitForFunction(() => Number(document.querySelector('[data-realisations-panel] [data-job-done]')?.getAttribute('data-job-done')) > 0, undefined, { timeout: 60_000 });
    expect(await page.isDisabled('[data-action="run-realisations"]')).toBe(true);
    await page.click('[data-action="cancel-realisations"]');
    await page.waitForSelector('[data-realisations-panel] [data-job-cancelled]', { timeout: 10_000 });
    expect(await page.$('[data-job-result="realise"]')).toBeNull();
    await page.fill('[data-realisations-panel] [data-field="count"]', '30');
    await page.click('[data-action="run-realisations"]');
    await page.waitForSelector('[data-job-result="realise"] [data-realisation-table]', { timeout: 60_000 });
    expect(s.pageErrors).toEqual([]);
  });

  it('on the demo, offers to add a realisations cell from its population and frequency grid, and runs it', async () => {
    const { page } = s;
    await s.freshDemo();
    await page.click('[data-tab="realise"]');
    await page.click('[data-realisations-panel] [data-action="add-starter-cell"]');
    await page.waitForSelector('[data-cell="realisations"]');
    expect(await page.inputValue('input[data-formula="realisations"]')).toBe('realiseBackground(pop, freqs, array_span, 100, 1)');
    await page.waitForSelector('[data-realisations-panel] select[aria-label="Realisations cell"] option[value="realisations"]', { state: 'attached' });
    await page.fill('[data-realisations-panel] [data-field="count"]', '120');
    await page.click('[data-action="run-realisations"]');
    await page.waitForSelector('[data-job-result="realise"] [data-realisation-table]', { timeout: 90_000 });
    expect(await page.textContent('[data-job-result="realise"] .job-time')).toMatch(/120 realisations of realisations, seed 1/);
    await page.click('[data-action="undo"]');
    await page.waitForSelector('[data-cell="realisations"]', { state: 'detached' });
  });
});
