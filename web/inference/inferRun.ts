// Posterior sampling of the sheet as a job of the app's worker: the statistics code's runInference
// (src/statistics/sheetInference.ts, the same as `strainsheet infer`), its likelihood evaluations
// spread over Web Workers. Every random number is drawn in this worker, so the chains are the same
// for any number of workers and the same as the command line's for the same seed.
import type { Sheet } from '../../src/sheet/sheet';
import { runInference, type InferenceProgress, type InferenceResult } from '../../src/statistics/sheetInference';
import type { JobControl } from '../../src/statistics/sheetValues';
import type { ParallelOptions } from '../../src/jobs/runChunks';
import { cornerModel, type CornerModel } from '../../src/statistics/cornerPlot';

export interface InferJobSpec {
  kind: 'infer';
  likelihood: string;
  free: string[];
  walkers: number;
  steps: number;
  seed: number;
  /** Steps discarded at the start; undefined: half the steps (as the command line). */
  burnIn?: number;
  thin: number;
  derived: string[];
  /** A spectrum cell for the posterior-predictive h_c band, or null. */
  spectrumCell: string | null;
}

/** What a running inference reports besides steps done: the sampler's acceptance and autocorrelation. */
export type InferProgressDetail = InferenceProgress;

export interface InferJobResult {
  kind: 'infer';
  result: InferenceResult;
  /** Web Workers that evaluated the likelihood (1: the job worker itself). */
  workers: number;
  /** The corner plot's histograms and contour levels of the kept draws, made here rather than on the page. */
  corner: CornerModel;
}

/** The kept draws of a run as cornerModel takes them (free cells, then derived cells), as `strainsheet infer --corner` does. */
export function cornerOf(r: InferenceResult): CornerModel {
  return cornerModel([
    ...r.parameters.map((p) => ({ name: p.cell, unit: p.unit, log: p.logScale, draws: r.samples[p.cell] })),
    ...r.derived.map((d) => ({ name: d.cell, unit: d.unit, log: r.samples[d.cell].every((x) => !(x <= 0)), draws: r.samples[d.cell] })),
  ]);
}

export async function runInferJob(sheet: Sheet, job: InferJobSpec, control: JobControl & { onStep(p: InferProgressDetail): void }, parallel?: ParallelOptions): Promise<InferJobResult> {
  const result = await runInference(
    sheet,
    {
      likelihood: job.likelihood,
      free: job.free,
      walkers: job.walkers,
      steps: job.steps,
      seed: job.seed,
      burnIn: job.burnIn,
      thin: job.thin,
      derived: job.derived,
      spectrumCell: job.spectrumCell ?? undefined,
    },
    control,
    { parallel },
  );
  return { kind: 'infer', result, workers: parallel && parallel.pool ? Math.max(1, parallel.workers) : 1, corner: cornerOf(result) };
}
