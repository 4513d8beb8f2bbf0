// Markdown to HTML for the shipped docs pages, with markdown-it (pinned; DEVELOPERS.md says why).
// Safety: raw HTML in the text is escaped, never passed through (html: false), and markdown-it's
// link check refuses javascript:, vbscript:, file: and data: addresses (other than images).
// Headings get ids so that "page.md#heading" links land on them.
import MarkdownIt from 'markdown-it';
import { headingSlug, splitDocReferences } from './docReferences';

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

// A page's plain-text references to other pages ("see docs/orbits.md") become links, as in the
// app's notes (not inside links or code, which are other token kinds).
md.core.ruler.push('doc_references', (state) => {
  const pages = (state.env as { pages?: readonly string[] }).pages ?? [];
  for (const block of state.tokens) {
    if (block.type !== 'inline' || !block.children) continue;
    const out: typeof block.children = [];
    let inLink = 0;
    for (const tok of block.children) {
      if (tok.type === 'link_open') inLink++;
      if (tok.type === 'link_close') inLink--;
      const parts = tok.type === 'text' && !inLink ? splitDocReferences(tok.content, pages) : [];
      if (!parts.some((p) => p.page)) {
        out.push(tok);
        continue;
      }
      for (const part of parts) {
        const text = new state.Token('text', '', 0);
        text.content = part.text;
        if (!part.page) {
          out.push(text);
          continue;
        }
        const open = new state.Token('link_open', 'a', 1);
        open.attrSet('href', `${part.page}.md${part.anchor ? `#${part.anchor}` : ''}`);
        out.push(open, text, new state.Token('link_close', 'a', -1));
      }
    }
    block.children = out;
  }
});

/**
 * The page as HTML (safe to put into the page: no markup of the text's own survives); plain-text
 * references to the shipped `pages` become links.
 */
export function markdownToHtml(text: string, pages: readonly string[] = []): string {
  return md.render(text, { pages });
}
