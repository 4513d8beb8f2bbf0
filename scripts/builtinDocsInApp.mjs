// The built-ins' documentation in the app, loaded when help first needs it. In the app's build and
// development server:
//  - the files of src/builtins lose the documentation fields of each built-in (category, summary,
//    args, returns, source, example: all but name and fn, which the engine uses), so the engine
//    chunk the page and its workers start with carries the built-ins' code only;
//  - `import('virtual:builtin-docs')` gives those fields of every built-in, read at build time
//    from allBuiltins() (src/builtins/index.ts, loaded through tsx), as a chunk of its own that
//    web/help/builtinDocs.ts loads on first use.
// The command line and the tests use the built-ins as written (vitest's own transforms skip this).
import { fileURLToPath, pathToFileURL } from 'node:url';
import { parseSync } from 'vite';

const DOC_FIELDS = new Set(['category', 'summary', 'args', 'returns', 'source', 'example']);
const BUILTIN_FILE = /\/src\/builtins\/[^/?]+\.ts$/;
const VIRTUAL = 'virtual:builtin-docs';
const RESOLVED = '\0virtual:builtin-docs';

function keyName(prop) {
  if (prop.type !== 'Property' || prop.computed) return undefined;
  if (prop.key.type === 'Identifier') return prop.key.name;
  if (prop.key.type === 'Literal' && typeof prop.key.value === 'string') return prop.key.value;
  return undefined;
}

/** Every object literal with name, fn and summary (a built-in's definition) in an ESTree tree. */
function builtinObjects(node, out = []) {
  if (Array.isArray(node)) {
    for (const n of node) builtinObjects(n, out);
    return out;
  }
  if (!node || typeof node !== 'object') return out;
  if (node.type === 'ObjectExpression') {
    const keys = new Set(node.properties.map(keyName));
    if (keys.has('name') && keys.has('fn') && keys.has('summary')) out.push(node);
  }
  for (const [k, v] of Object.entries(node)) if (k !== 'parent' && v && typeof v === 'object') builtinObjects(v, out);
  return out;
}

/**
 * The source with the documentation fields of each built-in blanked out: replaced by spaces (line
 * breaks kept), property and following comma, so every other character keeps its line and column
 * and no source map is needed.
 */
export function withoutBuiltinDocs(code, file) {
  const { program, errors } = parseSync(file, code);
  if (errors.length > 0) throw new Error(`${file}: cannot read it to leave out the built-ins' documentation: ${errors[0].message}`);
  const ranges = [];
  for (const obj of builtinObjects(program)) {
    for (const prop of obj.properties) {
      if (!DOC_FIELDS.has(keyName(prop))) continue;
      let end = prop.end;
      const after = /^\s*,/.exec(code.slice(end));
      if (after) end += after[0].length;
      ranges.push([prop.start, end]);
    }
  }
  if (ranges.length === 0) return null;
  let out = '';
  let at = 0;
  for (const [start, end] of ranges.sort((a, b) => a[0] - b[0])) {
    out += code.slice(at, start) + code.slice(start, end).replace(/[^\n]/g, ' ');
    at = end;
  }
  return out + code.slice(at);
}

/** @returns {import('vite').Plugin} */
export function builtinDocsInApp() {
  return {
    name: 'strainsheet-builtin-docs-in-app',
    enforce: 'pre',
    // The app's build (also when a test builds it) and development server; not vitest's module runner.
    apply: (_config, env) => env.command === 'build' || env.mode !== 'test',
    resolveId(source) {
      return source === VIRTUAL ? RESOLVED : null;
    },
    async load(id) {
      if (id !== RESOLVED) return null;
      const { tsImport } = await import('tsx/esm/api');
      const index = fileURLToPath(new URL('../src/builtins/index.ts', import.meta.url));
      this.addWatchFile(index);
      const { allBuiltins } = await tsImport(pathToFileURL(index).href, import.meta.url);
      const docs = allBuiltins().map(({ fn: _fn, ...doc }) => doc);
      return `export default ${JSON.stringify(docs)};`;
    },
    transform(code, id) {
      if (!BUILTIN_FILE.test(id)) return null;
      const stripped = withoutBuiltinDocs(code, id);
      return stripped === null ? null : { code: stripped, map: null };
    },
  };
}
