// Realisations of a sheet's finite population as a chunked job (src/jobs/chunkedJob.ts): the set-up
// (population, bins, span, threshold, environment) comes from a cell holding realiseBackground(...); the job draws
// its own number of realisations with its own seed, REALISE_CHUNK per chunk. Realisation r always
// draws from stream r of the seed (indexedStreams.ts), so chunks, workers and shards never change a number.
import type { Sheet } from '../sheet/sheet';
import { isSheetObject } from '../sheet/sheetObject';
import { chunkRange, type ChunkedJob, type ChunkPlan } from '../jobs/chunkedJob';
import { realisationCells, type RealisationCells } from '../physics/realisationCells';
import { drawRealisations, type RealisationDraws } from '../physics/binaryRealisations';
import type { RealisationsValue } from '../builtins/realisations';
import { joinDraws, summariseRealisations, type RealisationSummary } from './realisationSummary';
import { SheetJobError } from './sheetValues';

/** Realisations per chunk (any value gives the same numbers; it sets the granularity of workers and shards). */
export const REALISE_CHUNK = 100;
/** Realisations drawn between progress ticks inside a chunk. */
const TICK_BLOCK = 10;
/** Most realisation-bins of one run (six numbers each: about 0.5 GB at the limit). */
export const MAX_RUN_REALISATION_BINS = 10_000_000;

export interface RealiseOptions {
  /** Cell holding realiseBackground(...); default: the only such cell. */
  cell?: string;
  count: number;
  seed: number;
  /** K of realiseBackground ('all' draws every binary); default the cell's own. */
  threshold?: number | 'all';
  /** Leave out long-residence cells; default the cell's own choice. */
  dropLongResidence?: boolean;
}

export interface RealisePlan extends ChunkPlan {
  cell: string;
  count: number;
  seed: number;
  threshold: number | 'all';
  dropLongResidence: boolean;
}

export interface RealiseResult {
  cell: string;
  count: number;
  seed: number;
  threshold: number | 'all';
  dropLongResidence: boolean;
  frequencyHz: Float64Array;
  /** Per bin: h_c of the smooth expectation (f T sum N h^2), expected binaries, fraction of h_c^2 and of the count in long-residence cells. */
  smoothHc: Float64Array;
  expectedCount: Float64Array;
  longResidenceH2Fraction: Float64Array;
  longResidenceCountFraction: Float64Array;
  summary: RealisationSummary;
  draws: RealisationDraws;
}

function realisationsCellValue(sheet: Sheet, cell: string): RealisationsValue {
  if (!sheet.has(cell)) throw new SheetJobError(`realisations cell ${cell}: there is no cell of that name`);
  const st = sheet.state(cell);
  if (st.status === 'error') throw new SheetJobError(`realisations cell ${cell} has an error: ${st.error.message}`);
  const v = st.status === 'value' ? st.value : undefined;
  if (!isSheetObject(v) || v.kind !== 'realisations') throw new SheetJobError(`realisations cell ${cell} must hold realiseBackground(...), got ${isSheetObject(v) ? `a ${v.kind}` : typeof v}`);
  return v as unknown as RealisationsValue;
}

/** The cell holding realisations: the one named, or the only one in the sheet. */
export function realisationsCell(sheet: Sheet, cell?: string): string {
  if (cell !== undefined) return cell;
  const found = sheet.cells().filter((c) => {
    const st = sheet.state(c.name);
    return st.status === 'value' && isSheetObject(st.value) && st.value.kind === 'realisations';
  });
  if (found.length === 1) return found[0].name;
  if (found.length === 0) throw new SheetJobError('no cell holds realisations: add one such as realiseBackground(pop, freqs, array_span, 100, 1), or name it');
  throw new SheetJobError(`several cells hold realisations (${found.map((c) => c.name).join(', ')}): name one`);
}

const thresholdNumber = (t: number | 'all') => (t === 'all' ? Infinity : t);

/** The cells of a plan, built once per sheet object (a worker reuses its sheet for many chunks). */
const cellsOf = new WeakMap<Sheet, Map<string, RealisationCells>>();
function cellsFor(sheet: Sheet, plan: RealisePlan): RealisationCells {
  let m = cellsOf.get(sheet);
  if (!m) cellsOf.set(sheet, (m = new Map()));
  const key = `${plan.cell}|${plan.threshold}|${plan.dropLongResidence}`;
  let c = m.get(key);
  if (!c) {
    const s = realisationsCellValue(sheet, plan.cell).setup;
    try {
      // The environment's residence factor comes with the cell's set-up: the job counts as the cell does.
      c = realisationCells(s.population, s.cosmology, s.freqsHz, s.spanS, { threshold: thresholdNumber(plan.threshold), dropLongResidence: plan.dropLongResidence, residence: s.residence?.factor });
    } catch (e) {
      throw new SheetJobError(`realisations of ${plan.cell}: ${(e as Error).message}`);
    }
    m.set(key, c);
  }
  return c;
}

export const realiseJob: ChunkedJob<RealiseOptions, RealisePlan, RealisationDraws, RealiseResult> = {
  kind: 'realise',
  plan(sheet, opts) {
    const cell = realisationsCell(sheet, opts.cell);
    const v = realisationsCellValue(sheet, cell);
    const { count, seed } = opts;
    const bins = v.setup.freqsHz.length;
    if (!Number.isSafeInteger(count) || count < 1) throw new SheetJobError(`realisations: the count must be a positive whole number, got ${count}`);
    if (count * bins > MAX_RUN_REALISATION_BINS) throw new SheetJobError(`realisations: ${count} realisations of ${bins} bins exceed ${MAX_RUN_REALISATION_BINS} realisation-bins`);
    if (!Number.isSafeInteger(seed) || seed < 0) throw new SheetJobError(`realisations: the seed must be a non-negative whole number, got ${seed}`);
    const t = opts.threshold ?? (v.setup.threshold === Infinity ? 'all' : v.setup.threshold);
    if (t !== 'all' && !(t >= 0 && Number.isFinite(t))) throw new SheetJobError(`realisations: the threshold must be an expected count >= 0 or "all", got ${t}`);
    return { chunks: Math.ceil(count / REALISE_CHUNK), work: count, cell, count, seed, threshold: t, dropLongResidence: opts.dropLongResidence ?? v.setup.dropLongResidence };
  },
  chunkWork(plan, index) {
    const { start, end } = chunkRange(plan.count, REALISE_CHUNK, index);
    return end - start;
  },
  async runChunk(sheet, plan, index, control) {
    const cells = cellsFor(sheet, plan);
    const { start, end } = chunkRange(plan.count, REALISE_CHUNK, index);
    const blocks: RealisationDraws[] = [];
    for (let from = start; from < end; from += TICK_BLOCK) {
      blocks.push(drawRealisations(cells, plan.seed, from, Math.min(TICK_BLOCK, end - from)));
      await control.tick(Math.min(end, from + TICK_BLOCK) - start);
    }
    return joinDraws(blocks);
  },
  combine(sheet, plan, chunks) {
    const cells = cellsFor(sheet, plan);
    const draws = joinDraws(chunks);
    const bins = cells.bins;
    const all = (b: RealisationCells['bins'][number], part: number, kept: number) => (plan.dropLongResidence ? kept + part : kept);
    return {
      cell: plan.cell,
      count: plan.count,
      seed: plan.seed,
      threshold: plan.threshold,
      dropLongResidence: plan.dropLongResidence,
      frequencyHz: Float64Array.from(bins, (b) => b.frequencyHz),
      smoothHc: Float64Array.from(bins, (b) => Math.sqrt(b.hc2PerH2 * b.meanH2)),
      expectedCount: Float64Array.from(bins, (b) => b.expectedCount),
      longResidenceH2Fraction: Float64Array.from(bins, (b) => (b.longResidenceH2 > 0 ? b.longResidenceH2 / all(b, b.longResidenceH2, b.meanH2) : 0)),
      longResidenceCountFraction: Float64Array.from(bins, (b) => (b.longResidenceCount > 0 ? b.longResidenceCount / all(b, b.longResidenceCount, b.expectedCount) : 0)),
      summary: summariseRealisations(draws),
      draws,
    };
  },
};
