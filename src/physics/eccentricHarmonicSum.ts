// The harmonic-sum factor of the eccentric GW-driven background (Enoki & Nagashima 2007, PTP 117, 241):
//   dE/dln f_r = (dE/dln f_r)_circular * Phi,  Phi = sum_n (2/n)^(2/3) g(n, e_n) / F(e_n),
// where e_n is the eccentricity when the orbital frequency is f_r / n, and only orbits that exist
// (f_r / n >= f0 for binaries that start at orbital frequency f0 with eccentricity e0) contribute.
// Under GW-only decay e depends on f_orb/f0 and e0 alone (Peters 1964, Phys. Rev. 136, B1224), so
// Phi is a universal function of x = f_r / f0 for each e0; HarmonicSumTable tabulates it once.
import { eccentricityEnhancement, harmonicCut, harmonicPower, harmonicPowerBound, harmonicPowerBoundPart } from './petersMathews';
import { eccentricityFromShape, petersShapeLog } from './petersEvolution';
import { NO_TIME_CHECK, type TimeCheck } from './timeCheck';

/** A harmonic whose Kapteyn-bounded weight is below this is skipped (it cannot change a double sum of size >= 1e-2). */
const SKIP_WEIGHT = 1e-19;

/**
 * Phi(x; e0) by direct summation over harmonics n = 1 .. min(floor(x), nMax), x = f_r / f0.
 * nTop, if given, replaces floor(x) (used for left limits at integer x).
 */
export function harmonicSumDirect(x: number, e0: number, nMax: number, nTop?: number): number {
  if (!(x >= 1)) return 0;
  const below = Math.floor(x);
  return sumHarmonics(x, e0, Math.min(nTop ?? below, nMax), 0);
}

/** The sum after harmonic `partialAt` in the last sumHarmonics call. */
let partialSum = 0;

/** Phi(x; e0) summed over harmonics 1 .. top (x >= 1); the sum after harmonic partialAt is kept in partialSum. */
function sumHarmonics(x: number, e0: number, top: number, partialAt: number): number {
  if (top >= 1 && !(e0 >= 0 && e0 < 1)) throw new RangeError(`eccentricity e0 must lie in [0, 1), got ${e0}`);
  const shape0 = e0 === 0 ? 0 : petersShapeLog(e0);
  const twoOverN23 = harmonicWeights(top);
  let sum = 0;
  let en = e0;
  for (let n = 1; n <= top; n++) {
    // e grows with n (lower orbital frequency): the previous harmonic's e is a close first guess.
    en = e0 === 0 ? 0 : eccentricityFromShape(e0, shape0, x / n, n === 1 ? undefined : en);
    const weight = twoOverN23[n] / eccentricityEnhancement(en);
    // Skipped when the bound is below SKIP_WEIGHT; its cheap part decides first where it is above.
    if (n <= 2 || weight * harmonicPowerBoundPart(n, en) >= SKIP_WEIGHT || weight * harmonicPowerBound(n, en) >= SKIP_WEIGHT) sum += weight * harmonicPower(n, en);
    if (n === partialAt) partialSum = sum;
  }
  return sum;
}

/** (2/n)^(2/3) at index n, for n up to at least `top` (kept between calls, grown on demand). */
let harmonicWeightTable = new Float64Array(0);
function harmonicWeights(top: number): Float64Array {
  if (harmonicWeightTable.length <= top) {
    const t = new Float64Array(Math.max(top + 1, 2 * harmonicWeightTable.length, 64));
    for (let n = 1; n < t.length; n++) t[n] = Math.pow(2 / n, 2 / 3);
    harmonicWeightTable = t;
  }
  return harmonicWeightTable;
}

export interface HarmonicSumTableOptions {
  /**
   * Not part of the table (nor of its cache key): called once per integer interval while it is built
   * and once per point the log grid grows by later (TimeCheck; a stop leaves the grid as it was).
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
 * Layout: x < 1 gives 0 (no orbit exists yet); on [1, X1) each unit interval [k, k+1) holds its own
 * uniformly spaced values (max(4, ceil(16/k)) steps), from the right limit at k to the left limit at k+1 (Phi jumps at every
 * integer, where harmonic k+1 switches on); on [X1, X2] a logarithmic grid, computed as far as queries
 * reach (the jumps there are below
 * the stated tolerance, checked in test/orbits); beyond X2, where |Phi - 1| < 1e-9, the small-e law
 * Phi - 1 proportional to e^2 proportional to x^(-19/9) (Peters 1964: e proportional to f^(-19/18)).
 * Interpolation is four-point Lagrange (cubic) in x (integer region) and in ln x (log region), never
 * across an integer below X1.
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
  private readonly x1: number;
  private readonly unitValues: Float64Array; // per interval [k, k+1): unitSteps + 1 values
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
  private readonly mix: (x: number, nTop?: number) => number;
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

    const mix = (x: number, nTop?: number): number => {
      let s = 0;
      for (let k = 0; k < values.length; k++) if (weights[k] !== 0) s += weights[k] * harmonicSumDirect(x, values[k], this.harmonicsKept[k], nTop);
      return s;
    };

    this.unitSteps = new Int32Array(this.x1 - 1);
    this.unitOffsets = new Int32Array(this.x1 - 1);
    let total = 0;
    for (let k = 1; k < this.x1; k++) {
      this.unitSteps[k - 1] = Math.max(4, Math.ceil(perUnit / k));
      this.unitOffsets[k - 1] = total;
      total += this.unitSteps[k - 1] + 1;
    }
    this.unitValues = new Float64Array(total);
    const checkTime = (this.checkTime = opts.checkTime ?? NO_TIME_CHECK);
    // At x = k + 1 the left limit (harmonics up to k) and the value (up to k + 1) share their first k
    // terms: one pass gives both (rightAt, the value, starts interval k + 1).
    const rightAt = { value: 0 };
    const leftAndRight = (x: number, k: number): number => {
      let left = 0;
      let right = 0;
      for (let c = 0; c < values.length; c++) {
        if (weights[c] === 0) continue;
        const nMax = this.harmonicsKept[c];
        const full = sumHarmonics(x, values[c], Math.min(k + 1, nMax), Math.min(k, nMax));
        left += weights[c] * partialSum;
        right += weights[c] * full;
      }
      rightAt.value = right;
      return left;
    };
    for (let k = 1; k < this.x1; k++) {
      checkTime();
      const m = this.unitSteps[k - 1];
      const o = this.unitOffsets[k - 1];
      for (let i = 0; i < m; i++) this.unitValues[o + i] = i === 0 && k > 1 ? rightAt.value : mix(k + i / m, k);
      this.unitValues[o + m] = leftAndRight(k + m / m, k);
    }
    this.logStart = Math.log(this.x1);
    this.logStep = Math.LN10 / perDecade;
    this.mix = mix;
    this.growLog(3); // at least four values, so interpolation always has its nodes
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
    return this.unitValues.length + this.logCount;
  }
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
