// mathjs's linear-algebra solvers in the app, loaded after the first results
// (scripts/deferredMathInApp.mjs): `lusolve` and the eigenvalues behind the 2-norm of a matrix,
// with what only they use (LU and QR decompositions, triangular solvers, the sparse LU's
// ordering). Their names stay in the instance, as stand-ins that forward to the real functions
// once `loadDeferredMath()` has built them from mathjs's own factories, resolving each
// dependency as mathjs does (from the instance) except those within this set (built here).
// Formulas reach them only through the names `lusolve` and `norm` (the build checks that no
// other function of the instance depends on them), which load them before evaluation
// (web/engine/lazyBuiltins.ts).

type Factory = ((deps: Record<string, unknown>) => unknown) & { fn: string; dependencies: readonly string[]; meta?: unknown; isFactory?: true };

const standIns = new Map<string, { target?: unknown }>();

/** A factory with the real one's name and meta whose function (or class) forwards to the real one once loaded. */
export function deferredMathFactory(fn: string, meta: unknown): Factory {
  const slot: { target?: unknown } = {};
  standIns.set(fn, slot);
  const create = () =>
    function forward(this: unknown, ...args: unknown[]) {
      const real = slot.target as ((...a: unknown[]) => unknown) & (new (...a: unknown[]) => unknown);
      if (real === undefined) throw new Error(`the code of ${fn} has not loaded yet`);
      return new.target ? Reflect.construct(real, args) : real.apply(this, args);
    };
  return Object.assign(create, { isFactory: true as const, fn, dependencies: [] as string[], meta }) as unknown as Factory;
}

let loading: Promise<void> | null = null;

/** Builds the real functions of every stand-in (once), from the chunk of mathjs factories loaded here; `math` is the instance. */
export function loadDeferredMath(math: Record<string, unknown>): Promise<void> {
  loading ??= import('virtual:deferred-math').then((m) => {
    const factories = new Map<string, Factory>((Object.values(m.default) as Factory[]).map((f) => [f.fn, f]));
    const built = new Map<string, unknown>();
    const build = (name: string): unknown => {
      if (built.has(name)) return built.get(name);
      const f = factories.get(name)!;
      const deps: Record<string, unknown> = {};
      for (const d of f.dependencies.map((x) => x.replace(/^\?/, ''))) {
        deps[d] = factories.has(d) ? build(d) : d === 'math' ? math : d === 'mathWithTransform' ? (math.expression as { mathWithTransform: unknown }).mathWithTransform : math[d];
      }
      const real = f(deps);
      built.set(name, real);
      return real;
    };
    for (const [name, slot] of standIns) slot.target = build(name);
  });
  return loading;
}
