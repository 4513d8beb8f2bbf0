// Realisations of the sheet's finite population as a job of the app's worker: the statistics code's
// chunked `realise` job (src/statistics/realiseJob.ts, the same as `strainsheet realise`), its
// result sent back without the per-realisation draws (only a few single realisations, for the plot).
import type { Sheet } from '../../src/sheet/sheet';
import { runJob as runStatisticsJob } from '../../src/statistics/jobs';
import type { JobControl } from '../../src/statistics/sheetValues';
import type { ParallelOptions } from '../../src/jobs/runChunks';
import type { RealisationBinsRun } from '../../src/statistics/realisationReport';
import type { RealisationsValue } from '../../src/builtins/realisations';
import { REALISE_CHUNK } from '../../src/statistics/realiseJob';

export interface RealiseJobSpec {
  kind: 'realise';
  /** The realiseBackground cell; null: the only one. */
  cell: string | null;
  count: number;
  seed: number;
}

/** Single realisations sent back for the plot. */
export const SINGLES_SENT = 5;

export interface RealiseJobResult extends RealisationBinsRun {
  kind: 'realise';
  /** h_c of the first few realisations, one array per realisation. */
  singles: number[][];
  /** The loudest binary's own h_c, h sqrt(f T), median over realisations, per bin. */
  medianLoudestHc: number[];
  longResidenceCountFraction: ArrayLike<number>;
  drawnBinaries: number;
  workers: number;
}

export async function runRealiseJob(sheet: Sheet, job: RealiseJobSpec, control: JobControl, parallel?: ParallelOptions): Promise<RealiseJobResult> {
  const r = await runStatisticsJob(sheet, { kind: 'realise', cell: job.cell ?? undefined, count: job.count, seed: job.seed }, control, parallel);
  if (r.kind !== 'realise') throw new Error(`unexpected result ${r.kind}`);
  const { draws, ...rest } = r.result;
  const nb = rest.frequencyHz.length;
  const spanS = (sheet.value(rest.cell) as unknown as RealisationsValue).setup.spanS;
  const shown = Math.min(SINGLES_SENT, draws.count);
  return {
    kind: 'realise',
    ...rest,
    singles: Array.from({ length: shown }, (_, i) => Array.from(draws.hc.subarray(i * nb, (i + 1) * nb))),
    medianLoudestHc: Array.from(rest.frequencyHz, (f, k) => rest.summary.medianLoudestStrain[k] * Math.sqrt(f * spanS)),
    drawnBinaries: draws.drawnBinaries,
    workers: Math.min(parallel?.workers ?? 1, Math.ceil(job.count / REALISE_CHUNK)),
  };
}
