// mathjs builds a function of an instance on first use, but a factory gets all its dependencies
// when it is built: the Unit class and the expression nodes (built at start-up, for createUnit and
// the parser) would build a few dozen typed functions that no formula of a sheet may call (fix,
// for Unit.splitUnit, builds ceil, floor and round; AccessorNode's subset builds concat, zeros and
// add). These factories are given such dependencies as calls of the instance's own functions
// instead, so each is built on its first call. Only for factories that just call them.
import { factory, type FactoryFunction } from 'mathjs';

/** Factory (its key in the factory list) -> the function dependencies it is handed as calls. */
export const CALLED_ON_USE: Readonly<Record<string, readonly string[]>> = {
  createUnitClass: [
    'addScalar', 'subtractScalar', 'multiplyScalar', 'divideScalar', 'pow', 'abs', 'fix', 'round', 'equal',
    'isNumeric', 'format', 'number',
  ],
  // for matrix powers; Unit and number powers use none of them
  createPow: ['identity', 'multiply', 'matrix', 'inv', 'fraction', 'number'],
  // for vector products
  createMultiply: ['dot'],
  // for matrix divisors
  createDivide: ['multiply', 'inv', 'matrix'],
  // the parser's conversion of number literals (to BigNumber or Fraction only when configured so)
  createNumeric: ['number', 'bignumber', 'fraction'],
  createAccessorNode: ['subset'],
  createAssignmentNode: ['subset', 'matrix'],
  createIndexNode: ['size'],
  createConstantNode: ['isBounded'],
};

type Factory = FactoryFunction<unknown> & { fn: string; dependencies: string[]; meta?: object };

/** `original` with the named dependencies handed over as calls of the instance's functions. */
function callingOnUse(original: Factory, names: readonly string[]): Factory {
  const bare = (d: string) => d.replace(/^\?/, '');
  const others = original.dependencies.filter((d) => !names.includes(bare(d)));
  return factory(
    original.fn,
    [...others, 'math'] as never,
    (deps: Record<string, unknown>) => {
      const instance = deps.math as Record<string, (...args: unknown[]) => unknown>;
      const calls = Object.fromEntries(names.map((name) => [name, (...args: unknown[]) => instance[name](...args)]));
      return (original as unknown as (d: Record<string, unknown>) => unknown)({ ...deps, ...calls });
    },
    original.meta as never,
  ) as Factory;
}

/** The factory list with CALLED_ON_USE applied. */
export function withDependenciesCalledOnUse<T extends Record<string, unknown>>(factories: T): T {
  const out: Record<string, unknown> = { ...factories };
  for (const [key, names] of Object.entries(CALLED_ON_USE)) {
    const original = factories[key] as Factory | undefined;
    if (!original) throw new Error(`mathjs factory ${key} is not in the list`);
    const missing = names.filter((n) => !original.dependencies.some((d) => d.replace(/^\?/, '') === n));
    if (missing.length > 0) throw new Error(`mathjs factory ${key} does not depend on ${missing.join(', ')}`);
    out[key] = callingOnUse(original, names);
  }
  return out as T;
}
