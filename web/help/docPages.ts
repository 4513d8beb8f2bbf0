// The project's docs pages (docs/*.md), shipped with the app: the page names are known at build
// time, and each page's text is its own chunk, loaded the first time it is opened.
const loaders = import.meta.glob('../../docs/*.md', { query: '?raw', import: 'default' }) as Record<string, () => Promise<string>>;

const byName = new Map(Object.entries(loaders).map(([path, load]) => [path.replace(/^.*\//, '').replace(/\.md$/, ''), load]));

/** Names of the shipped pages ("physics" for docs/physics.md), sorted. */
export const DOC_PAGES: readonly string[] = [...byName.keys()].sort();

/** The text of a page, or null when no such page is shipped. */
export async function loadDocPage(name: string): Promise<string | null> {
  const load = byName.get(name);
  return load ? load() : null;
}
