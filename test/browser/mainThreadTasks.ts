// The page's main-thread tasks from a chromium trace (DevTools protocol), each with its wall time
// and its thread time (CPU time of the page's own work, so that other work on a loaded machine does
// not count). Used by test/browser/offPage.test.ts and bench/ui/slowFormula.bench.ts.
import type { Page } from 'playwright-core';

/** The main thread's tasks while `run` runs: wall and thread (CPU) time of each, from a chromium trace. */
export async function mainThreadTasks(page: Page, run: () => Promise<void>): Promise<Array<{ wallMs: number; threadMs: number }>> {
  const cdp = await page.context().newCDPSession(page);
  const events: Array<{ name: string; ph: string; pid: number; tid: number; dur?: number; tdur?: number; args?: { name?: string } }> = [];
  cdp.on('Tracing.dataCollected', (e) => events.push(...(e.value as unknown as typeof events)));
  await cdp.send('Tracing.start', { categories: 'devtools.timeline,disabled-by-default-devtools.timeline', transferMode: 'ReportEvents' });
  try {
    await run();
  } finally {
    const complete = new Promise((resolve) => cdp.once('Tracing.tracingComplete', resolve));
    await cdp.send('Tracing.end');
    await complete;
    await cdp.detach();
  }
  const main = new Set(events.filter((e) => e.ph === 'M' && e.name === 'thread_name' && e.args?.name === 'CrRendererMain').map((e) => `${e.pid}:${e.tid}`));
  const tasks = events.filter((e) => e.ph === 'X' && e.name === 'RunTask' && main.has(`${e.pid}:${e.tid}`));
  if (!tasks.length) throw new Error('the trace holds no task of the page\'s main thread');
  if (tasks.some((t) => t.tdur === undefined)) throw new Error('the trace gives no thread time for the page\'s tasks');
  return tasks.map((t) => ({ wallMs: (t.dur ?? 0) / 1000, threadMs: t.tdur! / 1000 }));
}

