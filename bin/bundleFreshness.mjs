// Shared by the command-line entries: a bundle under dist-cli/ is used only when it is newer than every
// file of the source folders it was built from, so a run never uses stale code.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));

function newestSourceMtime(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = `${dir}/${entry.name}`;
    const t = entry.isDirectory() ? newestSourceMtime(path) : statSync(path).mtimeMs;
    if (t > newest) newest = t;
  }
  return newest;
}

/** The bundle's path when it exists and is fresh against sourceDirs (relative to the project), else null. */
export function freshBundle(bundleName, sourceDirs) {
  const bundle = `${root}dist-cli/${bundleName}`;
  if (!existsSync(bundle)) return null;
  const newest = Math.max(...sourceDirs.map((d) => newestSourceMtime(`${root}${d}`)));
  return statSync(bundle).mtimeMs >= newest ? bundle : null;
}
