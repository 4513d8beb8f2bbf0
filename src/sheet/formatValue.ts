// How values are shown (4 significant digits, readable scientific notation, display units) and
// how they are written as JSON for the command line (numbers in SI with the SI unit).
import type { Matrix, Unit } from 'mathjs';
import { math } from './mathInstance';
import { isSheetObject } from './sheetObject';
import { isCellFunction } from './formulaCompiler';

/** Significant digits shown. */
export const SHOWN_DIGITS = 4;
/** List elements shown at the start and end of a long list. */
const LIST_HEAD = 3;
const LIST_TAIL = 2;

/** A number with 4 significant digits: fixed notation between 1e-3 and 1e5, else mantissa e exponent. */
export function formatNumber(x: number): string {
  if (Number.isNaN(x)) return 'NaN';
  if (!Number.isFinite(x)) return x > 0 ? 'Infinity' : '-Infinity';
  if (x === 0) return Object.is(x, -0) ? '0' : '0';
  const ax = Math.abs(x);
  if (Number.isInteger(x) && ax < 1e6) return String(x);
  if (ax >= 1e-3 && ax < 1e5) return String(Number(x.toPrecision(SHOWN_DIGITS)));
  const [mantissa, exponent] = x.toExponential(SHOWN_DIGITS - 1).split('e');
  const trimmed = mantissa.includes('.') ? mantissa.replace(/0+$/, '').replace(/\.$/, '') : mantissa;
  return `${trimmed}e${Number(exponent)}`;
}

/** Names of mathjs's base dimensions, in the order of Unit.dimensions, with their SI units. */
const SI_BASE = ['kg', 'm', 's', 'A', 'K', 'cd', 'mol', 'rad', 'bit'];

/** The SI unit text of a quantity's dimensions, e.g. 'm^3 kg^-1 s^-2'; '' when dimensionless. */
export function siUnitText(u: Unit): string {
  const dims = (u as Unit & { dimensions: number[] }).dimensions;
  const parts: string[] = [];
  // Conventional reading order: m, kg, s, then the rest.
  for (const i of [1, 0, 2, 3, 4, 5, 6, 7, 8]) {
    const p = dims[i];
    if (!p) continue;
    const rounded = Math.round(p * 1e6) / 1e6;
    parts.push(rounded === 1 ? SI_BASE[i] : `${SI_BASE[i]}^${rounded}`);
  }
  return parts.join(' ');
}

/** A quantity's value in SI base units. */
export function siValue(u: Unit): number {
  const v = (u as Unit & { value: number | null }).value;
  return v === null ? 1 : v;
}

function dimensionWord(u: Unit): string {
  const names: Array<[string, string]> = [
    ['m', 'length'], ['kg', 'mass'], ['s', 'time'], ['Hz', 'frequency'], ['m/s', 'velocity'],
    ['J', 'energy'], ['W', 'power'], ['km/s/Mpc', 'rate (1/time)'], ['kg/m^3', 'density'], ['m^-3', 'number density'],
  ];
  for (const [text, word] of names) if (u.equalBase(math.unit(text))) return `a ${word}`;
  const si = siUnitText(u);
  return si ? `in ${si}` : 'dimensionless';
}

/** Parts of a shown value: the number text and the unit it is shown in, plus an optional note. */
export interface ShownValue {
  number: string;
  unit: string;
  note?: string;
}

function unitInOwnUnits(u: Unit): ShownValue {
  const units = u.formatUnits();
  const v = (u as Unit & { value: number | null }).value;
  if (v === null) return { number: '', unit: units };
  const n = units ? u.toNumber(units) : v;
  return { number: formatNumber(n), unit: units };
}

function showUnit(u: Unit, displayUnit?: string): ShownValue {
  if (!displayUnit) return unitInOwnUnits(u);
  let target: Unit;
  try {
    target = math.unit(displayUnit);
  } catch {
    return { ...unitInOwnUnits(u), note: `display unit '${displayUnit}' is not a known unit` };
  }
  if (!u.equalBase(target)) {
    return { ...unitInOwnUnits(u), note: `display unit '${displayUnit}' does not fit: the value is ${dimensionWord(u)}` };
  }
  return { number: formatNumber(u.toNumber(displayUnit)), unit: displayUnit };
}

function showScalar(v: unknown, displayUnit?: string): ShownValue {
  if (typeof v === 'number') {
    if (displayUnit) {
      try {
        const target = math.unit(displayUnit);
        if (!target.dimensions.every((d: number) => d === 0)) {
          return { number: formatNumber(v), unit: '', note: `display unit '${displayUnit}' does not fit: the value is a plain number` };
        }
      } catch {
        return { number: formatNumber(v), unit: '', note: `display unit '${displayUnit}' is not a known unit` };
      }
    }
    return { number: formatNumber(v), unit: '' };
  }
  if (math.isUnit(v)) return showUnit(v as Unit, displayUnit);
  if (typeof v === 'boolean') return { number: String(v), unit: '' };
  if (math.isComplex(v)) {
    const c = v as unknown as { re: number; im: number };
    const sign = c.im < 0 || Object.is(c.im, -0) ? '-' : '+';
    return { number: `${formatNumber(c.re)} ${sign} ${formatNumber(Math.abs(c.im))}i`, unit: '' };
  }
  if (typeof v === 'string') return { number: v.length > 40 ? `"${v.slice(0, 37)}..." (${v.length} characters)` : `"${v}"`, unit: '' };
  if (v === null) return { number: 'null', unit: '' };
  if (v === undefined) return { number: '', unit: '' };
  if (isSheetObject(v)) return { number: v.describe(), unit: '' };
  if (isCellFunction(v)) return { number: v.syntax, unit: '' };
  if (typeof v === 'function') return { number: `function ${(v as { name?: string }).name || ''}`.trim(), unit: '' };
  return { number: String(v), unit: '' };
}

function shownText(s: ShownValue): string {
  const main = s.unit ? (s.number ? `${s.number} ${s.unit}` : s.unit) : s.number;
  return s.note ? `${main} (${s.note})` : main;
}

function showList(items: unknown[], displayUnit?: string): string {
  const one = (x: unknown): string => (Array.isArray(x) ? showList(x, displayUnit) : shownText(showScalar(x, displayUnit)));
  if (items.length <= LIST_HEAD + LIST_TAIL + 1) return `[${items.map(one).join(', ')}]`;
  const head = items.slice(0, LIST_HEAD).map(one);
  const tail = items.slice(items.length - LIST_TAIL).map(one);
  return `[${head.join(', ')}, ..., ${tail.join(', ')}] (${items.length} values)`;
}

/** The value as the number and unit columns show it (lists and objects as one text). Never throws. */
export function formatValueParts(value: unknown, displayUnit?: string): ShownValue {
  try {
    return showValue(value, displayUnit);
  } catch (e) {
    return { number: `(this value cannot be shown: ${e instanceof Error ? e.message : String(e)})`, unit: '' };
  }
}

function showValue(value: unknown, displayUnit?: string): ShownValue {
  if (math.isMatrix(value) || Array.isArray(value)) {
    const items = math.isMatrix(value) ? ((value as Matrix).valueOf() as unknown[]) : value;
    const size = math.isMatrix(value) ? (value as Matrix).size() : [items.length];
    const label = (text: string) => (size.length > 1 ? `${size.join('x')} matrix ${text}` : text);
    // A list of quantities of one dimension shows plain numbers with the unit once.
    const flat = items.flat(Infinity as 1) as unknown[];
    const first = flat[0];
    if (flat.length > 0 && flat.every((x) => math.isUnit(x)) && math.isUnit(first)) {
      const f = first as Unit;
      let target = f.formatUnits();
      let note: string | undefined;
      if (displayUnit) {
        const fits = (() => {
          try {
            return f.equalBase(math.unit(displayUnit));
          } catch {
            return false;
          }
        })();
        if (fits) target = displayUnit;
        else note = `display unit '${displayUnit}' does not fit: the values are ${dimensionWord(f)}`;
      }
      if (target && flat.every((x) => (x as Unit).equalBase(f))) {
        const toNumbers = (xs: unknown[]): unknown[] => xs.map((x) => (Array.isArray(x) ? toNumbers(x) : (x as Unit).toNumber(target)));
        const shown: ShownValue = { number: label(showList(toNumbers(items))), unit: target };
        if (note) shown.note = note;
        return shown;
      }
    }
    return { number: label(showList(items, displayUnit)), unit: '' };
  }
  return showScalar(value, displayUnit);
}

/** A value as one line of text, in the display unit when one is given. */
export function formatValue(value: unknown, displayUnit?: string): string {
  return shownText(formatValueParts(value, displayUnit));
}

/** A value as plain JSON: numbers as numbers, quantities in SI with their SI unit, lists as arrays. Never throws. */
export function valueToJSON(value: unknown): unknown {
  try {
    return toJSONValue(value);
  } catch (e) {
    return `(this value cannot be written: ${e instanceof Error ? e.message : String(e)})`;
  }
}

function toJSONValue(value: unknown): unknown {
  if (typeof value === 'number') return Number.isFinite(value) ? value : String(value);
  if (typeof value === 'string' || typeof value === 'boolean' || value === null) return value;
  if (value === undefined) return null;
  if (math.isUnit(value)) return { value: siValue(value as Unit), unit: siUnitText(value as Unit) };
  if (math.isComplex(value)) {
    const c = value as unknown as { re: number; im: number };
    return { re: c.re, im: c.im };
  }
  if (math.isMatrix(value)) return ((value as Matrix).valueOf() as unknown[]).map(toJSONValue);
  if (Array.isArray(value)) return value.map(toJSONValue);
  if (isSheetObject(value)) return value.toJSON();
  if (isCellFunction(value)) return value.syntax;
  if (typeof value === 'function') return `function ${(value as { name?: string }).name || ''}`.trim();
  return String(value);
}
