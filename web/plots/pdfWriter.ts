// A figure's SVG as a vector PDF (ISO 32000): jsPDF draws the page and svg2pdf.js converts the SVG
// elements; DejaVu Sans is embedded (a TrueType font file in the PDF), so Greek letters, minus signs
// and scripts print as on screen on any machine. Works in the page and, with a DOM stand-in
// (src/cli/svgDom.ts), in node.
import { FONT_NAME } from './textWidths';

/** The PDF's bytes for an <svg> element of width x height points. */
export async function svgElementToPdf(svg: Element, width: number, height: number, fontBase64: string, title: string): Promise<Uint8Array> {
  const { jsPDF } = await import('jspdf');
  // The package's main file is a UMD bundle that finds jsPDF only as a global; its ES build imports it.
  const { svg2pdf } = await import('svg2pdf.js/dist/svg2pdf.es.js');
  const doc = new jsPDF({ unit: 'pt', format: [width, height], orientation: width >= height ? 'landscape' : 'portrait', compress: true });
  doc.addFileToVFS('DejaVuSans.ttf', fontBase64);
  doc.addFont('DejaVuSans.ttf', FONT_NAME, 'normal');
  doc.setFont(FONT_NAME, 'normal');
  doc.setProperties({ title, creator: 'Strainsheet' });
  await svg2pdf(svg, doc, { x: 0, y: 0, width, height });
  return new Uint8Array(doc.output('arraybuffer'));
}

/** Base64 of bytes (for jsPDF's virtual file system), without Buffer or btoa on large strings. */
export function toBase64(bytes: Uint8Array): string {
  const abc = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
  let out = '';
  let i = 0;
  for (; i + 2 < bytes.length; i += 3) {
    const n = (bytes[i] << 16) | (bytes[i + 1] << 8) | bytes[i + 2];
    out += abc[n >> 18] + abc[(n >> 12) & 63] + abc[(n >> 6) & 63] + abc[n & 63];
  }
  if (i < bytes.length) {
    const n = (bytes[i] << 16) | ((bytes[i + 1] ?? 0) << 8);
    out += abc[n >> 18] + abc[(n >> 12) & 63] + (i + 1 < bytes.length ? abc[(n >> 6) & 63] : '=') + '=';
  }
  return out;
}
