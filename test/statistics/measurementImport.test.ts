// Reading free spectra and (A, gamma) samples from files (src/statistics/freeSpectrumImport.ts,
// amplitudeGammaImport.ts): each bad input of issue 12 is refused with the file, line and column.
// Expected positions are read off the test's own input text (independent of the parser).
import { describe, expect, it } from 'vitest';
import { importFreeSpectrum } from '../../src/statistics/freeSpectrumImport';
import { importAmplitudeGamma } from '../../src/statistics/amplitudeGammaImport';
import { ImportError } from '../../src/statistics/importText';
import { decodeColumn, decodeFreeSpectrum, encodeColumn, encodeFreeSpectrum, MAX_ENCODED_SAMPLES } from '../../src/statistics/sampleEncoding';

function refused(fn: () => unknown, where: { line: number | null; column: number | null }, message: RegExp): void {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(ImportError);
    const err = e as ImportError;
    expect({ line: err.line, column: err.column }).toEqual(where);
    expect(err.message).toMatch(message);
    expect(err.message.startsWith('data.csv') || err.message.startsWith('data.json')).toBe(true);
    return;
  }
  throw new Error('expected an ImportError');
}

const good = '# invented\n2.26 nHz,4.52 nHz\n-6.5,-7.0\n-6.6,-7.1\n-6.4,-7.2\n';

describe('free spectrum files: good input', () => {
  it('wide CSV: header frequencies with units, samples per column, comments skipped', () => {
    const r = importFreeSpectrum(good, 'data.csv');
    expect(Array.from(r.data.frequencyHz)).toEqual([2.26e-9, 4.52e-9]);
    expect(Array.from(r.data.samples[1])).toEqual([-7.0, -7.1, -7.2]);
    expect(r.data.spanS).toBeCloseTo(1 / 2.26e-9, 0);
  });
  it('long CSV and JSON give the same bins', () => {
    const long = importFreeSpectrum('f_nHz,value\n2.26,-6.5\n2.26,-6.6\n2.26,-6.4\n4.52,-7.0\n4.52,-7.1\n4.52,-7.2\n', 'data.csv');
    const json = importFreeSpectrum('{"quantity":"log10_rho","bins":[{"frequency":"2.26 nHz","samples":[-6.5,-6.6,-6.4]},{"frequency":"4.52 nHz","samples":[-7.0,-7.1,-7.2]}]}', 'data.json');
    const wide = importFreeSpectrum(good, 'data.csv');
    for (const r of [long, json]) {
      expect(Array.from(r.data.frequencyHz)).toEqual(Array.from(wide.data.frequencyHz));
      expect(r.data.samples.map((s) => Array.from(s))).toEqual(wide.data.samples.map((s) => Array.from(s)));
    }
  });
  it('rho (s) is taken to log10', () => {
    const r = importFreeSpectrum('2.26 nHz\n1e-7\n1e-6\n', 'data.csv', { quantity: 'rho' });
    expect(Array.from(r.data.samples[0])).toEqual([-7, -6]);
  });
});

describe('free spectrum files: every bad input of issue 12 names file, line and column', () => {
  it('ragged row', () => refused(() => importFreeSpectrum('2.26 nHz,4.52 nHz\n-6.5,-7.0\n-6.6\n', 'data.csv'), { line: 3, column: null }, /1 fields; the header has 2/));
  it('text in a number column', () => refused(() => importFreeSpectrum('2.26 nHz,4.52 nHz\n-6.5,-7.0\n-6.6,abc\n', 'data.csv'), { line: 3, column: 2 }, /"abc" is not a number/));
  it('NaN', () => refused(() => importFreeSpectrum('2.26 nHz,4.52 nHz\nNaN,-7.0\n-6.6,-7\n', 'data.csv'), { line: 2, column: 1 }, /"NaN", not a finite number/));
  it('infinite value', () => refused(() => importFreeSpectrum('2.26 nHz,4.52 nHz\n-6.5,-7.0\n-6.6,-Infinity\n', 'data.csv'), { line: 3, column: 2 }, /not a finite number/));
  it('rho <= 0 where logs are taken', () => refused(() => importFreeSpectrum('2.26 nHz\n1e-7\n0\n', 'data.csv', { quantity: 'rho' }), { line: 3, column: 1 }, /rho = 0: must be positive/));
  it('positive log10 rho (linear values given as logs)', () => refused(() => importFreeSpectrum('2.26 nHz\n-7\n3e-7\n', 'data.csv'), { line: 3, column: 1 }, /rather than their log10/));
  it('duplicate frequencies', () => refused(() => importFreeSpectrum('2.26 nHz,2.26 nHz\n-6.5,-7.0\n-6.6,-7.1\n', 'data.csv'), { line: 1, column: 2 }, /repeats the frequency of bin 1/));
  it('unsorted frequencies', () => refused(() => importFreeSpectrum('4.52 nHz,2.26 nHz\n-6.5,-7.0\n-6.6,-7.1\n', 'data.csv'), { line: 1, column: 2 }, /must increase/));
  it('unsorted bins in the long layout', () => refused(() => importFreeSpectrum('f_nHz,value\n4.52,-6.5\n4.52,-6.6\n2.26,-7\n', 'data.csv'), { line: 4, column: 1 }, /must increase/));
  it('too many bins (31 > 30)', () => {
    const head = Array.from({ length: 31 }, (_, k) => `${2.26 * (k + 1)} nHz`).join(',');
    const row = Array(31).fill('-7').join(',');
    refused(() => importFreeSpectrum(`${head}\n${row}\n${row}\n`, 'data.csv'), { line: 1, column: 31 }, /31 bins; at most 30/);
  });
  it('too many samples: refused without thinning, thinned by the stated factor with it', () => {
    const n = 10_001;
    const text = '2.26 nHz\n' + Array.from({ length: n }, (_, i) => `${-7 - (i % 100) / 1000}`).join('\n') + '\n';
    refused(() => importFreeSpectrum(text, 'data.csv'), { line: null, column: null }, /10001 samples .* every 2th sample/);
    const r = importFreeSpectrum(text, 'data.csv', { thin: true });
    expect(r.thin).toBe(2);
    expect(r.data.samples[0].length).toBe(5001);
  });
  it('missing header', () => refused(() => importFreeSpectrum('-6.5,-7.0\n-6.6,-7.1\n', 'data.csv'), { line: 1, column: null }, /no header/));
  it('missing unit', () => refused(() => importFreeSpectrum('2.26 nHz,4.52\n-6.5,-7.0\n-6.6,-7.1\n', 'data.csv'), { line: 1, column: 2 }, /has no unit/));
  it('JSON: syntax error and a bad sample give line and column', () => {
    refused(() => importFreeSpectrum('{"bins": [\n  {"frequency": "2.26 nHz", "samples": [-6.5,, -6.6]}]}', 'data.json'), { line: 2, column: 46 }, /not valid JSON/);
    refused(() => importFreeSpectrum('{"bins": [\n  {"frequency": "2.26 nHz",\n   "samples": [-6.5, "x"]}]}', 'data.json'), { line: 3, column: 22 }, /not a finite number/);
  });
});

describe('(A, gamma) files', () => {
  const rows = Array.from({ length: 12 }, (_, i) => `${-14.5 + i / 100},${3 + i / 10}`).join('\n');
  it('reads log10_A and gamma in either order', () => {
    const a = importAmplitudeGamma(`log10_A,gamma\n${rows}\n`, 'data.csv');
    expect(a.log10A[0]).toBe(-14.5);
    const swapped = importAmplitudeGamma(`gamma,log10_A\n${rows.split('\n').map((r) => r.split(',').reverse().join(',')).join('\n')}\n`, 'data.csv');
    expect(Array.from(swapped.gamma)).toEqual(Array.from(a.gamma));
  });
  it('refuses a missing header, a ragged row and text, naming the place', () => {
    refused(() => importAmplitudeGamma(`${rows}\n`, 'data.csv'), { line: 1, column: null }, /header must name two columns/);
    refused(() => importAmplitudeGamma(`log10_A,gamma\n${rows}\n-14.4\n`, 'data.csv'), { line: 14, column: null }, /ragged/);
    refused(() => importAmplitudeGamma(`log10_A,gamma\n${rows}\n-14.4,x\n`, 'data.csv'), { line: 14, column: 2 }, /"x" is not a number/);
  });
});

describe('compact encoding inside the sheet', () => {
  it('round trip within half a 12-bit step of each column range (stated in sampleEncoding.ts)', () => {
    const x = Float64Array.from({ length: 1000 }, (_, i) => -9 + 3 * Math.sin(i * 12.9898) ** 2);
    const back = decodeColumn(encodeColumn(x), 'test');
    const step = (Math.max(...x) - Math.min(...x)) / 4095;
    back.forEach((v, i) => expect(Math.abs(v - x[i])).toBeLessThanOrEqual(step / 2 + 1e-15));
  });
  it('a whole free spectrum survives encoding: frequencies exact, quantity and span kept', () => {
    const r = importFreeSpectrum(good, 'data.csv');
    const d = decodeFreeSpectrum(encodeFreeSpectrum(r.data, 1));
    expect(Array.from(d.frequencyHz)).toEqual(Array.from(r.data.frequencyHz));
    expect(d.spanS).toBe(r.data.spanS);
    expect(d.quantity).toBe('log10Rho');
  });
  it('damaged text is refused, saying where', () => {
    const t = encodeColumn([1, 2, 3]);
    expect(() => decodeColumn(t.slice(0, -1), 'bin 1')).toThrow(/bin 1: 3 samples need 6 characters/);
    expect(() => decodeColumn(t.slice(0, -1) + '!', 'bin 1')).toThrow(/character 6/);
    // characters beyond ASCII (one or two UTF-16 units) are not of the encoding either, and the first bad one is named
    expect(() => decodeColumn(t.slice(0, -3) + 'é' + t.slice(-2), 'bin 1')).toThrow(/character 4 /);
    expect(() => decodeColumn(t.slice(0, -4) + '😀' + t.slice(-2), 'bin 1')).toThrow(/character 3 /);
    expect(() => decodeColumn(t.slice(0, -4) + '!é' + t.slice(-2), 'bin 1')).toThrow(/character 3 /);
    expect(MAX_ENCODED_SAMPLES * 2).toBeLessThan(200_000); // fits the sheet's longest formula (formulaLimits.ts)
  });
});
