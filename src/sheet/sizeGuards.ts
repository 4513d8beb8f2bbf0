// Size guards for list arithmetic. mathjs broadcasts element-wise operations ([N,1] + [1,M] gives
// N x M) and multiplies matrices in O(n k m), so a short formula over lists within the element
// limit could still build 10^12 elements or run for hours inside one call, where no limit can
// stop it afterwards. These wrappers check the sizes first and throw a 'limit' error instead.
import type { Matrix } from 'mathjs';
import { BuiltinError } from './cellError';
import { math } from './mathInstance';
import { MAX_ELEMENTS } from './formulaLimits';
import { checkTimeNow, countBuilt } from './evaluationBudget';
import { listContentProblem, listElementCount } from './listContent';

/** Most multiply-adds one matrix product (or inverse, determinant, solve) may take. */
export const MAX_MATRIX_OPERATIONS = 100_000_000;

/** Element-wise functions of two or more lists that broadcast their sizes. */
export const BROADCASTING_FUNCTIONS: readonly string[] = [
  'add', 'subtract', 'dotMultiply', 'dotDivide', 'dotPow', 'mod', 'atan2', 'hypot', 'gcd', 'lcm', 'nthRoot',
  'equal', 'unequal', 'larger', 'largerEq', 'smaller', 'smallerEq', 'compare', 'xor', 'bitXor',
  'leftShift', 'rightArithShift', 'rightLogShift',
];

/** Size of a list value, or null for anything else. */
function listSize(v: unknown): number[] | null {
  if (v !== null && typeof v === 'object') {
    if ((v as { isMatrix?: boolean }).isMatrix === true) return (v as Matrix).size();
    if (Array.isArray(v)) {
      const size: number[] = [];
      let x: unknown = v;
      while (Array.isArray(x)) {
        size.push(x.length);
        x = x[0];
      }
      return size;
    }
  }
  return null;
}

const count = (size: number[]) => size.reduce((a, b) => a * b, 1);
const shape = (size: number[]) => size.join('x');

function tooLarge(fn: string, detail: string): never {
  throw new BuiltinError(`${fn}: ${detail}`, 'limit');
}

/** Throws when broadcasting the list arguments would exceed the element limit. */
export function checkBroadcast(fn: string, args: readonly unknown[]): void {
  let result: number[] | null = null;
  let lists = 0;
  for (const a of args) {
    const s = listSize(a);
    if (!s) continue;
    lists++;
    if (!result) {
      result = [...s];
      continue;
    }
    // align from the last dimension, as broadcasting does
    const n = Math.max(result.length, s.length);
    const merged: number[] = new Array(n);
    for (let i = 0; i < n; i++) {
      const x = result[result.length - n + i] ?? 1;
      const y = s[s.length - n + i] ?? 1;
      merged[i] = Math.max(x, y);
    }
    result = merged;
  }
  if (lists >= 2 && result && count(result) > MAX_ELEMENTS) {
    tooLarge(fn, `combining these lists would make ${shape(result)} = ${count(result)} elements (at most ${MAX_ELEMENTS})`);
  }
}

/** Throws when a matrix product would be too large or take too long. */
export function checkProduct(fn: string, args: readonly unknown[]): void {
  for (let i = 0; i + 1 < args.length; i++) {
    const a = listSize(args[i]);
    const b = listSize(args[i + 1]);
    if (!a || !b) continue;
    const rows = a.length === 2 ? a[0] : 1;
    const inner = a[a.length - 1];
    const cols = b.length === 2 ? b[1] : 1;
    if (rows * cols > MAX_ELEMENTS) tooLarge(fn, `the product of ${shape(a)} and ${shape(b)} lists would have ${rows * cols} elements (at most ${MAX_ELEMENTS})`);
    if (rows * inner * cols > MAX_MATRIX_OPERATIONS) tooLarge(fn, `the product of ${shape(a)} and ${shape(b)} lists would take ${rows * inner * cols} operations (at most ${MAX_MATRIX_OPERATIONS})`);
  }
}

/** Throws when a square-matrix routine (inverse, determinant, solve) on n x n would take n^3 too many steps. */
export function checkCubic(fn: string, args: readonly unknown[]): void {
  const s = listSize(args[0]);
  if (s && s.length === 2 && s[0] ** 3 > MAX_MATRIX_OPERATIONS) {
    tooLarge(fn, `a ${shape(s)} matrix is too large for ${fn} (at most ${Math.floor(Math.cbrt(MAX_MATRIX_OPERATIONS))} rows)`);
  }
}

/**
 * Throws when a matrix power A^p would take too many steps: repeated squaring takes up to
 * 2 log2(p) products of n^3 multiply-adds each (a negative p adds one inverse).
 */
export function checkMatrixPower(fn: string, args: readonly unknown[]): void {
  const s = listSize(args[0]);
  if (!s || s.length !== 2) return;
  const p = typeof args[1] === 'number' ? Math.abs(args[1]) : 1;
  const products = Number.isFinite(p) && p >= 1 ? 2 * Math.ceil(Math.log2(p + 1)) : 2;
  const steps = s[0] ** 3 * products;
  if (steps > MAX_MATRIX_OPERATIONS) {
    tooLarge(fn, `raising a ${shape(s)} matrix to the power ${String(args[1])} would take about ${steps.toPrecision(2)} operations (at most ${MAX_MATRIX_OPERATIONS})`);
  }
}

/** Throws when the 2-norm of a matrix (its largest singular value, an n^3 eigenvalue iteration) would take too long. */
export function checkNorm(fn: string, args: readonly unknown[]): void {
  const s = listSize(args[0]);
  if (!s || s.length !== 2 || args[1] !== 2) return;
  // mathjs finds the largest eigenvalue of A^T A: one n x m by m x n product, then an n^3 iteration
  const steps = s[0] * s[1] * Math.max(s[0], s[1]) * NORM2_ITERATION_FACTOR;
  if (steps > MAX_MATRIX_OPERATIONS) {
    tooLarge(fn, `the 2-norm of a ${shape(s)} matrix would take about ${steps.toPrecision(2)} operations (at most ${MAX_MATRIX_OPERATIONS}); norm(A, "fro"), norm(A, 1) and norm(A, Infinity) are cheap`);
  }
}
/**
 * Cost of mathjs's 2-norm (A^T A, then its eigenvalues by Jacobi sweeps) in units of one n x n
 * product: timed 2026-12-02 with mathjs 15.2.0 in Node 20 against multiply(A, A) in the same run,
 * on dense pseudo-random n x n matrices: 9 (n = 60), 91 (n = 100), 89 (n = 140), 64 (n = 200);
 * near-diagonal ones cost less (5 to 30). The largest seen is used. (The earlier 30 was not a
 * measured figure.)
 */
const NORM2_ITERATION_FACTOR = 90;

/** Throws when quantileSeq would copy and select in the data once per probability for too many probabilities. */
export function checkQuantiles(fn: string, args: readonly unknown[]): void {
  const data = listSize(args[0]);
  if (!data) return;
  const n = count(data);
  const probs = args[1];
  const p = listSize(probs);
  // quantileSeq(A, N) with a whole number N > 1 asks for the N - 1 quantiles between 0 and 1
  const many = p ? count(p) : typeof probs === 'number' && probs > 1 ? probs - 1 : 1;
  if (n * many > MAX_MATRIX_OPERATIONS) {
    tooLarge(fn, `${many} quantiles of ${n} values would take ${(n * many).toPrecision(2)} steps (mathjs copies the data for each; at most ${MAX_MATRIX_OPERATIONS})`);
  }
}

/** Throws when concatenating the lists would exceed the element limit. */
export function checkConcat(fn: string, args: readonly unknown[]): void {
  let total = 0;
  for (const a of args) {
    const s = listSize(a);
    if (s) total += count(s);
  }
  if (total > MAX_ELEMENTS) tooLarge(fn, `joining these lists would make ${total} elements (at most ${MAX_ELEMENTS})`);
}

/** Elements in a list result (0 for anything else). */
function resultCount(v: unknown): number {
  const s = listSize(v);
  return s ? count(s) : 0;
}

/** Functions whose expression form is a transform (1-based dimensions); their guard calls the transform. */
const TRANSFORMED = new Set(['concat', 'quantileSeq']);

function guarded(name: string, check: (fn: string, args: readonly unknown[]) => void): ((...args: unknown[]) => unknown) | undefined {
  if (!(name in math)) return undefined;
  // The mathjs function (or its expression transform) is looked up on the first call: mathjs
  // builds each function on first use.
  let fn: ((...args: unknown[]) => unknown) | undefined;
  const wrapper = function (...args: unknown[]): unknown {
    fn ??= TRANSFORMED.has(name) ? transforms()[name] : (math as unknown as Record<string, (...args: unknown[]) => unknown>)[name];
    // plain numbers and quantities pass straight through; only lists are measured, timed and counted
    if (args.length >= 1 && (listSize(args[0]) || listSize(args[1]))) {
      checkTimeNow();
      check(name, args);
      const result = fn(...args);
      countBuilt(resultCount(result), name);
      return result;
    }
    return fn(...args);
  };
  Object.defineProperty(wrapper, 'name', { value: name });
  return wrapper;
}

/** mathjs's expression transforms by name (built on first use). */
function transforms(): Record<string, (...args: unknown[]) => unknown> {
  return (math as unknown as { expression: { transform: Record<string, (...args: unknown[]) => unknown> } }).expression.transform;
}

/** Guarded replacements for the instance's list-arithmetic functions, by name. */
export function sizeGuardedFunctions(): Record<string, (...args: unknown[]) => unknown> {
  const out: Record<string, (...args: unknown[]) => unknown> = {};
  const put = (name: string, check: (fn: string, args: readonly unknown[]) => void) => {
    const w = guarded(name, check);
    if (w) out[name] = w;
  };
  for (const name of BROADCASTING_FUNCTIONS) put(name, checkBroadcast);
  put('multiply', (fn, args) => {
    checkProduct(fn, args);
  });
  put('divide', (fn, args) => {
    checkProduct(fn, args);
    if (listSize(args[1])?.length === 2) checkCubic(fn, [args[1]]);
  });
  put('pow', checkMatrixPower);
  for (const name of ['inv', 'det', 'lusolve']) put(name, checkCubic);
  put('norm', checkNorm);
  put('quantileSeq', checkQuantiles);
  put('concat', checkConcat);
  // list literals [a, b, ...] (mathjs's ArrayNode calls the namespace's matrix)
  let matrix: ((...a: unknown[]) => unknown) | undefined;
  out.matrix = function guardedMatrix(...args: unknown[]): unknown {
    const data = args[0];
    if (Array.isArray(data)) checkListContent('a list', data);
    matrix ??= (math as unknown as Record<string, (...a: unknown[]) => unknown>).matrix;
    return matrix(...args);
  };
  return out;
}

/** Throws when a list literal or list value holds something a list cannot, or too many elements; counts them. */
export function checkListContent(what: string, data: readonly unknown[]): void {
  checkTimeNow();
  const problem = listContentProblem(data);
  if (problem) throw new BuiltinError(`${what} can hold numbers, quantities, text and lists, not ${problem}`, 'eval');
  const n = listElementCount(data);
  if (n > MAX_ELEMENTS) tooLarge(what, `it would have ${n} elements (at most ${MAX_ELEMENTS})`);
  countBuilt(n, what);
}

/**
 * Range a:b:c in a formula (mathjs's range transform, which includes the end): sized before it is
 * built. Plain-number ranges are built here, as mathjs does (x = start, then x = x + step while
 * smallerEq(x, end), or largerEq for a negative step), with the typed comparison called only
 * where the plain one cannot decide; other ranges go to mathjs.
 */
export function guardedRangeTransform(): (...args: unknown[]) => unknown {
  const plain = math as unknown as Record<string, (...a: unknown[]) => unknown>;
  const DenseMatrix = (math as unknown as { DenseMatrix: new (data: { data: number[]; size: number[] }) => unknown }).DenseMatrix;
  const smallerEq = (a: number, b: number) => plain.smallerEq(a, b) as boolean;
  const largerEq = (a: number, b: number) => plain.largerEq(a, b) as boolean;
  return function guardedRange(...args: unknown[]): unknown {
    checkTimeNow();
    const includeEnd = typeof args[args.length - 1] === 'boolean' ? (args.pop() as boolean) : true;
    const [start, end, step] = args.length === 2 ? [args[0], args[1], 1] : args;
    if (typeof start === 'number' && typeof end === 'number' && typeof step === 'number' && args.length <= 3 && includeEnd) {
      if (!Number.isFinite(start) || !Number.isFinite(end) || !Number.isFinite(step) || step === 0) {
        throw new BuiltinError(`the range ${start}:${end} needs finite ends and a step that is not zero`, 'eval');
      }
      const size = Math.max(0, Math.floor((end - start) / step) + 1);
      if (size > MAX_ELEMENTS) tooLarge('range', `${start}:${end} would have ${size} elements (at most ${MAX_ELEMENTS})`);
      countBuilt(size, 'range');
      const out: number[] = [];
      let x = start;
      if (step > 0) while (x <= end || smallerEq(x, end)) (out.push(x), (x += step));
      else while (x >= end || largerEq(x, end)) (out.push(x), (x += step));
      // the elements are plain numbers made here: the matrix takes them without copying
      return new DenseMatrix({ data: out, size: [out.length] });
    }
    const result = transforms().range(...args, includeEnd);
    const n = resultCount(result);
    if (n > MAX_ELEMENTS) tooLarge('range', `the range has ${n} elements (at most ${MAX_ELEMENTS})`);
    countBuilt(n, 'range');
    return result;
  };
}
type RawTransform = ((args: Array<{ compile(): { evaluate(scope: unknown): unknown } }>, m: unknown, scope: unknown) => unknown) & { rawArgs: true };

/**
 * Guarded versions of the expression transforms of and, or, bitAnd and bitOr (mathjs evaluates
 * their second operand lazily): scalars keep the short cut, lists are measured first.
 */
export function sizeGuardedTransforms(): Record<string, RawTransform> {
  const plain = math as unknown as Record<string, (a: unknown, b: unknown) => unknown>;
  const isList = (v: unknown) => listSize(v) !== null;
  const make = (name: string, shortCut: (c1: unknown) => unknown): RawTransform => {
    const t = ((args, _m, scope) => {
      const c1 = args[0].compile().evaluate(scope);
      if (!isList(c1)) {
        const early = shortCut(c1);
        if (early !== undefined) return early;
      }
      const c2 = args[1].compile().evaluate(scope);
      checkBroadcast(name, [c1, c2]);
      return plain[name](c1, c2);
    }) as RawTransform;
    t.rawArgs = true;
    return t;
  };
  return {
    and: make('and', (c1) => (plain.and(c1, true) ? undefined : false)),
    or: make('or', (c1) => (plain.or(c1, false) ? true : undefined)),
    bitAnd: make('bitAnd', () => undefined),
    bitOr: make('bitOr', () => undefined),
  };
}
