// Starts Debian's chromium through playwright-core with a fresh profile folder, or explains why not.
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';

export const CHROMIUM_PATH = '/usr/bin/chromium';

/** Whether the browser suite can run; when it cannot, the reason (and CI must fail instead of skip). */
export function browserAvailability(): { ok: true } | { ok: false; reason: string; required: boolean } {
  if (existsSync(CHROMIUM_PATH)) return { ok: true };
  return {
    ok: false,
    reason: `Browser tests skipped: ${CHROMIUM_PATH} is not installed (apt-get install chromium).`,
    required: process.env.STRAINSHEET_REQUIRE_BROWSER === '1',
  };
}

export interface LaunchedBrowser {
  context: BrowserContext;
  close(): Promise<void>;
}

/**
 * Chromium with a fresh profile folder. playwright-core refuses a --user-data-dir argument and
 * takes the folder as launchPersistentContext's first parameter instead (it then passes
 * --user-data-dir itself), so the profile is fresh and temporary either way.
 */
export async function launchChromium(viewport = { width: 1440, height: 900 }): Promise<LaunchedBrowser> {
  const profile = mkdtempSync(join(tmpdir(), 'strainsheet-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    acceptDownloads: true,
    viewport,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  return {
    context,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}
