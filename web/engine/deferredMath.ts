// mathjs's functions that formulas call by name, in the app, loaded when a formula names one and
// otherwise after the first results (scripts/deferredMathInApp.mjs works the set out: the
// functions formulas call by name that nothing else of the instance needs, with what only they
// use, such as the LU and QR decompositions, the statistics and the trigonometry). Their names
// stay in the instance, as stand-ins; `loadDeferredMath()` builds the real functions from
// mathjs's own factories, resolving each dependency as mathjs does (from the instance) except
// those within this set (built here), then puts them in the instance's namespaces in place of the
// stand-ins, so that from then on formulas find exactly what an instance built with every
// factory holds (a function passed as an argument, as in map(v, sqrt), is the typed function).
// The stand-ins forward to the real functions once loaded and throw before; formulas reach the set
// only through the names `triggers` lists, which load it before evaluation (web/engine/lazyBuiltins.ts).

type Factory = ((deps: Record<string, unknown>) => unknown) & { fn: string; dependencies: readonly string[]; meta?: { isTransformFunction?: boolean }; isFactory?: true };

interface StandIn {
  fn: string;
  transform: boolean;
  target?: unknown;
  made?: unknown;
}

const standIns = new Map<string, StandIn>();

/**
 * A factory with the real one's name and meta whose function forwards to the real one once loaded.
 * `rawArgs`: the real one is a transform that takes its arguments unevaluated (mathjs's
 * FunctionNode reads this when a formula is compiled, which may come before loading).
 */
export function deferredMathFactory(exportName: string, fn: string, meta: Factory['meta'], rawArgs: boolean): Factory {
  const slot: StandIn = { fn, transform: meta?.isTransformFunction === true };
  standIns.set(exportName, slot);
  const create = () => {
    const forward = function forward(this: unknown, ...args: unknown[]) {
      const real = slot.target as (...a: unknown[]) => unknown;
      if (real === undefined) throw new Error(`the code of ${fn} has not loaded yet`);
      return real.apply(this, args);
    };
    if (rawArgs) Object.assign(forward, { rawArgs: true });
    slot.made = forward;
    return forward;
  };
  return Object.assign(create, { isFactory: true as const, fn, dependencies: [] as string[], meta }) as unknown as Factory;
}

let loading: Promise<void> | null = null;

/** Builds the real functions of every stand-in (once), from the chunk of mathjs factories loaded here; `math` is the instance. */
export function loadDeferredMath(math: Record<string, unknown>): Promise<void> {
  loading ??= import('virtual:deferred-math').then((m) => putInPlace(math, m.default as Record<string, Factory>));
  return loading;
}

/**
 * Builds the real functions of the stand-ins from `factories` (the deferred factories by export
 * name) for the instance `math`, makes the stand-ins forward to them and puts them in the
 * instance's namespaces in place of the stand-ins.
 */
export function putInPlace(math: Record<string, unknown>, factories: Record<string, Factory>): void {
  const plain = new Map<string, Factory>(Object.values(factories).filter((f) => f.meta?.isTransformFunction !== true).map((f) => [f.fn, f]));
  const expression = math.expression as { transform: Record<string, unknown>; mathWithTransform: Record<string, unknown> };
  const built = new Map<Factory, unknown>();
  const build = (f: Factory): unknown => {
    if (built.has(f)) return built.get(f);
    const deps: Record<string, unknown> = {};
    for (const d of f.dependencies.map((x) => x.replace(/^\?/, ''))) {
      deps[d] = plain.has(d) ? build(plain.get(d)!) : d === 'math' ? math : d === 'mathWithTransform' ? expression.mathWithTransform : math[d];
    }
    const real = f(deps);
    built.set(f, real);
    return real;
  };
  for (const [exportName, slot] of standIns) slot.target = build(factories[exportName]);
  // The namespaces: the plain one, the transforms, and the one formulas look names up in (where
  // the size guards stay: they look the function up on their first call).
  const made = new Set([...standIns.values()].map((s) => s.made).filter((x) => x !== undefined));
  const replace = (space: Record<string, unknown>, name: string, real: unknown) => {
    const d = Object.getOwnPropertyDescriptor(space, name);
    if (d && (d.get !== undefined || made.has(d.value))) space[name] = real;
  };
  const transformOf = new Map([...standIns.values()].filter((s) => s.transform).map((s) => [s.fn, s.target]));
  for (const slot of standIns.values()) {
    if (slot.transform) replace(expression.transform, slot.fn, slot.target);
    else replace(math, slot.fn, slot.target);
    replace(expression.mathWithTransform, slot.fn, transformOf.has(slot.fn) ? transformOf.get(slot.fn) : slot.target);
  }
}
