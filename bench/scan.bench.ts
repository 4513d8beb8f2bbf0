// Speed of scans and Monte Carlo on the demo circular model (examples/demo.json, an invented
// scenario). Targets (issue 5): a 100 x 100 two-input scan under 2 s, 10,000 Monte Carlo samples
// under 5 s. Run with `npm run bench`.
//
// The demo sheet is loaded once, outside the timed functions, with a measurement cell added in
// memory from the demo's own (invented) measured amplitude. Everything runs through
// Sheet.evaluateWith, as the web app's worker and the CLI do.
import { readFileSync } from 'node:fs';
import { bench, describe } from 'vitest';
import { Sheet } from '../src/sheet/sheet';
import { parseSheetFile } from '../src/sheet/sheetFile';
import { scan2D } from '../src/statistics/sheetScan';
import { monteCarlo } from '../src/statistics/sheetMonteCarlo';
import { measurementOfCell } from '../src/statistics/jobs';
import type { CellSpec } from '../src/sheet/types';

const file = parseSheetFile(readFileSync(new URL('../examples/demo.json', import.meta.url), 'utf8'));

function demo(patch: Record<string, Partial<CellSpec>> = {}): Sheet {
  const sheet = new Sheet({
    title: file.title,
    cells: [
      ...file.cells.map((c) => ({ ...c, ...(patch[c.name] ?? {}) })),
      { name: 'bench_measured', formula: 'measuredAmplitude(measured_A, measured_A_low, measured_A_high, measured_level)' },
    ],
  });
  const st = sheet.state('A_yr');
  if (st.status !== 'value') throw new Error(`demo sheet A_yr failed: ${JSON.stringify(st)}`);
  return sheet;
}

const scanSheet = demo();
const measurement = measurementOfCell(scanSheet, 'bench_measured');
const rate0 = (scanSheet.value('rate_norm') as { value: number }).value;

describe('two-input scan, demo circular model', () => {
  // mass_slope is evaluated (100 spectra); rate_norm follows from the sqrt law (probe-checked).
  bench(
    '100 x 100 scan of A_yr over mass_slope x rate_norm (log), likelihood map and HPD levels',
    async () => {
      const r = await scan2D(
        scanSheet,
        { cell: 'mass_slope', lo: -0.5, hi: 1, n: 100, log: false },
        { cell: 'rate_norm', lo: rate0 / 30, hi: rate0 * 30, n: 100, log: true },
        'A_yr',
        { measurement },
      );
      if (r.scaledAxis !== 'y' || r.failures) throw new Error('scan did not use the sqrt law or had failures');
    },
    { iterations: 3, time: 0, warmupIterations: 0 },
  );
});

// rate_norm uncertain only: one evaluation serves every sample (the sqrt factor).
const mcRateOnly = demo({ rate_norm: { uncertainty: 'lognormalDist(1.2e-3 Mpc^-3 Gyr^-1, 0.3)' }, mass_slope: { uncertainty: undefined } });
// rate_norm and mass_slope uncertain: every sample evaluates the population again; the demo's
// A_yr is taken at the one frequency f_yr from the population (amplitudeAtYear(pop)).
const mcTwo = demo({
  rate_norm: { uncertainty: 'lognormalDist(1.2e-3 Mpc^-3 Gyr^-1, 0.3)' },
  mass_slope: { uncertainty: 'normalDist(0.25, 0.1)' },
});

describe('Monte Carlo, demo circular model', () => {
  bench(
    '10,000 samples, rate_norm uncertain (sqrt factor, one evaluation)',
    async () => {
      await monteCarlo(mcRateOnly, { samples: 10_000, seed: 1, outputs: ['A_yr'], measurement });
    },
    { iterations: 5, time: 0, warmupIterations: 1 },
  );
  bench(
    '10,000 samples, rate_norm and mass_slope uncertain, A_yr at f_yr from the population',
    async () => {
      await monteCarlo(mcTwo, { samples: 10_000, seed: 1, outputs: ['A_yr'], measurement });
    },
    { iterations: 1, time: 0, warmupIterations: 0 },
  );
});
