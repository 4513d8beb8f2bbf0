import { describe, it, expect } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { scan1D } from '../../src/statistics/sheetScan';
import type { CellSpec } from '../../src/sheet/types';
import { hellingsDowns } from '../../src/physics/hellingsDowns';
import { detectionSnr } from '../../src/physics/detectionSnr';
import { powerLawModel } from '../../src/physics/strainOnBins';
import { DAY_S, YEAR_S } from '../../src/physics/constants';

// The array view through real formulas in a sheet (an invented array and amplitude). Values are
// compared with direct calls of the physics functions, so this checks the formula boundary
// (units, lists, errors as cell values); the physics itself is checked in the other files here.
function sheetOf(cells: Array<[string, string]>): Sheet {
  return new Sheet({ cells: cells.map(([name, formula]): CellSpec => ({ name, formula })) });
}

describe('array view in a sheet', () => {
  it('computes correlations, S/N, and detection span from ordinary cells', () => {
    const s = sheetOf([
      ['arr', 'pulsarArray(25, 150 ns, 14 day, 12 yr)'],
      ['A_yr', '2.2e-15'],
      ['hd90', 'hellingsDowns(90 deg)'],
      ['snr', 'detectionSnr(A_yr, arr)'],
      ['snr20', 'detectionSnr(A_yr, arr, 20 yr)'],
      ['tDet', 'detectionSpan(A_yr, arr, 3)'],
      ['curve', 'arraySensitivity(arr)'],
    ]);
    const v = (n: string) => {
      const st = s.state(n);
      if (st.status !== 'value') throw new Error(`${n}: ${JSON.stringify(st)}`);
      return st.value;
    };
    expect(v('hd90')).toBe(hellingsDowns(Math.PI / 2));
    const arr = { pulsars: Array.from({ length: 25 }, () => ({ precisionS: 150e-9, cadenceS: 14 * DAY_S, redAmplitude: 0, redGamma: 0 })), spanS: 12 * YEAR_S, positions: null };
    const direct = detectionSnr(arr, powerLawModel(2.2e-15)).snr;
    expect(Math.abs((v('snr') as number) / direct - 1)).toBeLessThan(1e-9);
    expect(v('snr20') as number).toBeGreaterThan(v('snr') as number);
    const tDet = v('tDet') as { toNumber(u: string): number };
    expect(tDet.toNumber('yr')).toBeGreaterThan(0);
    expect((v('curve') as { kind: string }).kind).toBe('sensitivityCurve');
  });

  it('keeps bad input as a cell error naming the built-in and the argument', () => {
    const s = sheetOf([
      ['none', 'pulsarArray(0, 100 ns, 14 day, 10 yr)'],
      ['slow', 'pulsarArray(10, 100 ns, 3 yr, 2 yr)'],
      ['flat', 'pulsarArray(10, -5 ns, 14 day, 10 yr)'],
      ['bare', 'hellingsDowns(1.5)'],
    ]);
    for (const [name, arg] of [
      ['none', 'count'],
      ['slow', 'span'],
      ['flat', 'precision'],
      ['bare', 'separation'],
    ]) {
      const st = s.state(name);
      expect(st.status, name).toBe('error');
      if (st.status === 'error') {
        expect(st.error.message).toContain(arg);
        expect(st.error.message).toMatch(/pulsarArray|hellingsDowns/);
      }
    }
  });

  it('reads per-pulsar lists and sky positions written as matrices', () => {
    const s = sheetOf([
      ['sky', 'pulsarArrayOnSky([[0 deg, 0 deg], [90 deg, 0 deg], [45 deg, 60 deg]], [100 ns, 200 ns, 300 ns], 14 day, 10 yr)'],
      ['snr', 'detectionSnr(3e-15, sky)'],
    ]);
    const st = s.state('snr');
    expect(st.status).toBe('value');
    if (st.status === 'value') expect(st.value as number).toBeGreaterThan(0);
  });

  it('is usable in a scan over span: S/N follows T^(13/3) in the weak regime (Siemens et al. 2013, CQG 30, 224015)', async () => {
    const s = sheetOf([
      ['spanT', '12 yr'],
      ['arr', 'pulsarArray(20, 1 us, 14 day, spanT)'],
      ['snr', 'detectionSnr(1e-18, arr)'],
    ]);
    const r = await scan1D(s, { cell: 'spanT', lo: 5 * YEAR_S, hi: 20 * YEAR_S, n: 5, log: true }, ['snr']);
    expect(r.failures).toBe(0);
    const t = r.axis.valuesSI;
    const y = r.outputs.snr;
    for (let i = 1; i < t.length; i++) {
      expect(Math.abs(y[i] / y[0] / Math.pow(t[i] / t[0], 13 / 3) - 1), `T=${t[i] / YEAR_S} yr`).toBeLessThan(1e-3);
    }
  });
});
