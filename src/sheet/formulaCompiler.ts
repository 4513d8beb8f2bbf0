// From formula text to something the sheet can evaluate: parse with mathjs, walk the tree against
// an allow-list of node kinds and function names, collect the cells it reads, then compile.
// Nothing here throws for a bad formula: problems come back as a CellError.
import type { MathNode } from 'mathjs';
import type { CellError } from './cellError';
import { lockedMath } from './lockedMath';
import { isMathjsName, math } from './mathInstance';
import { ALLOWED_CONSTANTS, ALLOWED_MATH_FUNCTIONS } from './allowedFunctions';
import { checkCellName, FREE_NAMES, MAX_NAME_LENGTH } from './cellName';
import { FunctionCellScope } from './functionCellScope';
import { BuiltinError } from './cellError';
import { checkTime, countBuilt, MAX_BUILT_ELEMENTS } from './evaluationBudget';
import { MAX_ELEMENTS, MAX_FORMULA_LENGTH, MAX_NESTING, MAX_NODES } from './formulaLimits';
import { restoreLongStrings, takeLongStrings } from './longStrings';

export { MAX_ELEMENTS, MAX_FORMULA_LENGTH, MAX_NESTING, MAX_NODES } from './formulaLimits';

/** Something compiled mathjs can evaluate with a Map-like scope. */
export interface Evaluable {
  evaluate(scope: Map<string, unknown>): unknown;
}

export type CompiledFormula =
  | { kind: 'expression'; deps: string[]; code: Evaluable; tree: MathNode }
  | { kind: 'function'; deps: string[]; functionName: string; params: string[]; body: Evaluable }
  | { kind: 'error'; deps: string[]; error: CellError };

/** A plain JS function made from a function cell. */
export interface CellFunction {
  (...args: unknown[]): unknown;
  readonly params: string[];
  readonly syntax: string;
}

export function isCellFunction(v: unknown): v is CellFunction {
  return typeof v === 'function' && Array.isArray((v as Partial<CellFunction>).params);
}

function fail(cell: string, kind: CellError['kind'], detail: string, position?: number): CompiledFormula {
  const error: CellError = { kind, message: `${cell}: ${detail}` };
  if (position !== undefined) error.position = position;
  return { kind: 'error', deps: [], error };
}

/** Deepest bracket nesting outside quoted text, and where it first exceeds the limit. */
function nestingProblem(text: string): number | undefined {
  let depth = 0;
  // a regular expression and indexOf find the brackets and quotes, so long strings are not walked character by character
  const special = /[()[\]{}"']/g;
  let m: RegExpExecArray | null;
  while ((m = special.exec(text)) !== null) {
    const i = m.index;
    const ch = text[i];
    if (ch === '"' || ch === "'") {
      // the closing quote: the first one not escaped by an odd run of backslashes
      let close = text.indexOf(ch, i + 1);
      for (;;) {
        if (close < 0) return undefined; // the rest is inside the string
        let slashes = 0;
        while (close - 1 - slashes > i && text[close - 1 - slashes] === '\\') slashes++;
        if (slashes % 2 === 0) break;
        close = text.indexOf(ch, close + 1);
      }
      special.lastIndex = close + 1;
    } else if (ch === '(' || ch === '[' || ch === '{') {
      if (++depth > MAX_NESTING) return i;
    } else depth--;
  }
  return undefined;
}

/** Numeric value of a literal range end: a number constant, possibly negated. */
function literalNumber(node: MathNode | undefined): number | undefined {
  if (!node) return undefined;
  const n = node as MathNode & { value?: unknown; op?: string; args?: MathNode[]; content?: MathNode };
  if (n.type === 'ConstantNode' && typeof n.value === 'number') return n.value;
  if (n.type === 'ParenthesisNode') return literalNumber(n.content);
  if (n.type === 'OperatorNode' && n.op === '-' && n.args?.length === 1) {
    const v = literalNumber(n.args[0]);
    return v === undefined ? undefined : -v;
  }
  if (n.type === 'OperatorNode' && n.op === '+' && n.args?.length === 1) return literalNumber(n.args[0]);
  return undefined;
}

// Unit names are fixed once the instance is locked (createUnit is refused), so answers can be kept.
const unitNameMemo = new Map<string, boolean>();
function isUnitName(name: string): boolean {
  let known = unitNameMemo.get(name);
  if (known === undefined) {
    try {
      known = math.Unit.isValuelessUnit(name);
    } catch {
      known = false;
    }
    if (unitNameMemo.size < 100_000) unitNameMemo.set(name, known);
  }
  return known;
}

/** Elements of all the literal ranges a:b:c in a formula (for the message when they are too many). */
function sumOfRanges(root: MathNode): number {
  let total = 0;
  root.traverse((node) => {
    const n = node as MathNode & { start?: MathNode; end?: MathNode; step?: MathNode };
    if (n.type !== 'RangeNode') return;
    const start = literalNumber(n.start);
    const end = literalNumber(n.end);
    const step = n.step ? literalNumber(n.step) : 1;
    if (start !== undefined && end !== undefined && step) total += Math.max(0, Math.floor((end - start) / step) + 1);
  });
  return total;
}

interface WalkResult {
  deps: string[];
  problem?: { kind: CellError['kind']; detail: string };
}

/**
 * Walks the tree without recursion. `params` are the parameters of a function cell (local names,
 * not dependencies).
 */
function walk(root: MathNode, params: ReadonlySet<string>, builtinNames: ReadonlySet<string>): WalkResult {
  const deps = new Set<string>();
  // Each entry: node, depth, whether inside an index (where `end` and free ranges are allowed).
  const stack: Array<[MathNode, number, boolean]> = [[root, 0, false]];
  let count = 0;
  let rangeElements = 0;
  const refuse = (detail: string): WalkResult => ({ deps: [], problem: { kind: 'refused', detail } });
  const isCallable = (name: string) => ALLOWED_MATH_FUNCTIONS.has(name) || builtinNames.has(name);
  // Anything else the mathjs namespace holds (inherited prototype names included) is out of reach.
  const forbiddenName = (name: string) => isMathjsName(name) && !isCallable(name) && !ALLOWED_CONSTANTS.has(name) && !FREE_NAMES.has(name);
  while (stack.length > 0) {
    const [node, depth, inIndex] = stack.pop()!;
    if (++count > MAX_NODES) return { deps: [], problem: { kind: 'limit', detail: `the formula has more than ${MAX_NODES} parts` } };
    if (depth > 4 * MAX_NESTING) return { deps: [], problem: { kind: 'limit', detail: 'the formula is nested too deeply' } };
    const n = node as MathNode & Record<string, any>;
    const push = (child: MathNode, childInIndex = inIndex) => stack.push([child, depth + 1, childInIndex]);
    switch (n.type) {
      case 'ConstantNode':
        break;
      case 'SymbolNode': {
        const name: string = n.name;
        if (name.length > MAX_NAME_LENGTH) {
          return { deps: [], problem: { kind: 'name', detail: `the name ${name.slice(0, 20)}... has ${name.length} characters; names have at most ${MAX_NAME_LENGTH}` } };
        }
        if (params.has(name)) break;
        if (name === 'end' && inIndex) break;
        if (ALLOWED_CONSTANTS.has(name) || isCallable(name)) break;
        if (forbiddenName(name)) return refuse(`${name} is not available in formulas`);
        if (!isUnitName(name)) deps.add(name);
        break;
      }
      case 'ParenthesisNode':
        push(n.content);
        break;
      case 'OperatorNode':
        if (typeof n.fn !== 'string' || !(n.fn in math)) return refuse(`operator ${n.op} is not available`);
        for (const a of n.args) push(a);
        break;
      case 'RelationalNode':
        for (const a of n.params) push(a);
        break;
      case 'ConditionalNode':
        push(n.condition);
        push(n.trueExpr);
        push(n.falseExpr);
        break;
      case 'ArrayNode':
        if (n.items.length > MAX_ELEMENTS) return { deps: [], problem: { kind: 'limit', detail: 'the list is too long' } };
        for (const item of n.items) push(item);
        break;
      case 'FunctionNode': {
        if (n.optional) return refuse('optional calls (?.) are not allowed');
        const fnNode = n.fn as MathNode & { name?: string };
        if (fnNode.type !== 'SymbolNode') return refuse('only named functions can be called (no calls on results or properties)');
        const name = fnNode.name!;
        if (params.has(name)) return refuse(`${name} is a parameter and cannot be called`);
        // Several lists at once would broadcast inside mathjs, past the size guards.
        if ((name === 'map' || name === 'forEach') && n.args.length > 2) return refuse(`${name} takes one list and a function (several lists at once are not available)`);
        if (!isCallable(name)) {
          if (forbiddenName(name) || ALLOWED_CONSTANTS.has(name)) return refuse(`function ${name} is not available in formulas`);
          deps.add(name); // a function cell
        }
        for (const a of n.args) push(a);
        break;
      }
      case 'AccessorNode': {
        if (n.optionalChaining) return refuse('optional property access (?.) is not allowed');
        const index = n.index as MathNode & Record<string, any>;
        if (index?.type !== 'IndexNode' || index.dotNotation) return refuse('property access (.name) is not allowed');
        for (const d of index.dimensions as MathNode[]) {
          const dn = d as MathNode & { value?: unknown };
          if (dn.type === 'ConstantNode' && typeof dn.value === 'string') return refuse('property access (["name"]) is not allowed');
          push(d, true);
        }
        push(n.object);
        break;
      }
      case 'RangeNode': {
        if (!inIndex) {
          const start = literalNumber(n.start);
          const end = literalNumber(n.end);
          const step = n.step ? literalNumber(n.step) : 1;
          if (start === undefined || end === undefined || step === undefined) {
            return refuse('a range a:b outside an index needs plain numbers at both ends (and step), for example 1:10');
          }
          if (!Number.isFinite(start) || !Number.isFinite(end) || !Number.isFinite(step) || step === 0) {
            return refuse('a range needs finite ends and a step that is not zero');
          }
          const size = Math.floor((end - start) / step) + 1;
          if (size > MAX_ELEMENTS) return { deps: [], problem: { kind: 'limit', detail: `the range ${start}:${end} would have ${size} elements (at most ${MAX_ELEMENTS})` } };
          rangeElements += Math.max(0, size);
          if (rangeElements > MAX_BUILT_ELEMENTS) {
            return { deps: [], problem: { kind: 'limit', detail: `the ranges in this formula would build ${sumOfRanges(root)} elements in all (at most ${MAX_BUILT_ELEMENTS})` } };
          }
        }
        push(n.start);
        push(n.end);
        if (n.step) push(n.step);
        break;
      }
      case 'AssignmentNode':
        return refuse('assignment (=) is not allowed inside a formula; the cell name is the left-hand side');
      case 'FunctionAssignmentNode':
        return refuse('a function can only be defined as a whole cell: name(x, y) = body');
      case 'BlockNode':
        return refuse('one expression per cell (no ; or line breaks between expressions)');
      case 'ObjectNode':
        return refuse('object literals {...} are not allowed');
      case 'IndexNode':
        return refuse('an index can only follow a value, as in v[2]');
      default:
        return refuse(`${n.type} is not allowed in formulas`);
    }
  }
  return { deps: [...deps] };
}

/** Compiles one cell's formula. `cell` names the cell in messages; `builtinNames` are the built-ins. */
/** parse(text), with long string literals taken out and put back (longStrings.ts); the original text when that does not hold. */
function parseTakingLongStrings(parse: (text: string) => MathNode, text: string): MathNode {
  const taken = takeLongStrings(text);
  if (taken) {
    try {
      const tree = parse(taken.text);
      if (restoreLongStrings(tree as unknown as Parameters<typeof restoreLongStrings>[0], taken)) return tree;
    } catch {
      // the original text gives the error, with its positions
    }
  }
  return parse(text);
}

export function compileFormula(text: string, cell: string, builtinNames?: ReadonlySet<string>): CompiledFormula {
  const locked = lockedMath();
  const builtins = builtinNames ?? new Set(locked.builtins.keys());
  if (typeof text !== 'string') return fail(cell, 'syntax', 'the formula must be text');
  if (text.trim() === '') return fail(cell, 'syntax', 'the formula is empty', 0);
  if (text.length > MAX_FORMULA_LENGTH) {
    return fail(cell, 'limit', `the formula is ${text.length} characters long (at most ${MAX_FORMULA_LENGTH})`);
  }
  const deep = nestingProblem(text);
  if (deep !== undefined) return fail(cell, 'limit', `brackets are nested more than ${MAX_NESTING} deep`, deep);
  let tree: MathNode;
  try {
    tree = parseTakingLongStrings(locked.parse, text);
  } catch (e) {
    const err = e as Error & { char?: number };
    if (err instanceof RangeError) return fail(cell, 'limit', 'the formula is too complex to read');
    const position = typeof err.char === 'number' ? Math.max(0, Math.min(text.length, err.char - 1)) : undefined;
    const detail = (err.message || 'cannot read the formula').replace(/\s*\(char \d+\)$/, '');
    return fail(cell, 'syntax', position === undefined ? detail : `${detail} at character ${position + 1}`, position);
  }
  const t = tree as MathNode & Record<string, any>;
  try {
    if (t.type === 'FunctionAssignmentNode') return compileFunctionCell(t, cell, builtins);
    const result = walk(tree, new Set(), builtins);
    if (result.problem) return fail(cell, result.problem.kind, result.problem.detail);
    return { kind: 'expression', deps: result.deps, code: tree.compile() as Evaluable, tree };
  } catch (e) {
    if (e instanceof RangeError) return fail(cell, 'limit', 'the formula is too complex to compile');
    return fail(cell, 'eval', `cannot compile the formula: ${(e as Error).message}`);
  }
}

function compileFunctionCell(t: MathNode & Record<string, any>, cell: string, builtins: ReadonlySet<string>): CompiledFormula {
  const functionName: string = t.name;
  const params: string[] = [...t.params];
  if (functionName !== cell) {
    return fail(cell, 'refused', `this formula defines the function ${functionName}; a function cell must have the function's name (rename the cell to ${functionName} or the function to ${cell})`);
  }
  const seen = new Set<string>();
  for (const p of params) {
    if (seen.has(p)) return fail(cell, 'refused', `parameter ${p} appears twice`);
    seen.add(p);
    if (p === functionName) return fail(cell, 'refused', `parameter ${p} has the function's own name`);
    const verdict = checkCellName(p, builtins);
    if (!verdict.ok) return fail(cell, 'refused', `parameter ${p} cannot be used: ${verdict.reason} (try ${verdict.suggestion})`);
  }
  const result = walk(t.expr, seen, builtins);
  if (result.problem) return fail(cell, result.problem.kind, result.problem.detail);
  return { kind: 'function', deps: result.deps, functionName, params, body: (t.expr as MathNode).compile() as Evaluable };
}

/**
 * The JS function a function cell's value is: it evaluates the body with the parameters bound to
 * the call's arguments and other names read from `inputs` (the cell's dependencies).
 */
export function makeCellFunction(
  functionName: string,
  params: string[],
  body: Evaluable,
  inputs: ReadonlyMap<string, unknown>,
): CellFunction {
  const arity = params.length;
  const syntax = `${functionName}(${params.join(', ')})`;
  const fn = function (...args: unknown[]): unknown {
    // mathjs's map/filter/forEach call back with (value, index, list): drop those two extras.
    if (args.length > arity && args.length <= arity + 2 && (Array.isArray(args[args.length - 1]) || math.isMatrix(args[args.length - 1]))) {
      args = args.slice(0, arity);
    }
    if (args.length !== arity) {
      throw new BuiltinError(`${syntax} takes ${arity} argument${arity === 1 ? '' : 's'}, got ${args.length}`, 'eval');
    }
    checkTime();
    const result = body.evaluate(new FunctionCellScope(params, args, inputs) as unknown as Map<string, unknown>);
    if (typeof result === 'object' && result !== null && (Array.isArray(result) || math.isMatrix(result))) {
      countBuilt(math.isMatrix(result) ? (result as { size(): number[] }).size().reduce((a, b) => a * b, 1) : (result as unknown[]).length, syntax);
    }
    return result;
  };
  Object.defineProperty(fn, 'length', { value: arity });
  Object.defineProperty(fn, 'name', { value: functionName });
  Object.defineProperty(fn, 'params', { value: Object.freeze([...params]), enumerable: true });
  Object.defineProperty(fn, 'syntax', { value: syntax, enumerable: true });
  Object.defineProperty(fn, 'toString', { value: () => syntax });
  return fn as unknown as CellFunction;
}
