// Measured values per frequency bin (a "free spectrum"): h_c, Omega_gw or timing-residual power at
// each frequency with an interval at a stated credibility. Entered as rows of numbers or as CSV text.
//
// CSV layout (our own): optional lines starting with '#' are comments; the first other line is a
// header naming the columns, in any order, case-insensitive:
//   frequency column: f_Hz, f_nHz or f_per_yr (cycles per year)
//   value column:     one of hc, omega_gw, power_s3 (one-sided residual power, s^3 = s^2/Hz)
//   interval columns: lo and hi (the interval ends, same quantity as the value)
// Separators: comma, semicolon or tab. Every row needs every column; numbers like 1.2e-15.
import { YEAR_S } from '../physics/constants';

export type BinQuantity = 'hc' | 'omegaGw' | 'residualPower';

export interface BinnedSpectrum {
  quantity: BinQuantity;
  frequencyHz: Float64Array;
  value: Float64Array;
  lower: Float64Array;
  upper: Float64Array;
  /** Credibility of the intervals, fraction in (0, 1). */
  level: number;
}

export class BinnedSpectrumError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'BinnedSpectrumError';
  }
}

const FREQUENCY_COLUMNS: Record<string, number> = { f_hz: 1, f_nhz: 1e-9, f_per_yr: 1 / YEAR_S };
const VALUE_COLUMNS: Record<string, BinQuantity> = { hc: 'hc', omega_gw: 'omegaGw', power_s3: 'residualPower' };
const MAX_BINS = 10_000;

/** Validates bins given as rows [frequency (Hz), value, lower, upper]. */
export function binsFromRows(rows: number[][], quantity: BinQuantity, level: number, what = 'row'): BinnedSpectrum {
  if (!(level > 0 && level < 1)) {
    throw new BinnedSpectrumError(`level is the credibility of the per-bin intervals as a fraction in (0, 1), e.g. 0.9 or 90%, got ${level}`);
  }
  if (rows.length === 0) throw new BinnedSpectrumError('no bins given: need at least one row of frequency, value, lower, upper');
  if (rows.length > MAX_BINS) throw new BinnedSpectrumError(`too many bins (${rows.length}); at most ${MAX_BINS}`);
  const n = rows.length;
  const out: BinnedSpectrum = {
    quantity,
    frequencyHz: new Float64Array(n),
    value: new Float64Array(n),
    lower: new Float64Array(n),
    upper: new Float64Array(n),
    level,
  };
  const names = ['frequency', 'value', 'lower', 'upper'];
  for (let i = 0; i < n; i++) {
    const r = rows[i];
    if (r.length !== 4) throw new BinnedSpectrumError(`${what} ${i + 1} has ${r.length} entries; need 4 (frequency, value, lower, upper)`);
    for (let j = 0; j < 4; j++) {
      if (!Number.isFinite(r[j])) throw new BinnedSpectrumError(`${what} ${i + 1}: ${names[j]} is not a finite number (${r[j]})`);
    }
    const [f, v, lo, hi] = r;
    if (!(f > 0)) throw new BinnedSpectrumError(`${what} ${i + 1}: frequency must be positive, got ${f} Hz`);
    if (i > 0 && !(f > out.frequencyHz[i - 1])) {
      throw new BinnedSpectrumError(`${what} ${i + 1}: frequencies must increase, ${f} Hz follows ${out.frequencyHz[i - 1]} Hz`);
    }
    if (!(v > 0)) throw new BinnedSpectrumError(`${what} ${i + 1}: value must be positive, got ${v}`);
    if (!(lo >= 0)) throw new BinnedSpectrumError(`${what} ${i + 1}: lower end must not be negative, got ${lo}`);
    if (!(lo <= v)) throw new BinnedSpectrumError(`${what} ${i + 1}: lower end ${lo} is above the value ${v}`);
    if (!(hi >= v)) throw new BinnedSpectrumError(`${what} ${i + 1}: upper end ${hi} is below the value ${v}`);
    out.frequencyHz[i] = f;
    out.value[i] = v;
    out.lower[i] = lo;
    out.upper[i] = hi;
  }
  return out;
}

/** Parses CSV text in the layout described at the top of this file. */
export function binsFromCsv(text: string, level: number): BinnedSpectrum {
  if (text.length > 2_000_000) throw new BinnedSpectrumError('CSV text is too long (over 2,000,000 characters)');
  const lines = text.split(/\r\n|\n|\r/);
  let header: string[] | null = null;
  let headerLine = 0;
  let sep = ',';
  const rows: number[][] = [];
  const lineOf: number[] = [];
  let freqCol = -1;
  let freqScale = 1;
  let valueCol = -1;
  let quantity: BinQuantity = 'hc';
  let loCol = -1;
  let hiCol = -1;
  for (let li = 0; li < lines.length; li++) {
    const line = lines[li].trim();
    if (line === '' || line.startsWith('#')) continue;
    if (header === null) {
      sep = line.includes('\t') ? '\t' : line.includes(';') ? ';' : ',';
      header = line.split(sep).map((h) => h.trim().toLowerCase());
      headerLine = li + 1;
      header.forEach((h, j) => {
        if (h in FREQUENCY_COLUMNS) {
          if (freqCol >= 0) throw new BinnedSpectrumError(`CSV line ${headerLine}: two frequency columns (${header![freqCol]} and ${h})`);
          freqCol = j;
          freqScale = FREQUENCY_COLUMNS[h];
        } else if (h in VALUE_COLUMNS) {
          if (valueCol >= 0) throw new BinnedSpectrumError(`CSV line ${headerLine}: two value columns (${header![valueCol]} and ${h})`);
          valueCol = j;
          quantity = VALUE_COLUMNS[h];
        } else if (h === 'lo') loCol = j;
        else if (h === 'hi') hiCol = j;
        else {
          throw new BinnedSpectrumError(
            `CSV line ${headerLine}: unknown column "${h}"; columns are one of f_Hz, f_nHz, f_per_yr; one of hc, omega_gw, power_s3; lo; hi`,
          );
        }
      });
      const missing = [freqCol < 0 && 'a frequency column (f_Hz, f_nHz or f_per_yr)', valueCol < 0 && 'a value column (hc, omega_gw or power_s3)', loCol < 0 && 'lo', hiCol < 0 && 'hi'].filter(Boolean);
      if (missing.length) throw new BinnedSpectrumError(`CSV line ${headerLine}: the header lacks ${missing.join(', ')}`);
      continue;
    }
    const cells = line.split(sep).map((c) => c.trim());
    if (cells.length !== header.length) {
      throw new BinnedSpectrumError(`CSV line ${li + 1} has ${cells.length} fields; the header has ${header.length}`);
    }
    const num = (j: number) => {
      const c = cells[j];
      const x = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(c) ? Number(c) : NaN;
      if (!Number.isFinite(x)) throw new BinnedSpectrumError(`CSV line ${li + 1}, column ${header![j]}: "${c}" is not a number`);
      return x;
    };
    rows.push([num(freqCol) * freqScale, num(valueCol), num(loCol), num(hiCol)]);
    lineOf.push(li + 1);
  }
  if (header === null) throw new BinnedSpectrumError('CSV text is empty: need a header line and at least one row');
  try {
    return binsFromRows(rows, quantity, level, 'data row');
  } catch (e) {
    // Name the CSV line rather than the data-row index.
    const m = /^data row (\d+)(.*)$/s.exec((e as Error).message);
    if (m) throw new BinnedSpectrumError(`CSV line ${lineOf[Number(m[1]) - 1]}${m[2]}`);
    throw e;
  }
}
