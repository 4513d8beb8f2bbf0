// Reading a free spectrum from a file (our own layouts; docs/freeSpectrum.md):
//   wide CSV:  header = one bin frequency with a unit per column ("2.26 nHz"), one row per sample;
//   long CSV:  header "f_nHz,value" (or f_Hz, f_uHz, f_per_yr), one row per (bin, sample), bins in
//              increasing frequency;
//   JSON:      {"quantity": "log10_rho", "span_s"?: T, "bins": [{"frequency": "2.26 nHz", "samples": [...]}]}
// '#' lines are comments. Values are log10 rho (s), log10 h_c, rho (s) or h_c, as the caller says.
// Every bad input is refused with the file, line and column; nothing is returned half-read.
// The ES-module build: esbuild cannot follow the UMD build's dynamic requires when bundling the CLI.
import * as jsonc from 'jsonc-parser/lib/esm/main.js';
import { FREE_SPECTRUM_MAX_BINS, FREE_SPECTRUM_MAX_SAMPLES, type FreeSpectrumData } from './freeSpectrum';
import { csvRows, frequencyColumnScale, frequencyWithUnit, ImportError, lineColumnAt, numberCell } from './importText';
import { MAX_ENCODED_SAMPLES, thinSamples } from './sampleEncoding';

export type ImportedQuantity = 'log10_rho' | 'log10_hc' | 'rho' | 'hc';

export interface FreeSpectrumImportOptions {
  quantity?: ImportedQuantity;
  /** Span T in s; default 1/f_1 (bins at k/T). */
  spanS?: number;
  /** Thin samples that exceed the stored limit (by the smallest whole factor); otherwise refuse. */
  thin?: boolean;
}

export interface ImportedFreeSpectrum {
  data: Omit<FreeSpectrumData, 'prior'>;
  /** Thinning factor applied (1: none). */
  thin: number;
  samplesRead: number;
}

interface RawBin {
  f: number;
  values: number[];
  where: { line: number; column: number };
}

function toLog(v: number, q: ImportedQuantity, file: string, line: number, column: number): number {
  if (q === 'rho' || q === 'hc') {
    if (!(v > 0)) throw new ImportError(file, line, column, `${q === 'rho' ? 'rho' : 'h_c'} = ${v}: must be positive to take its log10`);
    return Math.log10(v);
  }
  if (v > 0) {
    throw new ImportError(file, line, column, `${q.replace('_', ' ')} = ${v} is positive (rho above 1 s or h_c above 1): are these ${q === 'log10_rho' ? 'rho' : 'h_c'} values rather than their log10? Say so with the quantity ${q === 'log10_rho' ? 'rho' : 'hc'}`);
  }
  return v;
}

function wideCsv(rows: ReturnType<typeof csvRows>, file: string, q: ImportedQuantity): RawBin[] {
  const head = rows[0];
  const bins: RawBin[] = head.cells.map((c, j) => ({ f: frequencyWithUnit(c, file, head.line, j + 1), values: [], where: { line: head.line, column: j + 1 } }));
  for (const r of rows.slice(1)) {
    if (r.cells.length !== bins.length) throw new ImportError(file, r.line, null, `${r.cells.length} fields; the header has ${bins.length} (ragged row)`);
    r.cells.forEach((c, j) => bins[j].values.push(toLog(numberCell(c, file, r.line, j + 1, `the sample of bin ${j + 1} (${head.cells[j]})`), q, file, r.line, j + 1)));
  }
  return bins;
}

function longCsv(rows: ReturnType<typeof csvRows>, file: string, q: ImportedQuantity, scale: number): RawBin[] {
  const bins: RawBin[] = [];
  for (const r of rows.slice(1)) {
    if (r.cells.length !== 2) throw new ImportError(file, r.line, null, `${r.cells.length} fields; the header has 2 (ragged row)`);
    const f = numberCell(r.cells[0], file, r.line, 1, 'the frequency') * scale;
    if (!(f > 0)) throw new ImportError(file, r.line, 1, `the frequency must be positive, got ${r.cells[0]}`);
    const v = toLog(numberCell(r.cells[1], file, r.line, 2, 'the value'), q, file, r.line, 2);
    const last = bins[bins.length - 1];
    if (last && f === last.f) last.values.push(v);
    else {
      if (last && f < last.f) {
        const seen = bins.some((b) => b.f === f);
        throw new ImportError(file, r.line, 1, seen ? `the bin at ${r.cells[0]} appears again after other bins: keep each bin's rows together` : `frequencies must increase from bin to bin: ${r.cells[0]} follows a higher one`);
      }
      bins.push({ f, values: [v], where: { line: r.line, column: 1 } });
    }
  }
  return bins;
}

function jsonBins(text: string, file: string, q0: ImportedQuantity): { bins: RawBin[]; quantity: ImportedQuantity; spanS?: number } {
  const errors: jsonc.ParseError[] = [];
  const tree = jsonc.parseTree(text, errors, { disallowComments: true, allowTrailingComma: false });
  if (errors.length || !tree) {
    const e = errors[0];
    const at = lineColumnAt(text, e ? e.offset : 0);
    throw new ImportError(file, at.line, at.column, `not valid JSON: ${e ? jsonc.printParseErrorCode(e.error) : 'empty'}`);
  }
  const fail = (node: jsonc.Node | undefined, msg: string): never => {
    const at = lineColumnAt(text, node ? node.offset : 0);
    throw new ImportError(file, at.line, at.column, msg);
  };
  if (tree.type !== 'object') fail(tree, 'expected an object with "bins"');
  const qNode = jsonc.findNodeAtLocation(tree, ['quantity']);
  let quantity = q0;
  if (qNode) {
    if (!['log10_rho', 'log10_hc', 'rho', 'hc'].includes(qNode.value)) fail(qNode, `"quantity" must be log10_rho, log10_hc, rho or hc, got ${JSON.stringify(qNode.value)}`);
    quantity = qNode.value;
  }
  const spanNode = jsonc.findNodeAtLocation(tree, ['span_s']);
  if (spanNode && !(typeof spanNode.value === 'number' && spanNode.value > 0)) fail(spanNode, '"span_s" must be a positive number of seconds');
  const binsNode = jsonc.findNodeAtLocation(tree, ['bins']);
  if (!binsNode || binsNode.type !== 'array') return fail(binsNode ?? tree, 'missing "bins": an array of {"frequency": "2.26 nHz", "samples": [...]}');
  const bins: RawBin[] = [];
  for (const b of binsNode.children ?? []) {
    const fNode = jsonc.findNodeAtLocation(b, ['frequency']);
    if (!fNode || typeof fNode.value !== 'string') return fail(fNode ?? b, 'each bin needs "frequency" as text with a unit, e.g. "2.26 nHz"');
    const at = lineColumnAt(text, fNode.offset);
    const f = frequencyWithUnit(fNode.value, file, at.line, at.column);
    const sNode = jsonc.findNodeAtLocation(b, ['samples']);
    if (!sNode || sNode.type !== 'array') return fail(sNode ?? b, 'each bin needs "samples": an array of numbers');
    const values: number[] = [];
    for (const s of sNode.children ?? []) {
      if (s.type !== 'number' || !Number.isFinite(s.value)) fail(s, `a sample is ${JSON.stringify(s.value ?? text.slice(s.offset, s.offset + 10))}, not a finite number`);
      const p = lineColumnAt(text, s.offset);
      values.push(toLog(s.value, quantity, file, p.line, p.column));
    }
    bins.push({ f, values, where: at });
  }
  return { bins, quantity, spanS: spanNode?.value };
}

/** Reads a free spectrum from CSV or JSON text (by the file name's extension). */
export function importFreeSpectrum(text: string, file: string, opts: FreeSpectrumImportOptions = {}): ImportedFreeSpectrum {
  let q = opts.quantity ?? 'log10_rho';
  let bins: RawBin[];
  let spanS = opts.spanS;
  if (/\.json$/i.test(file)) {
    const j = jsonBins(text, file, q);
    bins = j.bins;
    q = j.quantity;
    spanS ??= j.spanS;
  } else {
    const rows = csvRows(text, file);
    if (rows.length === 0) throw new ImportError(file, null, null, 'the file has no header and no samples');
    const head = rows[0];
    if (head.cells.every((c) => /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(c))) {
      throw new ImportError(file, head.line, null, 'no header: the first line must name each bin by its frequency with a unit (e.g. "2.26 nHz,4.53 nHz") or be "f_nHz,value"');
    }
    const scale = head.cells.length === 2 ? frequencyColumnScale(head.cells[0]) : null;
    if (scale !== null) {
      const vq = head.cells[1].toLowerCase();
      if (['log10_rho', 'log10_hc', 'rho', 'hc'].includes(vq)) q = vq as ImportedQuantity;
      else if (vq !== 'value') throw new ImportError(file, head.line, 2, `the value column must be called value, log10_rho, log10_hc, rho or hc, got "${head.cells[1]}"`);
      bins = longCsv(rows, file, q, scale);
    } else bins = wideCsv(rows, file, q);
  }
  if (bins.length === 0) throw new ImportError(file, null, null, 'no bins found');
  if (bins.length > FREE_SPECTRUM_MAX_BINS) {
    const b = bins[FREE_SPECTRUM_MAX_BINS];
    throw new ImportError(file, b.where.line, b.where.column, `${bins.length} bins; at most ${FREE_SPECTRUM_MAX_BINS} can be stored in a sheet`);
  }
  for (let k = 1; k < bins.length; k++) {
    if (bins[k].f === bins[k - 1].f) throw new ImportError(file, bins[k].where.line, bins[k].where.column, `bin ${k + 1} repeats the frequency of bin ${k}`);
    if (bins[k].f < bins[k - 1].f) throw new ImportError(file, bins[k].where.line, bins[k].where.column, `bin frequencies must increase: bin ${k + 1} is below bin ${k}`);
  }
  for (const [k, b] of bins.entries()) {
    if (b.values.length < 2) throw new ImportError(file, b.where.line, b.where.column, `bin ${k + 1} has ${b.values.length} sample${b.values.length === 1 ? '' : 's'}; at least 2 are needed`);
  }
  const total = bins.reduce((a, b) => a + b.values.length, 0);
  let thin = 1;
  const fits = (k: number) => bins.every((b) => Math.ceil(b.values.length / k) <= FREE_SPECTRUM_MAX_SAMPLES) && bins.reduce((a, b) => a + Math.ceil(b.values.length / k), 0) <= MAX_ENCODED_SAMPLES;
  while (!fits(thin)) thin++;
  if (thin > 1 && !opts.thin) {
    throw new ImportError(file, null, null, `${total} samples (up to ${Math.max(...bins.map((b) => b.values.length))} per bin); a sheet stores at most ${MAX_ENCODED_SAMPLES} in all and ${FREE_SPECTRUM_MAX_SAMPLES} per bin. Allow thinning (keeps every ${thin}th sample) or give fewer samples`);
  }
  const f1 = bins[0].f;
  const samples = bins.map((b) => thinSamples(b.values, thin));
  return {
    data: {
      quantity: q === 'log10_rho' || q === 'rho' ? 'log10Rho' : 'log10Hc',
      frequencyHz: Float64Array.from(bins.map((b) => b.f)),
      spanS: spanS ?? 1 / f1,
      samples,
    },
    thin,
    samplesRead: total,
  };
}
