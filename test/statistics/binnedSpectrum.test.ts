import { describe, expect, it } from 'vitest';
import { binsFromCsv, binsFromRows } from '../../src/statistics/binnedSpectrum';
import { YEAR_S } from '../../src/physics/constants';

// Invented per-bin values (not a real data set).
const CSV = `# invented free spectrum of the demo array
f_nHz, hc, lo, hi
2.2, 8.0e-15, 5.0e-15, 1.2e-14
4.5, 5.1e-15, 3.3e-15, 7.0e-15
6.7, 3.9e-15, 2.0e-15, 5.8e-15
`;

describe('per-bin values', () => {
  it('parses CSV with comments, any separator and unit columns (nHz -> Hz)', () => {
    const b = binsFromCsv(CSV, 0.9);
    expect(b.quantity).toBe('hc');
    expect(b.frequencyHz[0] / 2.2e-9).toBeCloseTo(1, 14);
    expect(b.frequencyHz[2] / 6.7e-9).toBeCloseTo(1, 14);
    expect(b.value[1]).toBe(5.1e-15);
    const t = binsFromCsv('hi;lo;power_s3;f_per_yr\n3e-27;1e-27;2e-27;1\n', 0.68);
    expect(t.quantity).toBe('residualPower');
    expect(t.frequencyHz[0]).toBeCloseTo(1 / YEAR_S, 20);
    expect(t.lower[0]).toBe(1e-27);
  });
  it('errors name the line and column', () => {
    expect(() => binsFromCsv('f_nHz,hc,lo,hi\n2,abc,1,3\n', 0.9)).toThrow(/CSV line 2, column hc: "abc" is not a number/);
    expect(() => binsFromCsv('f_nHz,hc,lo\n2,2,1\n', 0.9)).toThrow(/header lacks hi/);
    expect(() => binsFromCsv('f_nHz,hc,lo,hi,extra\n', 0.9)).toThrow(/unknown column "extra"/);
    expect(() => binsFromCsv('f_nHz,hc,lo,hi\n2,2,1\n', 0.9)).toThrow(/CSV line 2 has 3 fields/);
    expect(() => binsFromCsv('f_nHz,hc,lo,hi\n2,2,2.5,3\n', 0.9)).toThrow(/CSV line 2: lower end 2.5 is above the value 2/);
    expect(() => binsFromCsv('# only\n', 0.9)).toThrow(/empty/);
    expect(() => binsFromCsv('f_nHz,hc,lo,hi\n4,2,1,3\n3,2,1,3\n', 0.9)).toThrow(/CSV line 3: frequencies must increase/);
  });
  it('rows are validated too, and the level is required in (0,1)', () => {
    expect(() => binsFromRows([[1e-9, 1, 0.5, 2]], 'hc', 90)).toThrow(/level/);
    expect(() => binsFromRows([[-1e-9, 1, 0.5, 2]], 'hc', 0.9)).toThrow(/row 1: frequency must be positive/);
    expect(() => binsFromRows([], 'hc', 0.9)).toThrow(/no bins/);
    expect(binsFromRows([[1e-9, 1, 0.5, 2]], 'omegaGw', 0.9).upper[0]).toBe(2);
  });
});
