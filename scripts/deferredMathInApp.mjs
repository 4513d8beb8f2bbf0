// mathjs's functions that formulas call by name or through a rarely used operator, in the app, in
// a chunk loaded when a formula names one and otherwise after the first results
// (web/engine/deferredMath.ts). In the app's build and development server,
// src/sheet/mathFactories.ts gives stand-ins (same names, so the names formulas may use and the
// locking are unchanged) for the deferred factories, and `virtual:deferred-math` gives the real
// ones. The set is worked out here from mathjs's dependency lists: every factory of the instance
// except the closure, under dependencies (optional ones included), of what the rest needs: the
// functions of the other operators, the constants, the names the parser, units and locking use,
// and the functions the engine and the app call themselves (`math.name` in src/ and web/). So a
// deferred factory is reached only through a function formulas call by name or an operator of
// OPERATOR_TEXT (the `triggers`: names, and `symbols`: text, which make the app load the set
// before evaluating a formula holding one) and through other deferred factories.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { loadsLazily } from './lazyInApp.mjs';

const FACTORIES = fileURLToPath(new URL('../src/sheet/mathFactories.ts', import.meta.url));
const RUNTIME = fileURLToPath(new URL('../web/engine/deferredMath.ts', import.meta.url));
const VIRTUAL = 'virtual:deferred-math';
const RESOLVED = '\0virtual:deferred-math';
/** Where the engine and the app call the instance's functions themselves. */
const CALLERS = ['../src/', '../web/'].map((d) => fileURLToPath(new URL(d, import.meta.url)));

/**
 * Operators whose functions may be deferred, with the text that writes each (mathjs's parse.js:
 * its delimiters and named delimiters). A formula whose text holds one of these may call the
 * function (the app looks for symbols outside double quotes, web/engine/lazyBuiltins.ts).
 */
export const OPERATOR_TEXT = {
  and: ['and'], or: ['or'], xor: ['xor'], not: ['not'], mod: ['mod', '%'], to: ['to', 'in'],
  bitAnd: ['&'], bitOr: ['|'], bitXor: ['^|'], bitNot: ['~'], leftShift: ['<<'], rightArithShift: ['>>'], rightLogShift: ['>>>'],
  factorial: ['!'], nullish: ['??'], ctranspose: ["'"],
};

/** Export names of the factories in mathFactories.ts's MATH_FACTORIES. */
function selectedExports(text) {
  const body = text.slice(text.indexOf('export const MATH_FACTORIES'));
  return [...body.matchAll(/^ {2}(create\w+),$/gm)].map((m) => m[1]);
}

/** Names `math.name` in the .ts/.tsx files under these folders (the engine's and the app's own calls of the instance). */
export function namesCalledIn(dirs) {
  const out = new Set();
  const walk = (dir) => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      const path = join(dir, e.name);
      if (e.isDirectory()) walk(path);
      else if (/\.tsx?$/.test(e.name)) for (const m of readFileSync(path, 'utf8').matchAll(/\bmath\.(\w+)/g)) out.add(m[1]);
    }
  };
  for (const d of dirs) walk(d);
  return out;
}

/**
 * The deferred set, from the factories ({ exportName, f } with mathjs's fn, dependencies and
 * meta), the names formulas call by name (`named`) and the names the rest needs (`kept`):
 * every factory outside the closure of `kept` under dependencies (optional ones included), with
 * the names (`triggers`) and operator text (`symbols`) through which formulas reach it.
 */
export function deferredSet(factories, named, kept) {
  const words = (n) => [n, ...(OPERATOR_TEXT[n] ?? []).filter((t) => /^\w+$/.test(t))];
  const strip = (d) => d.replace(/^\?/, '');
  const dependencies = new Map();
  for (const { f } of factories) dependencies.set(f.fn, [...(dependencies.get(f.fn) ?? []), ...f.dependencies.map(strip)]);
  const eager = new Set();
  const stack = [...dependencies.keys()].filter((n) => kept.has(n));
  while (stack.length > 0) {
    const n = stack.pop();
    if (eager.has(n) || !dependencies.has(n)) continue;
    eager.add(n);
    stack.push(...dependencies.get(n));
  }
  const deferred = new Set([...dependencies.keys()].filter((n) => !eager.has(n)));
  // By construction nothing kept depends on a deferred factory: the set is reached through the
  // deferred functions formulas call by name and the deferred operators.
  const triggers = [...new Set([...deferred].flatMap((n) => (named.has(n) || n in OPERATOR_TEXT ? words(n) : [])))].sort();
  const symbols = [...new Set([...deferred].flatMap((n) => (OPERATOR_TEXT[n] ?? []).filter((t) => !/^\w+$/.test(t))))].sort();
  return { deferred, triggers, symbols };
}

let planned;

/** { exports: factory export names deferred, entries: their names and metas, triggers, symbols } (worked out once per process). */
export async function deferredMathPlan() {
  planned ??= (async () => {
    const mathjs = await import('mathjs');
    const { register } = await import('tsx/esm/api');
    const api = register({ namespace: `strainsheet-deferred-math-${Date.now()}` });
    let named;
    let kept;
    try {
      const sel = await api.import(pathToFileURL(fileURLToPath(new URL('./mathFactorySelection.ts', import.meta.url))).href, import.meta.url);
      const allowed = await api.import(pathToFileURL(fileURLToPath(new URL('../src/sheet/allowedFunctions.ts', import.meta.url))).href, import.meta.url);
      named = new Set([...allowed.ALLOWED_MATH_FUNCTIONS].filter((n) => !sel.OPERATOR_FUNCTIONS.includes(n) && !sel.INTERNAL_NAMES.includes(n)));
      const reach = [...allowed.ALLOWED_MATH_FUNCTIONS, ...allowed.ALLOWED_CONSTANTS, ...sel.OPERATOR_FUNCTIONS, ...sel.INTERNAL_NAMES, ...allowed.LOCKED_FUNCTIONS];
      kept = new Set([...reach.filter((n) => !named.has(n) && !(n in OPERATOR_TEXT)), ...namesCalledIn(CALLERS)]);
    } finally {
      await api.unregister();
    }
    const exportsList = selectedExports(readFileSync(FACTORIES, 'utf8'));
    const factories = exportsList.map((e) => ({ exportName: e, f: mathjs[e] }));
    const { deferred, triggers, symbols } = deferredSet(factories, named, kept);
    const chosen = factories.filter(({ f }) => deferred.has(f.fn));
    // Which deferred transforms take their arguments unevaluated (mathjs's FunctionNode decides when
    // a formula is compiled, before the set has loaded, so the stand-in must say so too).
    const full = mathjs.create(mathjs.all);
    const rawArgs = (fn) => full.expression.transform[fn]?.rawArgs === true;
    return {
      exports: chosen.map((c) => c.exportName),
      entries: chosen.map(({ exportName, f }) => {
        const transform = f.meta?.isTransformFunction === true;
        return { exportName, fn: f.fn, meta: f.meta, transform, rawArgs: transform && rawArgs(f.fn) };
      }),
      triggers,
      symbols,
    };
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
    if (start > tableStart) return `  ${e.exportName}: deferredMathFactory(${JSON.stringify(e.exportName)}, ${JSON.stringify(e.fn)}, ${e.meta === undefined ? 'undefined' : JSON.stringify(e.meta)}, ${e.rawArgs}),`;
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
