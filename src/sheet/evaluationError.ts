// Turns whatever a formula's evaluation threw into a CellError in plain language, and checks a
// result for values the sheet flags (non-finite numbers, oversized lists).
import type { MathNode, Matrix, Unit } from 'mathjs';
import { BuiltinError, type CellError } from './cellError';
import { math } from './mathInstance';
import { MAX_ELEMENTS } from './formulaLimits';
import { isSheetObject } from './sheetObject';

function plainMathMessage(message: string): { kind: CellError['kind']; detail: string } {
  if (/^Units do not match/.test(message)) {
    const m = /\('(.*)' != '(.*)'\)/.exec(message);
    return {
      kind: 'unit',
      detail: m ? `cannot convert ${m[2]} to ${m[1]}: the units have different dimensions` : 'units do not match: the quantities combined have different dimensions',
    };
  }
  let m = /^Unexpected type of argument in function (\w+) \(expected: ([^,]+(?:,[^,]+)*?), actual: ([^,]+), index: (\d+)\)/.exec(message);
  if (m) {
    const [, fn, expected, actual] = m;
    if (/Unit/.test(expected) !== /Unit/.test(actual)) {
      return { kind: 'unit', detail: `units do not match in ${fn}: one value has a unit and the other is a plain number (${actual} where ${expected} was expected)` };
    }
    return { kind: 'eval', detail: `${fn} cannot take ${actual} there (expected ${expected})` };
  }
  if (/is no angle$/.test(message)) return { kind: 'unit', detail: 'trigonometric functions need an angle (rad, deg) or a plain number' };
  m = /^Undefined symbol (\w+)/.exec(message);
  if (m) return { kind: 'name', detail: `unknown name ${m[1]}` };
  m = /^Undefined function (\w+)/.exec(message);
  if (m) return { kind: 'name', detail: `unknown function ${m[1]}` };
  m = /^Too (few|many) arguments in function (\w+) \(expected: (\d+), actual: (\d+)\)/.exec(message);
  if (m) return { kind: 'eval', detail: `${m[2]} takes ${m[3]} argument${m[3] === '1' ? '' : 's'}, got ${m[4]}` };
  m = /^'(\w+)' is not a function/.exec(message);
  if (m) return { kind: 'eval', detail: `${m[1]} is called like a function but is a value (define it as ${m[1]}(x) = ... to make a function cell)` };
  if (/^Index out of range/.test(message)) return { kind: 'eval', detail: `index out of range ${message.replace(/^Index out of range\s*/, '')}`.trim() };
  if (/Dimension mismatch|shape mismatch|broadcast/.test(message)) return { kind: 'eval', detail: `list sizes do not match (${message})` };
  return { kind: 'eval', detail: message || 'evaluation failed' };
}

/** The CellError for an exception thrown while evaluating cell `cell`. */
export function errorFromException(cell: string, e: unknown): CellError {
  if (e instanceof BuiltinError) return { kind: e.kind, message: `${cell}: ${e.message}` };
  if (e instanceof RangeError && /call stack/i.test(e.message)) {
    return { kind: 'limit', message: `${cell}: the calculation went too deep (nested calls)` };
  }
  if (e instanceof Error) {
    const { kind, detail } = plainMathMessage(e.message);
    return { kind, message: `${cell}: ${detail}` };
  }
  return { kind: 'eval', message: `${cell}: evaluation failed (${String(e)})` };
}

function nonFiniteNumber(x: number): string | undefined {
  if (Number.isNaN(x)) return 'is not a number (NaN)';
  if (!Number.isFinite(x)) return x > 0 ? 'is infinite' : 'is minus infinity';
  return undefined;
}

/** Describes a scalar the sheet cannot hold (non-finite, a complex quantity), or undefined when it is fine. */
function scalarProblem(v: unknown): { kind: CellError['kind']; text: string } | undefined {
  if (typeof v === 'number') {
    const p = nonFiniteNumber(v);
    return p ? { kind: 'nonfinite', text: p } : undefined;
  }
  if (math.isUnit(v)) {
    const u = v as Unit & { value: unknown; dimensions: number[]; units: Array<{ power: number }> };
    if (u.dimensions.some((d) => !Number.isFinite(d)) || u.units.some((x) => !Number.isFinite(x.power))) {
      return { kind: 'nonfinite', text: 'has a unit raised to an infinite or undefined power' };
    }
    const value = u.value;
    if (value === null || value === undefined) return undefined;
    if (typeof value === 'number') {
      const p = nonFiniteNumber(value);
      return p ? { kind: 'nonfinite', text: p } : undefined;
    }
    if (math.isComplex(value)) return { kind: 'unit', text: 'is a complex quantity (a unit with an imaginary part), which the sheet cannot hold; take re(), im() or abs() of it, or of the plain number before adding the unit' };
    return { kind: 'unit', text: 'is a quantity whose value is not a plain number' };
  }
  if (math.isComplex(v)) {
    const c = v as unknown as { re: number; im: number };
    const p = nonFiniteNumber(c.re) ?? nonFiniteNumber(c.im);
    return p ? { kind: 'nonfinite', text: p.replace(/^is/, 'has a part that is') } : undefined;
  }
  if (typeof v === 'function' || (typeof v === 'object' && v !== null && !math.isBigNumber(v) && !math.isFraction(v))) {
    return { kind: 'eval', text: `is ${isSheetObject(v) ? `a ${v.kind}` : 'a value'} inside a list; a list can hold numbers, quantities, text and lists` };
  }
  return undefined;
}

/** Checks a computed value; returns the CellError to store instead, if any. */
export function checkResult(cell: string, value: unknown): CellError | undefined {
  if (value === undefined) return { kind: 'eval', message: `${cell}: the formula gives no value` };
  const isMatrix = math.isMatrix(value);
  if (!isMatrix && !Array.isArray(value)) {
    if (typeof value === 'object' && value !== null && !math.isUnit(value) && !math.isComplex(value)) return undefined; // sheet objects
    if (typeof value === 'function') return undefined; // function cells
    const problem = scalarProblem(value);
    return problem ? { kind: problem.kind, message: `${cell}: the result ${problem.text}` } : undefined;
  }
  const size = isMatrix ? (value as Matrix).size() : [(value as unknown[]).length];
  const total = size.reduce((a, b) => a * b, 1);
  if (total > MAX_ELEMENTS) return { kind: 'limit', message: `${cell}: the result has ${total} elements (at most ${MAX_ELEMENTS})` };
  // valueOf() gives the matrix's own data without copying it (a copy fails on objects mathjs cannot clone)
  const data = (isMatrix ? (value as Matrix).valueOf() : value) as unknown[];
  let index = 0;
  const stack: unknown[][] = [data];
  const positions: number[] = [0];
  while (stack.length > 0) {
    const list = stack[stack.length - 1];
    const i = positions[positions.length - 1]++;
    if (i >= list.length) {
      stack.pop();
      positions.pop();
      continue;
    }
    const x = list[i];
    if (Array.isArray(x)) {
      stack.push(x);
      positions.push(0);
      continue;
    }
    if (math.isMatrix(x)) {
      stack.push((x as Matrix).valueOf() as unknown[]);
      positions.push(0);
      continue;
    }
    index++;
    if (typeof x === 'number' && Number.isFinite(x)) continue;
    if (typeof x === 'string' || typeof x === 'boolean' || x === null) continue;
    const p = scalarProblem(x);
    if (p) return { kind: p.kind, message: `${cell}: element ${index} of the result ${p.text}` };
  }
  return undefined;
}

/** Levenshtein distance, for "did you mean" suggestions; stops early with `limit + 1` once it must exceed `limit`. */
export function editDistance(a: string, b: string, limit = Infinity): number {
  if (Math.abs(a.length - b.length) > limit) return limit + 1;
  const prev = new Array<number>(b.length + 1);
  for (let j = 0; j <= b.length; j++) prev[j] = j;
  for (let i = 1; i <= a.length; i++) {
    let diag = prev[0];
    prev[0] = i;
    let rowMin = prev[0];
    for (let j = 1; j <= b.length; j++) {
      const tmp = prev[j];
      prev[j] = Math.min(prev[j] + 1, prev[j - 1] + 1, diag + (a[i - 1] === b[j - 1] ? 0 : 1));
      diag = tmp;
      if (prev[j] < rowMin) rowMin = prev[j];
    }
    if (rowMin > limit) return limit + 1;
  }
  return prev[b.length];
}

/** Longest name a "did you mean" suggestion is searched for (cell names have at most 64 characters). */
const MAX_SUGGESTED_NAME = 64;
/** Most candidates compared letter by letter in one search (a 20,000-cell sheet with every function fits). */
const MAX_COMPARED = 50_000;

/** The nearest of `candidates` to `name`, if it is close enough to be a likely typo. */
export function nearestName(name: string, candidates: Iterable<string>): string | undefined {
  if (name.length > MAX_SUGGESTED_NAME) return undefined;
  const allowed = Math.max(1, Math.min(3, Math.floor(name.length / 3)));
  let best: string | undefined;
  let bestDistance = Infinity;
  let compared = 0;
  const lower = name.toLowerCase();
  for (const c of candidates) {
    if (Math.abs(c.length - name.length) > allowed) continue;
    if (c.toLowerCase() === lower) return c;
    if (compared >= MAX_COMPARED) continue;
    compared++;
    const d = editDistance(name, c, Math.min(allowed, bestDistance - 1));
    if (d < bestDistance) {
      best = c;
      bestDistance = d;
    }
  }
  return best !== undefined && bestDistance <= allowed ? best : undefined;
}

const COMBINING: Record<string, string> = {
  add: 'add', subtract: 'subtract', larger: 'compare', smaller: 'compare', largerEq: 'compare',
  smallerEq: 'compare', equal: 'compare', unequal: 'compare', to: 'convert',
};

function dimensionsOf(v: unknown): number[] | null | undefined {
  if (typeof v === 'number') return null; // a plain number
  if (math.isUnit(v)) return (v as Unit & { dimensions: number[] }).dimensions;
  return undefined; // lists and others: not explained here
}

function describeOperand(v: unknown): string {
  if (typeof v === 'number') return `the plain number ${v}`;
  const u = v as Unit;
  return u.toString();
}

/**
 * For a unit mismatch, finds the first addition, subtraction, comparison or conversion whose two
 * sides have different dimensions, and says which (evaluated again only on this error path).
 */
export function explainUnitMismatch(tree: MathNode, inputs: Map<string, unknown>): string | undefined {
  const stack: MathNode[] = [tree];
  const operators: Array<MathNode & { fn: string; args: MathNode[] }> = [];
  while (stack.length > 0 && operators.length < 200) {
    const node = stack.pop()! as MathNode & { fn?: unknown; args?: MathNode[] };
    if (node.type === 'OperatorNode' && typeof node.fn === 'string' && COMBINING[node.fn] && node.args?.length === 2) {
      operators.push(node as MathNode & { fn: string; args: MathNode[] });
    }
    node.forEach((child: MathNode) => void stack.push(child));
  }
  // innermost first: the deepest operators were found last
  for (const op of operators.reverse()) {
    try {
      const [a, b] = op.args.map((arg) => arg.compile().evaluate(inputs));
      if (op.fn === 'to') continue;
      const da = dimensionsOf(a);
      const db = dimensionsOf(b);
      if (da === undefined || db === undefined) continue;
      const same = da === null || db === null ? da === db || (da ?? db)!.every((d) => d === 0) : da.every((d, i) => d === db[i]);
      if (!same) {
        const why = da === null || db === null ? 'one has a unit and the other is a plain number' : 'their units have different dimensions';
        return `cannot ${COMBINING[op.fn]} ${describeOperand(a)} and ${describeOperand(b)}: ${why}`;
      }
    } catch {
      continue;
    }
  }
  return undefined;
}
