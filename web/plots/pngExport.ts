// PNG export at a chosen size: the plot is drawn again on an off-screen canvas with its own chart,
// so the export does not depend on the size of the window.
import { Chart } from 'chart.js';
import { attachModel, chartConfig } from './chartConfig';
import type { PlotModel } from './plotModel';

export interface PngSize {
  /** Width and height in CSS pixels (layout size: fonts and lines are sized for this). */
  width: number;
  height: number;
  /** Pixels per CSS pixel: the PNG is width*scale by height*scale pixels. */
  scale: number;
}

export const PNG_SIZES: { label: string; size: PngSize }[] = [
  { label: '800 × 500 px', size: { width: 800, height: 500, scale: 1 } },
  { label: '1600 × 1000 px', size: { width: 800, height: 500, scale: 2 } },
  { label: '3200 × 2000 px (print)', size: { width: 800, height: 500, scale: 4 } },
];

export async function plotToPng(model: PlotModel, size: PngSize): Promise<Blob> {
  const holder = document.createElement('div');
  holder.style.cssText = `position:fixed;left:-20000px;top:0;width:${size.width}px;height:${size.height}px;`;
  const canvas = document.createElement('canvas');
  canvas.width = size.width;
  canvas.height = size.height;
  canvas.style.width = `${size.width}px`;
  canvas.style.height = `${size.height}px`;
  holder.appendChild(canvas);
  document.body.appendChild(holder);
  const chart = new Chart(canvas, chartConfig(model, { responsive: false, devicePixelRatio: size.scale }));
  attachModel(chart, model);
  try {
    chart.resize(size.width, size.height);
    chart.update('none');
    return await new Promise<Blob>((resolve, reject) =>
      canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('The browser could not encode the PNG'))), 'image/png'),
    );
  } finally {
    chart.destroy();
    holder.remove();
  }
}
