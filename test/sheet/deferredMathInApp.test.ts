// In the app, mathjs's functions that formulas reach only by name or through a few operators
// come in a chunk loaded later (scripts/deferredMathInApp.mjs, web/engine/deferredMath.ts): the
// instance holds stand-ins until then. Checked here against an instance built with every
// factory at once (independent method: mathjs as the command line uses it): formulas compiled
// before the set is put in place give, after, the same values and the same error messages, and
// the instance's namespaces then hold the real functions.
import * as mathjs from 'mathjs';
import { describe, expect, it } from 'vitest';
import { deferredMathPlan, OPERATOR_TEXT } from '../../scripts/deferredMathInApp.mjs';
import { MATH_FACTORIES } from '../../src/sheet/mathFactories';
import { withDependenciesCalledOnUse } from '../../src/sheet/lazyFactoryDependencies';
import { deferredMathFactory, putInPlace } from '../../web/engine/deferredMath';

const CONFIG = { absTol: 0, relTol: 1e-12 };

/** Formulas that reach the deferred set: each function formulas may call by name, each deferred operator, some errors. */
const FORMULAS = [
  'sqrt(16)', 'sqrt(-4)', 'exp(1)', 'log(100, 10)', 'log10(1000)', 'log2(8)', 'log1p(1e-10)', 'expm1(1e-10)', 'cbrt(27)',
  'nthRoot(16, 4)', 'hypot(3, 4)', 'square(3 m)', 'cube(2)', 'sign(-3 kg)', 'gcd(12, 18)', 'lcm(4, 6)', 'erf(0.5)', 'lgamma(5.5)',
  'sin(pi / 6)', 'cos(1)', 'tan(1)', 'sec(1)', 'csc(1)', 'cot(1)', 'asin(0.5)', 'acos(0.5)', 'atan(1)', 'atan2(1, 2)', 'asec(2)',
  'acsc(2)', 'acot(2)', 'sinh(1)', 'cosh(1)', 'tanh(1)', 'asinh(1)', 'acosh(2)', 'atanh(0.5)', 'asin(2)', 'sin(30 deg)',
  're(3 + 4i)', 'im(3 + 4i)', 'arg(1 + i)', 'compare(1, 2)', 'compare(2 m, 1 m)', 'deepEqual([1, 2], [1, 2])', 'isNaN(NaN)',
  'isFinite(1)', 'isNegative(-1)', 'min([3, 1, 2])', 'max(1, 5)', 'max([[1, 5], [7, 2]], 1)', 'sum([1, 2, 3])', 'sum([1 m, 2 m])',
  'prod([1, 2, 3])', 'mean([1, 2, 3, 4])', 'median([3, 1, 2])', 'std([1, 2, 3, 4])', 'variance([1, 2, 3, 4])', 'mad([1, 2, 3, 4])',
  'cumsum([1, 2, 3])', 'quantileSeq([1, 2, 3, 4], 0.25)', 'count([1, 2, 3])', 'squeeze([[1, 2]])', 'sort([3, 1, 2])',
  'sort([3, 1, 2], "desc")', 'diff([1, 4, 9])', 'cross([1, 0, 0], [0, 1, 0])', 'norm([3, 4])', 'norm([[1, 2], [3, 4]], 2)',
  'trace([[1, 2], [3, 4]])', 'lusolve([[2, 1], [1, 3]], [1, 2])', 'reshape([1, 2, 3, 4], [2, 2])', 'row([[1, 2], [3, 4]], 2)',
  'column([[1, 2], [3, 4]], 1)', 'flatten([[1, 2], [3]])', 'transpose([[1, 2], [3, 4]])', 'map([1, 4, 9], sqrt)',
  'map([1, 2, 3], f(x) = x ^ 2)', 'filter([1, -2, 3], isPositive)', 'forEach([1, 2], sqrt)', 'det([[1, 2], [3, 4]])',
  'inv([[1, 2], [3, 4]])', '[[1, 2], [3, 4]]\'', '5!', '7 mod 3', '7 % 3', '5 m to cm', '2 in', 'true and false', 'true or false',
  'true xor true', 'not true', '5 & 3', '5 | 3', '5 ^| 3', '~5', '1 << 3', '-16 >> 2', '-16 >>> 2', 'null ?? 3', '[1, 2] + 1',
  'sqrt("x")', 'sort(5)', 'median([])', 'gcd(1.5, 2)', 'lusolve([[1, 2], [2, 4]], [1, 2])', 'map([1, 2], 3)', 'sum()', 'log(-1 m)',
];

type Outcome = { value: string } | { error: string };
const outcome = (math: mathjs.MathJsInstance, run: () => unknown): Outcome => {
  try {
    return { value: math.format(run(), { precision: 14 }) };
  } catch (e) {
    return { error: (e as Error).message };
  }
};

describe('mathjs functions loaded later in the app', () => {
  it('formulas compiled before the deferred set is put in place give the eager instance’s values and errors', async () => {
    const plan = await deferredMathPlan();
    const eager = mathjs.create(withDependenciesCalledOnUse(MATH_FACTORIES), CONFIG);
    const factories: Record<string, unknown> = { ...MATH_FACTORIES };
    for (const e of plan.entries) factories[e.exportName] = deferredMathFactory(e.exportName, e.fn, e.meta as never, e.rawArgs);
    const later = mathjs.create(withDependenciesCalledOnUse(factories as typeof MATH_FACTORIES), CONFIG);
    const compiled = FORMULAS.map((f) => later.parse(f).compile());
    // Before: the formulas that reach the set throw, and say why.
    expect(outcome(later, () => compiled[0].evaluate())).toEqual({ error: 'the code of sqrt has not loaded yet' });
    const exported = mathjs as unknown as Record<string, unknown>;
    putInPlace(later as unknown as Record<string, unknown>, Object.fromEntries(plan.exports.map((e) => [e, exported[e]])) as never);
    FORMULAS.forEach((f, i) => {
      expect(outcome(later, () => compiled[i].evaluate()), f).toEqual(outcome(eager, () => eager.parse(f).compile().evaluate()));
      expect(outcome(later, () => later.parse(f).compile().evaluate()), f).toEqual(outcome(eager, () => eager.parse(f).compile().evaluate()));
    });
    // The namespaces hold the real functions (typed functions where mathjs makes them), not the stand-ins.
    const ns = later as unknown as Record<string, unknown>;
    const spaces = (later as unknown as { expression: { transform: Record<string, unknown>; mathWithTransform: Record<string, unknown> } }).expression;
    for (const e of plan.entries) {
      const found = (e.transform ? spaces.transform[e.fn] : ns[e.fn]) as { name: string };
      expect(found.name, e.fn).not.toBe('forward');
      expect((spaces.mathWithTransform[e.fn] as { name?: string } | undefined)?.name, e.fn).not.toBe('forward');
    }
    expect((later.typed as unknown as { isTypedFunction(f: unknown): boolean }).isTypedFunction(ns.sqrt)).toBe(true);
  });

  it('the set is reached only through functions formulas call by name and the operators of OPERATOR_TEXT', async () => {
    const plan = await deferredMathPlan();
    // lusolve and the eigenvalues of norm (the set before issue 11's widening), sqrt, the bitwise operators
    for (const name of ['lusolve', 'norm', 'sqrt', 'bitAnd', 'median']) expect(plan.triggers, name).toContain(name);
    for (const fn of Object.keys(OPERATOR_TEXT).filter((f) => plan.entries.some((e) => e.fn === f))) {
      for (const text of OPERATOR_TEXT[fn]) expect([...plan.triggers, ...plan.symbols], fn).toContain(text);
    }
    // what the demo's first result and the parser use stays in the page's chunk
    for (const name of ['multiply', 'divide', 'pow', 'unaryMinus', 'add', 'matrix', 'unit', 'number', 'parse', 'complex']) {
      expect(plan.entries.map((e) => e.fn), name).not.toContain(name);
    }
  });
});
