// The web app's plain modules, in node (no browser): CSV and XML writing, formula reading for
// completion, plot conversions, grid geometry, credible contours and the job runner. Each check
// names where its expected value comes from.
import { describe, expect, it } from 'vitest';
import { csvDocument, csvField, csvLine, plotToCsv } from '../../web/files/csvText';
import { escapeXml, plotToSvg } from '../../web/plots/svgWriter';
import { callAroundCaret, completionsFor, wordBeforeCaret } from '../../web/help/formulaContext';
import { axisTicks } from '../../web/plots/axisTicks';
import { cellEdges, dataRange, type PlotModel } from '../../web/plots/plotModel';
import { scientificPieces } from '../../web/sheet/ScientificText';
import { spectrumPlotModel } from '../../web/plots/spectrumPlotModel';
import { binsFromJson, measuredFromJson, frequencyList, sampleFrequencyFunction } from '../../web/plots/sheetPlotData';
import { groupBySection, freshName, STANDARD_SECTIONS } from '../../web/sheet/sections';
import { scan2Model } from '../../web/jobs/scanPlotModels';
import { axisSpecFor, runJob, JobCancelled } from '../../web/jobs/jobRunner';
import { openSheetFile } from '../../web/files/openSheetFile';
import { hpdThresholds } from '../../src/statistics/credibleRegion';
import { math } from '../../src/sheet/mathInstance';
import { F_YR_HZ, KM_S_MPC_SI } from '../../src/physics/constants';
import type { Scan2Result } from '../../web/jobs/jobProtocol';

describe('CSV (IETF RFC 4180, Shafranovich 2005, section 2)', () => {
  it('quotes fields with commas, quotes or line breaks and doubles inner quotes (rules 5-7)', () => {
    expect(csvLine(['a,b', 'say "hi"', 'plain', 'two\nlines'])).toBe('"a,b","say ""hi""",plain,"two\nlines"');
  });
  it('ends records with CRLF (rule 1) and writes numbers as shortest round-trip text', () => {
    expect(csvDocument(['x', 'y'], [[1, 2.5e-15]])).toBe('x,y\r\n1,2.5e-15\r\n');
    expect(Number(csvField(0.1 + 0.2))).toBe(0.1 + 0.2);
  });
  it('leaves non-finite numbers empty rather than writing NaN', () => {
    expect(csvLine([NaN, Infinity, null, undefined])).toBe(',,,');
  });
  it('defuses text a spreadsheet would run as a formula (OWASP "CSV Injection")', () => {
    expect(csvField('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvField('@SUM(A1)')).toBe(`'@SUM(A1)`);
  });
});

describe('XML text in the SVG writer (W3C XML 1.0, section 2.4)', () => {
  it('escapes markup characters in text and attributes', () => {
    expect(escapeXml(`<a & "b" 'c'>`)).toBe('&lt;a &amp; &quot;b&quot; &apos;c&apos;&gt;');
  });
  it('never lets a series label become markup', () => {
    const model: PlotModel = {
      id: 't',
      title: 'T <b>',
      x: { label: 'x', scale: 'linear' },
      y: { label: 'y', scale: 'linear' },
      series: [{ id: 's', label: '</text><script>x</script>', kind: 'line', x: [0, 1], y: [0, 1], color: '#000000' }],
      notes: [],
    };
    const svg = plotToSvg(model);
    expect(svg).not.toContain('<script>');
    expect(svg).toContain('&lt;/text&gt;&lt;script&gt;x&lt;/script&gt;');
    // Every element opened is closed: count of "<tag" minus self-closed equals count of "</tag>".
    const opened = (svg.match(/<[a-zA-Z][^>]*[^/]>/g) ?? []).length;
    const closed = (svg.match(/<\/[a-zA-Z]+>/g) ?? []).length;
    expect(opened).toBe(closed);
  });
});

describe('reading a formula at the caret (mathjs expression syntax: calls as name(args))', () => {
  it('finds the identifier being typed', () => {
    expect(wordBeforeCaret('2 * rate_n', 10)).toEqual({ start: 4, word: 'rate_n' });
    expect(wordBeforeCaret('2 * 3e5', 7)).toBeNull(); // a number is not a name
    expect(wordBeforeCaret('binsFromText("rate', 18)).toBeNull(); // inside a string literal
  });
  it('finds the call around the caret and the argument index', () => {
    expect(callAroundCaret('logGrid(1 nHz, 10', 17)).toEqual({ name: 'logGrid', argIndex: 1 });
    expect(callAroundCaret('f(g(1, 2), ', 11)).toEqual({ name: 'f', argIndex: 1 });
    expect(callAroundCaret('[1, 2', 5)).toBeNull();
    expect(callAroundCaret('2 * (3 + ', 9)).toBeNull(); // a parenthesis, not a call
  });
  it('completes exact-case prefixes first, then case-insensitive ones', () => {
    const c = [
      { name: 'rate_norm', kind: 'cell' as const, detail: '' },
      { name: 'Rate_other', kind: 'cell' as const, detail: '' },
      { name: 'logGrid', kind: 'built-in' as const, detail: '' },
    ];
    expect(completionsFor('rate', c).map((x) => x.name)).toEqual(['rate_norm', 'Rate_other']);
    expect(completionsFor('', c)).toEqual([]);
  });
});

describe('plot geometry', () => {
  it('puts log-axis cell edges at geometric midpoints (midpoints in log10)', () => {
    const e = cellEdges([1, 10, 100], 'log');
    const expected = [10 ** -0.5, 10 ** 0.5, 10 ** 1.5, 10 ** 2.5];
    e.forEach((v, i) => expect(v / expected[i]).toBeCloseTo(1, 12));
    expect(cellEdges([0, 1, 2], 'linear')).toEqual([-0.5, 0.5, 1.5, 2.5]);
  });
  it('ticks a log axis at the powers of ten inside it', () => {
    const t = axisTicks('log', 2e-9, 3e-7);
    expect(t.length).toBe(2);
    expect(t[0] / 1e-8).toBeCloseTo(1, 12);
    expect(t[1] / 1e-7).toBeCloseTo(1, 12);
  });
  it('drops values a log axis cannot show from its range', () => {
    const m: PlotModel = { id: 'r', title: '', x: { label: '', scale: 'log' }, y: { label: '', scale: 'log' }, series: [{ id: 'a', label: '', kind: 'line', x: [0, 1, 10], y: [-1, 2, 3], color: '#000000' }], notes: [] };
    expect(dataRange(m, 'x')).toEqual([1, 10]);
    expect(dataRange(m, 'y')).toEqual([2, 3]);
  });
  it('writes powers of ten and unit exponents as superscripts', () => {
    expect(scientificPieces('2.5e-15 Mpc^-3')).toEqual([{ text: '2.5 × 10' }, { text: '−15', sup: true }, { text: ' Mpc' }, { text: '−3', sup: true }]);
    expect(scientificPieces('1e7 Msun')).toEqual([{ text: '10' }, { text: '7', sup: true }, { text: ' Msun' }]);
  });
});

describe('spectrum plot conversions', () => {
  const f = [F_YR_HZ / 4, F_YR_HZ, 4 * F_YR_HZ];
  const hc = [3e-15, 2e-15, 1e-15];
  const H0 = 70 * KM_S_MPC_SI;
  it('converts h_c to timing-residual power P = h_c^2 / (12 pi^2 f^3) (Thrane & Romano 2013, PRD 88, 124032)', () => {
    const m = spectrumPlotModel({ quantity: 'psd', curves: [{ id: 'c', label: 'c', frequencyHz: f, hc }], measured: [], bins: [], h0PerS: null, notes: [] });
    m.series[0].y.forEach((p, i) => expect(p / (hc[i] ** 2 / (12 * Math.PI ** 2 * f[i] ** 3))).toBeCloseTo(1, 12));
  });
  it('converts h_c to Omega_gw = 2 pi^2 f^2 h_c^2 / (3 H0^2) (Phinney 2001, astro-ph/0108028)', () => {
    const m = spectrumPlotModel({ quantity: 'omega', curves: [{ id: 'c', label: 'c', frequencyHz: f, hc }], measured: [], bins: [], h0PerS: H0, notes: [] });
    m.series[0].y.forEach((o, i) => expect(o / ((2 * Math.PI ** 2 * f[i] ** 2 * hc[i] ** 2) / (3 * H0 ** 2))).toBeCloseTo(1, 12));
  });
  it('uses a spectrum’s own Omega_gw series when it carries one', () => {
    const own = [1, 2, 3];
    const m = spectrumPlotModel({ quantity: 'omega', curves: [{ id: 'c', label: 'c', frequencyHz: f, hc, omegaGw: own }], measured: [], bins: [], h0PerS: H0, notes: [] });
    expect(m.series[0].y).toEqual(own);
  });
  it('draws the measured band as h_c = A (f/f_ref)^((3-gamma)/2): slope -2/3 for gamma = 13/3 (Phinney 2001)', () => {
    const measured = [{ label: 'm', median: 2e-15, lower: 1e-15, upper: 4e-15, level: 0.9, gamma: 13 / 3, fRefHz: F_YR_HZ }];
    const m = spectrumPlotModel({ quantity: 'hc', curves: [{ id: 'c', label: 'c', frequencyHz: f, hc }], measured, bins: [], h0PerS: null, notes: [] });
    const band = m.series.find((s) => s.kind === 'band')!;
    const k = band.x.length - 1;
    expect(band.yLow![k] / (1e-15 * (band.x[k] / F_YR_HZ) ** (-2 / 3))).toBeCloseTo(1, 12);
    expect(band.yHigh![0] / (4e-15 * (band.x[0] / F_YR_HZ) ** (-2 / 3))).toBeCloseTo(1, 12);
    const point = m.series.find((s) => s.kind === 'interval')!;
    expect([point.x[0], point.y[0], point.yLow![0], point.yHigh![0]]).toEqual([F_YR_HZ, 2e-15, 1e-15, 4e-15]);
  });
  it('reads a measurement’s stated interval and level from its JSON, and refuses one without a reference frequency', () => {
    const m = measuredFromJson('m', { median: 2e-15, stated: { lower: 1e-15, upper: 3e-15, level: 0.9 }, gamma: 13 / 3, fRefHz: F_YR_HZ });
    expect(m).toEqual({ label: 'm', median: 2e-15, lower: 1e-15, upper: 3e-15, level: 0.9, gamma: 13 / 3, fRefHz: F_YR_HZ });
    expect(measuredFromJson('m', { median: 2e-15 })).toBeNull();
  });
  it('reads a list of frequency quantities in SI', () => {
    // the sheet's instance has no evaluate (it is built from the formula language's factories only)
    const list = (unit: string) => math.matrix([math.unit(1, unit), math.unit(2, unit)]);
    expect(frequencyList(list('nHz'))!.map((x) => x / 1e-9)).toEqual([1, 2].map((x) => expect.closeTo(x, 12)));
    expect(frequencyList(list('m'))).toBeNull();
  });
});

describe('per-bin measured values', () => {
  it('turns per-bin Omega_gw into h_c with the inverse of Omega_gw = 2 pi^2 f^2 h_c^2 / (3 H0^2) (Phinney 2001)', () => {
    const H0 = 70 * KM_S_MPC_SI;
    const f = 2e-9;
    const hc = 3e-15;
    const omega = (2 * Math.PI ** 2 * f ** 2 * hc ** 2) / (3 * H0 ** 2);
    const b = binsFromJson('bins', { quantity: 'omegaGw', frequencyHz: [f], value: [omega], lower: [omega / 4], upper: [omega * 4] }, H0)!;
    expect(b.hc[0] / hc).toBeCloseTo(1, 12);
    expect(b.hcLower[0] / (hc / 2)).toBeCloseTo(1, 12); // h_c goes as sqrt(Omega_gw)
    expect(b.hcUpper[0] / (hc * 2)).toBeCloseTo(1, 12);
  });
  it('turns per-bin residual power into h_c with the inverse of P = h_c^2 / (12 pi^2 f^3) (Thrane & Romano 2013)', () => {
    const f = 5e-9;
    const hc = 1e-15;
    const p = hc ** 2 / (12 * Math.PI ** 2 * f ** 3);
    const b = binsFromJson('bins', { quantity: 'residualPower', frequencyHz: [f], value: [p], lower: [p], upper: [p] }, null)!;
    expect(b.hc[0] / hc).toBeCloseTo(1, 12);
  });
});

describe('sections on screen', () => {
  it('orders the standard sections first and the user’s own after them, skipping empty ones', () => {
    const groups = groupBySection([
      { name: 'a', formula: '1', section: 'mine' },
      { name: 'b', formula: '1', section: 'results' },
      { name: 'c', formula: '1', section: 'cosmology' },
      { name: 'd', formula: '1' },
    ]);
    expect(groups.map((g) => g.name)).toEqual(['cosmology', 'results', 'mine', 'my cells']);
    expect(STANDARD_SECTIONS.indexOf('cosmology')).toBeLessThan(STANDARD_SECTIONS.indexOf('results'));
  });
  it('finds a fresh name', () => {
    expect(freshName('x_copy', new Set(['x_copy', 'x_copy_2']))).toBe('x_copy_3');
  });
});

describe('credible contours of a two-input map', () => {
  it('draws the 68.27% HPD contour of a 2-D Gaussian at Delta chi^2 = 2.30 (Press et al. 2007, Numerical Recipes 3rd ed., sec. 15.6)', () => {
    const n = 121;
    const xs = Array.from({ length: n }, (_, i) => -4 + (8 * i) / (n - 1));
    const mass = new Float64Array(n * n);
    for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) mass[i + n * j] = Math.exp(-0.5 * (xs[i] ** 2 + xs[j] ** 2));
    const hpd = hpdThresholds(mass, [0.6827, 0.9545]);
    const axis = { cell: 'x', lo: -4, hi: 4, n, log: false, unit: '' };
    const result: Scan2Result = {
      kind: 'scan2',
      x: axis,
      y: { ...axis, cell: 'y' },
      output: 'A_yr',
      xValues: xs,
      yValues: xs,
      mass: Array.from(hpd.posterior),
      levels: [
        { level: 0.6827, threshold: hpd.thresholds[0] },
        { level: 0.9545, threshold: hpd.thresholds[1] },
      ],
      prior: 'uniform',
      failures: [],
    };
    const model = scan2Model(result);
    const radius = (id: string) => {
      const s = model.series.find((x) => x.id === id)!;
      const r = s.x.map((x, k) => Math.hypot(x, s.y[k])).filter(Number.isFinite);
      return { min: Math.min(...r), max: Math.max(...r) };
    };
    const step = 8 / (n - 1);
    // Delta chi^2 = 2.30 for 68.27% and 6.18 for 95.45% with two parameters.
    const r68 = radius('contour-0.6827');
    expect(r68.min).toBeGreaterThan(Math.sqrt(2.3) - 1.5 * step);
    expect(r68.max).toBeLessThan(Math.sqrt(2.3) + 1.5 * step);
    const r95 = radius('contour-0.9545');
    expect(r95.min).toBeGreaterThan(Math.sqrt(6.18) - 1.5 * step);
    expect(r95.max).toBeLessThan(Math.sqrt(6.18) + 1.5 * step);
  });
});

const SCAN_SHEET = JSON.stringify({
  format: 'strainsheet',
  version: 1,
  title: 'scan test (invented)',
  notes: '',
  cells: [
    { name: 'rate_norm', formula: '1e-3 Mpc^-3 Gyr^-1' },
    { name: 'A_yr', formula: '2e-15 * sqrt(rate_norm / (1e-3 Mpc^-3 Gyr^-1))' },
  ],
});

describe('the job runner (runs inside the worker; DOM-free)', () => {
  it('passes scan ends with their unit as formula text (numbers alone for plain cells)', () => {
    expect(axisSpecFor({ cell: 'x', lo: 1e-4, hi: 1e-2, n: 5, log: true, unit: 'Mpc^-3 Gyr^-1' })).toEqual({ cell: 'x', lo: '0.0001 Mpc^-3 Gyr^-1', hi: '0.01 Mpc^-3 Gyr^-1', n: 5, log: true });
    expect(axisSpecFor({ cell: 'x', lo: 1, hi: 2, n: 3, log: false, unit: '' })).toEqual({ cell: 'x', lo: 1, hi: 2, n: 3, log: false });
  });
  it('scans an input through the sheet: A_yr = A0 sqrt(rate/rate0) for this sheet (closed form of its formula)', async () => {
    const progress: number[] = [];
    const r = await runJob(SCAN_SHEET, { kind: 'scan1', axis: { cell: 'rate_norm', lo: 1e-4, hi: 1e-2, n: 9, log: true, unit: 'Mpc^-3 Gyr^-1' }, output: 'A_yr', measurement: null }, { signal: new AbortController().signal, progress: (d) => progress.push(d) });
    if (r.kind !== 'scan1') throw new Error('wrong kind');
    expect(r.x.length).toBe(9);
    for (let k = 1; k < 9; k++) expect(r.x[k] / r.x[k - 1]).toBeCloseTo(Math.sqrt(Math.sqrt(10)), 10); // 1e-4..1e-2 in 8 equal log steps
    r.x.forEach((x, i) => expect(r.y[i] / (2e-15 * Math.sqrt(x / 1e-3))).toBeCloseTo(1, 10));
    expect(progress.at(-1)).toBe(9);
  });
  it('stops when cancelled (an output that needs every point evaluated)', async () => {
    const c = new AbortController();
    c.abort();
    const sheet = SCAN_SHEET.replace('sqrt(rate_norm / (1e-3 Mpc^-3 Gyr^-1))', '(rate_norm / (1e-3 Mpc^-3 Gyr^-1))^0.7');
    expect(sheet).not.toBe(SCAN_SHEET);
    await expect(runJob(sheet, { kind: 'scan1', axis: { cell: 'rate_norm', lo: 1e-4, hi: 1e-2, n: 9, log: true, unit: 'Mpc^-3 Gyr^-1' }, output: 'A_yr', measurement: null }, { signal: c.signal, progress: () => {} })).rejects.toBeInstanceOf(JobCancelled);
  });
  it('names a missing cell', async () => {
    await expect(runJob(SCAN_SHEET, { kind: 'scan1', axis: { cell: 'nope', lo: 1, hi: 2, n: 3, log: false, unit: '' }, output: 'A_yr', measurement: null }, { signal: new AbortController().signal, progress: () => {} })).rejects.toThrow(/nope/);
  });
});

describe('opening a sheet file', () => {
  it('refuses an oversized file before reading it, and a file the parser refuses, saying the sheet is unchanged', async () => {
    const big = new Blob([new Uint8Array(5_000_001)]);
    const r1 = await openSheetFile(big, () => 1);
    expect(r1.ok).toBe(false);
    if (!r1.ok) expect(r1.message).toMatch(/5 MB.*unchanged/);
    const r2 = await openSheetFile(Object.assign(new Blob(['{']), { name: 'x.json' }), () => {
      throw new Error('the file is not JSON');
    });
    expect(r2).toEqual({ ok: false, message: '"x.json" was not opened: the file is not JSON. The sheet is unchanged.' });
  });
});

describe('autosave in local storage (failures reported, never thrown)', () => {
  function fakeStorage(opts: { quota?: boolean } = {}) {
    const data = new Map<string, string>();
    return {
      data,
      getItem: (k: string) => data.get(k) ?? null,
      setItem: (k: string, v: string) => {
        if (opts.quota) throw new DOMException('full', 'QuotaExceededError');
        data.set(k, v);
      },
      removeItem: (k: string) => void data.delete(k),
    };
  }
  async function withWindow<T>(win: unknown, run: (m: typeof import('../../web/files/autosave')) => T): Promise<T> {
    const g = globalThis as { window?: unknown };
    const before = g.window;
    g.window = win;
    try {
      return run(await import('../../web/files/autosave'));
    } finally {
      g.window = before;
    }
  }
  it('reports storage switched off (the browser refuses access to localStorage)', async () => {
    const win = {
      get localStorage(): Storage {
        throw new DOMException('denied', 'SecurityError');
      },
    };
    await withWindow(win, (m) => {
      const w = m.writeAutosave('x');
      expect(w.ok).toBe(false);
      if (!w.ok) expect(w.message).toMatch(/does not allow local storage/);
      expect(m.restoreAutosave(() => 1).safeToWrite).toBe(false);
    });
  });
  it('reports a full storage by name', async () => {
    await withWindow({ localStorage: fakeStorage({ quota: true }) }, (m) => {
      const w = m.writeAutosave('x'.repeat(3000));
      expect(w.ok).toBe(false);
      if (!w.ok) expect(w.message).toMatch(/local storage is full \(sheet is 3 kB\)/);
    });
  });
  it('keeps an unreadable autosave under another key, once (issue 10: not again on every start)', async () => {
    const storage = fakeStorage();
    await withWindow({ localStorage: storage }, (m) => {
      storage.data.set(m.AUTOSAVE_KEY, '{broken');
      const r = m.restoreAutosave(() => {
        throw new Error('not JSON');
      });
      expect(r.sheet).toBeUndefined();
      expect(r.safeToWrite).toBe(true);
      const aside = [...storage.data.keys()].filter((k) => k.startsWith(m.SET_ASIDE_PREFIX));
      expect(aside.length).toBe(1);
      expect(storage.data.get(aside[0])).toBe('{broken');
      expect(storage.data.has(m.AUTOSAVE_KEY)).toBe(false);
      expect(r.message).toContain(aside[0]);
      // the next start finds nothing to restore and sets nothing aside again
      const again = m.restoreAutosave(() => {
        throw new Error('not JSON');
      });
      expect(again).toEqual({ safeToWrite: true });
      expect([...storage.data.keys()].filter((k) => k.startsWith(m.SET_ASIDE_PREFIX)).length).toBe(1);
    });
  });
});

describe('the app engine budget (issue 10)', () => {
  it('stops drawing a function cell that takes longer than one cell\'s budget, saying why', async () => {
    const { Sheet } = await import('../../web/engine/engine');
    const { cellBudgetSeconds, setCellBudget } = await import('../../src/sheet/evaluationBudget');
    const before = cellBudgetSeconds();
    try {
      const s = new Sheet({ cells: [{ name: 'heavy', formula: 'heavy(f) = sum(1:1e6) * 0 + 1' }, { name: 'light', formula: 'light(f) = 2' }] });
      const grid = Array.from({ length: 41 }, (_, k) => 1e-9 * Math.pow(100, k / 40));
      // a light curve within the page's budget
      expect(sampleFrequencyFunction(s.value('light') as (x: unknown) => unknown, grid)).toEqual({ y: grid.map(() => 2) });
      // 41 sums of a million numbers, past a budget of 0.02 s
      setCellBudget(0.02);
      const heavy = sampleFrequencyFunction(s.value('heavy') as (x: unknown) => unknown, grid);
      expect('reason' in heavy && heavy.reason).toBe("drawing it takes longer than 0.02 s (one cell's time budget here)");
    } finally {
      setCellBudget(before);
    }
  });

  it('hands a slow formula off the page after the page budget per cell, instead of failing it', async () => {
    const { Sheet } = await import('../../web/engine/engine');
    const { APP_PAGE_CELL_SECONDS } = await import('../../web/engine/pageBudget');
    const { cellBudgetSeconds, DEFAULT_CELL_SECONDS, handOffOnTimeout, setCellBudget, setHandOffOnTimeout } = await import('../../src/sheet/evaluationBudget');
    try {
      expect(cellBudgetSeconds()).toBe(APP_PAGE_CELL_SECONDS);
      expect(handOffOnTimeout()).toBe(true);
      const cells = [
        { name: 'step', formula: 'step(x) = x + 1' },
        { name: 'steps', formula: 'steps(x) = step(step(step(step(x))))' },
        { name: 'slow', formula: 'sum(map(1:1e6, steps)) + sum(map(1:1e6, steps)) + sum(map(1:1e6, steps))' },
      ];
      const s = new Sheet({ cells });
      const st = s.state('slow');
      expect(st.status === 'pending' && st.offPage !== undefined).toBe(true);
    } finally {
      setCellBudget(DEFAULT_CELL_SECONDS);
      setHandOffOnTimeout(false);
    }
  });
});
