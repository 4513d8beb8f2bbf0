// Monte Carlo of a whole spectrum: the sheet's uncertain cells (their `uncertainty` distributions,
// sheetMonteCarlo.ts) are drawn with seeded streams, one per chunk (prngStreams.ts), the spectrum cell
// is evaluated for each draw with Sheet.evaluateWith (the sheet is left as it was), and the draw's h_c
// is read at the measured bins. Per bin: the median and the central 68.27% / 95.45% band (Hyndman &
// Fan 1996 definition 7 quantiles); per draw: the effective (A, gamma) fitted over the lowest bins as
// the comparison fits (effectivePowerLaw.ts), the cloud on the (A, gamma) plane.
import type { Sheet } from '../sheet/sheet';
import { isSheetObject } from '../sheet/sheetObject';
import { chunkRange, type ChunkedJob, type ChunkPlan } from '../jobs/chunkedJob';
import { chunkRandom } from './prngStreams';
import { uncertainCells, type SampleableDistribution } from './sheetMonteCarlo';
import { SheetJobError } from './sheetValues';
import { strainAtFrequency } from './binnedComparison';
import { fitEffectivePowerLaw } from './effectivePowerLaw';
import { ONE_SIGMA_LEVEL, TWO_SIGMA_LEVEL, sortedQuantile } from './sampleSummary';

/** Draws per chunk (any value gives the same numbers; it sets the granularity of workers). */
export const SPECTRUM_SAMPLE_CHUNK = 50;
export const MAX_SPECTRUM_SAMPLES = 20_000;

export interface SpectrumSampleOptions {
  /** The spectrum cell to draw. */
  spectrum: string;
  samples: number;
  seed: number;
  /** Bin frequencies where h_c is read, Hz, increasing. */
  frequencyHz: number[];
  /** The lowest this many bins are fitted with a power law (at least 2). */
  fitBins: number;
  fRefHz: number;
  /** The array's noise-equivalent h_c at the fitted bins (weights of the fit), if any. */
  noiseHc?: number[];
}

export interface SpectrumSamplePlan extends ChunkPlan {
  options: SpectrumSampleOptions;
  names: string[];
}

export interface SpectrumSampleChunk {
  /** h_c at the bins, draw by draw: [s * bins + k]; NaN for a failed draw. */
  hc: Float64Array;
  log10A: Float64Array;
  gamma: Float64Array;
  failures: number;
  firstError?: string;
}

export interface SpectrumSampleResult {
  spectrum: string;
  samples: number;
  seed: number;
  inputs: string[];
  frequencyHz: number[];
  median: number[];
  lower68: number[];
  upper68: number[];
  lower95: number[];
  upper95: number[];
  /** Fitted effective power law of each successful draw. */
  log10A: number[];
  gamma: number[];
  failures: number;
  firstError?: string;
}

const distributionsOf = new WeakMap<Sheet, Map<string, SampleableDistribution>>();
function distributions(sheet: Sheet): Map<string, SampleableDistribution> {
  let d = distributionsOf.get(sheet);
  if (!d) distributionsOf.set(sheet, (d = uncertainCells(sheet)));
  return d;
}

function spectrumOf(v: unknown): { frequencyHz: Float64Array; hc: Float64Array } | null {
  const o = v as { frequencyHz?: unknown; hc?: unknown };
  return isSheetObject(v) && o.frequencyHz instanceof Float64Array && o.hc instanceof Float64Array ? { frequencyHz: o.frequencyHz, hc: o.hc } : null;
}

/** h_c at f, with frequencies a hair outside the grid (published bin frequencies carry ~6 digits) read at its ends. */
function strainAt(s: { frequencyHz: Float64Array; hc: Float64Array }, f: number): number {
  const lo = s.frequencyHz[0];
  const hi = s.frequencyHz[s.frequencyHz.length - 1];
  const x = f < lo && f > lo * (1 - 1e-5) ? lo : f > hi && f < hi * (1 + 1e-5) ? hi : f;
  return strainAtFrequency(s.frequencyHz, s.hc, x);
}

export const spectrumSampleJob: ChunkedJob<SpectrumSampleOptions, SpectrumSamplePlan, SpectrumSampleChunk, SpectrumSampleResult> = {
  kind: 'spectrumSample',
  plan(sheet, opts) {
    const { spectrum, samples, seed, frequencyHz, fitBins } = opts;
    if (!(Number.isInteger(samples) && samples >= 2 && samples <= MAX_SPECTRUM_SAMPLES)) throw new SheetJobError(`Monte Carlo of ${spectrum}: samples must be a whole number from 2 to ${MAX_SPECTRUM_SAMPLES}, got ${samples}`);
    if (!(Number.isInteger(seed) && seed >= 0)) throw new SheetJobError(`Monte Carlo of ${spectrum}: the seed must be a whole number >= 0, got ${seed}`);
    if (!sheet.has(spectrum)) throw new SheetJobError(`Monte Carlo: there is no cell ${spectrum}`);
    const st = sheet.state(spectrum);
    if (st.status === 'error') throw new SheetJobError(`Monte Carlo: ${spectrum} has an error: ${st.error.message}`);
    if (!spectrumOf(st.status === 'value' ? st.value : undefined)) throw new SheetJobError(`Monte Carlo: ${spectrum} must hold a spectrum (e.g. strainSpectrum(pop, freqs))`);
    if (!frequencyHz.length || !(fitBins >= 2 && fitBins <= frequencyHz.length)) throw new SheetJobError(`Monte Carlo of ${spectrum}: the fit needs 2 to ${frequencyHz.length} bins, got ${fitBins}`);
    const names = [...distributions(sheet).keys()];
    if (!names.length) throw new SheetJobError('Monte Carlo: no cell has an uncertainty; give one an uncertainty such as lognormalDist(...)');
    return { chunks: Math.ceil(samples / SPECTRUM_SAMPLE_CHUNK), work: samples, options: opts, names };
  },
  chunkWork(plan, index) {
    const { start, end } = chunkRange(plan.options.samples, SPECTRUM_SAMPLE_CHUNK, index);
    return end - start;
  },
  async runChunk(sheet, plan, index, control) {
    const { start, end } = chunkRange(plan.options.samples, SPECTRUM_SAMPLE_CHUNK, index);
    const o = plan.options;
    const nb = o.frequencyHz.length;
    const dists = distributions(sheet);
    const rng = chunkRandom(o.seed, index);
    const count = end - start;
    const hc = new Float64Array(count * nb).fill(NaN);
    const log10A = new Float64Array(count).fill(NaN);
    const gamma = new Float64Array(count).fill(NaN);
    const noise = o.noiseHc ? Float64Array.from(o.noiseHc) : undefined;
    const fitF = Float64Array.from(o.frequencyHz.slice(0, o.fitBins));
    let failures = 0;
    let firstError: string | undefined;
    const overrides: Record<string, unknown> = {};
    for (let s = 0; s < count; s++) {
      for (const n of plan.names) overrides[n] = dists.get(n)!.sample(rng);
      const st = sheet.evaluateWith(overrides, [o.spectrum])[o.spectrum];
      try {
        if (!st || st.status !== 'value') throw new Error(st?.status === 'error' ? st.error.message : `${o.spectrum} has no value`);
        const spec = spectrumOf(st.value);
        if (!spec) throw new Error(`${o.spectrum} is not a spectrum`);
        for (let k = 0; k < nb; k++) hc[s * nb + k] = strainAt(spec, o.frequencyHz[k]);
        const fit = fitEffectivePowerLaw(fitF, hc.subarray(s * nb, s * nb + o.fitBins), o.fRefHz, o.fitBins, noise);
        log10A[s] = fit.log10A;
        gamma[s] = fit.gamma;
      } catch (err) {
        failures++;
        firstError ??= err instanceof Error ? err.message : String(err);
        hc.fill(NaN, s * nb, (s + 1) * nb);
      }
      await control.tick(s + 1);
    }
    return { hc, log10A, gamma, failures, firstError };
  },
  combine(_sheet, plan, chunks) {
    const o = plan.options;
    const nb = o.frequencyHz.length;
    const result: SpectrumSampleResult = {
      spectrum: o.spectrum,
      samples: o.samples,
      seed: o.seed,
      inputs: plan.names,
      frequencyHz: [...o.frequencyHz],
      median: [],
      lower68: [],
      upper68: [],
      lower95: [],
      upper95: [],
      log10A: [],
      gamma: [],
      failures: chunks.reduce((a, c) => a + c.failures, 0),
      firstError: chunks.find((c) => c.firstError)?.firstError,
    };
    for (const c of chunks) {
      c.log10A.forEach((a, i) => {
        if (Number.isFinite(a) && Number.isFinite(c.gamma[i])) (result.log10A.push(a), result.gamma.push(c.gamma[i]));
      });
    }
    for (let k = 0; k < nb; k++) {
      const col: number[] = [];
      for (const c of chunks) for (let s = 0; s < c.hc.length / nb; s++) if (Number.isFinite(c.hc[s * nb + k])) col.push(c.hc[s * nb + k]);
      const sorted = Float64Array.from(col).sort();
      const q = (p: number) => (sorted.length ? sortedQuantile(sorted, p) : NaN);
      result.median.push(q(0.5));
      result.lower68.push(q(0.5 - ONE_SIGMA_LEVEL / 2));
      result.upper68.push(q(0.5 + ONE_SIGMA_LEVEL / 2));
      result.lower95.push(q(0.5 - TWO_SIGMA_LEVEL / 2));
      result.upper95.push(q(0.5 + TWO_SIGMA_LEVEL / 2));
    }
    return result;
  },
};
