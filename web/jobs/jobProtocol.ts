// Messages between the page and the job worker. Everything crossing is plain data (structured clone):
// the sheet goes as its file text, results come back as numbers.
import type { RealiseJobResult, RealiseJobSpec } from './realiseRun';
import type { InferJobResult, InferJobSpec, InferProgressDetail } from '../inference/inferRun';


/** One scanned input: values from lo to hi (in the display unit given), n points, linear or log. */
export interface ScanAxisSpec {
  cell: string;
  lo: number;
  hi: number;
  n: number;
  log: boolean;
  /** Unit the numbers are in ('' for a plain number). */
  unit: string;
}

export type JobSpec =
  | { kind: 'scan1'; axis: ScanAxisSpec; output: string; measurement: string | null }
  | { kind: 'scan2'; x: ScanAxisSpec; y: ScanAxisSpec; output: string; measurement: string }
  | { kind: 'sample'; samples: number; seed: number; output: string; measurement: string | null }
  | { kind: 'goalSeek'; input: string; output: string; target: string }
  | RealiseJobSpec
  | InferJobSpec;

/** An input value that makes the output reach a target (Brent's method, src/statistics/goalSeek.ts). */
export interface GoalSeekJobResult {
  kind: 'goalSeek';
  input: string;
  output: string;
  target: string;
  /** The solution in the input cell's own unit ('' for a plain number). */
  value: number;
  unit: string;
  achievedSI: number;
  evaluations: number;
}

/** The measured amplitude's band at f_yr as the statistics code reports it. */
export interface BandData {
  median: number;
  lower: number;
  upper: number;
  level: number;
}

export interface Scan1Result {
  kind: 'scan1';
  input: ScanAxisSpec;
  output: string;
  /** Unit of the output values (SI text, '' for a plain number). */
  outputUnit: string;
  /** Input values in the axis unit; output values in SI (plain numbers). */
  x: number[];
  y: number[];
  band?: BandData;
  /** Outputs obtained by the sqrt law instead of evaluating every point (checked with probes). */
  scaled: boolean;
  /** Message per point that failed (index -> message), at most a few. */
  failures: { index: number; message: string }[];
}

export interface Scan2Result {
  kind: 'scan2';
  x: ScanAxisSpec;
  y: ScanAxisSpec;
  output: string;
  xValues: number[];
  yValues: number[];
  /** Row-major nx * ny grid (index i + nx * j) of the posterior mass per cell (sums to 1). */
  mass: number[];
  /** Mass thresholds enclosing 68.27% and 95.45% (highest-posterior-density order). */
  levels: { level: number; threshold: number }[];
  prior: string;
  failures: { index: number; message: string }[];
}

export interface SampleResult {
  kind: 'sample';
  output: string;
  outputUnit: string;
  band?: BandData;
  samples: number;
  seed: number;
  /** Sorted output values (SI), possibly thinned for transfer. */
  sorted: number[];
  summary: { label: string; value: string }[];
}

export type JobResult = Scan1Result | Scan2Result | SampleResult | GoalSeekJobResult | RealiseJobResult | InferJobResult;

/** `workers`: Web Workers for the job's chunks (default: the browser's core count). */
export type ToWorker = { type: 'start'; jobId: number; sheetText: string; job: JobSpec; workers?: number } | { type: 'cancel'; jobId: number };

export type FromWorker =
  | { type: 'progress'; jobId: number; done: number; total: number; detail?: InferProgressDetail }
  | { type: 'result'; jobId: number; result: JobResult; elapsedMs: number }
  | { type: 'cancelled'; jobId: number }
  | { type: 'error'; jobId: number; message: string };
