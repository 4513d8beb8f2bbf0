// Fuzzing the formula engine (issue 10): formulas built from a small grammar of the formula
// language and mutated formulas of the demo sheet, evaluated in a cell of the demo sheet. Checks:
// no exception escapes the engine, formatting never throws, and a stored value never holds an
// unflagged non-finite number or a complex quantity. Fixed seed; 2,000 formulas here.
// A longer run uses the same code: STRAINSHEET_FUZZ_COUNT=200000 STRAINSHEET_FUZZ_SEED=7
// npx vitest run test/security/fuzz.test.ts (see DEVELOPERS.md).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { formatValue, formatValueParts, valueToJSON } from '../../src/sheet/formatValue';
import { math } from '../../src/sheet/mathInstance';
import { isSheetObject } from '../../src/sheet/sheetObject';
import { DEFAULT_CELL_SECONDS, setCellBudget } from '../../src/sheet/evaluationBudget';
import { ALLOWED_MATH_FUNCTIONS } from '../../src/sheet/allowedFunctions';
import { mulberry32 } from '../arrayView/seededRandom';

const COUNT = Number(process.env.STRAINSHEET_FUZZ_COUNT ?? 2000);
const SEED = Number(process.env.STRAINSHEET_FUZZ_SEED ?? 20_261_202);
const DEMO = readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8');

const generator = mulberry32;

const NUMBERS = ['0', '-0', '1', '2', '0.5', '-3', '1e308', '1e-308', '5e-324', 'Infinity', '-Infinity', 'NaN', '1e6', '1e9', '2^30', '17', 'pi', 'i', '1+2i'];
const UNITS = ['m', 'kg', 's', 'Hz', 'nHz', 'Msun', 'Mpc', 'yr', 'Gyr', 'km/s', 'day', 'deg', 'rad', 'J'];
const OPERATORS = ['+', '-', '*', '/', '^', '.*', './', '.^', '==', '<', '>=', 'and', 'or', 'mod', ' to '];
const FUNCTIONS = [...ALLOWED_MATH_FUNCTIONS].filter((f) => f !== 'map' && f !== 'forEach' && f !== 'filter');

type Random = () => number;
const pick = <T,>(r: Random, xs: readonly T[]): T => xs[Math.floor(r() * xs.length)];

/** A random formula of the language, at most `depth` levels deep. */
function grammarFormula(r: Random, cells: string[], depth: number): string {
  const leaf = () => {
    const k = r();
    if (k < 0.35) return pick(r, NUMBERS);
    if (k < 0.55) return `${pick(r, NUMBERS)} ${pick(r, UNITS)}`;
    if (k < 0.85) return pick(r, cells);
    if (k < 0.9) return `"${pick(r, ['', 'text', '1'])}"`;
    return `${pick(r, ['1', '-2', '0'])}:${pick(r, ['3', '10', '1e3', '-1'])}`;
  };
  if (depth <= 0) return leaf();
  const sub = () => grammarFormula(r, cells, depth - 1 - Math.floor(r() * 2));
  const k = r();
  if (k < 0.25) return leaf();
  if (k < 0.5) return `${sub()} ${pick(r, OPERATORS)} ${sub()}`;
  if (k < 0.75) {
    const n = Math.floor(r() * 4);
    return `${pick(r, FUNCTIONS)}(${Array.from({ length: n }, sub).join(', ')})`;
  }
  if (k < 0.85) return `[${Array.from({ length: 1 + Math.floor(r() * 3) }, sub).join(', ')}]`;
  if (k < 0.9) return `-(${sub()})`;
  if (k < 0.95) return `${sub()} ? ${sub()} : ${sub()}`;
  return `(${sub()})[${pick(r, ['1', 'end', '2:3', '0', '1e9'])}]`;
}

/** A demo formula changed once or twice: a token replaced, a character dropped or repeated, a piece cut or pasted. */
function mutatedFormula(r: Random, formulas: string[], cells: string[]): string {
  let f = pick(r, formulas);
  const times = 1 + Math.floor(r() * 2);
  for (let t = 0; t < times; t++) {
    const at = Math.floor(r() * (f.length + 1));
    const k = r();
    if (k < 0.3) f = f.replace(/-?\d+(\.\d+)?(e-?\d+)?/g, (m) => (r() < 0.4 ? pick(r, NUMBERS) : m));
    else if (k < 0.45) f = f.slice(0, at) + f.slice(at + 1);
    else if (k < 0.55) f = f.slice(0, at) + f.slice(at, at + 1).repeat(2 + Math.floor(r() * 3)) + f.slice(at + 1);
    else if (k < 0.7) f = f.replace(/[A-Za-z_]\w*/g, (m) => (r() < 0.25 ? pick(r, cells) : m));
    else if (k < 0.8) f = f.slice(0, at) + pick(r, [...OPERATORS, '(', ')', '[', ']', ',', '"', ':', ' ', 'end']) + f.slice(at);
    else if (k < 0.9) f = f.slice(0, at);
    else f = `${f} ${pick(r, OPERATORS)} ${pick(r, formulas)}`;
  }
  return f;
}

/** A description of a non-finite number or complex quantity anywhere in a stored value, or undefined. */
function unflagged(v: unknown, top = true): string | undefined {
  if (typeof v === 'number') return Number.isFinite(v) ? undefined : `non-finite number ${v}`;
  if (typeof v === 'string' || typeof v === 'boolean' || v === null) return undefined;
  if (math.isUnit(v)) {
    const u = v as unknown as { value: unknown; dimensions: number[] };
    if (u.dimensions.some((d) => !Number.isFinite(d))) return 'infinite unit power';
    if (u.value === null) return undefined;
    return typeof u.value === 'number' && Number.isFinite(u.value) ? undefined : `quantity with value ${String(u.value)}`;
  }
  if (math.isComplex(v)) {
    const c = v as unknown as { re: number; im: number };
    return Number.isFinite(c.re) && Number.isFinite(c.im) ? undefined : 'non-finite complex number';
  }
  if (math.isMatrix(v) || Array.isArray(v)) {
    const items = (math.isMatrix(v) ? (v as { valueOf(): unknown[] }).valueOf() : v) as unknown[];
    for (const x of items) {
      const p = unflagged(x, false);
      if (p) return p;
    }
    return undefined;
  }
  if (top && (isSheetObject(v) || typeof v === 'function' || math.isBigNumber(v) || math.isFraction(v))) return undefined;
  return `a ${typeof v} inside a list`;
}

describe(`fuzzing formulas (seed ${SEED}, ${COUNT} formulas)`, () => {
  it('no exception escapes the engine, formatting never throws, no unflagged non-finite value', () => {
    const r = generator(SEED);
    const sheet = Sheet.fromFile(DEMO);
    const cells = sheet.cells().map((c) => c.name);
    const formulas = sheet.cells().map((c) => c.formula);
    const failures: string[] = [];
    const kinds = new Map<string, number>();
    // A short budget keeps the run quick: a formula past it is stopped, which is also checked here.
    setCellBudget(0.05);
    try {
      for (let k = 0; k < COUNT && failures.length < 5; k++) {
        const formula = k % 4 === 3 ? mutatedFormula(r, formulas, cells) : grammarFormula(r, cells, 4);
        try {
          sheet.setCell({ name: 'fuzz', formula });
          const st = sheet.state('fuzz');
          const kind = st.status === 'value' ? 'value' : st.status === 'error' ? st.error.kind : 'pending';
          kinds.set(kind, (kinds.get(kind) ?? 0) + 1);
          if (st.status === 'pending') failures.push(`${formula}: left pending`);
          if (st.status === 'error' && !(typeof st.error.message === 'string' && st.error.message.startsWith('fuzz: '))) failures.push(`${formula}: message ${st.error.message}`);
          if (st.status === 'value') {
            const p = unflagged(st.value);
            if (p) failures.push(`${formula}: stored ${p}`);
            formatValue(st.value);
            formatValueParts(st.value, pick(r, ['', 'm', 'nHz', 'Msun']));
            JSON.stringify(valueToJSON(st.value));
          }
        } catch (e) {
          failures.push(`${formula}: threw ${(e as Error)?.stack ?? String(e)}`);
        }
      }
    } finally {
      setCellBudget(DEFAULT_CELL_SECONDS);
    }
    expect(failures).toEqual([]);
    // the run reached both values and errors (it is not only testing the parser)
    expect(kinds.get('value') ?? 0).toBeGreaterThan(COUNT / 20);
    expect(kinds.get('syntax') ?? 0).toBeGreaterThan(0);
    // About 2.5 s for 2,000 formulas on an idle 2-core machine; the longer run through
    // STRAINSHEET_FUZZ_COUNT gets the same time per formula.
  }, Math.max(30_000, COUNT * 15));
});
