// A phenomenological hardening model with a fixed total lifetime, of the form used by the population
// analyses of Agazie et al. 2023 (ApJL 952, L37; arXiv:2306.16220, first author and abstract checked
// 2026-12-02; unverified: the form, the default values and the equation number, since the abstract gives
// no hardening form and the text beyond it was not reachable; that this arXiv number is ApJL 952, L37 is
// not stated in the reachable text either). The environment hardens a circular binary at
//   da/dt_env = -A x^(1 - nu_in) (1 + x)^(nu_in - nu_out),  x = a / a_c,
// so that its hardening time a/|da/dt| goes as x^nu_in inside the break a_c and as x^nu_out outside it;
// GW emission adds da/dt_GW = -B / a^3, B = (64/5) G^3 m1 m2 M / c^5 (Peters 1964, Phys. Rev. 136, B1224,
// eq. 5.6). The normalisation A of each binary (M, q) is the root of
//   T(A) = Int_{a_isco}^{a_0} da / (|da/dt|_env + |da/dt|_GW) = tau_f,
// a_0 the separation at formation and a_isco = 6 G M / c^2. When GW emission alone is faster than
// tau_f (T(0) <= tau_f), A = 0 and the lifetime is the GW time.
import { C_SI, G_SI, GYR_S, PC_M } from './constants';
import { gaussLegendreRule } from './gaussLegendre';

export interface PhenomHardening {
  /** Total lifetime tau_f from formation at a_0 to coalescence, s. */
  lifetimeS: number;
  /** Index nu_in of the hardening time a/|da/dt| inside the break (a << a_c). */
  innerIndex: number;
  /** Index nu_out of the hardening time outside the break (a >> a_c). */
  outerIndex: number;
  /** Break separation a_c, m. */
  breakSeparationM: number;
  /** Separation a_0 at which the binary forms (the galaxy merger), m. */
  initialSeparationM: number;
}

/**
 * Default shape: nu_in = -1, nu_out = +2.5, a_c = 100 pc, a_0 = 10^4 pc, tau_f = 3 Gyr (fiducial
 * values for the analysis of Agazie et al. 2023, which varied tau_f in [0.1, 11] Gyr and nu_in in
 * [-1.5, 0]; unverified: none of these is in the paper's abstract, the only part reachable, so whether
 * a_c is 100 pc or 10 pc is open too).
 */
export const PHENOM_HARDENING_DEFAULTS: Readonly<PhenomHardening> = Object.freeze({
  lifetimeS: 3 * GYR_S,
  innerIndex: -1,
  outerIndex: 2.5,
  breakSeparationM: 100 * PC_M,
  initialSeparationM: 1e4 * PC_M,
});

export function checkPhenomHardening(h: PhenomHardening): void {
  if (!(h.lifetimeS >= 0 && Number.isFinite(h.lifetimeS))) throw new RangeError(`lifetime must be finite and >= 0, got ${h.lifetimeS} s`);
  if (!Number.isFinite(h.innerIndex)) throw new RangeError(`inner index must be finite, got ${h.innerIndex}`);
  if (!Number.isFinite(h.outerIndex)) throw new RangeError(`outer index must be finite, got ${h.outerIndex}`);
  if (!(h.breakSeparationM > 0 && Number.isFinite(h.breakSeparationM))) throw new RangeError(`break separation must be positive and finite, got ${h.breakSeparationM} m`);
  if (!(h.initialSeparationM > 0 && Number.isFinite(h.initialSeparationM))) throw new RangeError(`initial separation must be positive and finite, got ${h.initialSeparationM} m`);
}

/** B of |da/dt|_GW = B / a^3 for a circular binary: (64/5) G^3 m1 m2 M / c^5, m^4/s (Peters 1964, eq. 5.6). */
export function gwHardeningConstant(mKg: number, q: number): number {
  const m1 = mKg / (1 + q);
  const m2 = mKg - m1;
  return ((64 / 5) * G_SI * G_SI * G_SI * m1 * m2 * mKg) / (C_SI * C_SI * C_SI * C_SI * C_SI);
}

/** Separation of the innermost stable circular orbit, 6 G M / c^2, m (Schwarzschild; where the lifetime integral stops). */
export function iscoSeparationM(mKg: number): number {
  return (6 * G_SI * mKg) / (C_SI * C_SI);
}

/** The environment's shape g(x) = x^(1 - nu_in) (1 + x)^(nu_in - nu_out): |da/dt|_env = A g(a / a_c). */
export function environmentShape(x: number, h: PhenomHardening): number {
  return Math.pow(x, 1 - h.innerIndex) * Math.pow(1 + x, h.innerIndex - h.outerIndex);
}

/** da/dt of the model (negative), m/s: -A g(a/a_c) - B/a^3. */
export function phenomHardeningRate(aM: number, norm: number, mKg: number, q: number, h: PhenomHardening): number {
  return -norm * environmentShape(aM / h.breakSeparationM, h) - gwHardeningConstant(mKg, q) / (aM * aM * aM);
}

/** Gauss-Legendre points per panel and the widest panel in ln a of the lifetime integral. */
const ORDER = 10;
const PANEL_WIDTH = 0.5;
const UNIT = gaussLegendreRule(ORDER);

/**
 * Nodes of the lifetime integral in u = ln a shared by every mass: panels of at most 0.5 laid down from
 * ln a_0, with an edge at ln a_c when it lies below ln a_0, extended downwards on demand. Only the lowest
 * panel, cut at ln a_isco, depends on the mass. The integrand is analytic in u (powers of e^u joined
 * smoothly), so composite Gauss-Legendre converges geometrically.
 */
export class LifetimeGrid {
  /** Panel edges, descending from ln a_0. */
  readonly edges: number[];
  a4w = new Float64Array(0);
  ga3 = new Float64Array(0);
  constructor(readonly h: PhenomHardening) {
    checkPhenomHardening(h);
    const hi = Math.log(h.initialSeparationM);
    const brk = Math.log(h.breakSeparationM);
    this.edges = [hi];
    if (brk < hi) {
      const n = Math.ceil((hi - brk) / PANEL_WIDTH);
      for (let i = 1; i <= n; i++) this.edges.push(i === n ? brk : hi - ((hi - brk) * i) / n);
    }
  }

  /** Fills w a^4 and g(a/a_c) a^3 at the nodes of [lo, hi] into the arrays from index `at`. */
  fillPanel(lo: number, hi: number, a4w: Float64Array, ga3: Float64Array, at: number): void {
    const mid = 0.5 * (lo + hi);
    const half = 0.5 * (hi - lo);
    for (let i = 0; i < ORDER; i++) {
      const a = Math.exp(mid + half * UNIT.nodes[i]);
      const a3 = a * a * a;
      a4w[at + i] = half * UNIT.weights[i] * a3 * a;
      ga3[at + i] = environmentShape(a / this.h.breakSeparationM, this.h) * a3;
    }
  }

  /** Number of whole panels above uLow (their lower edges >= uLow), growing the grid to reach it. */
  panelsAbove(uLow: number): number {
    const e = this.edges;
    while (e[e.length - 1] > uLow) e.push(e[e.length - 1] - PANEL_WIDTH);
    const panels = e.length - 1;
    if (this.a4w.length < panels * ORDER) {
      const a4w = new Float64Array(panels * ORDER);
      const ga3 = new Float64Array(panels * ORDER);
      a4w.set(this.a4w);
      ga3.set(this.ga3);
      for (let p = this.a4w.length / ORDER; p < panels; p++) this.fillPanel(e[p + 1], e[p], a4w, ga3, p * ORDER);
      this.a4w = a4w;
      this.ga3 = ga3;
    }
    let n = 0;
    while (n < panels && e[n + 1] >= uLow) n++;
    return n;
  }
}

/**
 * The lifetime integral of one total mass, T(A) = Int_{ln a_isco}^{ln a_0} a^4 du / (A g a^3 + B):
 * the grid's whole panels above ln a_isco and one panel from ln a_isco to the next edge. The nodes do not
 * depend on A or q, so a root solve reuses them.
 */
export class LifetimeIntegral {
  readonly h: PhenomHardening;
  /** Whole panels of the grid used, times ORDER. */
  private readonly count: number;
  private readonly grid: LifetimeGrid;
  private readonly partA4w = new Float64Array(ORDER);
  private readonly partGa3 = new Float64Array(ORDER);
  private readonly hasPart: boolean;
  constructor(
    readonly mKg: number,
    hOrGrid: PhenomHardening | LifetimeGrid,
  ) {
    this.grid = hOrGrid instanceof LifetimeGrid ? hOrGrid : new LifetimeGrid(hOrGrid);
    this.h = this.grid.h;
    const lo = Math.log(iscoSeparationM(mKg));
    const hi = Math.log(this.h.initialSeparationM);
    if (!(hi > lo)) {
      this.count = 0;
      this.hasPart = false;
      return;
    }
    const n = this.grid.panelsAbove(lo);
    this.count = n * ORDER;
    const top = this.grid.edges[n];
    this.hasPart = top > lo;
    if (this.hasPart) this.grid.fillPanel(lo, top, this.partA4w, this.partGa3, 0);
  }

  /** T(A) for the binary of this mass and mass-ratio constant B (gwHardeningConstant), s. */
  time(norm: number, B: number): number {
    return this.timeAndSlope(norm, B).t;
  }

  /** T(A) and A dT/dA, s. */
  timeAndSlope(norm: number, B: number): { t: number; slope: number } {
    let t = 0;
    let slope = 0;
    const { a4w, ga3 } = this.grid;
    for (let k = 0; k < this.count; k++) {
      const d = norm * ga3[k] + B;
      const v = a4w[k] / d;
      t += v;
      slope -= (v * norm * ga3[k]) / d;
    }
    if (this.hasPart) {
      for (let k = 0; k < ORDER; k++) {
        const d = norm * this.partGa3[k] + B;
        const v = this.partA4w[k] / d;
        t += v;
        slope -= (v * norm * this.partGa3[k]) / d;
      }
    }
    return { t, slope };
  }

  /** Int a / g du (the lifetime without GW emission at A = 1), s m/s. */
  environmentOnly(): number {
    let s = 0;
    for (let k = 0; k < this.count; k++) s += this.grid.a4w[k] / this.grid.ga3[k];
    if (this.hasPart) for (let k = 0; k < ORDER; k++) s += this.partA4w[k] / this.partGa3[k];
    return s;
  }
}

/** Time from a_0 to the ISCO by GW emission alone, (a_0^4 - a_isco^4) / (4 B), s (the integral of Peters 1964, eq. 5.6). */
export function gwOnlyLifetime(mKg: number, q: number, h: PhenomHardening): number {
  const a0 = h.initialSeparationM;
  const ai = iscoSeparationM(mKg);
  if (!(a0 > ai)) return 0;
  return (a0 * a0 * a0 * a0 - ai * ai * ai * ai) / (4 * gwHardeningConstant(mKg, q));
}

/** Lifetime of a binary under the model: tau_f, or the GW time when GW emission alone is faster, s. */
export function phenomLifetime(mKg: number, q: number, h: PhenomHardening): number {
  return Math.min(h.lifetimeS, gwOnlyLifetime(mKg, q, h));
}

/**
 * The normalisation A (m/s) for which T(A) = tau_f, by safeguarded Newton steps on ln T(A) in ln A
 * (T falls monotonically from the GW time at A = 0 to 0); 0 when GW emission alone takes no longer than
 * tau_f; Infinity for tau_f = 0. Relative error of T(A) against tau_f below 1e-12.
 */
export function phenomNormalisation(integral: LifetimeIntegral, q: number): number {
  const h = integral.h;
  const mKg = integral.mKg;
  if (!(gwOnlyLifetime(mKg, q, h) > h.lifetimeS)) return 0;
  const tau = h.lifetimeS;
  if (tau === 0) return Infinity; // coalescence at formation: no time at any separation
  const B = gwHardeningConstant(mKg, q);
  // Without GW emission T = I_env / A, so A_env = I_env / tau bounds the root from above.
  let hi = Math.log(integral.environmentOnly() / tau); // T(e^hi) <= tau
  let lo = hi - 4; // grow down until T(e^lo) > tau
  for (let i = 0; i < 200 && !(integral.time(Math.exp(lo), B) > tau); i++) {
    hi = lo;
    lo -= 4;
  }
  let u = hi;
  for (let i = 0; i < 100; i++) {
    const { t, slope } = integral.timeAndSlope(Math.exp(u), B);
    const f = Math.log(t / tau); // decreasing in u
    if (Math.abs(f) < 1e-13) break;
    if (f > 0) lo = u;
    else hi = u;
    const next = u - f / (slope / t);
    u = next > lo && next < hi ? next : 0.5 * (lo + hi);
    if (hi - lo < 1e-15 * Math.max(1, Math.abs(u))) break;
  }
  return Math.exp(u);
}
