// The mass integral of a factored density up to the cut, F(x) = cumulative[p] + (x - a_p) Q_p(x)
// (circularMassModels.ts), where Q_p(x) is the Gauss-Legendre mean of the integrand over [a_p, x],
// the start a_p of the mass panel x falls in. Q_p is analytic in x, so on pieces of each panel it is
// replaced by its Chebyshev interpolant (Press, Teukolsky, Vetterling & Flannery 1992, Numerical
// Recipes in C, 2nd ed., Cambridge University Press, section 5.8), built when a piece is first
// read. A piece is used only when its last coefficients are below TABLE_TOL of the local
// F / (x - a_p); a piece that does not converge in MAX_LEVEL halvings reads the direct rule instead.
// A spectrum at many frequencies then costs one short sum per (frequency, redshift) pair instead of
// order x 2 exponentials.

/** Chebyshev points of the first kind per piece. */
const POINTS = 20;
/** Largest trusted tail (the last two coefficients) relative to the local value, per piece. */
export const TABLE_TOL = 1e-14;
/** Halvings of a panel tried before a piece falls back to the direct rule. */
const MAX_LEVEL = 4;
const SLOTS = 1 << MAX_LEVEL;

/** cos(pi k (j + 1/2) / POINTS), row k. */
const COS = Array.from({ length: POINTS }, (_, k) => Float64Array.from({ length: POINTS }, (_, j) => Math.cos((Math.PI * k * (j + 0.5)) / POINTS)));

const UNREAD = -2;
const DIRECT = -1;

/** The table of one factored mass model. `partial(a, x)` is the direct Gauss-Legendre integral over [a, x] (x > a). */
export class CutMassTable {
  /** Per panel and slot, the piece covering the slot (DIRECT: the direct rule; UNREAD: not yet read). */
  private readonly slotPiece: Int16Array;
  /** Per panel and node of its tree of halvings (1 + 2 + ... + SLOTS nodes), the piece tried there. */
  private readonly tried: Int16Array;
  /** Per piece: centre, 2 / width and POINTS Chebyshev coefficients (c_0 halved). */
  private centre = new Float64Array(4);
  private scale = new Float64Array(4);
  private coeffs = new Float64Array(4 * POINTS);
  private count = 0;
  constructor(
    private readonly lo: number,
    private readonly hi: number,
    private readonly width: number,
    private readonly panels: number,
    private readonly cumulative: Float64Array,
    private readonly partial: (a: number, x: number) => number,
  ) {
    this.slotPiece = new Int16Array(panels * SLOTS).fill(UNREAD);
    this.tried = new Int16Array(panels * (2 * SLOTS - 1)).fill(UNREAD);
  }

  /** F(xCut): equal to cumulative[p] + partial(a_p, xCut) within TABLE_TOL. */
  value(xCut: number): number {
    if (xCut >= this.hi) return this.cumulative[this.panels];
    const p = Math.min(this.panels, Math.max(0, Math.floor((xCut - this.lo) / this.width)));
    const a = this.lo + p * this.width;
    if (p === this.panels || !(xCut > a)) return this.cumulative[p];
    const slot = Math.min(SLOTS - 1, Math.floor(((xCut - a) / this.width) * SLOTS));
    let piece = this.slotPiece[p * SLOTS + slot];
    if (piece === UNREAD) piece = this.resolve(p, slot);
    if (piece === DIRECT) return this.cumulative[p] + this.partial(a, xCut);
    // Sum_k c_k T_k(t) by Clenshaw's recurrence (Numerical Recipes in C, section 5.8)
    const c = this.coeffs;
    const base = piece * POINTS;
    const t = (xCut - this.centre[piece]) * this.scale[piece];
    const t2 = 2 * t;
    let b1 = 0;
    let b2 = 0;
    for (let k = base + POINTS - 1; k > base; k--) {
      const b0 = t2 * b1 - b2 + c[k];
      b2 = b1;
      b1 = b0;
    }
    return this.cumulative[p] + (xCut - a) * (t * b1 - b2 + c[base]);
  }

  /** The largest converged piece over a slot (halving from the whole panel), or DIRECT after MAX_LEVEL halvings. */
  private resolve(p: number, slot: number): number {
    for (let level = 0; ; level++) {
      const k = slot >> (MAX_LEVEL - level);
      const node = p * (2 * SLOTS - 1) + (1 << level) - 1 + k;
      let piece = this.tried[node];
      if (piece === UNREAD) piece = this.tried[node] = this.build(p, level, k);
      if (piece !== DIRECT || level === MAX_LEVEL) {
        const span = 1 << (MAX_LEVEL - level);
        this.slotPiece.fill(piece, p * SLOTS + k * span, p * SLOTS + (k + 1) * span);
        return piece;
      }
    }
  }

  /** Piece k of 2^level in panel p, or DIRECT when its tail is not below TABLE_TOL (or a value is not finite). */
  private build(p: number, level: number, k: number): number {
    const a = this.lo + p * this.width;
    const w = this.width / (1 << level);
    const centre = a + (k + 0.5) * w;
    const values = new Float64Array(POINTS);
    // the smallest local F / (x - a), against which the tail is judged
    let floor = Infinity;
    for (let j = 0; j < POINTS; j++) {
      const x = centre + 0.5 * w * COS[1][j];
      const part = this.partial(a, x);
      values[j] = part / (x - a);
      if (!Number.isFinite(values[j])) return DIRECT;
      floor = Math.min(floor, (this.cumulative[p] + part) / (x - a));
    }
    if (this.count === this.centre.length) this.grow();
    const piece = this.count;
    const base = piece * POINTS;
    for (let i = 0; i < POINTS; i++) {
      let s = 0;
      for (let j = 0; j < POINTS; j++) s += values[j] * COS[i][j];
      this.coeffs[base + i] = (2 / POINTS) * s;
    }
    this.coeffs[base] *= 0.5;
    const tail = Math.abs(this.coeffs[base + POINTS - 1]) + Math.abs(this.coeffs[base + POINTS - 2]);
    if (!(tail <= TABLE_TOL * floor)) return DIRECT;
    this.centre[piece] = centre;
    this.scale[piece] = 2 / w;
    this.count++;
    return piece;
  }

  private grow(): void {
    const n = 2 * this.centre.length;
    const centre = new Float64Array(n);
    const scale = new Float64Array(n);
    const coeffs = new Float64Array(n * POINTS);
    centre.set(this.centre);
    scale.set(this.scale);
    coeffs.set(this.coeffs);
    this.centre = centre;
    this.scale = scale;
    this.coeffs = coeffs;
  }
}
