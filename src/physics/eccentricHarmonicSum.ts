// The harmonic-sum factor of the eccentric GW-driven background (Enoki & Nagashima 2007, PTP 117, 241):
//   dE/dln f_r = (dE/dln f_r)_circular * Phi,  Phi = sum_n (2/n)^(2/3) g(n, e_n) / F(e_n),
// where e_n is the eccentricity when the orbital frequency is f_r / n, and only orbits that exist
// (f_r / n >= f0 for binaries that start at orbital frequency f0 with eccentricity e0) contribute.
// Under GW-only decay e depends on f_orb/f0 and e0 alone (Peters 1964, Phys. Rev. 136, B1224), so
// Phi is a universal function of x = f_r / f0 for each e0; HarmonicSumTable tabulates it once.
import { harmonicCut } from './petersMathews';
import { HarmonicSeries, harmonicSeriesFor } from './harmonicSeries';
import { NO_TIME_CHECK, type TimeCheck } from './timeCheck';

/**
 * Phi(x; e0) by direct summation over harmonics n = 1 .. min(floor(x), nMax), x = f_r / f0.
 * nTop, if given, replaces floor(x) (used for left limits at integer x).
 */
export function harmonicSumDirect(x: number, e0: number, nMax: number, nTop?: number): number {
  if (!(x >= 1)) return 0;
  const top = Math.min(nTop ?? Math.floor(x), nMax);
  if (!(top >= 1)) return 0;
  return harmonicSeriesFor(e0).sum(x, top, 0);
}

export interface HarmonicSumTableOptions {
  /**
   * Not part of the table (nor of its cache key): called once per integer interval when it is built
   * (on the first query inside it) and once per log-grid point (TimeCheck; a stop leaves the table as it was).
   */
  checkTime?: TimeCheck;
  /**
   * Power fraction allowed to be left out at e0 by truncating the harmonic sum (sum rule
   * sum_n g = F, Peters & Mathews 1963). Default 1e-7.
   */
  harmonicTolerance?: number;
  /**
   * Sub-intervals of [1, 2); interval [k, k+1) gets max(4, ceil(pointsPerUnit / k)) (Phi varies on the
   * scale of x itself, so the relative step stays about 1/pointsPerUnit). Default 16.
   */
  pointsPerUnit?: number;
  /** x where the integer-interval region ends and the logarithmic grid begins. Default 64. */
  integerRegionEnd?: number;
  /** Logarithmic grid points per decade of x. Default 48. */
  pointsPerDecade?: number;
}

/**
 * Phi(x) tabulated for one e0 (or a weighted mixture of e0 values on the same grid).
 * Layout: x < 1 gives 0 (no orbit exists yet); on [1, 16) each unit interval [k, k+1) holds its own
 * uniformly spaced values (ceil(16/k), at least 4, steps), from the right limit at k to the left limit
 * at k+1 (Phi jumps at every integer, where harmonic k+1 switches on), built on the first query inside
 * it. On [16, X1) one step per unit is as fine (relative step at most 1/16): on [k, k+1) Phi is the sum
 * over harmonics n <= k, a smooth function of x also beyond the interval, interpolated (eight-point
 * Lagrange) from its values at the integers k .. k+7; the sums over n <= K at integer j are kept for
 * every K (one pass per j), so an interval costs a few harmonics, not four sums. On [X1, X2] a logarithmic grid, computed as far as queries reach (the jumps there are below the stated
 * tolerance, checked in test/orbits); beyond X2, where |Phi - 1| < 1e-9, the small-e law
 * Phi - 1 proportional to e^2 proportional to x^(-19/9) (Peters 1964: e proportional to f^(-19/18)).
 * Interpolation is four-point Lagrange (cubic) in x (unit intervals) and in ln x (log region), never
 * across a jump. Every value is the same whatever order the queries come in.
 */
export class HarmonicSumTable {
  readonly e0Values: Float64Array;
  readonly e0Weights: Float64Array;
  /** Highest harmonic kept for each e0. */
  readonly harmonicsKept: Int32Array;
  /** Largest power fraction left out by the truncation, over the e0 values. */
  readonly omittedFraction: number;
  private readonly unitSteps: Int32Array; // sub-intervals of [k, k+1), index k - 1
  private readonly unitOffsets: Int32Array; // start of interval k's values in unitValues
  private readonly unitBuilt: Uint8Array; // index k - 1: interval k's values are in place
  private unitCount = 0; // values of the intervals built
  private readonly x1: number;
  private readonly unitValues: Float64Array; // per interval [k, k+1): unitSteps + 1 values
  private readonly unitFrom: number; // from this interval on, values at the integers (16, or X1)
  // per e0 value c and integer j >= unitFrom - 1: the sums over harmonics n <= K at x = j, index K
  private readonly integerSums: (Float64Array | undefined)[][];
  private readonly nodes8 = new Float64Array(8);
  // At integer x = j the left limit (harmonics up to j - 1) and the value (up to j) share their first
  // j - 1 terms, so one pass gives both: the last value of interval j - 1 and the first of interval j.
  private readonly jumpLeft: Float64Array; // index j
  private readonly jumpRight: Float64Array;
  private readonly jumpDone: Uint8Array;
  private readonly logStart: number;
  private readonly logStep: number;
  // The log grid grows on demand, in order, so only the x range actually asked for is computed; the
  // values (and where the grid ends) are the same whatever order the queries come in.
  private logValues = new Float64Array(64);
  private logCount = 0;
  private logCalm = 0;
  private logDone = false;
  private x2 = Infinity;
  private tailAtX2 = 0;
  private readonly series: HarmonicSeries[]; // per e0 value
  private readonly checkTime: TimeCheck;

  /** A table for one e0, or for a mixture sum_k w_k Phi(x; e0_k) (weights summing to 1). */
  constructor(e0: number | { values: ArrayLike<number>; weights: ArrayLike<number> }, opts: HarmonicSumTableOptions = {}) {
    const values = typeof e0 === 'number' ? [e0] : Array.from(e0.values);
    const weights = typeof e0 === 'number' ? [1] : Array.from(e0.weights);
    if (values.length === 0 || values.length !== weights.length) throw new RangeError('HarmonicSumTable: e0 values and weights must be non-empty and of equal length');
    for (const e of values) if (!(e >= 0 && e < 1)) throw new RangeError(`HarmonicSumTable: eccentricity e0 must lie in [0, 1), got ${e}`);
    const tol = opts.harmonicTolerance ?? 1e-7;
    const perUnit = opts.pointsPerUnit ?? 16;
    this.x1 = opts.integerRegionEnd ?? 64;
    const perDecade = opts.pointsPerDecade ?? 48;
    this.e0Values = Float64Array.from(values);
    this.e0Weights = Float64Array.from(weights);
    const cuts = values.map((e) => harmonicCut(e, tol));
    this.harmonicsKept = Int32Array.from(cuts.map((c) => c.nMax));
    this.omittedFraction = Math.max(...cuts.map((c) => c.omittedFraction));
    this.series = values.map((e) => new HarmonicSeries(e));
    // where one step per unit is fine enough (ceil(perUnit / k) = 1), at least at integer 2
    this.unitFrom = Math.min(Math.max(perUnit, 2), this.x1);
    this.integerSums = values.map(() => []);

    this.unitSteps = new Int32Array(this.x1 - 1);
    this.unitOffsets = new Int32Array(this.x1 - 1);
    this.unitBuilt = new Uint8Array(this.x1 - 1);
    let total = 0;
    for (let k = 1; k < this.x1; k++) {
      this.unitSteps[k - 1] = Math.max(4, Math.ceil(perUnit / k));
      this.unitOffsets[k - 1] = total;
      total += this.unitSteps[k - 1] + 1;
    }
    this.unitValues = new Float64Array(total);
    this.jumpLeft = new Float64Array(this.x1 + 1);
    this.jumpRight = new Float64Array(this.x1 + 1);
    this.jumpDone = new Uint8Array(this.x1 + 1);
    this.checkTime = opts.checkTime ?? NO_TIME_CHECK;
    this.logStart = Math.log(this.x1);
    this.logStep = Math.LN10 / perDecade;
    this.growLog(3); // at least four values, so interpolation always has its nodes
  }

  /** sum_k w_k Phi(x; e0_k) over harmonics up to min(nTop ?? floor(x), nMax_k). */
  private mix(x: number, nTop?: number): number {
    let s = 0;
    for (let k = 0; k < this.series.length; k++) {
      if (this.e0Weights[k] === 0) continue;
      const top = Math.min(nTop ?? Math.floor(x), this.harmonicsKept[k]);
      if (top >= 1) s += this.e0Weights[k] * this.series[k].sum(x, top, 0);
    }
    return s;
  }

  /** The left limit and the value at integer x = j (1 < j <= X1), from one pass per e0. */
  private jumpAt(j: number): void {
    if (this.jumpDone[j]) return;
    let left = 0;
    let right = 0;
    for (let c = 0; c < this.series.length; c++) {
      if (this.e0Weights[c] === 0) continue;
      const nMax = this.harmonicsKept[c];
      const full = this.series[c].sum(j, Math.min(j, nMax), Math.min(j - 1, nMax));
      left += this.e0Weights[c] * this.series[c].partial;
      right += this.e0Weights[c] * full;
    }
    this.jumpLeft[j] = left;
    this.jumpRight[j] = right;
    this.jumpDone[j] = 1;
  }

  /** Computes the values of interval [k, k+1). */
  private buildInterval(k: number): void {
    this.checkTime();
    const m = this.unitSteps[k - 1];
    const o = this.unitOffsets[k - 1];
    if (k > 1) this.jumpAt(k);
    this.jumpAt(k + 1);
    const v = this.unitValues;
    v[o] = k > 1 ? this.jumpRight[k] : this.mix(1, 1);
    for (let i = 1; i < m; i++) v[o + i] = this.mix(k + i / m, k);
    v[o + m] = this.jumpLeft[k + 1];
    this.unitBuilt[k - 1] = 1;
    this.unitCount += m + 1;
  }

  /** Phi at x in [k, k+1), k >= unitFrom: the sum over n <= k through its values at the integers k .. k+7. */
  private byIntegers(x: number, k: number): number {
    for (let d = 0; d < 8; d++) {
      const j = k + d;
      let v = 0;
      for (let c = 0; c < this.series.length; c++) {
        if (this.e0Weights[c] === 0) continue;
        v += this.e0Weights[c] * this.sumsAt(c, j)[Math.min(k, this.harmonicsKept[c])];
      }
      this.nodes8[d] = v;
    }
    return eightPointAt(this.nodes8, x - k);
  }

  /** The sums over harmonics n <= K at x = j for K = 0 .. min(j, nMax) (the intervals up to j use them). */
  private sumsAt(c: number, j: number): Float64Array {
    const i = j - this.unitFrom;
    let row = this.integerSums[c][i];
    if (!row) {
      this.checkTime();
      const top = Math.min(j, this.harmonicsKept[c]);
      row = new Float64Array(top + 1);
      this.series[c].sum(j, top, 0, row);
      this.integerSums[c][i] = row;
      this.unitCount += 1;
    }
    return row;
  }

  /** Computes log-grid values up to index i (or until the grid ends: Phi within 1e-9 of 1 at four points, or x > 1e15). */
  private growLog(i: number): void {
    while (!this.logDone && this.logCount <= i) {
      this.checkTime();
      const j = this.logCount;
      const x = Math.exp(this.logStart + j * this.logStep);
      const v = this.mix(x);
      if (j === this.logValues.length) {
        const bigger = new Float64Array(2 * j);
        bigger.set(this.logValues);
        this.logValues = bigger;
      }
      this.logValues[j] = v;
      this.logCount = j + 1;
      this.logCalm = Math.abs(v - 1) < 1e-9 ? this.logCalm + 1 : 0;
      if ((this.logCalm >= 4 && j >= 3) || x > 1e15) {
        this.logDone = true;
        this.x2 = x;
        this.tailAtX2 = v - 1;
      }
    }
  }

  /** Phi at x = f_r / f0. */
  at(x: number): number {
    if (!(x >= 1)) return 0;
    if (x < this.x1) {
      const k = Math.floor(x);
      if (k >= this.unitFrom) return this.byIntegers(x, k);
      if (!this.unitBuilt[k - 1]) this.buildInterval(k);
      const m = this.unitSteps[k - 1];
      return cubicAt(this.unitValues, this.unitOffsets[k - 1], m + 1, (x - k) * m);
    }
    const t = (Math.log(x) - this.logStart) / this.logStep;
    if (!this.logDone) this.growLog(Math.floor(t) + 2);
    if (x <= this.x2) return cubicAt(this.logValues, 0, this.logCount, t);
    return 1 + this.tailAtX2 * Math.pow(this.x2 / x, 19 / 9);
  }

  /** Where the logarithmic grid ends (above it the small-e law is used); completes the grid. */
  get logGridEnd(): number {
    this.growLog(Number.MAX_SAFE_INTEGER);
    return this.x2;
  }

  /** Number of values tabulated so far. */
  get size(): number {
    return this.unitCount + this.logCount;
  }
}

/** prod_{b != a} (a - b) for nodes 0 .. 7. */
const EIGHT_POINT_DENOMINATORS = Float64Array.from({ length: 8 }, (_, a) => {
  let d = 1;
  for (let b = 0; b < 8; b++) if (b !== a) d *= a - b;
  return d;
});

/**
 * Eight-point Lagrange interpolation at t (0 <= t <= 1 here) of values[0..7] at t = 0..7, written about
 * values[0] so that a constant is reproduced exactly and t = 0 gives values[0].
 */
function eightPointAt(values: Float64Array, t: number): number {
  const y0 = values[0];
  let s = 0;
  for (let a = 1; a < 8; a++) {
    let l = 1 / EIGHT_POINT_DENOMINATORS[a];
    for (let b = 0; b < 8; b++) if (b !== a) l *= t - b;
    s += l * (values[a] - y0);
  }
  return y0 + s;
}

/** Four-point Lagrange interpolation at fractional index t of values[offset .. offset + count - 1] (count >= 4). */
function cubicAt(values: Float64Array, offset: number, count: number, t: number): number {
  let i = Math.floor(t) - 1;
  if (i < 0) i = 0;
  if (i > count - 4) i = count - 4;
  const u = t - i; // position relative to node i, in [0, 3]
  const y0 = values[offset + i];
  const y1 = values[offset + i + 1];
  const y2 = values[offset + i + 2];
  const y3 = values[offset + i + 3];
  const a = u - 1;
  const b = u - 2;
  const c = u - 3;
  // Written about y1 so that a constant table is reproduced exactly (the basis sums to 1).
  return y1 + (-(y0 - y1) * a * b * c - 3 * (y2 - y1) * u * a * c + (y3 - y1) * u * a * b) / 6;
}
