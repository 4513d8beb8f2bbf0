// Reading (A, gamma) posterior samples from CSV (our own layout): a header naming two columns,
// log10_A (or A) and gamma, in either order; one row per sample; '#' lines are comments.
// Every bad input is refused with the file, line and column.
import { AMPLITUDE_GAMMA_MAX_SAMPLES } from './amplitudeGammaPosterior';
import { csvRows, ImportError, numberCell } from './importText';
import { thinSamples } from './sampleEncoding';

export interface ImportedAmplitudeGamma {
  log10A: Float64Array;
  gamma: Float64Array;
  thin: number;
  samplesRead: number;
}

export function importAmplitudeGamma(text: string, file: string, opts: { thin?: boolean } = {}): ImportedAmplitudeGamma {
  const rows = csvRows(text, file);
  if (rows.length === 0) throw new ImportError(file, null, null, 'the file has no header and no samples');
  const head = rows[0];
  const names = head.cells.map((c) => c.toLowerCase());
  const ia = names.findIndex((n) => n === 'log10_a' || n === 'a');
  const ig = names.indexOf('gamma');
  if (ia < 0 || ig < 0 || names.length !== 2) {
    throw new ImportError(file, head.line, null, `the header must name two columns, log10_A (or A) and gamma; found ${head.cells.map((c) => `"${c}"`).join(', ')}`);
  }
  const linear = names[ia] === 'a';
  const a: number[] = [];
  const g: number[] = [];
  for (const r of rows.slice(1)) {
    if (r.cells.length !== 2) throw new ImportError(file, r.line, null, `${r.cells.length} fields; the header has 2 (ragged row)`);
    let x = numberCell(r.cells[ia], file, r.line, ia + 1, head.cells[ia]);
    if (linear) {
      if (!(x > 0)) throw new ImportError(file, r.line, ia + 1, `A = ${x}: must be positive to take its log10`);
      x = Math.log10(x);
    } else if (x > 0) {
      throw new ImportError(file, r.line, ia + 1, `log10_A = ${x} is positive: are these A values rather than log10 A? Call the column A`);
    }
    a.push(x);
    g.push(numberCell(r.cells[ig], file, r.line, ig + 1, 'gamma'));
  }
  if (a.length < 10) throw new ImportError(file, null, null, `${a.length} samples; at least 10 are needed`);
  const thin = Math.ceil(a.length / AMPLITUDE_GAMMA_MAX_SAMPLES);
  if (thin > 1 && !opts.thin) {
    throw new ImportError(file, null, null, `${a.length} samples; a sheet stores at most ${AMPLITUDE_GAMMA_MAX_SAMPLES}. Allow thinning (keeps every ${thin}th sample) or give fewer samples`);
  }
  return { log10A: thinSamples(a, thin), gamma: thinSamples(g, thin), thin, samplesRead: a.length };
}
