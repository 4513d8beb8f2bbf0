// The loudest binary expected per frequency bin of the GW-driven finite-population counts
// (finiteBinaries.ts without a residence factor; Sesana, Vecchio & Colacino 2008, MNRAS 390, 192), for
// all bins from one bucketing of the nodes. A node's strain is h = h_F(z, f) M_c^(5/3) with
// h_F = STRAIN (1+z)^(2/3) f^(2/3) / D_C(z), and its count rate / M_c^(5/3) x tau_F(z, f) dln f with
// tau_F dln f = RESIDENCE (1+z)^(-8/3) f^(-8/3) / (f T) (the formulas of finiteBinaries.ts). So the nodes
// rank by strain as by g = (1+z)^(2/3) M_c^(5/3) / D_C at every f, every count is an f-free weight
// c = rate / M_c^(5/3) (1+z)^(-8/3) times one factor of f that falls as f rises, and a node past its ISCO
// at f is past it at every higher f. The count at or above any g therefore only falls with f, and the
// loudest binary's g never rises: bins taken by increasing f move one cursor down buckets of g (by the
// high word of g, as loudestExpected in finiteBinaries.ts, so the buckets keep the order of g), and only
// the bucket where the count from the top reaches 1 is sorted, by the strains of the bin.

const BUCKETS = 4096;

/** Index of the high 32-bit word of a float64 in a Uint32Array view of its buffer. */
const HIGH_WORD = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1 ? 1 : 0;

/** The loudest binary per bin, for bins of non-decreasing f (loudest() called in that order). */
export class LoudestSweep {
  private readonly nz: number;
  private readonly nm: number;
  private readonly nq: number;
  private readonly drop: Float64Array; // (1+z)^(-8/3) per z node
  private readonly bucketOf: Int32Array; // per node
  private readonly next: Int32Array; // per node: the next node of its bucket (-1: none)
  private readonly first: Int32Array; // per bucket: its first node (-1: empty)
  private readonly weight: Float64Array; // per bucket: sum of c over its emitting nodes
  private readonly emittingBefore: Int32Array; // per z: the ISCO cut of the last bin
  private cursor = BUCKETS - 1; // the bucket the last crossing was found in
  private above = 0; // sum of c over the buckets above the cursor
  private lastF = -Infinity;
  private lastStrain = 0;
  private readonly members: number[] = [];

  constructor(
    private readonly rate: Float64Array,
    private readonly mc53: Float64Array,
    z: ArrayLike<number>,
    dc: Float64Array,
    nm: number,
    nq: number,
  ) {
    const nz = z.length;
    this.nz = nz;
    this.nm = nm;
    this.nq = nq;
    const g = new Float64Array(nz);
    this.drop = new Float64Array(nz);
    for (let iz = 0; iz < nz; iz++) {
      g[iz] = Math.pow(1 + z[iz], 2 / 3) / dc[iz];
      this.drop[iz] = Math.pow(1 + z[iz], -8 / 3);
    }
    const size = nz * nm * nq;
    this.bucketOf = new Int32Array(size);
    this.next = new Int32Array(size);
    this.first = new Int32Array(BUCKETS).fill(-1);
    this.weight = new Float64Array(BUCKETS);
    this.emittingBefore = new Int32Array(nz).fill(nm);
    this.fill(g);
  }

  /** Buckets by the high word of g between the smallest and largest g (products of the smallest and largest factors: rounding keeps the order). */
  private fill(g: Float64Array): void {
    const { nz, nm, nq, rate, mc53, drop, bucketOf, next, first, weight } = this;
    let gLo = Infinity;
    let gHi = 0;
    for (let iz = 0; iz < nz; iz++) {
      gLo = Math.min(gLo, g[iz]);
      gHi = Math.max(gHi, g[iz]);
    }
    let mLo = Infinity;
    let mHi = 0;
    for (let i = 0; i < nm * nq; i++) {
      mLo = Math.min(mLo, mc53[i]);
      mHi = Math.max(mHi, mc53[i]);
    }
    const value = new Float64Array(1);
    const words = new Uint32Array(value.buffer);
    value[0] = gLo * mLo;
    const lowWord = words[HIGH_WORD];
    value[0] = gHi * mHi;
    let shift = 0;
    while ((words[HIGH_WORD] - lowWord) / 2 ** shift >= BUCKETS) shift++;
    const scale = 1 / 2 ** shift;
    for (let iz = 0; iz < nz; iz++) {
      for (let im = 0; im < nm; im++) {
        for (let iq = 0; iq < nq; iq++) {
          const i = (iz * nm + im) * nq + iq;
          value[0] = g[iz] * mc53[im * nq + iq];
          const b = Math.min(BUCKETS - 1, Math.floor((words[HIGH_WORD] - lowWord) * scale));
          bucketOf[i] = b;
          next[i] = first[b];
          first[b] = i;
          weight[b] += (rate[i] / mc53[im * nq + iq]) * drop[iz];
        }
      }
    }
  }

  /**
   * Strain of the loudest binary expected in the bin at f (tau, hF, emitting and dlnf as finiteBinaries.ts
   * computes them for it): the node where the count from the top reaches 1; 0 if it never does.
   */
  loudest(f: number, tau: Float64Array, hF: Float64Array, emitting: Int32Array, dlnf: number): number {
    if (f === this.lastF) return this.lastStrain;
    if (!(f > this.lastF)) throw new RangeError(`bins must come by increasing frequency, got ${f} Hz after ${this.lastF} Hz`);
    this.lastF = f;
    this.dropMerged(emitting);
    // count of a node = c x perWeight, up to rounding (used to find the bucket; the bucket's own nodes are counted exactly)
    const perWeight = tau[0] * dlnf / this.drop[0];
    const { weight } = this;
    for (;;) {
      while (this.cursor >= 0 && (this.above + weight[this.cursor]) * perWeight < 1) this.above += weight[this.cursor--];
      if (this.cursor < 0) return (this.lastStrain = 0);
      const h = this.crossing(this.above * perWeight, tau, hF, emitting, dlnf);
      if (h > 0) return (this.lastStrain = h);
      // a bucket left with no emitting node (its weight a rounding residue): on to the next
      this.above += weight[this.cursor--];
    }
  }

  /** Takes the nodes past their ISCO at this bin (mass index >= emitting[z]) out of their buckets' weights. */
  private dropMerged(emitting: Int32Array): void {
    const { nz, nm, nq, rate, mc53, drop, bucketOf, weight } = this;
    for (let iz = 0; iz < nz; iz++) {
      const from = emitting[iz];
      const to = this.emittingBefore[iz];
      if (from >= to) continue;
      this.emittingBefore[iz] = from;
      for (let im = from; im < to; im++) {
        for (let iq = 0; iq < nq; iq++) {
          const i = (iz * nm + im) * nq + iq;
          const c = (rate[i] / mc53[im * nq + iq]) * drop[iz];
          weight[bucketOf[i]] -= c;
          if (bucketOf[i] > this.cursor) this.above -= c;
        }
      }
    }
  }

  /** The emitting nodes of the cursor's bucket by decreasing strain, counted from `count`: the strain where it reaches 1 (the last one's if rounding keeps it just short), 0 if none emits. */
  private crossing(count: number, tau: Float64Array, hF: Float64Array, emitting: Int32Array, dlnf: number): number {
    const { nm, nq, rate, mc53, members } = this;
    members.length = 0;
    for (let i = this.first[this.cursor]; i >= 0; i = this.next[i]) {
      const iq = i % nq;
      const zm = (i - iq) / nq;
      const im = zm % nm;
      const iz = (zm - im) / nm;
      if (im >= emitting[iz] || rate[i] === 0) continue;
      members.push(i);
    }
    if (members.length === 0) return 0;
    const strainOf = (i: number) => {
      const iq = i % nq;
      const zm = (i - iq) / nq;
      const im = zm % nm;
      return hF[(zm - im) / nm] * mc53[im * nq + iq];
    };
    members.sort((a, b) => strainOf(b) - strainOf(a));
    let last = 0;
    for (const i of members) {
      const iq = i % nq;
      const zm = (i - iq) / nq;
      const im = zm % nm;
      const iz = (zm - im) / nm;
      last = hF[iz] * mc53[im * nq + iq];
      count += (rate[i] / mc53[im * nq + iq]) * tau[iz] * dlnf;
      if (count >= 1) return last;
    }
    return last;
  }
}
