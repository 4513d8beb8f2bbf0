// CSV as RFC 4180 (Shafranovich 2005, IETF RFC 4180): comma separated, CRLF line ends, fields with
// comma, quote or line break quoted, quotes doubled. Text fields that a spreadsheet program would run
// as a formula (leading = or @) get a leading apostrophe (OWASP "CSV Injection" guidance).
import type { PlotModel } from '../plots/plotModel';

export function csvField(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  let text = value;
  if (/^[=@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvLine(fields: (string | number | null | undefined)[]): string {
  return fields.map(csvField).join(',');
}

export function csvDocument(header: string[], rows: (string | number | null | undefined)[][]): string {
  return [csvLine(header), ...rows.map(csvLine)].join('\r\n') + '\r\n';
}

/**
 * The plotted data in long form: one row per point of every series, with the axes' quantities
 * and units in the header. Values are in the axis's stated unit; numbers are shortest round-trip.
 */
export function plotToCsv(model: PlotModel): string {
  const xf = model.x.displayFactor ?? 1;
  const yf = model.y.displayFactor ?? 1;
  const header = ['series', model.x.label, model.y.label, `${model.y.label} lower`, `${model.y.label} upper`];
  const rows: (string | number | null)[][] = [];
  for (const s of model.series) {
    for (let i = 0; i < s.x.length; i++) {
      const y = s.y[i];
      const lo = s.yLow?.[i];
      const hi = s.yHigh?.[i];
      rows.push([
        s.label,
        s.x[i] * xf,
        y === undefined ? null : y * yf,
        lo === undefined ? null : lo * yf,
        hi === undefined ? null : hi * yf,
      ]);
    }
  }
  if (model.heatmap) {
    const h = model.heatmap;
    header.push(h.label);
    for (const r of rows) r.push(null);
    for (let j = 0; j < h.y.length; j++) {
      for (let i = 0; i < h.x.length; i++) rows.push(['map', h.x[i] * xf, h.y[j] * yf, null, null, h.z[i + h.x.length * j]]);
    }
  }
  return csvDocument(header, rows);
}
