// Size guards for list arithmetic. mathjs broadcasts element-wise operations ([N,1] + [1,M] gives
// N x M) and multiplies matrices in O(n k m), so a short formula over lists within the element
// limit could still build 10^12 elements or run for hours inside one call, where no limit can
// stop it afterwards. These wrappers check the sizes first and throw a 'limit' error instead.
import type { Matrix } from 'mathjs';
import { BuiltinError } from './cellError';
import { math } from './mathInstance';
import { MAX_ELEMENTS } from './formulaLimits';

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

/** Throws when a square-matrix routine (inverse, determinant, solve, power) on n x n would take n^3 too many steps. */
export function checkCubic(fn: string, args: readonly unknown[]): void {
  const s = listSize(args[0]);
  if (s && s.length === 2 && s[0] ** 3 > MAX_MATRIX_OPERATIONS) {
    tooLarge(fn, `a ${shape(s)} matrix is too large for ${fn} (at most ${Math.floor(Math.cbrt(MAX_MATRIX_OPERATIONS))} rows)`);
  }
}

function guarded(name: string, check: (fn: string, args: readonly unknown[]) => void): ((...args: unknown[]) => unknown) | undefined {
  if (!(name in math)) return undefined;
  // The mathjs function is looked up on the first call (mathjs builds it on first use).
  let fn: ((...args: unknown[]) => unknown) | undefined;
  const wrapper = function (...args: unknown[]): unknown {
    // plain numbers pass straight through; only lists are measured
    if (args.length >= 1 && (typeof args[0] === 'object' || typeof args[1] === 'object')) check(name, args);
    fn ??= (math as unknown as Record<string, (...args: unknown[]) => unknown>)[name];
    return fn(...args);
  };
  Object.defineProperty(wrapper, 'name', { value: name });
  return wrapper;
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
  put('pow', checkCubic);
  for (const name of ['inv', 'det', 'lusolve']) put(name, checkCubic);
  return out;
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
