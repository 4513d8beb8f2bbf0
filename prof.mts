// temporary profiling harness (not committed)
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build, preview } from 'vite';
import { launchChromium } from './test/browser/chromiumBrowser';
import { bigSheetText } from './test/browser/bigSheet';
const root = process.cwd();
const outDir = mkdtempSync(join(tmpdir(), 'ssprof-'));
await build({ configFile: join(root, 'vite.config.ts'), root: join(root, 'web'), logLevel: 'error', build: { outDir, emptyOutDir: true, minify: false } });
const server = await preview({ configFile: join(root, 'vite.config.ts'), root: join(root, 'web'), logLevel: 'error', build: { outDir }, preview: { port: 0, host: '127.0.0.1' } });
const url = server.resolvedUrls!.local[0];
const b = await launchChromium();
const page = await b.context.newPage();
await page.goto(url);
await page.evaluate(() => localStorage.clear());
await page.reload();
await page.waitForFunction(() => document.querySelector('[data-key-value="A_yr"]')?.getAttribute('data-raw')?.match(/\d/), undefined, { timeout: 60000 });
await page.evaluate(`window.__sheetFile = new File([(${bigSheetText.toString()})(20000)], 'long.strainsheet.json', { type: 'application/json' })`);
const cdp = await b.context.newCDPSession(page);
const events: any[] = [];
cdp.on('Tracing.dataCollected', (e: any) => events.push(...e.value));
const done = new Promise((r) => cdp.on('Tracing.tracingComplete', r));
await page.waitForTimeout(300);
await page.evaluate(() => { const w = window as any; w.__lt = []; new PerformanceObserver((l) => { for (const e of l.getEntries()) w.__lt.push([e.startTime, e.duration]); }).observe({ type: 'longtask' }); });
const action = process.argv[2] ?? 'open';
const startTrace = () => cdp.send('Tracing.start', { traceConfig: { includedCategories: ['toplevel', 'disabled-by-default-v8.cpu_profiler', 'v8.execute', 'devtools.timeline'], recordMode: 'recordContinuously' }, transferMode: 'ReportEvents' } as any);
if (action === 'open') await startTrace();
await page.evaluate(() => {
  const input = document.querySelector('input[data-action="open-file"]') as HTMLInputElement;
  const dt = new DataTransfer(); dt.items.add((window as any).__sheetFile); input.files = dt.files;
  input.dispatchEvent(new Event('change', { bubbles: true }));
});
await page.waitForFunction(() => document.querySelector('[data-cell="c0"]') && !document.querySelector('[data-recalculating]'), undefined, { timeout: 300000, polling: 'raf' });
await page.waitForTimeout(500);
if (action !== 'open') {
  if (action === 'undo') { await page.fill('input[data-formula="c0"]', '2.5 m'); await page.press('input[data-formula="c0"]', 'Enter'); await page.waitForTimeout(3000); }
  await page.evaluate(() => { (window as any).__lt = []; });
  await startTrace();
  const t0 = Date.now();
  if (action === 'undo') await page.click('button[data-action="undo"]');
  if (action === 'scroll') await page.evaluate(() => { const p = document.querySelector('.sheet-pane')!; p.scrollTop = p.scrollHeight / 2; });
  await page.waitForTimeout(200);
  await page.waitForFunction(() => !document.querySelector('[data-recalculating]'), undefined, { timeout: 300000, polling: 'raf' });
  await page.waitForTimeout(1000);
  console.log('action took', Date.now() - t0);
}
await cdp.send('Tracing.end');
await done;
const lt = await page.evaluate(() => (window as any).__lt);
console.log('long tasks', lt.map(([s, d]: number[]) => d.toFixed(0)).join(', '));
// main renderer thread: the one with most RunTask on CrRendererMain
const threadNames = new Map<string, string>();
for (const e of events) if (e.ph === 'M' && e.name === 'thread_name') threadNames.set(`${e.pid}:${e.tid}`, e.args.name);
const mainKey = [...threadNames].filter(([, n]) => n === 'CrRendererMain').map(([k]) => k);
const tasks = events.filter((e) => e.ph === 'X' && e.name === 'ThreadControllerImpl::RunTask' && mainKey.includes(`${e.pid}:${e.tid}`) && e.dur > 50000).sort((a, b) => b.dur - a.dur);
// profile samples
const nodes = new Map<number, any>(); const parent = new Map<number, number>(); const samples: [number, number][] = [];
for (const e of events) if (e.name === 'ProfileChunk' && mainKey.includes(`${e.pid}:${e.tid}`) || (e.name === 'ProfileChunk')) {
  const d = e.args.data; if (!d) continue;
  for (const n of d.cpuProfile?.nodes ?? []) { nodes.set(n.id, n); if (n.parent) parent.set(n.id, n.parent); }
}
// samples: need per-profile time base
const profiles = new Map<string, number>();
for (const e of events) if (e.name === 'Profile') profiles.set(e.id, e.args.data.startTime);
const clock = new Map<string, number>();
for (const e of events) if (e.name === 'ProfileChunk') {
  const d = e.args.data; const ids = d.cpuProfile?.samples ?? []; const deltas = d.timeDeltas ?? [];
  let t = clock.get(e.id) ?? profiles.get(e.id) ?? 0;
  for (let i = 0; i < ids.length; i++) { t += deltas[i]; samples.push([t, ids[i]]); }
  clock.set(e.id, t);
}
const name = (id: number) => { const n = nodes.get(id); if (!n) return '?'; const cf = n.callFrame; return `${cf.functionName || '(anon)'}@${(cf.url || '').split('/').pop()}:${cf.lineNumber}`; };
for (const task of tasks.slice(0, 5)) {
  const inside = samples.filter(([t]) => t >= task.ts && t <= task.ts + task.dur);
  console.log(`\n== task ${(task.dur / 1000).toFixed(1)} ms, ${inside.length} samples`);
  for (const e of events) if (e.ph === 'X' && e.pid === task.pid && e.tid === task.tid && e.ts >= task.ts && e.ts <= task.ts + task.dur && e.dur > 4000) console.log(`   ev ${e.name} ${(e.dur / 1000).toFixed(1)} ms ${JSON.stringify(e.args?.data ?? {}).slice(0, 150)}`);
  const self = new Map<string, number>(); const total = new Map<string, number>();
  for (const [, id] of inside) {
    self.set(name(id), (self.get(name(id)) ?? 0) + 1);
    const seen = new Set<string>(); for (let p: number | undefined = id; p !== undefined; p = parent.get(p)) { const nm = name(p); if (!seen.has(nm)) { seen.add(nm); total.set(nm, (total.get(nm) ?? 0) + 1); } }
  }
  const top = (m: Map<string, number>, k: number) => [...m].sort((a, b) => b[1] - a[1]).slice(0, k).map(([n, v]) => `  ${v} ${n}`).join('\n');
  console.log(' self:\n' + top(self, 12)); console.log(' total:\n' + top(total, Number(process.env.TOTALS ?? 45)));
}
await b.close(); await server.close();
