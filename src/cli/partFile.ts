// Part files of sharded runs (`--shard K/N`): the chunk results of one shard with what identifies
// the run (sheet text and its SHA-256, command, options, seed, shard), so that `strainsheet merge`
// can check that the parts belong together and rebuild the result of the unsharded run.
// Float64Arrays are stored as base64 of their little-endian bytes, so every value (NaN included)
// comes back bit for bit.
import { createRequire } from 'node:module';
import type { JobSpec } from '../statistics/jobs';

export const PART_FORMAT = 'strainsheet-part';
export const PART_VERSION = 1;

export interface PartFile {
  format: typeof PART_FORMAT;
  version: number;
  command: string;
  /** Chunked job kind (scan1d, scan2d, sample, ...). */
  kind: string;
  sheetSha256: string;
  /** The sheet's file text after --set edits: what every shard evaluated. */
  sheet: string;
  /** The job's options as given on the command line (outputs, ranges, samples, measurement cell...). */
  options: JobSpec;
  /** Seed of a random job; null for a job without randomness. */
  seed: number | null;
  shard: { index: number; count: number };
  /** Chunks [first, end) of `total` held in `results`, in order. */
  chunks: { first: number; end: number; total: number };
  results: unknown[];
}

export function sha256Hex(text: string): string {
  // node:crypto is loaded here, on first use, not with the command line (3-7 ms of every start)
  const { createHash } = createRequire(import.meta.url)('node:crypto') as typeof import('node:crypto');
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

/** JSON.stringify replacer: Float64Array -> { $f64: base64 }. */
function encode(_key: string, value: unknown): unknown {
  if (value instanceof Float64Array) return { $f64: Buffer.from(value.buffer, value.byteOffset, value.byteLength).toString('base64') };
  return value;
}

/** JSON.parse reviver: { $f64: base64 } -> Float64Array. */
function decode(_key: string, value: unknown): unknown {
  if (value && typeof value === 'object' && !Array.isArray(value) && typeof (value as { $f64?: unknown }).$f64 === 'string' && Object.keys(value).length === 1) {
    const bytes = Buffer.from((value as { $f64: string }).$f64, 'base64');
    if (bytes.length % 8 !== 0) throw new Error('a stored number array has a length that is not a multiple of 8 bytes');
    const out = new Float64Array(bytes.length / 8);
    new Uint8Array(out.buffer).set(bytes);
    return out;
  }
  return value;
}

export function partFileText(part: PartFile): string {
  return JSON.stringify(part, encode) + '\n';
}

/** Parses and checks the shape of a part file; throws an Error naming what is wrong (the caller adds the file name). */
export function parsePartFile(text: string): PartFile {
  let v: unknown;
  try {
    v = JSON.parse(text, decode);
  } catch (e) {
    throw new Error(`not a part file: ${(e as Error).message}`);
  }
  const p = v as Partial<PartFile>;
  if (!p || typeof p !== 'object' || p.format !== PART_FORMAT) throw new Error(`not a part file (its "format" is not "${PART_FORMAT}")`);
  if (p.version !== PART_VERSION) throw new Error(`part file version ${String(p.version)}; this strainsheet reads version ${PART_VERSION}`);
  const isWhole = (x: unknown) => Number.isSafeInteger(x) && (x as number) >= 0;
  if (typeof p.command !== 'string' || typeof p.kind !== 'string') throw new Error('"command" and "kind" must be text');
  if (typeof p.sheet !== 'string' || typeof p.sheetSha256 !== 'string') throw new Error('"sheet" and "sheetSha256" must be text');
  if (sha256Hex(p.sheet) !== p.sheetSha256) throw new Error('the sheet it holds does not match its "sheetSha256" (the file was changed)');
  if (!p.options || typeof p.options !== 'object') throw new Error('"options" is missing');
  if (!(p.seed === null || isWhole(p.seed))) throw new Error('"seed" must be a whole number or null');
  const s = p.shard;
  if (!s || !isWhole(s.index) || !isWhole(s.count) || s.index < 1 || s.index > s.count) throw new Error('"shard" must be {index, count} with 1 <= index <= count');
  const c = p.chunks;
  if (!c || !isWhole(c.first) || !isWhole(c.end) || !isWhole(c.total) || c.first > c.end || c.end > c.total) throw new Error('"chunks" must be {first, end, total} with first <= end <= total');
  if (!Array.isArray(p.results) || p.results.length !== c.end - c.first) throw new Error(`"results" must hold ${c.end - c.first} chunk results`);
  return p as PartFile;
}
