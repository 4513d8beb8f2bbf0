// The loudest binary expected in a frequency bin of the finite-population counts (finiteBinaries.ts,
// after Sesana, Vecchio & Colacino 2008, MNRAS 390, 192): the strain with one binary expected at or above it.

/**
 * The loudest binary expected in a bin (the strain with one binary expected at or above it, as
 * loudestExpected finds it) for strains h_F(z) x M_c^(5/3) and counts rate x tau_F(z) / M_c^(5/3):
 * the (mass, q) nodes are put once in order of decreasing M_c^(5/3), which is the order of
 * decreasing strain at every z, with per-z prefix sums of rate / M_c^(5/3). The count at or above a
 * strain h is then a binary search per z; bisection in h narrows the nodes that hold the crossing
 * to a few, which are sorted. Merged nodes (past the ISCO: mass index >= emitting[z]) are taken out
 * of the prefix sums per frequency.
 */
export class LoudestSearch {
  private readonly order: Int32Array; // node (im * nq + iq) at each rank
  private readonly rankedMc53: Float64Array;
  private readonly massOfRank: Int32Array;
  private readonly rankOfNode: Int32Array;
  private readonly prefix: Float64Array; // per z: sum over ranks < j of rate / M_c^(5/3)
  private readonly exRanks: Int32Array; // scratch: ranks of merged nodes of one z, ascending
  private readonly exPrefix: Float64Array;
  private readonly exStart: Int32Array; // per z: start of its merged ranks in the scratch
  private readonly exCount: Int32Array;
  private readonly exCut: Int32Array; // per z: the first merged mass index the scratch holds (-1: none yet)
  private readonly members: number[] = [];
  private readonly rankLo: Int32Array;
  private readonly rankHi: Int32Array;
  private readonly rankMid: Int32Array;
  // the count at or above the bracket's upper end in the last search (set by bracket())
  private countHi = 0;
  constructor(
    private rate: Float64Array,
    private readonly mc53: Float64Array,
    private readonly nz: number,
    private readonly nm: number,
    private readonly nq: number,
  ) {
    const p = nm * nq;
    this.order = Int32Array.from(Array.from({ length: p }, (_, i) => i).sort((a, b) => mc53[b] - mc53[a] || a - b));
    this.rankedMc53 = Float64Array.from(this.order, (i) => mc53[i]);
    this.massOfRank = Int32Array.from(this.order, (i) => Math.floor(i / nq));
    this.rankOfNode = new Int32Array(p);
    for (let j = 0; j < p; j++) this.rankOfNode[this.order[j]] = j;
    this.prefix = new Float64Array(nz * (p + 1));
    this.fillPrefix();
    this.exRanks = new Int32Array(nz * p);
    this.exPrefix = new Float64Array(nz * (p + 1));
    this.exStart = new Int32Array(nz);
    this.exCount = new Int32Array(nz);
    this.exCut = new Int32Array(nz).fill(-1);
    this.rankLo = new Int32Array(nz);
    this.rankHi = new Int32Array(nz);
    this.rankMid = new Int32Array(nz);
  }

  private fillPrefix(): void {
    const p = this.rankedMc53.length;
    for (let iz = 0; iz < this.nz; iz++) {
      const base = iz * (p + 1);
      for (let j = 0; j < p; j++) this.prefix[base + j + 1] = this.prefix[base + j] + this.rate[iz * p + this.order[j]] / this.rankedMc53[j];
    }
  }

  /** New rates for the same nodes (a residence factor per bin): the order by M_c^(5/3) is kept, the sums rebuilt. */
  useRates(rate: Float64Array): void {
    this.rate = rate;
    this.fillPrefix();
    this.exCut.fill(-1);
  }

  /** Ranks j with hF x M_c^(5/3)[j] >= h (a prefix of the ranks), known to lie in [from, to]. */
  private ranksAtOrAbove(hF: number, h: number, from = 0, to = this.rankedMc53.length): number {
    let lo = from;
    let hi = to;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (hF * this.rankedMc53[mid] >= h) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }

  /** Sum of rate / M_c^(5/3) over the first `ranks` ranks at z, merged nodes left out. */
  private emittingSum(iz: number, ranks: number): number {
    const p = this.rankedMc53.length;
    let s = this.prefix[iz * (p + 1) + ranks];
    const n = this.exCount[iz];
    if (n > 0) {
      const start = this.exStart[iz];
      let lo = 0;
      let hi = n;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (this.exRanks[start + mid] < ranks) lo = mid + 1;
        else hi = mid;
      }
      s -= this.exPrefix[iz * (p + 1) + lo];
    }
    return s;
  }

  search(tau: Float64Array, hF: Float64Array, emitting: Int32Array, dlnf: number): number {
    // Three passes, each a method of its own (compiled on its own while cold).
    this.updateMerged(emitting);
    if (!this.bracket(tau, hF, dlnf)) return 0;
    return this.crossing(tau, hF, emitting, dlnf);
  }

  /** Merged nodes of each z, by rank, with their prefix sums (kept while the z's ISCO cut stays). */
  private updateMerged(emitting: Int32Array): void {
    const { nz, nm, nq } = this;
    const p = nm * nq;
    for (let iz = 0; iz < nz; iz++) {
      if (this.exCut[iz] === emitting[iz]) continue;
      this.exCut[iz] = emitting[iz];
      const first = iz * p;
      let used = first;
      this.exStart[iz] = first;
      for (let im = emitting[iz]; im < nm; im++) for (let iq = 0; iq < nq; iq++) this.exRanks[used++] = this.rankOfNode[im * nq + iq];
      this.exCount[iz] = used - first;
      if (used > first) {
        const ranks = this.exRanks.subarray(first, used).sort();
        const base = iz * (p + 1);
        for (let j = 0; j < ranks.length; j++) this.exPrefix[base + j + 1] = this.exPrefix[base + j] + this.rate[iz * p + this.order[ranks[j]]] / this.rankedMc53[ranks[j]];
      }
    }
  }

  /** Bracket [lo, hi) of the crossing strain (count at or above lo >= 1, at or above hi < 1) narrowed until few nodes lie inside; false when fewer than one binary is expected. */
  private bracket(tau: Float64Array, hF: Float64Array, dlnf: number): boolean {
    const { nz, nm, nq } = this;
    const p = nm * nq;
    let hMin = Infinity;
    let hMax = 0;
    for (let iz = 0; iz < nz; iz++) {
      hMin = Math.min(hMin, hF[iz] * this.rankedMc53[p - 1]);
      hMax = Math.max(hMax, hF[iz] * this.rankedMc53[0]);
    }
    // Bracket [lo, hi): count at or above lo >= 1, at or above hi < 1; ranks at each end per z.
    let lo = hMin;
    let hi = 2 * hMax;
    const { rankLo, rankHi, rankMid } = this;
    let inside = 0;
    let countLo = 0;
    let countHi = 0;
    for (let iz = 0; iz < nz; iz++) {
      rankLo[iz] = p;
      rankHi[iz] = 0;
      inside += p;
      countLo += tau[iz] * dlnf * this.emittingSum(iz, p);
    }
    if (countLo < 1) return false;
    for (let it = 0; it < 200 && inside > 48; it++) {
      // Odd steps interpolate ln(count) linearly in ln h towards count 1 (kept inside the bracket);
      // even steps bisect in ln h, so the bracket at least halves every two steps.
      let mid = Math.sqrt(lo * hi);
      if (it % 2 === 1 && countHi > 0) {
        const t = Math.min(0.9, Math.max(0.1, Math.log(countLo) / (Math.log(countLo) - Math.log(countHi))));
        mid = lo * Math.pow(hi / lo, t);
      }
      if (!(mid > lo && mid < hi)) break;
      let c = 0;
      for (let iz = 0; iz < nz; iz++) {
        rankMid[iz] = this.ranksAtOrAbove(hF[iz], mid, rankHi[iz], rankLo[iz]);
        c += tau[iz] * dlnf * this.emittingSum(iz, rankMid[iz]);
      }
      inside = 0;
      if (c >= 1) {
        lo = mid;
        countLo = c;
        for (let iz = 0; iz < nz; iz++) inside += (rankLo[iz] = rankMid[iz]) - rankHi[iz];
      } else {
        hi = mid;
        countHi = c;
        for (let iz = 0; iz < nz; iz++) inside += rankLo[iz] - (rankHi[iz] = rankMid[iz]);
      }
    }
    this.countHi = countHi;
    return true;
  }

  /** The strain where the count from the top reaches 1, among the nodes inside the bracket. */
  private crossing(tau: Float64Array, hF: Float64Array, emitting: Int32Array, dlnf: number): number {
    const { nz, nm, nq, rankLo, rankHi } = this;
    const p = nm * nq;
    // The nodes with lo <= strain < hi, by decreasing strain, from the count at or above hi.
    let cum = this.countHi;
    const members = this.members;
    members.length = 0;
    for (let iz = 0; iz < nz; iz++) {
      for (let j = rankHi[iz]; j < rankLo[iz]; j++) {
        if (this.massOfRank[j] >= emitting[iz] || this.rate[iz * p + this.order[j]] === 0) continue;
        members.push(iz * p + j);
      }
    }
    const strainOf = (m: number) => hF[Math.floor(m / p)] * this.rankedMc53[m % p];
    members.sort((x, y) => strainOf(y) - strainOf(x));
    let last = 0;
    for (const m of members) {
      const iz = Math.floor(m / p);
      const j = m % p;
      last = strainOf(m);
      cum += (this.rate[iz * p + this.order[j]] / this.rankedMc53[j]) * tau[iz] * dlnf;
      if (cum >= 1) return last;
    }
    return last;
  }
}
