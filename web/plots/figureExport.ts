// The page's figure exports at a chosen size: SVG (the figure writer's text), PDF (that SVG through
// jsPDF and svg2pdf.js, font embedded) and PNG at 300 dpi (that SVG drawn onto a canvas), so the
// three files are one figure. The PDF code and the font load only when a PDF is asked for.
import type { PlotModel } from './plotModel';
import { plotFigure } from './svgWriter';
import { FIGURE_SIZES, PNG_DPI, type FigureSizeId } from './figureSizes';
import { withDensity } from './pngDensity';

export function figureSvg(model: PlotModel, size: FigureSizeId): string {
  return plotFigure(model, { size }).svg;
}

let fontBase64: Promise<string> | null = null;

async function embeddedFont(): Promise<string> {
  fontBase64 ??= (async () => {
    const { default: url } = await import('dejavu-fonts-ttf/ttf/DejaVuSans.ttf?url');
    const res = await fetch(url);
    if (!res.ok) throw new Error(`the figure font could not be loaded (${res.status})`);
    const { toBase64 } = await import('./pdfWriter');
    return toBase64(new Uint8Array(await res.arrayBuffer()));
  })();
  try {
    return await fontBase64;
  } catch (err) {
    fontBase64 = null;
    throw err;
  }
}

export async function figurePdf(model: PlotModel, size: FigureSizeId): Promise<Blob> {
  const { svg, layout } = plotFigure(model, { size });
  const el = new DOMParser().parseFromString(svg, 'image/svg+xml').documentElement;
  const { svgElementToPdf } = await import('./pdfWriter');
  const bytes = await svgElementToPdf(el, layout.width, layout.height, await embeddedFont(), model.title);
  return new Blob([bytes as BlobPart], { type: 'application/pdf' });
}

/** The figure as PNG at PNG_DPI: its width in pixels is the size's width in inches times 300. */
export async function figurePng(model: PlotModel, size: FigureSizeId): Promise<Blob> {
  const { svg, layout } = plotFigure(model, { size });
  const scale = PNG_DPI / 72;
  const w = Math.round(FIGURE_SIZES[size].widthIn * PNG_DPI);
  const h = Math.round(layout.height * scale);
  const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
  try {
    const img = new Image(w, h);
    img.src = url;
    await img.decode();
    const canvas = document.createElement('canvas');
    canvas.width = w;
    canvas.height = h;
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('the browser gave no 2D canvas');
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, w, h);
    ctx.drawImage(img, 0, 0, w, h);
    const blob = await new Promise<Blob>((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('The browser could not encode the PNG'))), 'image/png'));
    return new Blob([withDensity(new Uint8Array(await blob.arrayBuffer()), PNG_DPI) as BlobPart], { type: 'image/png' });
  } finally {
    URL.revokeObjectURL(url);
  }
}
