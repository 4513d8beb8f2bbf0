// The parallel job kinds of src/jobs/jobKinds.ts, each loaded when a chunk worker first runs one
// (test/jobs/webJobKinds.test.ts checks that this lists the same kinds).
import type { AnyChunkedJob } from '../../src/jobs/chunkedJob';

export const WEB_JOB_KINDS: Readonly<Record<string, () => Promise<AnyChunkedJob>>> = {
  scan1d: () => import('../../src/statistics/scan1dJob').then((m) => m.scan1dJob),
  scan2d: () => import('../../src/statistics/scan2dJob').then((m) => m.scan2dJob),
  sample: () => import('../../src/statistics/monteCarloJob').then((m) => m.monteCarloJob),
  inferBatch: () => import('../../src/statistics/inferBatchJob').then((m) => m.inferBatchJob),
  realise: () => import('../../src/statistics/realiseJob').then((m) => m.realiseJob),
  spectrumSample: () => import('../../src/statistics/spectrumMonteCarloJob').then((m) => m.spectrumSampleJob),
};

/** The job of this kind; rejects naming it when there is none. */
export async function loadJobKind(kind: string): Promise<AnyChunkedJob> {
  const load = WEB_JOB_KINDS[kind];
  if (!load) throw new Error(`unknown parallel job kind ${kind}`);
  return load();
}
