// The built-ins in the app, each file of src/builtins a group loaded on demand. In the app's build
// and development server:
//  - `virtual:builtin-groups` gives `builtinGroups` (web/engine/lazyBuiltins.ts): every built-in's
//    name, in the order of allBuiltins(), read at build time from each file of src/builtins listed
//    in src/builtins/index.ts (loaded through tsx), and for each file a loader that imports it as a
//    chunk of its own;
//  - src/builtins/index.ts becomes `allBuiltins()` of those names with functions that forward to
//    the loaded groups, so the engine chunk the page and its workers start with carries no
//    built-in code; whoever evaluates formulas awaits the groups they name first. One more group
//    holds no built-ins but mathjs's functions loaded later (scripts/deferredMathInApp.mjs),
//    which formulas reach through their names and a few operators.
// The command line and the tests use src/builtins/index.ts as written; under vitest's module
// runner `virtual:builtin-groups` has no groups (every built-in is there already).
import { readFileSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { deferredMathPlan } from './deferredMathInApp.mjs';
import { loadsLazily } from './lazyInApp.mjs';

const VIRTUAL = 'virtual:builtin-groups';
const FIRST = 'virtual:demo-first-builtins';
const FIRST_RESOLVED = '\0virtual:demo-first-builtins';
const RESOLVED = '\0virtual:builtin-groups';
const INDEX = fileURLToPath(new URL('../src/builtins/index.ts', import.meta.url));
const BUILTINS_DIR = fileURLToPath(new URL('../src/builtins/', import.meta.url));
const RUNTIME = fileURLToPath(new URL('../web/engine/lazyBuiltins.ts', import.meta.url));
const DEFERRED_MATH = fileURLToPath(new URL('../web/engine/deferredMath.ts', import.meta.url));
const DEMO = fileURLToPath(new URL('../examples/demo.json', import.meta.url));
const MATH_INSTANCE = fileURLToPath(new URL('../src/sheet/mathInstance.ts', import.meta.url));

/** The groups of src/builtins/index.ts: [{ exportName, file }] in the order allBuiltins() spreads them. */
export function groupsOfIndex(text) {
  const fileOf = new Map();
  for (const m of text.matchAll(/^import \{ (\w+) \} from '\.\/(\w+)';$/gm)) fileOf.set(m[1], m[2]);
  const body = /export function allBuiltins\(\)[^{]*\{([\s\S]*?)\n\}/.exec(text);
  if (!body) throw new Error(`${INDEX}: cannot find allBuiltins()`);
  const order = [...body[1].matchAll(/\.\.\.(\w+),/g)].map((m) => m[1]);
  if (order.length !== fileOf.size || order.some((e) => !fileOf.has(e))) {
    throw new Error(`${INDEX}: allBuiltins() must spread exactly the lists imported as "import { xBuiltins } from './x';"`);
  }
  return order.map((exportName) => ({ exportName, file: fileOf.get(exportName) }));
}

/**
 * The files of the groups the demo's first result (A_yr, the page's FIRST_RESULTS) needs: those
 * named by the formulas of A_yr and of the cells it reads, directly or not (names found as the
 * app finds them, web/engine/lazyBuiltins.ts). `namesOf(file)` gives a group's built-in names.
 */
export function demoFirstGroups(demoText, groups, namesOf) {
  const formulas = new Map(JSON.parse(demoText).cells.map((c) => [c.name, c.formula]));
  const ids = new Set();
  const stack = ['A_yr'];
  const seen = new Set();
  while (stack.length > 0) {
    const n = stack.pop();
    if (seen.has(n) || !formulas.has(n)) continue;
    seen.add(n);
    for (const id of formulas.get(n).match(/[A-Za-z_$][\w$]*/g) ?? []) {
      ids.add(id);
      if (formulas.has(id)) stack.push(id);
    }
  }
  return groups.filter(({ file }) => namesOf(file).some((name) => ids.has(name))).map(({ file }) => file);
}

let namesRead;

/** Built-in names of each group file (read once per process, through tsx). */
function groupNames(index) {
  namesRead ??= (async () => {
    const { register } = await import('tsx/esm/api');
    const api = register({ namespace: `strainsheet-builtin-groups-${Date.now()}` });
    const out = new Map();
    try {
      for (const { exportName, file } of index) {
        const mod = await api.import(pathToFileURL(`${BUILTINS_DIR}${file}.ts`).href, import.meta.url);
        out.set(file, mod[exportName].map((b) => b.name));
      }
    } finally {
      await api.unregister();
    }
    return out;
  })();
  return namesRead;
}

/** @returns {import('vite').Plugin} */
export function builtinGroupsInApp() {
  let lazy = false;
  return {
    name: 'strainsheet-builtin-groups-in-app',
    enforce: 'pre',
    config(_config, env) {
      lazy = loadsLazily(env);
    },
    resolveId(source) {
      if (source === FIRST) return FIRST_RESOLVED;
      return source === VIRTUAL ? RESOLVED : null;
    },
    // The page starts on the demo: its data is fetched with the page's scripts (a preload link), not
    // after they have run.
    transformIndexHtml: {
      order: 'post',
      handler(html, ctx) {
        if (!lazy || !ctx.bundle) return html;
        // The demo sheet's data, which web/app/demoSheet.ts fetches when there is no autosave.
        const demoAsset = Object.values(ctx.bundle).find((o) => o.type === 'asset' && /(^|\/)demo-[^/]*\.json$/.test(o.fileName));
        if (!demoAsset) return html;
        return html.replace('</head>', `    <link rel="preload" as="fetch" crossorigin href="./${demoAsset.fileName}">\n  </head>`);
      },
    },
    async load(id) {
      if (id === FIRST_RESOLVED) {
        // The groups the demo's first result needs, imported by the page itself (not by the
        // engine, which the workers share): the page starts on the demo, and loading them apart
        // would only add requests before its first result.
        if (!lazy) return 'export const firstBuiltins = [];\n';
        const index = groupsOfIndex(readFileSync(INDEX, 'utf8'));
        const names = await groupNames(index);
        let first = [];
        try {
          first = demoFirstGroups(readFileSync(DEMO, 'utf8'), index, (f) => names.get(f) ?? []);
        } catch {
          // no demo in this build (web/app/demoSheet.ts says so)
        }
        const chosen = index.filter((g) => first.includes(g.file));
        return (
          chosen.map((g, i) => `import { ${g.exportName} as g${i} } from ${JSON.stringify(`${BUILTINS_DIR}${g.file}.ts`)};\n`).join('') +
          `export const firstBuiltins = [${chosen.map((g, i) => `[${JSON.stringify(g.file)}, g${i}]`).join(', ')}];\n`
        );
      }
      if (lazy && id === INDEX) return `export { allBuiltins } from '${VIRTUAL}';\n`;
      if (id !== RESOLVED) return null;
      const head = `import { LazyBuiltins } from ${JSON.stringify(RUNTIME)};\n`;
      if (!lazy) return `${head}export const builtinGroups = new LazyBuiltins([]);\nexport const demoFirstGroups = [];\n`;
      this.addWatchFile(INDEX);
      const index = groupsOfIndex(readFileSync(INDEX, 'utf8'));
      for (const { file } of index) this.addWatchFile(`${BUILTINS_DIR}${file}.ts`);
      const namesByFile = await groupNames(index);
      let first = [];
      try {
        first = demoFirstGroups(readFileSync(DEMO, 'utf8'), index, (f) => namesByFile.get(f) ?? []);
      } catch {
        // no demo in this build (web/app/demoSheet.ts says so)
      }
      const groups = index.map(({ exportName, file }) => {
        const path = JSON.stringify(`${BUILTINS_DIR}${file}.ts`);
        return `  { group: ${JSON.stringify(file)}, names: ${JSON.stringify(namesByFile.get(file))}, load: () => import(${path}).then((m) => m.${exportName}) },`;
      });
      // mathjs's functions deferred by scripts/deferredMathInApp.mjs: one more group, of no built-ins.
      const { triggers, symbols } = await deferredMathPlan();
      groups.push(
        `  { group: 'mathjs functions', names: [], triggers: ${JSON.stringify(triggers)}, symbols: ${JSON.stringify(symbols)}, load: () => loadDeferredMath(math).then(() => []) },`,
      );
      const imports = `import { loadDeferredMath } from ${JSON.stringify(DEFERRED_MATH)};\nimport { math } from ${JSON.stringify(MATH_INSTANCE)};\n`;
      return (
        `${head}${imports}export const builtinGroups = new LazyBuiltins([\n${groups.join('\n')}\n]);\n` +
        `export const allBuiltins = () => builtinGroups.allBuiltins();\n` +
        `/** The groups the demo's first result needs (in the page's own chunks: virtual:demo-first-builtins). */\n` +
        `export const demoFirstGroups = ${JSON.stringify(first)};\n`
      );
    },
  };
}
