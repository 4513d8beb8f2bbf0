// Speed of the array view. Target (issue 7): the expected S/N of the demo sheet's spectrum over a
// 50-value span scan in under 200 ms. Run with `npm run bench`.
//
// The demo sheet (examples/demo.json, an invented scenario) is loaded once, outside the timed
// functions, with three cells added in memory: an invented 40-pulsar array, a span to scan and the
// S/N of the sheet's `spectrum` cell. The scan runs through the sheet (evaluateWith, as the scans of
// src/statistics do), so only the S/N cell is recomputed per span. Spans run 3 to 30 yr; beyond the
// demo grid's 1/(14 yr) the spectrum is extended with its own population (see docs/array.md).
import { readFileSync } from 'node:fs';
import { bench, describe } from 'vitest';
import { Sheet } from '../src/sheet/sheet';
import { parseSheetFile } from '../src/sheet/sheetFile';
import { quantity } from '../src/sheet/mathInstance';
import { DAY_S, YEAR_S } from '../src/physics/constants';
import { detectionSnr, detectionSpan } from '../src/physics/detectionSnr';
import { arraySensitivity } from '../src/physics/arraySensitivity';
import { spectrumModel } from '../src/physics/strainOnBins';
import type { Spectrum } from '../src/physics/spectrum';
import type { PulsarArray } from '../src/physics/pulsarArray';
import { mulberry32, unitSphere } from '../test/arrayView/seededRandom';

const file = parseSheetFile(readFileSync(new URL('../examples/demo.json', import.meta.url), 'utf8'));
const sheet = new Sheet({
  title: file.title,
  cells: [
    ...file.cells,
    { name: 'bench_array', formula: 'pulsarArray(40, 150 ns, array_cadence, array_span)' },
    { name: 'bench_span', formula: '14 yr' },
    { name: 'bench_snr', formula: 'detectionSnr(spectrum, bench_array, bench_span)' },
  ],
});
const check = sheet.state('bench_snr');
if (check.status !== 'value') throw new Error(`demo sheet S/N cell failed: ${JSON.stringify(check)}`);
const spectrumValue = sheet.value('spectrum') as Spectrum;
const spans = Array.from({ length: 50 }, (_, i) => (3 + (27 * i) / 49) * YEAR_S);
const spanValues = spans.map((t) => quantity(t, 'yr'));

// Plain-physics variants on the same spectrum, spans within its grid (up to 14 yr).
const model = spectrumModel({ frequencyHz: spectrumValue.frequencyHz, hc: spectrumValue.hc });
const pulsar = { precisionS: 150e-9, cadenceS: 21 * DAY_S, redAmplitude: 0, redGamma: 0 };
const skyAveraged: PulsarArray = { pulsars: Array.from({ length: 40 }, () => pulsar), spanS: 14 * YEAR_S, positions: null };
const rand = mulberry32(2026);
const positions: Array<[number, number]> = Array.from({ length: 100 }, () => {
  const v = unitSphere(rand);
  return [Math.atan2(v[1], v[0]), Math.asin(v[2])];
});
const onSky: PulsarArray = { pulsars: positions.map(() => pulsar), spanS: 14 * YEAR_S, positions };
const gridSpans = Array.from({ length: 50 }, (_, i) => (3 + (11 * i) / 49) * YEAR_S);

describe('array view', () => {
  bench('demo sheet: detectionSnr of `spectrum` over a 50-span scan, 3-30 yr, 40 pulsars (target < 200 ms)', () => {
    for (const t of spanValues) {
      const r = sheet.evaluateWith({ bench_span: t }, ['bench_snr']).bench_snr;
      if (r.status !== 'value') throw new Error('S/N failed in the scan');
    }
  });
  bench('physics only: detectionSnr over 50 spans, 3-14 yr, 40 pulsars sky-averaged', () => {
    for (const t of gridSpans) detectionSnr(skyAveraged, model, t);
  });
  bench('physics only: detectionSnr over 50 spans, 3-14 yr, 100 pulsars with positions (4950 pairs)', () => {
    for (const t of gridSpans) detectionSnr(onSky, model, t);
  });
  bench('physics only: detectionSpan to S/N 3 within 14 yr, 40 pulsars', () => {
    detectionSpan(skyAveraged, model, 3, 14 * YEAR_S);
  });
  bench('physics only: arraySensitivity, 40 pulsars over 14 yr', () => {
    arraySensitivity(skyAveraged);
  });
});
