// Regression tests, in chromium, for issue 15's "Confusing" items finished here: the sheet's notes
// and the docs pages shipped with the app, file-open messages, map legends and breakdown titles.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { PROJECT_ROOT } from './appServer';
import { browserAvailability } from './chromiumBrowser';
import { startAppSession, type AppSession } from './appSession';

const availability = browserAvailability();
const runSuite = availability.ok || availability.required;
const DEMO = Sheet.fromFile(readFileSync(join(PROJECT_ROOT, 'examples/demo.json'), 'utf8'));
/** The first heading of a docs page as the repository has it (the shipped page must be this file). */
const docTitle = (page: string) => /^# (.+)$/m.exec(readFileSync(join(PROJECT_ROOT, 'docs', `${page}.md`), 'utf8'))![1];

describe.runIf(runSuite)('issue 15, confusing items', { timeout: 60_000 }, () => {
  let s: AppSession;
  beforeAll(async () => {
    if (!availability.ok) throw new Error(availability.reason);
    s = await startAppSession();
  }, 120_000);
  afterAll(async () => {
    await s?.close();
  });

  it('shows the sheet’s notes, opens a docs page a row refers to (shipped with the app, under the CSP), follows links between pages, and edits the notes with undo', async () => {
    await s.freshDemo();
    const { page } = s;
    await page.evaluate(() => {
      const w = window as unknown as { cspViolations: string[] };
      w.cspViolations = [];
      document.addEventListener('securitypolicyviolation', (e) => w.cspViolations.push(`${e.violatedDirective} ${e.blockedURI}`));
    });
    expect((await page.textContent('[data-sheet-notes] .sheet-notes-text'))?.trim()).toBe(DEMO.notes);

    // The measurement's source names docs/statistics.md: the link opens that page in the Docs tab.
    const ref = page.locator('[data-cell="measured"] [data-doc-ref="statistics"]');
    await ref.click();
    await page.waitForSelector('.doc-page[data-doc="statistics"] h1');
    expect(await page.getAttribute('[data-tab="docs"]', 'aria-selected')).toBe('true');
    expect(await page.textContent('.doc-page h1')).toBe(docTitle('statistics'));
    expect(await page.evaluate(() => document.activeElement?.classList.contains('doc-page'))).toBe(true);

    // A link between pages (statistics.md links freeSpectrum.md) opens the other page here; Back returns.
    await page.click('.doc-page a[href="freeSpectrum.md"]');
    await page.waitForSelector('.doc-page[data-doc="freeSpectrum"] h1');
    expect(await page.textContent('.doc-page h1')).toBe(docTitle('freeSpectrum'));
    await page.click('.docs-back');
    await page.waitForSelector('.doc-page[data-doc="statistics"] h1');
    expect(await page.evaluate(() => (window as unknown as { cspViolations: string[] }).cspViolations)).toEqual([]);

    // Editing the notes is one undoable step; Escape leaves them as they were.
    await page.click('[data-action="edit-notes"]');
    await page.fill('.sheet-notes-input', 'Scenario: see docs/orbits.md for the decoupling assumption.');
    await page.keyboard.press('Control+Enter');
    await page.waitForSelector('[data-sheet-notes] [data-doc-ref="orbits"]');
    await page.click('[data-action="edit-notes"]');
    await page.fill('.sheet-notes-input', 'typed, then abandoned');
    await page.keyboard.press('Escape');
    expect(await page.textContent('.sheet-notes-text')).toBe('Scenario: see docs/orbits.md for the decoupling assumption.');
    await page.click('[data-action="undo"]');
    await page.waitForFunction((t) => document.querySelector('.sheet-notes-text')?.textContent === t, DEMO.notes);
    expect(s.pageErrors).toEqual([]);
  });

  it('refuses a PNG opened as a sheet with a clear message (file name, what it is, no bytes of it), merges the repeat with a count, and dismisses it', async () => {
    await s.freshDemo();
    const { page } = s;
    const formulas = () => page.$$eval('input[data-formula]', (xs) => xs.map((x) => (x as HTMLInputElement).value));
    const before = await formulas();
    const png = await page.screenshot({ clip: { x: 0, y: 0, width: 40, height: 30 } });
    for (let i = 0; i < 2; i++) {
      await page.setInputFiles('input[data-action="open-file"]', { name: 'figure.png', mimeType: 'image/png', buffer: png });
      await page.waitForFunction((n) => document.querySelector('.message.error')?.getAttribute('data-message-count') === String(n), i + 1);
    }
    const errors = page.locator('.message.error');
    expect(await errors.count()).toBe(1);
    const text = (await errors.locator('.message-text').textContent()) ?? '';
    expect(text).toBe('"figure.png" was not opened: it is a PNG image, not a sheet; a sheet file is JSON text (such as name.strainsheet.json). The sheet is unchanged.');
    expect(await errors.locator('.message-count').textContent()).toBe('×2');
    // Nothing on screen holds a control character or the replacement character of undecodable bytes.
    expect(await page.evaluate(() => /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\ufffd]/.test(document.body.innerText))).toBe(false);
    expect(await formulas()).toEqual(before);
    await errors.locator('button.dismiss').click();
    await page.waitForFunction(() => document.querySelectorAll('.message.error').length === 0);
    expect(s.pageErrors).toEqual([]);
  });
});
