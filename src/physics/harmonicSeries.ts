// The harmonic sum of the eccentric GW-driven background for one e0 (Enoki & Nagashima 2007, PTP 117, 241):
//   Phi(x; e0) = sum_{n=1}^{top} (2/n)^(2/3) g(n, e_n) / F(e_n),  x = f_r / f0,
// e_n the eccentricity at orbital frequency f_r / n (Peters 1964, Phys. Rev. 136, B1224), g and F of
// Peters & Mathews 1963 (Phys. Rev. 131, 435). What depends on e0 alone is computed once per series.
import { eccentricityEnhancement, harmonicPower, harmonicPowerBound, harmonicPowerBoundPart } from './petersMathews';
import { eccentricityFromShape, petersShapeLog } from './petersEvolution';

/** A harmonic whose Kapteyn-bounded weight is below this is skipped (it cannot change a double sum of size >= 1e-2). */
export const SKIP_WEIGHT = 1e-19;

/**
 * The sum of harmonics 1 .. top at x for one e0, and its value after a chosen harmonic (or after each).
 * Should top exceed x, the harmonics above x (orbits not formed yet, x/n < 1) give the sum's smooth
 * continuation; the cheap keep test, which assumes e_n <= e0, is not used for them.
 */
export class HarmonicSeries {
  /** The sum after harmonic `partialAt` in the last sum() call. */
  partial = 0;
  private readonly shape0: number;
  private readonly enhancement0: number;
  private readonly eBoundFactor: number; // e(f0 r) <= eBoundFactor r^(-19/18), see tailSkipped
  // keptFrom[n]: from this eccentricity on, harmonic n surely passes the cheap skip test (below).
  private keptFrom = new Float64Array(0);

  constructor(readonly e0: number) {
    if (!(e0 >= 0 && e0 < 1)) throw new RangeError(`eccentricity e0 must lie in [0, 1), got ${e0}`);
    this.shape0 = e0 === 0 ? 0 : petersShapeLog(e0);
    this.enhancement0 = eccentricityEnhancement(e0);
    this.eBoundFactor = e0 === 0 ? 0 : Math.exp((19 / 12) * this.shape0);
  }

  /**
   * Phi(x; e0) summed over harmonics 1 .. top; the sum after harmonic partialAt is kept in `partial`,
   * and, if given, the sum after each harmonic n in prefix[n] (prefix[0] = 0).
   */
  sum(x: number, top: number, partialAt: number, prefix?: Float64Array): number {
    const e0 = this.e0;
    const shape0 = this.shape0;
    const twoOverN23 = harmonicWeights(top);
    const keptFrom = this.keptFromUpTo(top);
    let sum = 0;
    let en = e0;
    // harmonics lowestSure .. top are shown to be skipped (tailFrom); checks stop once top itself is not
    let lowestSure = top + 1;
    if (prefix) prefix[0] = 0;
    for (let n = 1; n <= top; n++) {
      // e grows with n (lower orbital frequency): the previous harmonic's e is a close first guess.
      en = e0 === 0 ? 0 : eccentricityFromShape(e0, shape0, x / n, n === 1 ? undefined : nextGuess(en, n));
      const weight = twoOverN23[n] / eccentricityEnhancement(en);
      // Skipped when the bound is below SKIP_WEIGHT; its cheap part decides first where it is above, and
      // before it the eccentricity above which that part surely passes (keptFrom, no transcendental call;
      // it assumes e_n <= e0, true where the orbit has formed, n <= x), and after it one Kapteyn bound
      // that shows the bound surely below (skipBound).
      if (n <= 2 || (en >= keptFrom[n] && n <= x) || (!(skipBound(n, n * en, twoOverN23[n]) < 0.5 * SKIP_WEIGHT) && (weight * harmonicPowerBoundPart(n, en) >= SKIP_WEIGHT || weight * harmonicPowerBound(n, en) >= SKIP_WEIGHT))) {
        sum += weight * harmonicPower(n, en);
      } else if (lowestSure > 0) {
        // a harmonic skipped: if every later one surely is too, the sum is complete
        lowestSure = this.tailFrom(x, n, lowestSure);
        if (lowestSure === n + 1) {
          if (partialAt >= n && partialAt <= top) this.partial = sum;
          if (prefix) prefix.fill(sum, n, top + 1);
          break;
        }
        if (lowestSure === top + 1) lowestSure = 0; // top itself may be kept: no tail to skip
      }
      if (n === partialAt) this.partial = sum;
      if (prefix) prefix[n] = sum;
    }
    return sum;
  }

  /**
   * Extends the run lowestSure .. top of harmonics shown to fail the skip test down towards after + 1,
   * without their eccentricities, and returns its new start (after + 1 when all are shown): since
   * -ln(1 - e^2) and the last term of the Peters 1964 shape are >= 0, (12/19) ln e_n <= shape(e0) -
   * (2/3) ln(x/n), an upper bound e^ on e_n, and skipBound(n, n e^) grows with e (Kapteyn's bound grows
   * with the argument).
   */
  private tailFrom(x: number, after: number, lowestSure: number): number {
    const twoOverN23 = harmonicWeights(lowestSure);
    let n = lowestSure - 1;
    for (; n > after; n--) {
      const eHat = this.eBoundFactor * Math.pow(n / x, 19 / 18) * (1 + 1e-9);
      if (!(skipBound(n, n * eHat, twoOverN23[n]) < 0.5 * SKIP_WEIGHT)) break;
    }
    return n + 1;
  }

  private keptFromUpTo(top: number): Float64Array {
    if (this.keptFrom.length <= top) {
      const t = new Float64Array(Math.max(top + 1, 2 * this.keptFrom.length, 64));
      t.set(this.keptFrom);
      const weights = harmonicWeights(t.length);
      for (let n = Math.max(this.keptFrom.length, 1); n < t.length; n++) t[n] = surePassEccentricity(n, weights[n] / this.enhancement0);
      this.keptFrom = t;
    }
    return this.keptFrom;
  }
}

/**
 * An upper bound on (2/n)^(2/3)/F(e) * harmonicPowerBound(n, e) at x = n e, n >= 3: the weight is at most
 * twoOverN23 = (2/n)^(2/3) (F >= 1), the five Bessel bounds are at most Kapteyn's bound K_{n-2}(x) (it
 * falls with the order), and the coefficients at e <= 1 make the bound at most 1.9 n^4 K^2. Compared
 * with SKIP_WEIGHT / 2, a factor 2 to spare for rounding. Infinity where Kapteyn's bound is 1 (x >= n-2).
 */
function skipBound(n: number, x: number, twoOverN23: number): number {
  const m = n - 2;
  const z = x / m;
  if (!(z < 1)) return Infinity;
  const s = Math.sqrt(1 - z * z);
  const k = Math.exp(m * (Math.log(z) + s - Math.log1p(s)));
  const n2 = n * n;
  return twoOverN23 * 1.9 * n2 * n2 * k * k;
}

/**
 * A first guess of e_n from e_{n-1}: the orbital frequency falls by (n-1)/n, and
 * d ln e / d ln f = -(2/3) / (e d shape/de) (Peters 1964, eq. 5.11 with Kepler's law), so to first
 * order e_n = e_{n-1} (n / (n-1))^((2/3) / (e shape'(e))).
 */
function nextGuess(ePrev: number, n: number): number {
  const e2 = ePrev * ePrev;
  const eSlope = 12 / 19 + (2 * e2) / (1 - e2) + ((870 / 2299) * (242 / 304) * e2) / (1 + (121 / 304) * e2);
  return ePrev * Math.pow(n / (n - 1), 2 / (3 * eSlope));
}

/**
 * An eccentricity e* such that every e in [e*, e0] passes the cheap skip test of harmonic n,
 * (2/n)^(2/3)/F(e) * harmonicPowerBoundPart(n, e) >= SKIP_WEIGHT, with a factor 2 to spare for rounding;
 * Infinity where none is found. minWeight = (2/n)^(2/3)/F(e0) bounds the weight from below (F grows
 * with e, and e_n <= e0 since x/n >= 1). The part is (n^2/24) K^2, K = exp(n g(u)) Kapteyn's bound
 * at z = e = exp(u), g(u) = u + s - ln(1 + s), s = sqrt(1 - z^2), which increases with u (dg/du = s),
 * so e* = exp(u*) with g(u*) = ln(48 SKIP_WEIGHT / (minWeight n^2)) / (2 n), by Newton's method.
 */
function surePassEccentricity(n: number, minWeight: number): number {
  if (n <= 2) return 0;
  const target = Math.log((48 * SKIP_WEIGHT) / (minWeight * n * n)) / (2 * n);
  if (!(target < 0)) return Infinity; // K <= 1: the test may fail whatever e is
  const g = (u: number): number => {
    const z = Math.exp(u);
    const s = Math.sqrt(1 - z * z);
    return u + s - Math.log1p(s) - target;
  };
  // g is concave: from u = target (where g >= 0) Newton's steps approach the root from below.
  let u = target;
  for (let i = 0; i < 60; i++) {
    const z = Math.exp(u);
    const s = Math.sqrt(1 - z * z);
    const step = (u + s - Math.log1p(s) - target) / s;
    if (!Number.isFinite(step)) break;
    u -= step;
    if (Math.abs(step) < 1e-14) break;
  }
  // above the root by a margin, checked
  const above = u + 1e-12;
  return above < 0 && g(above) >= 0 ? Math.exp(above) : Infinity;
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

// The series of the last few e0 values asked for by harmonicSeriesFor.
const recent: HarmonicSeries[] = [];

/** The series of one e0 (kept for the last 8 values asked for). */
export function harmonicSeriesFor(e0: number): HarmonicSeries {
  for (const s of recent) if (s.e0 === e0) return s;
  const s = new HarmonicSeries(e0);
  if (recent.length >= 8) recent.shift();
  recent.push(s);
  return s;
}
