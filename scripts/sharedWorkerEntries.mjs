// Web Workers that share the page's chunks. `import url from './someWorker.ts?shared-worker-url'`
// gives the URL of a module worker built as one more entry of the app's own build, so the engine
// modules it imports land in chunks that the page and every such worker load from the same files
// (downloaded once, counted once), instead of a copy of the engine in each worker bundle, as Vite
// builds `new Worker(new URL(...))` and `?worker` imports. Start it with
// `new Worker(url, { type: 'module' })`. Such a worker may import only code that never touches the
// page (no DOM, no Solid): its chunks are shared with the page's.
import { basename } from 'node:path';

const SUFFIX = '?shared-worker-url';
const PREFIX = '\0shared-worker-url:';

/** @returns {import('vite').Plugin} */
export function sharedWorkerEntries() {
  let serve = false;
  return {
    name: 'strainsheet-shared-worker-entries',
    enforce: 'pre',
    configResolved(config) {
      serve = config.command === 'serve';
    },
    async resolveId(source, importer) {
      if (!source.endsWith(SUFFIX)) return null;
      const resolved = await this.resolve(source.slice(0, -SUFFIX.length), importer, { skipSelf: true });
      return resolved ? PREFIX + resolved.id : null;
    },
    load(id) {
      if (!id.startsWith(PREFIX)) return null;
      const file = id.slice(PREFIX.length);
      // The development server compiles each module on request: the worker loads its source.
      if (serve) return `export default new URL(${JSON.stringify(`/@fs${file}`)}, import.meta.url).href;`;
      const ref = this.emitFile({ type: 'chunk', id: file, name: basename(file).replace(/\.[^.]+$/, '') });
      return `export default import.meta.ROLLUP_FILE_URL_${ref};`;
    },
  };
}
