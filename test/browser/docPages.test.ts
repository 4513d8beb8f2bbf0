// The docs pages shipped with the app, in node: Markdown rendered safely, references to pages found
// in text, links between pages resolved, and every page a sheet names shipped.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { markdownToHtml } from '../../web/help/markdownPage';
import { docLinkTarget, headingSlug, splitDocReferences } from '../../web/help/docReferences';
import { PROJECT_ROOT } from './appServer';

const PAGES = readdirSync(join(PROJECT_ROOT, 'docs'))
  .filter((f) => f.endsWith('.md'))
  .map((f) => f.replace(/\.md$/, ''));

describe('Markdown of the docs pages (markdown-it documentation, "Safety": html disabled, unsafe links refused)', () => {
  it('escapes raw HTML instead of passing it through', () => {
    const html = markdownToHtml('Text <script>alert(1)</script> and <img src=x onerror="alert(2)">\n\n<iframe src="x"></iframe>');
    expect(html).not.toMatch(/<script|<img|<iframe/i);
    expect(html).toContain('&lt;script&gt;');
  });
  it('refuses javascript:, vbscript: and data: links (no anchor is made)', () => {
    for (const href of ['javascript:alert(1)', 'vbscript:msgbox(1)', 'data:text/html;base64,PHNjcmlwdD4=', 'JaVaScRiPt:alert(1)']) {
      expect(markdownToHtml(`[x](${href})`), href).not.toMatch(/<a /);
    }
    expect(markdownToHtml('[page](physics.md)')).toContain('<a href="physics.md">page</a>');
  });
  it('gives headings prefixed ids (markdown-it "Safety": prefix generated ids against DOM clobbering), numbered when repeated', () => {
    const html = markdownToHtml('# The sheet engine\n\n## Formulas and sources\n\n## Formulas and sources');
    expect(html).toContain('<h1 id="doc-the-sheet-engine">');
    expect(html).toContain('<h2 id="doc-formulas-and-sources">');
    expect(html).toContain('<h2 id="doc-formulas-and-sources-1">');
    expect(headingSlug('What this is, and what it is not')).toBe('what-this-is-and-what-it-is-not');
  });
  it('links plain-text references to shipped pages, not those in code or links, nor unknown pages', () => {
    const html = markdownToHtml('See docs/orbits.md#finite-number and docs/nothing.md; `docs/array.md`; [x](docs/physics.md).', PAGES);
    expect(html).toContain('<a href="orbits.md#finite-number">docs/orbits.md#finite-number</a>');
    expect(html).toContain('docs/nothing.md;');
    expect(html).toContain('<code>docs/array.md</code>');
    expect(html).toContain('<a href="docs/physics.md">x</a>');
  });
  it('renders tables and code as the pages use them (GitHub-style tables, fenced code)', () => {
    const html = markdownToHtml('| a | b |\n| --- | --- |\n| 1 | 2 |\n\n```ts\nconst x = 1 < 2;\n```');
    expect(html).toMatch(/<table>[\s\S]*<td>1<\/td>/);
    expect(html).toContain('const x = 1 &lt; 2;');
  });
});

describe('references to docs pages', () => {
  it('finds docs/PAGE.md (and a heading) in text and leaves other files plain', () => {
    expect(splitDocReferences('thresholds in docs/freeSpectrum.md; see README.md and docs/nothing.md', PAGES)).toEqual([
      { text: 'thresholds in ' },
      { text: 'docs/freeSpectrum.md', page: 'freeSpectrum' },
      { text: '; see README.md and docs/nothing.md' },
    ]);
    expect(splitDocReferences('(docs/orbits.md#finite-number)', PAGES)).toEqual([
      { text: '(' },
      { text: 'docs/orbits.md#finite-number', page: 'orbits', anchor: 'finite-number' },
      { text: ')' },
    ]);
    expect(splitDocReferences('', PAGES)).toEqual([{ text: '' }]);
  });
  it('resolves links inside a page to a shipped page or heading, and nothing else', () => {
    expect(docLinkTarget('freeSpectrum.md', 'statistics', PAGES)).toEqual({ page: 'freeSpectrum' });
    expect(docLinkTarget('./array.md#noise', 'statistics', PAGES)).toEqual({ page: 'array', anchor: 'noise' });
    expect(docLinkTarget('#formulas-and-sources', 'physics', PAGES)).toEqual({ page: 'physics', anchor: 'formulas-and-sources' });
    expect(docLinkTarget('../README.md', 'physics', PAGES)).toBeNull();
    expect(docLinkTarget('https://example.org/x.md', 'physics', PAGES)).toBeNull();
  });
  it('every docs page the demo sheet or a built-in names is shipped (a file of docs/)', () => {
    const texts = [readFileSync(join(PROJECT_ROOT, 'examples/demo.json'), 'utf8'), ...readdirSync(join(PROJECT_ROOT, 'src/builtins')).map((f) => readFileSync(join(PROJECT_ROOT, 'src/builtins', f), 'utf8'))];
    const named = new Set(texts.flatMap((t) => [...t.matchAll(/docs\/([A-Za-z0-9_-]+)\.md/g)].map((m) => m[1])));
    expect(named.size).toBeGreaterThan(0);
    for (const page of named) expect(PAGES, page).toContain(page);
  });
});
