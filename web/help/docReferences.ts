// References to docs pages in text the app shows (a cell's note or source, the sheet's notes, a
// built-in's source): "docs/orbits.md" or "docs/orbits.md#some-heading" becomes a link to that page.
// Inside a page, links are relative ("freeSpectrum.md", "./array.md#noise", "#formulas").

export interface TextPart {
  text: string;
  /** Set when the part is a reference to a shipped page. */
  page?: string;
  anchor?: string;
}

const IN_TEXT = /\bdocs\/([A-Za-z][A-Za-z0-9_-]*)\.md(?:#([A-Za-z0-9_-]+))?/g;

/** Splits text into plain parts and references to pages in `pages` (others stay plain text). */
export function splitDocReferences(text: string, pages: readonly string[]): TextPart[] {
  const parts: TextPart[] = [];
  let last = 0;
  for (const m of text.matchAll(IN_TEXT)) {
    if (!pages.includes(m[1])) continue;
    if (m.index > last) parts.push({ text: text.slice(last, m.index) });
    parts.push({ text: m[0], page: m[1], ...(m[2] ? { anchor: m[2] } : {}) });
    last = m.index + m[0].length;
  }
  if (last < text.length || parts.length === 0) parts.push({ text: text.slice(last) });
  return parts;
}

/**
 * Where a link inside a page goes: another shipped page (and heading), a heading of the same page,
 * or null for anything else (an outside address, a file of the repository that is not shipped).
 */
export function docLinkTarget(href: string, current: string, pages: readonly string[]): { page: string; anchor?: string } | null {
  const same = /^#([A-Za-z0-9_-]+)$/.exec(href);
  if (same) return { page: current, anchor: same[1] };
  const m = /^(?:\.\/)?(?:(?:\.\.\/)?docs\/)?([A-Za-z][A-Za-z0-9_-]*)\.md(?:#([A-Za-z0-9_-]+))?$/.exec(href);
  if (!m || !pages.includes(m[1])) return null;
  return m[2] ? { page: m[1], anchor: m[2] } : { page: m[1] };
}

/** The id a heading gets, as the usual Markdown hosts make it: lower case, punctuation dropped, spaces to '-'. */
export function headingSlug(text: string): string {
  return text
    .trim()
    .toLowerCase()
    .replace(/[^\p{L}\p{N}\s_-]/gu, '')
    .replace(/\s/g, '-');
}
