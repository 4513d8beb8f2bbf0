// Display of values (4 significant digits) and their JSON form for the command line.
// Expected texts follow from the rules in src/sheet/formatValue.ts applied by hand; conversions
// use the IAU definitions (pc = 648000/pi au, IAU 2015 B2; au, IAU 2012 B2).
import { describe, expect, it } from 'vitest';
import { formatNumber, formatValue, valueToJSON } from '../../src/sheet/formatValue';
import { math } from '../../src/sheet/mathInstance';
import type { SheetObject } from '../../src/sheet/sheetObject';
import { sheetOf } from './helpers';

describe('formatNumber', () => {
  it('uses 4 significant digits and scientific notation outside 1e-3..1e5', () => {
    expect(formatNumber(1.23456e-15)).toBe('1.235e-15');
    expect(formatNumber(3.0856775814913673e22)).toBe('3.086e22');
    expect(formatNumber(0.5)).toBe('0.5');
    expect(formatNumber(12.3456)).toBe('12.35');
    expect(formatNumber(42)).toBe('42');
    expect(formatNumber(123456)).toBe('123456'); // whole numbers below a million stay exact
    expect(formatNumber(2e6)).toBe('2e6');
    expect(formatNumber(-0.000123)).toBe('-1.23e-4');
    expect(formatNumber(NaN)).toBe('NaN');
    expect(formatNumber(-Infinity)).toBe('-Infinity');
    expect(formatNumber(0)).toBe('0');
  });
});

describe('formatValue', () => {
  it('converts quantities to the display unit', () => {
    const d = math.unit(1, 'Mpc');
    expect(formatValue(d, 'pc')).toBe('1e6 pc');
    expect(formatValue(math.unit(3.0856775814913673e22, 'm'), 'Mpc')).toBe('1 Mpc');
    expect(formatValue(math.unit(70, 'km/s/Mpc'))).toBe('70 km / (s Mpc)');
  });

  it('notes a display unit of the wrong dimension or an unknown one, without failing', () => {
    expect(formatValue(math.unit(2, 'yr'), 'Mpc')).toBe("2 yr (display unit 'Mpc' does not fit: the value is a time)");
    expect(formatValue(math.unit(2, 'yr'), 'parsnip')).toContain("display unit 'parsnip' is not a known unit");
    expect(formatValue(3, 'Mpc')).toContain('does not fit: the value is a plain number');
  });

  it('shortens long lists and shows lists of quantities with one unit', () => {
    const s = sheetOf({ v: '1:10', f: 'logGrid(1 nHz, 1000 nHz, 4)', m2x2: '[[1, 2], [3, 4]]' });
    expect(formatValue(s.value('v'))).toBe('[1, 2, 3, ..., 9, 10] (10 values)');
    expect(formatValue(s.value('f'), 'nHz')).toBe('[1, 10, 100, 1000] nHz');
    expect(formatValue(s.value('m2x2'))).toBe('2x2 matrix [[1, 2], [3, 4]]');
  });

  it('shows sheet objects by describe() and function cells by signature', () => {
    const obj: SheetObject = { kind: 'thing', describe: () => 'a thing of 3 parts', toJSON: () => ({ parts: 3 }) };
    expect(formatValue(obj)).toBe('a thing of 3 parts');
    const s = sheetOf({ density: 'density(z, q) = z * q' });
    expect(formatValue(s.value('density'))).toBe('density(z, q)');
    expect(valueToJSON(obj)).toEqual({ parts: 3 });
    expect(valueToJSON(s.value('density'))).toBe('density(z, q)');
  });
});

describe('valueToJSON', () => {
  it('writes quantities in SI with their SI unit', () => {
    expect(valueToJSON(math.unit(1, 'km/s'))).toEqual({ value: 1000, unit: 'm s^-1' });
    expect(valueToJSON(math.unit(1, 'pc'))).toEqual({ value: (648000 / Math.PI) * 149597870700, unit: 'm' });
    expect(valueToJSON(math.unit(6.6743e-11, 'm^3 kg^-1 s^-2'))).toEqual({ value: 6.6743e-11, unit: 'm^3 kg^-1 s^-2' });
    expect(valueToJSON(2.5)).toBe(2.5);
    expect(valueToJSON(math.matrix([1, 2]))).toEqual([1, 2]);
    expect(valueToJSON(true)).toBe(true);
  });
});
