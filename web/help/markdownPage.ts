// Markdown to HTML for the shipped docs pages, with markdown-it (pinned; DEVELOPERS.md says why).
// Safety: raw HTML in the text is escaped, never passed through (html: false), and markdown-it's
// link check refuses javascript:, vbscript:, file: and data: addresses (other than images).
// Headings get ids so that "page.md#heading" links land on them.
import MarkdownIt from 'markdown-it';
import { headingSlug } from './docReferences';

/** Heading ids are prefixed so that they never clash with the app's own ids. */
export const DOC_HEADING_PREFIX = 'doc-';

const md = new MarkdownIt({ html: false, linkify: false, typographer: false });

md.core.ruler.push('heading_ids', (state) => {
  const tokens = state.tokens;
  const seen = new Map<string, number>();
  for (let i = 0; i < tokens.length; i++) {
    if (tokens[i].type !== 'heading_open') continue;
    const base = headingSlug(tokens[i + 1]?.content ?? '');
    const n = seen.get(base) ?? 0;
    seen.set(base, n + 1);
    tokens[i].attrSet('id', `${DOC_HEADING_PREFIX}${n ? `${base}-${n}` : base}`);
  }
});

/** The page as HTML (safe to put into the page: no markup of the text's own survives). */
export function markdownToHtml(text: string): string {
  return md.render(text);
}
