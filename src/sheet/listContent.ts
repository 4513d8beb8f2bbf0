// What a list may hold (numbers, quantities, complex numbers, text, booleans and lists of these)
// and how many elements a nested list holds in all. Sheet objects and functions cannot be list
// elements: mathjs cannot copy them and the display cannot show them.
import { math } from './mathInstance';
import { isSheetObject } from './sheetObject';

function isListValue(v: unknown): boolean {
  return Array.isArray(v) || math.isMatrix(v);
}

/** A description of the first element a list cannot hold, or undefined when all are fine. */
export function listContentProblem(data: readonly unknown[]): string | undefined {
  const stack: unknown[] = [data];
  while (stack.length > 0) {
    const v = stack.pop();
    if (Array.isArray(v)) {
      for (let i = 0; i < v.length; i++) {
        const x = v[i];
        if (typeof x === 'object' && x !== null) stack.push(x);
        else if (typeof x === 'function') return describe(x);
      }
    } else if (math.isMatrix(v)) {
      // a Matrix's own elements were checked when it was built
    } else if (!(math.isUnit(v) || math.isComplex(v) || math.isBigNumber(v) || math.isFraction(v))) {
      return describe(v);
    }
  }
  return undefined;
}

function describe(v: unknown): string {
  if (isSheetObject(v)) return `a ${v.kind}`;
  if (typeof v === 'function') return 'a function';
  return `a value of type ${Object.prototype.toString.call(v).slice(8, -1)}`;
}

/** Elements held by a nested list (matrices count their size). */
export function listElementCount(data: readonly unknown[]): number {
  let total = 0;
  const stack: unknown[] = [data];
  while (stack.length > 0) {
    const v = stack.pop();
    if (Array.isArray(v)) {
      for (let i = 0; i < v.length; i++) {
        if (isListValue(v[i])) stack.push(v[i]);
        else total++;
      }
    } else if (math.isMatrix(v)) {
      total += (v as { size(): number[] }).size().reduce((a, b) => a * b, 1);
    }
  }
  return total;
}
