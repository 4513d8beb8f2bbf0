import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';
import solid from 'vite-plugin-solid';
import type { Plugin } from 'vite';
import { sharedWorkerEntries } from './scripts/sharedWorkerEntries.mjs';
import { builtinDocsInApp } from './scripts/builtinDocsInApp.mjs';
import { builtinGroupsInApp, groupsOfIndex } from './scripts/builtinGroupsInApp.mjs';
import { deferredMathInApp } from './scripts/deferredMathInApp.mjs';
import { mathjsWithoutLatex } from './scripts/mathjsWithoutLatex.mjs';

const projectRoot = fileURLToPath(new URL('.', import.meta.url));
/** The files of src/builtins that are groups of built-ins (listed in its index.ts). */
const BUILTIN_GROUPS = new Set(groupsOfIndex(readFileSync(new URL('./src/builtins/index.ts', import.meta.url), 'utf8')).map((g) => g.file));

// The Content-Security-Policy in web/index.html is the production one. The development server's
// hot reload talks over a WebSocket, so only `vite` (serve) widens connect-src with ws: and wss:.
const devServerWebSockets: Plugin = {
  name: 'strainsheet-dev-websockets',
  apply: 'serve',
  transformIndexHtml: (html) => html.replace("connect-src 'self'", "connect-src 'self' ws: wss:"),
};

/**
 * Names of the chunks shared by the page and its workers (their automatic names come from whichever
 * module happens to come first): the mathjs library and the sheet engine, so that the bundle budget
 * (test/bundle/budget.json) can name them.
 */
function sharedChunkName(chunk: { name: string; moduleIds: string[]; facadeModuleId: string | null }): string {
  const has = (part: string) => chunk.moduleIds.some((id) => id.includes(part));
  // A group of built-ins loaded on demand (scripts/builtinGroupsInApp.mjs), apart from the docs pages of the same names.
  if (chunk.name === 'demoFirstBuiltins') return chunk.name;
  const group = chunk.moduleIds.map((id) => /\/src\/builtins\/(\w+)\.ts$/.exec(id)?.[1]).find((f) => f !== undefined && BUILTIN_GROUPS.has(f));
  if (group) return `builtinGroup-${group}`;
  if (chunk.facadeModuleId === '\0virtual:deferred-math') return 'mathjsDeferred';
  if (has('/node_modules/mathjs/')) return 'mathjs';
  if (has('/src/sheet/sheet.ts')) return 'sheetEngine';
  if (has('/node_modules/workerpool/')) return 'jobRuntime';
  if (has('virtual:builtin-docs')) return 'builtinDocs';
  return chunk.name;
}

/**
 * Vite's preloading of a dynamic import's chunks uses the document, which workers lack; the
 * engine's chunks, shared with the workers, import the groups of built-ins and mathjs's solvers.
 * In a worker (no document) the helper imports without preloading.
 */
const preloadInWorkers: Plugin = {
  name: 'strainsheet-preload-in-workers',
  apply: 'build',
  transform(code, id) {
    if (id !== '\0vite/preload-helper.js') return null;
    const guarded = code.replace('deps && deps.length > 0', "deps && deps.length > 0 && typeof document !== 'undefined'").replace('window.dispatchEvent(e);', "if (typeof window !== 'undefined') window.dispatchEvent(e);");
    if (guarded === code || !guarded.includes("typeof window !== 'undefined'")) throw new Error("Vite's preload helper has changed: cannot make it work in workers");
    return { code: guarded, map: null };
  },
};

/**
 * The sheet engine and the validator of its files, with the small modules the page and every
 * worker load with it (the built-ins' names and loaders, the physical constants, Vite's preload
 * helper), which would otherwise be chunks of their own, one request each.
 */
const ENGINE_MODULES =
  /\/src\/sheet\/|\/node_modules\/zod\/|\/web\/engine\/(lazyBuiltins|builtinsNeeded|deferredMath)\.ts$|virtual:builtin-groups$|\/src\/builtins\/index\.ts$|\/src\/physics\/constants\.ts$|vite\/preload-helper/;
/** Small modules of the page's start that panels loaded later import too (otherwise a chunk each). */
const PAGE_PARTS = /\/web\/(sheet\/(rowAnnotations\.ts|AnnotationBadges\.tsx)|plots\/matchingCells\.ts|help\/(LinkedText|BuiltinSignature)\.tsx|help\/(docPages|docReferences)\.ts|engine\/engine\.ts|files\/(download|csvText)\.ts)$/;

/** The Web Workers' entries (scripts/sharedWorkerEntries.mjs). */
const WORKER_ENTRIES = ['web/jobs/jobWorker.ts', 'web/jobs/chunkWebWorker.ts', 'web/engine/offPageWorker.ts'].map((f) => fileURLToPath(new URL(f, import.meta.url)));

/**
 * The groups of built-ins the demo's first result needs (imported by the page through
 * virtual:demo-first-builtins) and the modules of src/ they import, in one chunk instead of one
 * per file: all but those a worker imports at its start (which stay in chunks of their own, so
 * the workers do not load the rest) and those of the engine's chunk.
 */
function demoFirstBuiltins(id: string, ctx: { getModuleInfo(id: string): { importedIds: readonly string[] } | null }): string | null {
  const closure = (starts: readonly string[]) => {
    const seen = new Set<string>();
    const stack = [...starts];
    while (stack.length > 0) {
      const m = stack.pop()!;
      if (seen.has(m) || m.includes('/node_modules/') || ENGINE_MODULES.test(m)) continue;
      seen.add(m);
      stack.push(...(ctx.getModuleInfo(m)?.importedIds ?? []));
    }
    return seen;
  };
  const first = closure(ctx.getModuleInfo('\0virtual:demo-first-builtins')?.importedIds ?? []);
  if (!first.has(id)) return null;
  return closure(WORKER_ENTRIES).has(id) ? null : 'demoFirstBuiltins';
}

// The Vite root is web/ (the app); tests and benchmarks are found from the project root.
export default defineConfig({
  root: 'web',
  base: './',
  plugins: [solid(), devServerWebSockets, preloadInWorkers, sharedWorkerEntries(), builtinDocsInApp(), builtinGroupsInApp(), deferredMathInApp(), mathjsWithoutLatex()],
  server: { port: 5173, strictPort: false },
  build: {
    outDir: '../dist',
    emptyOutDir: true,
    target: 'es2022',
    rolldownOptions: {
      output: {
        chunkFileNames: (chunk) => `assets/${sharedChunkName(chunk)}-[hash].js`,
        // The engine in a chunk of its own (not merged with mathjs's, whose solvers load later).
        codeSplitting: {
          groups: [
            { name: 'sheetEngine', test: ENGINE_MODULES, includeDependenciesRecursively: false },
            { name: 'pageParts', test: PAGE_PARTS, includeDependenciesRecursively: false },
            { name: demoFirstBuiltins, test: /\/src\/(builtins|physics|statistics)\//, includeDependenciesRecursively: false },
          ],
        },
      },
    },
  },
  worker: { format: 'es' },
  test: {
    root: projectRoot,
    environment: 'node',
    include: ['test/**/*.test.ts'],
    testTimeout: 30_000,
    reporters: ['default', './test/support/summaryReporter.ts'],
    benchmark: { include: ['bench/**/*.bench.ts'] },
  },
});
