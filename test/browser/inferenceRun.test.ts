// The Inference panel in a real browser, on a small invented sheet: the chains of a run on Web
// Workers are those of one worker and of `strainsheet infer` run in this process for the same seed
// (an independent path to the same numbers), the live progress shows steps, acceptance and the
// autocorrelation estimate, a run that is long by construction cancels cleanly, and a prior is
// edited with the row's editor, refused as the command line refuses it.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import { toySheet } from '../statistics/toySheet';
import { browserAvailability } from './chromiumBrowser';
import { startAppSession, type AppSession } from './appSession';
import { download } from './pageHelpers';

const availability = browserAvailability();
const runSuite = availability.ok || availability.required;
const toy = toySheet({ rate_norm: { prior: 'logUniformDist(1e-5 Mpc^-3 Gyr^-1, 1e-1 Mpc^-3 Gyr^-1)' }, slope: { uncertainty: 'normalDist(0.7, 0.05)' } });
toy.updateCell('measured', { formula: 'measuredLog10Amplitude(-14.6, 0.2)' });
toy.setCell({ name: 'logL', formula: 'amplitudeLogLikelihood(A_yr, measured)' });
toy.title = 'inference check';
const SHEET_TEXT = toy.toFileText();
const AXE_SOURCE = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

describe.runIf(runSuite)('inference in the app', { timeout: 120_000 }, () => {
  let s: AppSession;
  const dir = mkdtempSync(join(tmpdir(), 'strainsheet-infer-app-'));
  beforeAll(async () => {
    if (!availability.ok) throw new Error(availability.reason);
    s = await startAppSession();
  }, 180_000);
  afterAll(async () => {
    await s?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  async function openToySheet(): Promise<void> {
    await s.openSheetInTab('toy.json', SHEET_TEXT, 'logL', 'infer');
    await s.page.waitForSelector('[data-inference-panel] [data-free-cell="rate_norm"]');
  }

  async function fill(fields: Record<string, string>): Promise<void> {
    for (const [k, v] of Object.entries(fields)) await s.page.fill(`[data-inference-panel] [data-field="${k}"]`, v);
  }

  async function runAndExportChains(workers: string): Promise<string> {
    const { page } = s;
    await fill({ walkers: '8', steps: '40', seed: '3', workers });
    await page.click('[data-action="run-inference"]');
    await page.waitForSelector(`[data-job-result="infer"] [data-posterior-table]`, { timeout: 90_000 });
    expect(await page.textContent('[data-job-result="infer"] .job-time')).toMatch(new RegExp(`8 walkers x 40 steps, seed 3, burn-in 20, thinning 1; .* on ${workers} worker`));
    return (await download(page, () => page.click('[data-action="export-chains-csv"]'))).bytes.toString('utf8');
  }

  it('runs on Web Workers with the chains of one worker and of `strainsheet infer` for the same seed', async () => {
    const { page } = s;
    await openToySheet();
    // The free cell is the one with a prior; slope's uncertainty is offered as a default prior, unticked.
    expect(await page.isChecked('[data-free-cell="rate_norm"] input[type="checkbox"]')).toBe(true);
    expect(await page.isChecked('[data-free-cell="slope"] input[type="checkbox"]')).toBe(false);
    expect(await page.inputValue('[data-inference-panel] select[aria-label="Likelihood cell"]')).toBe('logL');
    const two = await runAndExportChains('2');
    await page.waitForSelector('[data-job-result="infer"] [data-corner-plot="1"] canvas');
    expect(await page.textContent('[data-verdict-text]')).toMatch(/^(Converged|Run longer)/);
    const median = Number(await page.getAttribute('[data-posterior="rate_norm"] [data-median]', 'data-median'));
    // In the browser the number of workers changes no bit.
    expect(await runAndExportChains('1')).toBe(two);

    const sheetPath = join(dir, 'toy.json');
    writeFileSync(sheetPath, SHEET_TEXT);
    let err = '';
    const code = await main(['infer', sheetPath, '--likelihood', 'logL', '--steps', '40', '--walkers', '8', '--seed', '3', '--workers', '1', '--quiet', '--csv', join(dir, 'chains.csv'), '--json', join(dir, 'summary.json')], {
      out: () => {},
      err: (t) => void (err += t),
    });
    expect(code, err).toBe(0);
    const cli = readFileSync(join(dir, 'chains.csv'), 'utf8').trim().split('\n');
    const app = two.trim().split('\n');
    expect(app.slice(0, 2)).toEqual(cli.slice(0, 2));
    expect(app).toHaveLength(2 + 40 * 8);
    expect(cli).toHaveLength(app.length);
    // Step, walker and kept agree exactly, the values to 1e-9 relative: ECMA-262 leaves Math.pow's
    // approximation to the engine ("Function Properties of the Math Object"), and Chromium's and
    // Node's V8 differ in its last bit for some arguments (unit conversions of the prior's bounds).
    for (let i = 2; i < cli.length; i++) {
      const a = app[i].split(',');
      const b = cli[i].split(',');
      expect(a.slice(0, 3), `row ${i}`).toEqual(b.slice(0, 3));
      for (let j = 3; j < b.length; j++) {
        const rel = Math.abs(Number(a[j]) - Number(b[j])) / Math.max(Math.abs(Number(b[j])), 1e-300);
        expect(rel, `row ${i}, column ${j}: app ${a[j]}, cli ${b[j]}`).toBeLessThanOrEqual(1e-9);
      }
    }
    const summary = JSON.parse(readFileSync(join(dir, 'summary.json'), 'utf8'));
    expect(Math.abs(median - summary.parameters[0].median) / summary.parameters[0].median).toBeLessThanOrEqual(1e-9);

    // Accessibility of the panel with a result, its corner plot and the prior editor open (axe-core rules).
    await page.click('[data-action="edit-prior-rate_norm"]');
    const violations = (await page.evaluate(async (src) => {
      // axe-core is evaluated through the DevTools protocol, which the page's CSP does not govern.
      (0, eval)(src);
      const axe = (window as unknown as { axe: { run(ctx: Element, opts: object): Promise<{ violations: { id: string; impact: string | null; nodes: { target: string[] }[] }[] }> } }).axe;
      const r = await axe.run(document.querySelector('[data-panel="infer"]')!, { resultTypes: ['violations'] });
      return r.violations.map((v) => ({ id: v.id, impact: v.impact, nodes: v.nodes.slice(0, 3).map((n) => n.target) }));
    }, AXE_SOURCE)) as { id: string; impact: string | null }[];
    const bad = violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
    expect(bad, JSON.stringify(bad, null, 1)).toEqual([]);
    await page.keyboard.press('Escape');

    // Pinned, the result stays after a reload.
    await page.click('[data-action="pin-inference"]');
    await page.waitForSelector('[data-inference-pin]');
    await page.reload();
    await page.waitForSelector('[data-cell="logL"]');
    await page.click('[data-tab="infer"]');
    await page.waitForSelector('[data-inference-pin] [data-posterior="rate_norm"]');
  });

  it('shows steps, acceptance and the autocorrelation estimate while running, and cancels a run that is long by construction', async () => {
    const { page } = s;
    await openToySheet();
    // 200,000 steps of 8 walkers: 1.6 million sheet evaluations, minutes of work, so the cancel cannot race the end.
    await fill({ walkers: '8', steps: '200000', seed: '1', workers: '2' });
    await page.click('[data-action="run-inference"]');
    await page.waitForFunction(
      () => {
        const el = document.querySelector('[data-inference-panel] [data-infer-progress]');
        return !!el && Number(el.getAttribute('data-step')) >= 20 && /acceptance 0\.\d{3}, autocorrelation time [\d.]+ steps/.test(el.textContent ?? '');
      },
      undefined,
      { timeout: 60_000 },
    );
    await page.click('[data-action="cancel-inference"]');
    await page.waitForSelector('[data-inference-panel] [data-job-cancelled]', { timeout: 10_000 });
    expect(await page.$('[data-job-result="infer"]')).toBeNull();
    await fill({ steps: '20' });
    await page.click('[data-action="run-inference"]');
    await page.waitForSelector('[data-job-result="infer"]', { timeout: 60_000 });
  });

  it('edits a prior with the row editor: a normal prior on a scale parameter is refused, naming the cell; a good one is stored', async () => {
    const { page } = s;
    await openToySheet();
    await page.click('[data-action="edit-prior-rate_norm"]');
    const box = page.locator('[data-prior-editor="rate_norm"] input.annotation-input');
    await box.fill('normalDist(1e-3 Mpc^-3 Gyr^-1, 1e-3 Mpc^-3 Gyr^-1)');
    await box.press('Enter');
    await page.waitForSelector('[data-prior-editor="rate_norm"] .form-error');
    expect(await page.textContent('[data-prior-editor="rate_norm"] .form-error')).toMatch(/rate_norm .*reaches below zero, but rate_norm is a scale parameter/);
    await box.fill('logUniformDist(1e-4 Mpc^-3 Gyr^-1, 1e-2 Mpc^-3 Gyr^-1)');
    await box.press('Enter');
    await page.waitForSelector('[data-prior-editor="rate_norm"]', { state: 'detached' });
    expect(await page.textContent('[data-prior-of="rate_norm"]')).toBe('prior logUniformDist(1e-4 Mpc^-3 Gyr^-1, 1e-2 Mpc^-3 Gyr^-1)');
    // The row shows it as a badge, and undo takes it back.
    await page.waitForSelector('[data-cell="rate_norm"] [data-annotation="prior"]');
    await page.click('[data-action="undo"]');
    await page.waitForFunction(() => document.querySelector('[data-prior-of="rate_norm"]')?.textContent === 'prior logUniformDist(1e-5 Mpc^-3 Gyr^-1, 1e-1 Mpc^-3 Gyr^-1)');
    expect(s.pageErrors).toEqual([]);
  });

  it('on the demo, offers the likelihood cell of A_yr and the measured amplitude, and samples the merger rate with its uncertainty as prior', async () => {
    const { page } = s;
    await s.freshDemo();
    await page.click('[data-tab="infer"]');
    await page.click('[data-inference-panel] [data-action="add-starter-cell"]');
    await page.waitForSelector('[data-cell="lnL_amplitude"]');
    expect(await page.inputValue('input[data-formula="lnL_amplitude"]')).toBe('amplitudeLogLikelihood(A_yr, measured)');
    await page.waitForFunction(() => (document.querySelector('[data-inference-panel] select[aria-label="Likelihood cell"]') as HTMLSelectElement | null)?.value === 'lnL_amplitude');
    // rate_norm has no prior but an uncertainty: offered unticked, with the uncertainty as its default prior.
    expect(await page.textContent('[data-prior-of="rate_norm"]')).toMatch(/^no prior; its uncertainty lognormalDist\(/);
    await page.check('[data-free-cell="rate_norm"] input[type="checkbox"]');
    await fill({ walkers: '4', steps: '12', seed: '2', workers: '2' });
    // Also the local merger-rate density's posterior and the posterior-predictive h_c of the spectrum.
    await page.click('[data-inference-panel] details.derived-cells summary');
    await page.check('[data-inference-panel] input[data-derived="rate_today"]');
    await page.selectOption('[data-inference-panel] select[aria-label="Spectrum cell for the predictive band"]', 'spectrum');
    await page.click('[data-action="run-inference"]');
    await page.waitForSelector('[data-job-result="infer"] [data-posterior="rate_norm"]', { timeout: 90_000 });
    expect(await page.textContent('[data-job-result="infer"] .job-time')).toMatch(/4 walkers x 12 steps, seed 2, burn-in 6/);
    await page.waitForSelector('[data-job-result="infer"] [data-posterior="rate_today"]');
    await page.waitForSelector('[data-job-result="infer"] [data-plot="predictive-band"] canvas');
    // rate_norm and rate_today in the corner plot: two histograms and their pair.
    expect(await page.$$eval('[data-corner-plot="2"] [data-plot^="corner-"]', (els) => els.length)).toBe(3);
  });
});
