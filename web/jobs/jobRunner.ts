// Runs one job on a private copy of the sheet (DOM-free: used inside the job worker). The work is
// done by the statistics code (src/statistics/jobs.ts: scans with the sqrt-law shortcut, HPD
// credible regions, seeded Monte Carlo); this file turns the page's job into its JobSpec and its
// result into plain arrays for the plots.
import { Sheet } from '../../src/sheet/sheet';
import { loadBuiltinsNamedIn } from '../engine/builtinsNeeded';
import { runJob as runStatisticsJob, type AxisSpec, type JobResult as StatisticsResult } from '../../src/statistics/jobs';
import { JobCancelledError } from '../../src/statistics/sheetValues';
import { formatNumber } from '../../src/sheet/formatValue';
import type { ParallelOptions } from '../../src/jobs/runChunks';
import { SAMPLE_CHUNK } from '../../src/statistics/monteCarloJob';
import type { JobResult, JobSpec, Scan1Result, Scan2Result, SampleResult, ScanAxisSpec } from './jobProtocol';
import { runRealiseJob } from './realiseRun';
import { runInferJob, type InferProgressDetail } from '../inference/inferRun';

export interface JobControl {
  signal: AbortSignal;
  /** Steps done of the total; an inference adds its acceptance and autocorrelation estimate. */
  progress: (done: number, total: number, detail?: InferProgressDetail) => void;
}

/** The page's axis as the statistics code takes it: numbers with their unit as formula text. */
export function axisSpecFor(a: ScanAxisSpec): AxisSpec {
  const bound = (v: number) => (a.unit ? `${v} ${a.unit}` : v);
  return { cell: a.cell, lo: bound(a.lo), hi: bound(a.hi), n: a.n, log: a.log };
}

const MAX_SORTED_SENT = 4000;

function failuresOf(count: number, first: string | undefined): { index: number; message: string }[] {
  return count > 0 ? [{ index: 0, message: `${count} point${count === 1 ? '' : 's'} failed; the first: ${first ?? 'no message'}` }] : [];
}

function toScan1(job: Extract<JobSpec, { kind: 'scan1' }>, r: Extract<StatisticsResult, { kind: 'scan1d' }>['result']): Scan1Result {
  return {
    kind: 'scan1',
    input: { ...job.axis, unit: r.axis.unit },
    output: job.output,
    outputUnit: r.units[job.output] ?? '',
    x: Array.from(r.axis.values),
    y: Array.from(r.outputs[job.output]),
    band: r.band,
    scaled: r.scaled.includes(job.output),
    failures: failuresOf(r.failures, r.firstError),
  };
}

function toScan2(job: Extract<JobSpec, { kind: 'scan2' }>, r: Extract<StatisticsResult, { kind: 'scan2d' }>['result']): Scan2Result {
  if (!r.posterior || !r.levels || !r.thresholds) throw new Error('the map needs a measurement to give a posterior');
  return {
    kind: 'scan2',
    x: { ...job.x, unit: r.x.unit },
    y: { ...job.y, unit: r.y.unit },
    output: job.output,
    xValues: Array.from(r.x.values),
    yValues: Array.from(r.y.values),
    mass: Array.from(r.posterior),
    levels: r.levels.map((level, k) => ({ level, threshold: r.thresholds![k] })),
    prior: r.priors ?? `${r.x.prior} in ${r.x.cell}, ${r.y.prior} in ${r.y.cell}`,
    failures: failuresOf(r.failures, r.firstError),
  };
}

function toSample(job: Extract<JobSpec, { kind: 'sample' }>, r: Extract<StatisticsResult, { kind: 'sample' }>['result'], workers: number): SampleResult {
  const values = Float64Array.from(r.outputs[job.output].filter(Number.isFinite)).sort();
  const step = Math.max(1, Math.ceil(values.length / MAX_SORTED_SENT));
  const sorted: number[] = [];
  for (let i = 0; i < values.length; i += step) sorted.push(values[i]);
  const unit = r.units[job.output] ?? '';
  const u = unit ? ` ${unit}` : '';
  const s = r.summaries[job.output];
  const summary: { label: string; value: string }[] = [
    { label: 'inputs drawn', value: r.inputs.map((i) => `${i.cell}: ${i.distribution}`).join('; ') || 'none (no cell has an uncertainty)' },
    { label: 'samples', value: `${r.samples} (seed ${r.seed}), ${r.evaluations} evaluations${r.failures ? `, ${r.failures} failed` : ''}` },
    { label: 'workers', value: `${workers} (chunks of ${SAMPLE_CHUNK} samples; the samples do not depend on the number of workers)` },
  ];
  if (s) {
    summary.push({ label: 'median', value: `${formatNumber(s.median)}${u} ± ${formatNumber(s.medianError)} (Monte Carlo error)` });
    for (const iv of s.intervals) {
      summary.push({ label: `${(100 * iv.level).toFixed(2)}% interval`, value: `${formatNumber(iv.lower)} to ${formatNumber(iv.upper)}${u} (ends ± ${formatNumber(iv.lowerError)}, ± ${formatNumber(iv.upperError)})` });
    }
  }
  if (r.overlap) {
    summary.push({
      label: 'inside the measured interval',
      value: `${(100 * r.overlap.fractionInside).toFixed(1)}% ± ${(100 * r.overlap.fractionInsideError).toFixed(1)}% of samples (${(100 * r.overlap.band.level).toFixed(0)}% interval)`,
    });
  }
  return { kind: 'sample', output: job.output, outputUnit: unit, band: r.overlap?.band, samples: r.samples, seed: r.seed, sorted, summary };
}

/**
 * Runs a job on a sheet built from its file text. Scans and samples split into chunks; with
 * `parallel` (the job worker passes a pool of Web Workers) the chunks run on several workers, with
 * the same result as on one.
 */
export async function runJob(sheetText: string, job: JobSpec, ctl: JobControl, parallel?: ParallelOptions): Promise<JobResult> {
  await loadBuiltinsNamedIn(sheetText); // the groups of built-ins its formulas name (lazyBuiltins.ts)
  const sheet = Sheet.fromFile(sheetText, { evaluateOnRead: true });
  // workers the job's chunks ran on: 1 (this worker) unless it started a pool
  let poolWorkers = 1;
  const par = parallel
    ? {
        ...parallel,
        sheetText,
        onPoolStart: (n: number) => {
          poolWorkers = n;
          parallel.onPoolStart?.(n);
        },
      }
    : undefined;
  const control = { signal: ctl.signal, onProgress: ctl.progress };
  try {
    if (job.kind === 'scan1') {
      const r = await runStatisticsJob(sheet, { kind: 'scan', vary: [axisSpecFor(job.axis)], outputs: [job.output], measurementCell: job.measurement ?? undefined }, control, par);
      if (r.kind !== 'scan1d') throw new Error(`unexpected result ${r.kind}`);
      return toScan1(job, r.result);
    }
    if (job.kind === 'scan2') {
      const r = await runStatisticsJob(sheet, { kind: 'scan', vary: [axisSpecFor(job.x), axisSpecFor(job.y)], outputs: [job.output], measurementCell: job.measurement }, control, par);
      if (r.kind !== 'scan2d') throw new Error(`unexpected result ${r.kind}`);
      return toScan2(job, r.result);
    }
    if (job.kind === 'realise') return await runRealiseJob(sheet, job, control, par);
    if (job.kind === 'infer') return await runInferJob(sheet, job, { signal: ctl.signal, onStep: (p) => ctl.progress(p.step, p.steps, p) }, par);
    if (job.kind === 'goalSeek') {
      const target = job.target.trim();
      const r = await runStatisticsJob(sheet, { kind: 'goalSeek', input: job.input, output: job.output, target: /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(target) ? Number(target) : target }, control);
      if (r.kind !== 'goalSeek') throw new Error(`unexpected result ${r.kind}`);
      const g = r.result;
      return { kind: 'goalSeek', input: g.input, output: g.output, target: job.target, value: g.value, unit: g.unit, achievedSI: g.achievedSI, evaluations: g.evaluations };
    }
    const r = await runStatisticsJob(sheet, { kind: 'sample', samples: job.samples, seed: job.seed, outputs: [job.output], measurementCell: job.measurement ?? undefined }, control, par);
    if (r.kind !== 'sample') throw new Error(`unexpected result ${r.kind}`);
    return toSample(job, r.result, poolWorkers);
  } catch (err) {
    if (err instanceof JobCancelledError) throw new JobCancelled();
    throw err;
  }
}

export class JobCancelled extends Error {
  constructor() {
    super('the job was cancelled');
    this.name = 'JobCancelled';
  }
}
