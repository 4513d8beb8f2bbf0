// mathjs's functions that formulas reach only by name or through a rarely used operator, in the
// app, loaded when a formula names one and otherwise after the first results
// (scripts/deferredMathInApp.mjs works the set out: those nothing else of the instance needs, with
// what only they use, such as the LU and QR decompositions, the statistics and the
// trigonometry). Their names stay in the instance, as stand-ins; once `loadDeferredMath()` has
// loaded mathjs's own factories, each real function is built on its first use, resolving each
// dependency as mathjs does (from the instance) except those within this set (built here), and
// takes the stand-in's place in the instance's namespaces, so that from then on formulas find
// exactly what an instance built with every factory holds (a function passed as an argument, as
// in map(v, sqrt), is the typed function). The stand-ins forward to the real functions once
// loaded and throw before; formulas reach the set only through the names and operator text
// (`triggers`, `symbols`) which load it before evaluation (web/engine/lazyBuiltins.ts).

type Factory = ((deps: Record<string, unknown>) => unknown) & { fn: string; dependencies: readonly string[]; meta?: { isTransformFunction?: boolean }; isFactory?: true };

interface StandIn {
  fn: string;
  transform: boolean;
  /** The real function, built on first use (set once the set has loaded). */
  real?: () => unknown;
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
      if (slot.real === undefined) throw new Error(`the code of ${fn} has not loaded yet`);
      slot.target ??= slot.real();
      return (slot.target as (...a: unknown[]) => unknown).apply(this, args);
    };
    if (rawArgs) Object.assign(forward, { rawArgs: true });
    slot.made = forward;
    return forward;
  };
  return Object.assign(create, { isFactory: true as const, fn, dependencies: [] as string[], meta }) as unknown as Factory;
}

let loading: Promise<void> | null = null;

/** Loads the deferred factories (once) and gives the stand-ins their real functions; `math` is the instance. */
export function loadDeferredMath(math: Record<string, unknown>): Promise<void> {
  loading ??= import('virtual:deferred-math').then((m) => putInPlace(math, m.default as Record<string, Factory>));
  return loading;
}

/**
 * Gives the stand-ins their real functions from `factories` (the deferred factories by export
 * name) for the instance `math`, and puts these in the instance's namespaces in place of the
 * stand-ins. Each is built on its first use, as mathjs builds its own (building them all at
 * once would hold the page for a long task).
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
  for (const [exportName, slot] of standIns) slot.real = () => build(factories[exportName]);
  // The namespaces: the plain one, the transforms, and the one formulas look names up in (where
  // the size guards stay: they look the function up on their first call).
  const made = new Set([...standIns.values()].map((s) => s.made).filter((x) => x !== undefined));
  const replace = (space: Record<string, unknown>, name: string, real: () => unknown) => {
    const d = Object.getOwnPropertyDescriptor(space, name);
    if (d && (d.get !== undefined || made.has(d.value))) lazy(space, name, real);
  };
  const transformOf = new Map([...standIns.values()].filter((s) => s.transform).map((s) => [s.fn, s]));
  for (const slot of standIns.values()) {
    replace(slot.transform ? expression.transform : math, slot.fn, slot.real!);
    replace(expression.mathWithTransform, slot.fn, (transformOf.get(slot.fn) ?? slot).real!);
  }
}

/** A property whose value is resolved on first read (as mathjs's own namespaces are). */
function lazy(space: Record<string, unknown>, name: string, resolve: () => unknown): void {
  let value: unknown;
  let resolved = false;
  Object.defineProperty(space, name, {
    get: () => {
      if (!resolved) (value = resolve()), (resolved = true);
      return value;
    },
    set: (v: unknown) => {
      value = v;
      resolved = true;
    },
    configurable: true,
    enumerable: true,
  });
}
