// Turns imported measurement files into sheet cells (the CLI's `import` and the app's Open data):
// the samples are stored inside the cell's formula in the compact encoding of
// src/statistics/sampleEncoding.ts, so the sheet file stays self-contained.
import type { CellSpec } from '../sheet/types';
import { importFreeSpectrum, type FreeSpectrumImportOptions } from '../statistics/freeSpectrumImport';
import { importAmplitudeGamma } from '../statistics/amplitudeGammaImport';
import { encodeAmplitudeGamma, encodeFreeSpectrum } from '../statistics/sampleEncoding';
import { ImportError } from '../statistics/importText';

export type MeasurementKind = 'free-spectrum' | 'amplitude-gamma';

export interface MeasurementCellOptions extends FreeSpectrumImportOptions {
  kind: MeasurementKind;
  /** Uniform prior of the free-spectrum analysis on the sampled quantity. */
  prior?: { lower: number; upper: number };
  /** Reference frequency of (A, gamma) samples, Hz. */
  fRefHz?: number;
}

const num = (x: number) => String(Number(x.toPrecision(15)));

/** The cell that holds the measurement in `text` (read from `file`); throws ImportError naming file, line and column. */
export function measurementCell(name: string, text: string, file: string, opts: MeasurementCellOptions): CellSpec {
  if (opts.kind === 'free-spectrum') {
    const r = importFreeSpectrum(text, file, opts);
    if (opts.prior) {
      const lo = Math.min(...r.data.samples.map((s) => Math.min(...s)));
      const hi = Math.max(...r.data.samples.map((s) => Math.max(...s)));
      if (lo < opts.prior.lower || hi > opts.prior.upper) {
        throw new ImportError(file, null, null, `samples run from ${lo.toPrecision(4)} to ${hi.toPrecision(4)}, outside the prior range ${opts.prior.lower} to ${opts.prior.upper}`);
      }
    }
    const enc = encodeFreeSpectrum(r.data, r.thin);
    const prior = opts.prior ? `, ${num(opts.prior.lower)}, ${num(opts.prior.upper)}` : '';
    const thinned = r.thin > 1 ? `; thinned by ${r.thin} (${r.samplesRead} samples read, every ${r.thin}th kept)` : '';
    return {
      name,
      formula: `measuredFreeSpectrum("${enc}"${prior})`,
      note: `free spectrum read from ${basename(file)}: ${r.data.frequencyHz.length} bins${thinned}${opts.prior ? '' : '; no prior divided out'}`,
      section: 'measurement',
    };
  }
  const r = importAmplitudeGamma(text, file, opts);
  const fRef = opts.fRefHz ?? 1 / (365.25 * 86400);
  const thinned = r.thin > 1 ? `; thinned by ${r.thin} (${r.samplesRead} samples read, every ${r.thin}th kept)` : '';
  return {
    name,
    formula: `measuredAmplitudeGamma("${encodeAmplitudeGamma(r.log10A, r.gamma, fRef, r.thin)}")`,
    note: `(A, gamma) samples read from ${basename(file)}: ${r.log10A.length} samples${thinned}`,
    section: 'measurement',
  };
}

function basename(path: string): string {
  return path.split(/[\\/]/).pop() ?? path;
}
