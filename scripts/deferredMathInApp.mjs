// mathjs's linear-algebra solvers in the app, in a chunk loaded after the first results
// (web/engine/deferredMath.ts). In the app's build and development server, src/sheet/mathFactories.ts
// gives stand-ins (same names, so the names formulas may use and the locking are unchanged) for
// the factories only `lusolve` and the eigenvalues of `norm` reach, and `virtual:deferred-math`
// gives the real factories. The set is worked out here from mathjs's dependency lists: the
// entries and every factory of the instance that only they (directly or not) depend on, leaving
// out every name formulas, operators or the engine use. The names that reach the set
// (`triggers`) must be functions formulas call by name, so that the app can load the set before
// evaluating a formula that names one; the build fails otherwise.
import { readFileSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { loadsLazily } from './lazyInApp.mjs';

const FACTORIES = fileURLToPath(new URL('../src/sheet/mathFactories.ts', import.meta.url));
const RUNTIME = fileURLToPath(new URL('../web/engine/deferredMath.ts', import.meta.url));
const VIRTUAL = 'virtual:deferred-math';
const RESOLVED = '\0virtual:deferred-math';
/** Where the deferred set starts: the eigenvalue solver (only the 2-norm of a matrix uses it) and lusolve. */
const ENTRIES = ['eigs', 'lusolve'];

/** Export names of the factories in mathFactories.ts's MATH_FACTORIES. */
function selectedExports(text) {
  const body = text.slice(text.indexOf('export const MATH_FACTORIES'));
  return [...body.matchAll(/^ {2}(create\w+),$/gm)].map((m) => m[1]);
}

let planned;

/** { exports: factory export names deferred, fns: their names, triggers, metas } (worked out once per process). */
export async function deferredMathPlan() {
  planned ??= (async () => {
    const mathjs = await import('mathjs');
    const { register } = await import('tsx/esm/api');
    const api = register({ namespace: `strainsheet-deferred-math-${Date.now()}` });
    let reach;
    let named;
    try {
      const sel = await api.import(pathToFileURL(fileURLToPath(new URL('./mathFactorySelection.ts', import.meta.url))).href, import.meta.url);
      const allowed = await api.import(pathToFileURL(fileURLToPath(new URL('../src/sheet/allowedFunctions.ts', import.meta.url))).href, import.meta.url);
      named = new Set([...allowed.ALLOWED_MATH_FUNCTIONS].filter((n) => !sel.OPERATOR_FUNCTIONS.includes(n) && !sel.INTERNAL_NAMES.includes(n)));
      reach = new Set([...allowed.ALLOWED_MATH_FUNCTIONS, ...allowed.ALLOWED_CONSTANTS, ...sel.OPERATOR_FUNCTIONS, ...sel.INTERNAL_NAMES, ...allowed.LOCKED_FUNCTIONS]);
    } finally {
      await api.unregister();
    }
    const exportsList = selectedExports(readFileSync(FACTORIES, 'utf8'));
    const factories = exportsList.map((e) => ({ exportName: e, f: mathjs[e] }));
    const strip = (d) => d.replace(/^\?/, '');
    const dependents = new Map();
    for (const { f } of factories) for (const d of f.dependencies) dependents.set(strip(d), [...(dependents.get(strip(d)) ?? []), f.fn]);
    const fns = new Set(factories.map(({ f }) => f.fn));
    const deferred = new Set(ENTRIES);
    for (let changed = true; changed; ) {
      changed = false;
      for (const name of [...deferred]) {
        for (const { f } of factories.filter(({ f }) => f.fn === name)) {
          for (const d of f.dependencies.map(strip)) {
            if (deferred.has(d) || reach.has(d) || !fns.has(d)) continue;
            if ((dependents.get(d) ?? []).every((x) => deferred.has(x))) {
              deferred.add(d);
              changed = true;
            }
          }
        }
      }
    }
    const triggers = new Set([...deferred].filter((n) => reach.has(n)));
    for (const n of deferred) for (const x of dependents.get(n) ?? []) if (!deferred.has(x)) triggers.add(x);
    const bad = [...triggers].filter((t) => !named.has(t));
    if (bad.length > 0) throw new Error(`deferred mathjs factories are reached through ${bad.join(', ')}, which formulas do not call by name`);
    const chosen = factories.filter(({ f }) => deferred.has(f.fn));
    if (chosen.some(({ f }) => f.meta?.isTransformFunction)) throw new Error('a deferred mathjs factory is a transform');
    return { exports: chosen.map((c) => c.exportName), entries: chosen.map(({ exportName, f }) => ({ exportName, fn: f.fn, meta: f.meta })), triggers: [...triggers].sort() };
  })();
  return planned;
}

/** mathFactories.ts with stand-ins for the deferred factories (imports of them removed). */
export function withDeferredFactories(code, plan) {
  const meta = new Map(plan.entries.map((e) => [e.exportName, e]));
  const importEnd = code.indexOf("} from 'mathjs';");
  const tableStart = code.indexOf('export const MATH_FACTORIES');
  if (importEnd < 0 || tableStart < 0) throw new Error(`${FACTORIES}: cannot find the import of mathjs or MATH_FACTORIES`);
  const lines = code.split('\n');
  let at = 0;
  const out = lines.map((line) => {
    const start = at;
    at += line.length + 1;
    const m = /^ {2}(create\w+),$/.exec(line);
    if (!m || !meta.has(m[1])) return line;
    const e = meta.get(m[1]);
    if (start < importEnd) return '';
    if (start > tableStart) return `  ${e.exportName}: deferredMathFactory(${JSON.stringify(e.fn)}, ${JSON.stringify(e.meta)}),`;
    return line;
  });
  return `import { deferredMathFactory } from ${JSON.stringify(RUNTIME)};\n${out.join('\n')}`;
}

/** @returns {import('vite').Plugin} */
export function deferredMathInApp() {
  let lazy = false;
  return {
    name: 'strainsheet-deferred-math-in-app',
    enforce: 'pre',
    config(_config, env) {
      lazy = loadsLazily(env);
    },
    resolveId(source) {
      return source === VIRTUAL ? RESOLVED : null;
    },
    async load(id) {
      if (id !== RESOLVED) return null;
      const plan = await deferredMathPlan();
      return `import { ${plan.exports.join(', ')} } from 'mathjs';\nexport default { ${plan.exports.join(', ')} };\n`;
    },
    async transform(code, id) {
      if (!lazy || id !== FACTORIES) return null;
      return { code: withDeferredFactories(code, await deferredMathPlan()), map: null };
    },
  };
}
