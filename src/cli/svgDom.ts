// A DOM stand-in for svg2pdf.js in node (linkedom): parses the figure's SVG and measures text with
// the embedded font's widths (web/plots/textWidths.ts), since node has no layout engine. The figure
// writer places every text run at an absolute position, so these widths only have to be plausible.
// linkedom is loaded on first use (a static import of this external package would be hoisted to the
// top of the command-line bundle and parsed at every start, about 0.2 s of CPU time).
import { textWidth } from '../../web/plots/figureText';

let installed = false;

/** Parses SVG text into an element svg2pdf.js can draw, installing the stand-in on first use. */
export async function svgElementFromText(svgText: string): Promise<Element> {
  const { DOMParser, parseHTML } = await import('linkedom');
  if (!installed) {
    const blank = () => parseHTML('<!doctype html><html><head></head><body></body></html>');
    const win = blank();
    const g = globalThis as Record<string, unknown>;
    g.window ??= win;
    g.document ??= win.document;
    const doc = g.document as { implementation?: unknown };
    if (!doc.implementation) Object.defineProperty(doc, 'implementation', { value: { createHTMLDocument: () => blank().document } });
    installed = true;
  }
  const root = new DOMParser().parseFromString(svgText, 'image/svg+xml').documentElement as unknown as Element;
  const proto = Object.getPrototypeOf(root) as Record<string, unknown>;
  if (typeof proto.getBBox !== 'function') {
    proto.getBBox = function (this: Element) {
      const size = parseFloat(this.getAttribute('font-size') ?? '') || 16;
      return { x: 0, y: 0, width: textWidth(this.textContent ?? '', size), height: size };
    };
  }
  return root;
}
