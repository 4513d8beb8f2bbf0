// One batch of likelihood evaluations of an inference run as a chunked job (src/jobs/chunkedJob.ts):
// the ensemble sampler proposes half the walkers at a time, and those points are split into chunks
// of INFER_CHUNK_POINTS evaluated on any thread. Every random number is drawn by the sampler in the
// main thread, so a run is the same for any number of workers.
import type { Sheet } from '../sheet/sheet';
import { chunkRange, type ChunkedJob, type ChunkPlan } from '../jobs/chunkedJob';
import { runChunks, type ChunkExecutor, type ParallelOptions } from '../jobs/runChunks';
import type { BatchAnswer } from './ensembleSampler';
import { freeParameters, type FreeParameter } from './priors';
import { sheetEvaluator, type InferenceEvaluator } from './sheetInference';

/** Points per chunk (fixed: part of the job, not of the number of workers). */
export const INFER_CHUNK_POINTS = 2;

export interface InferBatchOptions {
  free: string[];
  likelihood: string;
  derived: string[];
  points: Float64Array[];
}

interface InferBatchPlan extends ChunkPlan {
  free: string[];
  likelihood: string;
  derived: string[];
  dim: number;
  /** Points, flattened: points[i * dim + k]. */
  points: Float64Array;
}

interface InferBatchChunk {
  logLikelihood: Float64Array;
  extras: Float64Array;
  failure?: { index: number; message: string };
}

/** The evaluator of a sheet for given free cells, kept per sheet object (workers reuse their sheet). */
const evaluators = new WeakMap<Sheet, Map<string, { params: FreeParameter[]; evaluate: InferenceEvaluator; last: { index: number; message: string } | null }>>();

function evaluatorFor(sheet: Sheet, plan: InferBatchPlan) {
  let bySpec = evaluators.get(sheet);
  if (!bySpec) evaluators.set(sheet, (bySpec = new Map()));
  const key = `${plan.free.join(',')}|${plan.likelihood}|${plan.derived.join(',')}`;
  let e = bySpec.get(key);
  if (!e) {
    const params = freeParameters(sheet, plan.free);
    const entry = { params, evaluate: null as unknown as InferenceEvaluator, last: null as { index: number; message: string } | null };
    entry.evaluate = sheetEvaluator(sheet, params, plan.likelihood, plan.derived, (u, message) => {
      entry.last ??= { index: -1, message };
      void u;
    });
    bySpec.set(key, (e = entry));
  }
  return e;
}

export const inferBatchJob: ChunkedJob<InferBatchOptions, InferBatchPlan, InferBatchChunk, BatchAnswer> = {
  kind: 'inferBatch',
  plan(_sheet, o) {
    const dim = o.free.length;
    const points = new Float64Array(o.points.length * dim);
    o.points.forEach((p, i) => points.set(p, i * dim));
    return { chunks: Math.ceil(o.points.length / INFER_CHUNK_POINTS), work: o.points.length, free: o.free, likelihood: o.likelihood, derived: o.derived, dim, points };
  },
  chunkWork(plan, index) {
    const { start, end } = chunkRange(plan.work, INFER_CHUNK_POINTS, index);
    return end - start;
  },
  async runChunk(sheet, plan, index) {
    const { start, end } = chunkRange(plan.work, INFER_CHUNK_POINTS, index);
    const e = evaluatorFor(sheet, plan);
    const pts = Array.from({ length: end - start }, (_, j) => plan.points.subarray((start + j) * plan.dim, (start + j + 1) * plan.dim));
    let failure: InferBatchChunk['failure'];
    const answers: BatchAnswer[] = [];
    for (let j = 0; j < pts.length; j++) {
      e.last = null;
      answers.push(await e.evaluate([pts[j]]));
      if (e.last && !failure) failure = { index: start + j, message: (e.last as { message: string }).message };
    }
    const E = plan.derived.length;
    const ll = new Float64Array(pts.length);
    const extras = new Float64Array(pts.length * E);
    answers.forEach((a, j) => {
      if (a instanceof Float64Array) ll[j] = a[0];
      else {
        ll[j] = a.logLikelihood[0];
        extras.set(a.extras, j * E);
      }
    });
    return { logLikelihood: ll, extras, failure };
  },
  combine(_sheet, plan, chunks) {
    const E = plan.derived.length;
    const ll = new Float64Array(plan.work);
    const extras = new Float64Array(plan.work * E);
    chunks.forEach((c, i) => {
      ll.set(c.logLikelihood, i * INFER_CHUNK_POINTS);
      extras.set(c.extras, i * INFER_CHUNK_POINTS * E);
    });
    return { logLikelihood: ll, extras };
  },
};

/**
 * An evaluator that spreads each batch over a pool of workers kept for the whole run. Call close()
 * when the run ends. onFailure hears the first failing point of each batch with its message.
 */
export function pooledEvaluator(
  sheet: Sheet,
  spec: { free: string[]; likelihood: string; derived: string[] },
  parallel: ParallelOptions,
  onFailure: (point: Float64Array, message: string) => void,
): { evaluate: InferenceEvaluator; close(): Promise<void> } {
  const workers = parallel.workers;
  let executor: ChunkExecutor | null = null;
  const sheetText = sheet.toFileText();
  const keep: ParallelOptions = {
    workers,
    pool: (n) => {
      executor ??= parallel.pool!(n);
      const ex = executor;
      return { runChunk: (...a) => ex.runChunk(...a), close: async () => {} };
    },
  };
  return {
    async evaluate(points) {
      const plan = inferBatchJob.plan(sheet, { ...spec, points });
      const indices = Array.from({ length: plan.chunks }, (_, i) => i);
      const chunks = await runChunks(inferBatchJob, sheet, plan, indices, undefined, { ...keep, workers: Math.max(1, workers), sheetText });
      for (const c of chunks) if (c.failure) onFailure(points[c.failure.index], c.failure.message);
      return inferBatchJob.combine(sheet, plan, chunks);
    },
    async close() {
      const ex = executor as ChunkExecutor | null;
      if (ex) await ex.close(false);
    },
  };
}
