// A queue of whole-number ranks that always yields the smallest first (binary min-heap), each
// rank at most once. Recalculation takes cells in topological rank through it.

export class RankQueue {
  private readonly heap: number[] = [];
  private readonly queued = new Set<number>();

  get size(): number {
    return this.heap.length;
  }

  push(rank: number): void {
    if (this.queued.has(rank)) return;
    this.queued.add(rank);
    const h = this.heap;
    let i = h.length;
    h.push(rank);
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (h[parent] <= rank) break;
      h[i] = h[parent];
      i = parent;
    }
    h[i] = rank;
  }

  /** The smallest rank (the queue must not be empty). */
  pop(): number {
    const h = this.heap;
    const top = h[0];
    const last = h.pop()!;
    if (h.length > 0) {
      let i = 0;
      const n = h.length;
      for (;;) {
        const l = 2 * i + 1;
        if (l >= n) break;
        const r = l + 1;
        const c = r < n && h[r] < h[l] ? r : l;
        if (h[c] >= last) break;
        h[i] = h[c];
        i = c;
      }
      h[i] = last;
    }
    this.queued.delete(top);
    return top;
  }
}
