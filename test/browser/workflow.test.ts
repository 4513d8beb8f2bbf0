// Regression tests, in chromium, for what a researcher tripped over (issue 15, "Broken" items 1-4 and
// the cancel of a running job): the uncertainty of a row, tabs and headers at any scroll position,
// job forms whose shown cell is the cell that runs, and the narrow layout.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { PROJECT_ROOT } from './appServer';
import { browserAvailability } from './chromiumBrowser';
import { ARTIFACTS, startAppSession, visibleAtCentre, type AppSession } from './appSession';
import { download, openRowDetails, setFormula } from './pageHelpers';

const availability = browserAvailability();
const runSuite = availability.ok || availability.required;
const DEMO_TEXT = readFileSync(join(PROJECT_ROOT, 'examples/demo.json'), 'utf8');
const demo = () => Sheet.fromFile(DEMO_TEXT);

describe.runIf(runSuite)('what a researcher trips over', { timeout: 60_000 }, () => {
  let s: AppSession;
  beforeAll(async () => {
    if (!availability.ok) throw new Error(availability.reason);
    s = await startAppSession();
  }, 120_000);
  afterAll(async () => {
    await s?.close();
  });

  const savedSheet = async () => Sheet.fromFile((await download(s.page, () => s.page.click('[data-action="save-sheet"]'))).bytes.toString('utf8'));

  it('shows each row’s uncertainty as a badge and edits it with validation, Escape and undo', async () => {
    await s.freshDemo();
    const { page } = s;
    const original = demo().get('mass_slope')!.uncertainty!;
    const badge = page.locator('[data-cell="mass_slope"] [data-annotation="uncertainty"]');
    expect(await badge.textContent()).toContain(original);
    // A value of another dimension is refused at the row, with the cell named; the typed text stays.
    await badge.click();
    const input = page.locator('[data-cell="mass_slope"] .annotation-input');
    await input.fill('lognormalDist(1 Msun, 0.1)');
    await input.press('Enter');
    const error = page.locator('[data-cell="mass_slope"] [data-annotation-editor] .form-error');
    await error.waitFor();
    expect(await error.textContent()).toMatch(/uncertainty of mass_slope gives values in .* but mass_slope is in no unit/);
    expect(await input.inputValue()).toBe('lognormalDist(1 Msun, 0.1)');
    // Not a distribution at all.
    await input.fill('0.3');
    await input.press('Enter');
    await page.waitForFunction(() => /must give a distribution/.test(document.querySelector('[data-cell="mass_slope"] [data-annotation-editor] .form-error')?.textContent ?? ''));
    // Escape leaves the cell as it was.
    await input.press('Escape');
    expect(await badge.textContent()).toContain(original);
    expect((await savedSheet()).get('mass_slope')!.uncertainty).toBe(original);
    // A good one is stored (one undo step), and undo brings the old one back.
    await badge.click();
    await input.fill('normalDist(0.3, 0.05)');
    await input.press('Enter');
    await page.waitForFunction(() => document.querySelector('[data-cell="mass_slope"] [data-annotation="uncertainty"]')?.textContent?.includes('normalDist(0.3, 0.05)'));
    expect((await savedSheet()).get('mass_slope')!.uncertainty).toBe('normalDist(0.3, 0.05)');
    expect(await page.getAttribute('[data-action="undo"]', 'title')).toBe('Undo change uncertainty of mass_slope');
    await page.click('[data-action="undo"]');
    await page.waitForFunction((o) => document.querySelector('[data-cell="mass_slope"] [data-annotation="uncertainty"]')?.textContent?.includes(o), original);
  });

  it('adds an uncertainty to a cell that had none, and sampling draws it', async () => {
    await s.freshDemo();
    const { page } = s;
    expect(demo().get('cutoff_mass')!.uncertainty).toBeUndefined();
    await openRowDetails(page, 'cutoff_mass');
    await page.click('[data-cell="cutoff_mass"] [data-action="edit-uncertainty"]');
    const input = page.locator('[data-cell="cutoff_mass"] .annotation-input');
    await input.fill('lognormalDist(1.2e9 Msun, 0.2)');
    await input.press('Enter');
    await page.waitForSelector('[data-cell="cutoff_mass"] [data-annotation="uncertainty"]');
    // The Monte Carlo of the sheet lists it among the inputs it draws.
    await page.click('[data-tab="scan"]');
    await page.click('[data-panel="scan"] input[name="mode"] >> nth=2');
    await page.fill('[data-panel="scan"] fieldset:has-text("samples") input >> nth=0', '20');
    await page.click('[data-action="run-job"]');
    await page.waitForSelector('[data-job-result="sample"] .summary-table', { timeout: 60_000 });
    expect(await page.textContent('[data-job-result="sample"] .summary-table')).toContain('cutoff_mass: ');
    // Removing it is one undoable edit too.
    await page.click('[data-cell="cutoff_mass"] [data-annotation="uncertainty"]');
    await page.click('[data-cell="cutoff_mass"] [data-action="remove-annotation"]');
    await page.waitForSelector('[data-cell="cutoff_mass"] [data-annotation="uncertainty"]', { state: 'detached' });
    expect((await savedSheet()).get('cutoff_mass')!.uncertainty).toBeUndefined();
    await page.click('[data-tab="plots"]');
  });

  it('keeps the side panel’s tabs and the column headers visible at any scroll position', async () => {
    await s.freshDemo();
    const { page } = s;
    for (const where of ['top', 'middle', 'bottom']) {
      await page.$eval('.sheet-pane', (el, w) => (el.scrollTop = w === 'top' ? 0 : w === 'middle' ? el.scrollHeight / 2 : el.scrollHeight), where);
      // The page itself does not scroll: the sheet and the side panel scroll on their own.
      await page.evaluate(() => window.scrollTo(0, 10_000));
      for (const tab of ['plots', 'scan', 'realise', 'infer', 'reference', 'docs']) expect(await visibleAtCentre(page, `[data-tab="${tab}"]`), `${tab} tab, ${where}`).toBe(true);
      for (const k of [1, 2, 3, 4, 5]) expect(await visibleAtCentre(page, `.sheet-head > span:nth-child(${k})`), `header ${k}, ${where}`).toBe(true);
    }
    // A tab focused from the keyboard is on screen and not covered.
    await page.focus('[data-tab="plots"]');
    await page.keyboard.press('ArrowRight');
    expect(await page.evaluate(() => document.activeElement?.getAttribute('data-tab'))).toBe('scan');
    expect(await visibleAtCentre(page, '[data-tab="scan"]')).toBe(true);
    expect(await page.getAttribute('[data-tab="scan"]', 'aria-selected')).toBe('true');
    await page.click('[data-tab="plots"]');
  });

  it('runs the cell the output select shows, also after that cell was in error and recovered', async () => {
    await s.freshDemo();
    const { page } = s;
    await page.click('[data-tab="scan"]');
    // The panel's code loads on first show: wait for the form before reading it ($eval does not wait).
    await page.waitForSelector('select[aria-label="Output cell"]');
    const shownOutput = () => page.$eval('select[aria-label="Output cell"]', (el) => (el as HTMLSelectElement).selectedOptions[0]?.value);
    expect(await shownOutput()).toBe('A_yr');
    const rate = demo().get('rate_norm')!.formula;
    await setFormula(page, 'rate_norm', `${rate} * (`);
    await page.waitForSelector('[data-cell="A_yr"].status-error');
    // While A_yr has no value it stays the shown choice, marked as such.
    expect(await shownOutput()).toBe('A_yr');
    expect(await page.$eval('select[aria-label="Output cell"]', (el) => (el as HTMLSelectElement).selectedOptions[0]?.textContent)).toContain('no value now');
    await setFormula(page, 'rate_norm', rate);
    await page.waitForSelector('[data-cell="A_yr"].status-ok');
    expect(await shownOutput()).toBe('A_yr');
    expect(await page.$eval('select[aria-label="input cell"]', (el) => (el as HTMLSelectElement).selectedOptions[0]?.value)).toBe('rate_norm');
    await page.click('[data-action="run-job"]');
    await page.waitForSelector('[data-job-result="scan1"]', { timeout: 30_000 });
    expect(await page.getAttribute('[data-panel="scan"] [data-plot="scan1"] canvas', 'aria-label')).toBe('A_yr as rate_norm varies');
    await page.click('[data-tab="plots"]');
  });

  it('offers a map whose second input is one A_yr depends on, with linear spacing for an order-one slope', async () => {
    await s.freshDemo();
    const { page } = s;
    await page.click('[data-tab="scan"]');
    await page.click('[data-panel="scan"] input[name="mode"] >> nth=1');
    const second = page.locator('[data-panel="scan"] .axis-fields >> nth=1');
    expect(await second.locator('select').evaluate((el) => (el as HTMLSelectElement).selectedOptions[0]?.value)).toBe('mass_slope');
    expect(await second.locator('input[type="checkbox"]').isChecked()).toBe(false);
    const ends = await second.locator('input[type="number"]').evaluateAll((xs) => xs.slice(0, 2).map((x) => Number((x as HTMLInputElement).value)));
    expect(ends[0]).toBeLessThan(0.25);
    expect(ends[1]).toBeGreaterThan(0.25);
    await page.click('[data-tab="plots"]');
  });

  it('cancels a job that is long by construction, and a cancel always ends as cancelled', async () => {
    await s.freshDemo();
    const { page } = s;
    await page.click('[data-tab="scan"]');
    // 200000 Monte Carlo samples of the demo, which draws mass_slope: every sample is a full
    // evaluation of the population's A_yr (no square-root shortcut applies to a slope), so the job
    // runs for minutes; the cancel below cannot race its end.
    await page.click('[data-panel="scan"] input[name="mode"] >> nth=2');
    await page.fill('[data-panel="scan"] fieldset:has-text("samples") input >> nth=0', '200000');
    const ayrBefore = await page.getAttribute('[data-value="A_yr"]', 'data-raw');
    await page.click('[data-action="run-job"]');
    await page.waitForSelector('[data-panel="scan"] progress');
    await page.click('[data-action="cancel-job"]');
    await page.waitForSelector('[data-job-cancelled]', { timeout: 5_000 });
    expect(await page.$('[data-job-result]')).toBeNull();
    expect(await page.getAttribute('[data-value="A_yr"]', 'data-raw')).toBe(ayrBefore);
    // The next job runs normally.
    await page.fill('[data-panel="scan"] fieldset:has-text("samples") input >> nth=0', '20');
    await page.click('[data-action="run-job"]');
    await page.waitForSelector('[data-job-result="sample"]', { timeout: 60_000 });
    await page.click('[data-tab="plots"]');
  });

  it('makes one undo step of one edit of a row, keeps half-typed text off the sheet, and Escape restores the text from before', async () => {
    await s.freshDemo();
    const { page } = s;
    const rate = demo().get('rate_norm')!.formula;
    const box = page.locator('input[data-formula="rate_norm"]');
    const ayr = () => page.getAttribute('[data-value="A_yr"]', 'data-raw');
    const before = await ayr();
    // Two pauses while typing recalculate twice; leaving the box ends the edit: one undo step.
    await box.click();
    await box.press('End');
    await box.pressSequentially(' * 2', { delay: 30 });
    await page.waitForFunction((b) => document.querySelector('[data-value="A_yr"]')?.getAttribute('data-raw') !== b, before);
    const once = await ayr();
    await box.pressSequentially(' * 2', { delay: 30 });
    await page.waitForFunction((b) => document.querySelector('[data-value="A_yr"]')?.getAttribute('data-raw') !== b, once);
    await box.evaluate((el) => (el as HTMLInputElement).blur());
    expect(await page.getAttribute('[data-action="undo"]', 'title')).toBe('Undo edit rate_norm');
    await page.click('[data-action="undo"]');
    await page.waitForFunction((b) => document.querySelector('[data-value="A_yr"]')?.getAttribute('data-raw') === b, before);
    expect(await box.inputValue()).toBe(rate);
    expect(await page.isDisabled('[data-action="undo"]')).toBe(true);
    // Half-typed text: the row says why it is not stored yet; nothing else turns red, the plot stays current.
    await box.click();
    await box.press('End');
    await box.pressSequentially(' * (', { delay: 30 });
    await page.waitForSelector('[data-cell="rate_norm"] [data-draft-error]');
    await page.waitForTimeout(400); // longer than the recalculation pause
    expect(await page.$$eval('.cell-row.status-error', (r) => r.length)).toBe(0);
    expect(await ayr()).toBe(before);
    expect(await page.getAttribute('[data-plot="spectrum"]', 'data-stale')).toBeNull();
    // Escape brings back the text from before the edit.
    await box.press('Escape');
    expect(await box.inputValue()).toBe(rate);
    // Escape after a stored pause undoes that too: the sheet is as before, and no undo step is left.
    await box.pressSequentially(' * 3', { delay: 30 });
    await page.waitForFunction((b) => document.querySelector('[data-value="A_yr"]')?.getAttribute('data-raw') !== b, before);
    await box.press('Escape');
    await page.waitForFunction((b) => document.querySelector('[data-value="A_yr"]')?.getAttribute('data-raw') === b, before);
    expect(await box.inputValue()).toBe(rate);
    await box.evaluate((el) => (el as HTMLInputElement).blur());
    expect(await page.isDisabled('[data-action="undo"]')).toBe(true);
  });

  it('keeps the last good plot, marked stale, and each key-result card on its own cell, while an input is in error', async () => {
    await s.freshDemo();
    const { page } = s;
    // Cards are picked by what the cells hold: wait for the cells evaluated off the page too.
    await page.waitForFunction(() => !document.querySelector('[data-recalculating], [data-off-page], [data-waits-for]'));
    const cards = await page.$$eval('[data-key-result]', (xs) => xs.map((x) => x.getAttribute('data-key-result')));
    const rate = demo().get('rate_norm')!.formula;
    const box = page.locator('input[data-formula="rate_norm"]');
    await box.click();
    await box.press('End');
    await box.pressSequentially(' * (', { delay: 20 });
    await box.press('Enter'); // stored as typed
    await page.waitForSelector('[data-cell="rate_norm"].status-error');
    await page.waitForSelector('[data-plot="spectrum"][data-stale="true"]');
    expect(await page.textContent('[data-plot="spectrum"] .stale-note')).toContain('rate_norm');
    expect(await page.$$eval('[data-key-result]', (xs) => xs.map((x) => x.getAttribute('data-key-result')))).toEqual(cards);
    expect(await page.getAttribute('[data-key-result="A_yr"]', 'class')).toContain('error');
    await setFormula(page, 'rate_norm', rate);
    await page.waitForSelector('[data-plot="spectrum"]:not([data-stale])');
    expect(await page.$$eval('[data-key-result]', (xs) => xs.map((x) => x.getAttribute('data-key-result')))).toEqual(cards);
  });

  it('completes names in the add-a-cell form, never doubles a parenthesis, and names a function cell from its formula', async () => {
    await s.freshDemo();
    const { page } = s;
    const formula = page.locator('form.add-cell input[name="formula"]');
    await formula.click();
    await formula.pressSequentially('hc_two(f) = A_y', { delay: 20 });
    await page.waitForSelector('form.add-cell .completions');
    expect(await page.textContent('form.add-cell .completions')).toContain('A_yr');
    await page.click('form.add-cell .completions li:has(.completion-name:text-is("A_yr"))');
    expect(await formula.inputValue()).toBe('hc_two(f) = A_yr');
    await formula.pressSequentially(' * (f * 1 yr)^(-2/3)', { delay: 10 });
    // A different name in the name field is refused, naming both; an empty one is taken from the formula.
    await page.fill('form.add-cell input[name="name"]', 'other_name');
    await formula.press('Enter');
    await page.waitForFunction(() => /defines the function hc_two/.test(document.querySelector('form.add-cell .form-error')?.textContent ?? ''));
    await page.fill('form.add-cell input[name="name"]', '');
    await formula.press('Enter');
    await page.waitForSelector('[data-cell="hc_two"]');
    expect(await page.inputValue('input[data-formula="hc_two"]')).toBe('hc_two(f) = A_yr * (f * 1 yr)^(-2/3)');
    // Accepting a built-in before an existing parenthesis keeps one parenthesis.
    const box = page.locator('input[data-formula="snr_threshold"]');
    await box.click();
    await box.fill('logGr(1 nHz, 100 nHz, 5)');
    await box.press('Home');
    for (let i = 0; i < 5; i++) await box.press('ArrowRight');
    await page.waitForSelector('[data-cell="snr_threshold"] .completions');
    await box.press('Tab');
    expect(await box.inputValue()).toBe('logGrid(1 nHz, 100 nHz, 5)');
    await box.press('Escape');
    await box.press('Escape');
    expect(await box.inputValue()).toBe(demo().get('snr_threshold')!.formula);
    await box.evaluate((el) => (el as HTMLInputElement).blur());
  });

  it('at 1000 px shows the sheet or the plots, one click apart, with a short key-results bar', async () => {
    const { page } = s;
    await page.setViewportSize({ width: 1000, height: 800 });
    try {
      await s.freshDemo();
      expect(await page.isVisible('.sheet-pane')).toBe(true);
      expect(await page.isVisible('.side-panel')).toBe(false);
      const bar = await page.$eval('.key-results', (el) => el.getBoundingClientRect().height);
      expect(bar).toBeLessThan(800 / 8);
      await page.click('[data-view-button="side"]');
      await page.waitForSelector('[data-plot="spectrum"] canvas');
      expect(await visibleAtCentre(page, '[data-plot="spectrum"] canvas')).toBe(true);
      expect(await page.isVisible('.sheet-pane')).toBe(false);
      await page.screenshot({ path: join(ARTIFACTS, 'narrow-plots-1000.png') });
      await page.click('[data-view-button="sheet"]');
      expect(await visibleAtCentre(page, 'input[data-formula="A_yr"]')).toBe(false); // far down the sheet
      expect(await page.isVisible('.sheet-pane')).toBe(true);
    } finally {
      await page.setViewportSize({ width: 1400, height: 900 });
    }
  });
});
