// Which cells read which. Edges point from a cell to the names it reads; a name may not (yet) be
// a cell, so that adding it later finds the cells waiting for it. All traversals are iterative:
// a 10,000-cell chain must not overflow the stack.

export interface EvaluationPlan {
  /** Cells in an order where every cell comes after the cells it reads (within the planned set). */
  order: string[];
  /** Cells on dependency cycles, each with one cycle through it. */
  cycles: Map<string, CycleThrough>;
}

/** Longest stretch of a cycle kept as names (longer cycles keep their start and end). */
export const CYCLE_NAMES_KEPT = 50;

/** A cycle through one cell: `a -> b -> a` has length 2 and names [a, b, a]. */
export interface CycleThrough {
  /** The cells on the cycle, starting and ending at the cell; for cycles longer than
   *  CYCLE_NAMES_KEPT only the first CYCLE_NAMES_KEPT names, then the cell again. */
  names: string[];
  /** The last few cells before the cycle closes (for long cycles). */
  closing: string[];
  /** Number of cells on the cycle. */
  length: number;
}

export class DependencyGraph {
  private readonly reads = new Map<string, string[]>();
  private readonly readBy = new Map<string, Set<string>>();

  /** Sets the names cell `name` reads (replacing the previous ones). */
  setDependencies(name: string, deps: readonly string[]): void {
    this.removeCell(name);
    const unique = [...new Set(deps)];
    this.reads.set(name, unique);
    for (const d of unique) {
      let s = this.readBy.get(d);
      if (!s) this.readBy.set(d, (s = new Set()));
      s.add(name);
    }
  }

  /** Forgets what `name` reads (cells reading `name` keep their edges to it). */
  removeCell(name: string): void {
    const old = this.reads.get(name);
    if (!old) return;
    for (const d of old) {
      const s = this.readBy.get(d);
      if (s) {
        s.delete(name);
        if (s.size === 0) this.readBy.delete(d);
      }
    }
    this.reads.delete(name);
  }

  dependencies(name: string): string[] {
    return [...(this.reads.get(name) ?? [])];
  }

  /** The cells reading `name`, without copying (do not change the graph while iterating). */
  dependentsView(name: string): Iterable<string> {
    return this.readBy.get(name) ?? [];
  }

  dependents(name: string): string[] {
    return [...(this.readBy.get(name) ?? [])];
  }

  /** `names` and every cell that reads them, directly or not. */
  downstream(names: Iterable<string>): Set<string> {
    const seen = new Set<string>(names);
    const queue = [...seen];
    for (let i = 0; i < queue.length; i++) {
      const s = this.readBy.get(queue[i]);
      if (!s) continue;
      for (const d of s) {
        if (!seen.has(d)) {
          seen.add(d);
          queue.push(d);
        }
      }
    }
    return seen;
  }

  /** `names` and every name they read, directly or not. */
  upstream(names: Iterable<string>): Set<string> {
    const seen = new Set<string>(names);
    const queue = [...seen];
    for (let i = 0; i < queue.length; i++) {
      for (const d of this.reads.get(queue[i]) ?? []) {
        if (!seen.has(d)) {
          seen.add(d);
          queue.push(d);
        }
      }
    }
    return seen;
  }

  /**
   * Orders the cells of `subset` (Kahn's algorithm, reads outside the subset count as done).
   * Cells left over sit on cycles or below them; the cycle members are found with Tarjan's
   * strongly-connected-components algorithm (iterative form) and the rest ordered after them.
   * `tieOrder` gives the position of each cell in the sheet, used to break ties stably.
   */
  plan(subset: ReadonlySet<string>, tieOrder?: ReadonlyMap<string, number>): EvaluationPlan {
    return this.planRest(subset, this.kahn(subset, new Set(), tieOrder), tieOrder);
  }

  /**
   * The same plan, worked out a slice at a time: after each `sliceMs` of ordering it awaits
   * `pause()` (a page gives itself back to its events). Only the cycles part, when there are
   * cycles, is done in one step.
   */
  async planInSlices(subset: ReadonlySet<string>, tieOrder: ReadonlyMap<string, number>, pause: () => Promise<void>, sliceMs: number): Promise<EvaluationPlan> {
    let start = performance.now();
    const check = async () => {
      if (performance.now() - start < sliceMs) return;
      await pause();
      start = performance.now();
    };
    const indegree = new Map<string, number>();
    let k = 0;
    for (const n of subset) {
      let d = 0;
      for (const r of this.reads.get(n) ?? []) if (subset.has(r)) d++;
      indegree.set(n, d);
      if ((++k & 1023) === 0) await check();
    }
    const position = (n: string) => tieOrder.get(n) ?? 0;
    let ready = [...subset].filter((n) => indegree.get(n) === 0).sort((a, b) => position(a) - position(b));
    const order: string[] = [];
    while (ready.length > 0) {
      const next: string[] = [];
      for (const n of ready) {
        order.push(n);
        for (const d of this.readBy.get(n) ?? []) {
          if (!subset.has(d)) continue;
          const left = indegree.get(d)! - 1;
          indegree.set(d, left);
          if (left === 0) next.push(d);
        }
        if ((++k & 1023) === 0) await check();
      }
      ready = next.sort((a, b) => position(a) - position(b));
      await check();
    }
    return this.planRest(subset, order, tieOrder);
  }

  /** The plan from Kahn's order of `subset`: the cells left over are on cycles or below them. */
  private planRest(subset: ReadonlySet<string>, order: string[], tieOrder?: ReadonlyMap<string, number>): EvaluationPlan {
    const cycles = new Map<string, CycleThrough>();
    if (order.length === subset.size) return { order, cycles };
    const placed = new Set(order);
    const rest = new Set([...subset].filter((n) => !placed.has(n)));
    for (const component of this.stronglyConnected(rest)) {
      const members = new Set(component);
      const selfLoop = component.length === 1 && (this.reads.get(component[0]) ?? []).includes(component[0]);
      if (component.length === 1 && !selfLoop) continue;
      // One breadth-first search finds a cycle; members on it get that cycle rotated to start
      // at them, the others (components that are not a simple ring) get a search of their own.
      // The search starts at the member whose name sorts first, so the cycle each cell names
      // depends on the graph alone, not on the order of `subset`: a recalculation of part of a
      // sheet names the cycles a rebuild names (readers further down quote them).
      let start = component[0];
      for (const m of component) if (m < start) start = m;
      const ring = this.cycleThrough(start, members).slice(0, -1);
      const onRing = new Map(ring.map((n, i) => [n, i]));
      for (const m of component) {
        const at = onRing.get(m);
        const loop = at === undefined ? this.cycleThrough(m, members).slice(0, -1) : ring;
        const from = at ?? 0;
        const k = loop.length;
        const take = Math.min(k, CYCLE_NAMES_KEPT);
        const names = new Array<string>(take + 1);
        for (let i = 0; i < take; i++) names[i] = loop[(from + i) % k];
        names[take] = m;
        const closing: string[] = [];
        for (let i = Math.max(take, k - 3); i < k; i++) closing.push(loop[(from + i) % k]);
        cycles.set(m, { names, closing, length: k });
      }
    }
    const below = new Set([...rest].filter((n) => !cycles.has(n)));
    order.push(...this.kahn(below, new Set(cycles.keys()), tieOrder));
    return { order, cycles };
  }

  private kahn(subset: ReadonlySet<string>, done: ReadonlySet<string>, tieOrder?: ReadonlyMap<string, number>): string[] {
    const indegree = new Map<string, number>();
    for (const n of subset) {
      let k = 0;
      for (const d of this.reads.get(n) ?? []) if (subset.has(d) && !done.has(d)) k++;
      indegree.set(n, k);
    }
    const position = (n: string) => tieOrder?.get(n) ?? 0;
    let ready = [...subset].filter((n) => indegree.get(n) === 0);
    if (tieOrder) ready.sort((a, b) => position(a) - position(b));
    const order: string[] = [];
    // Process in waves so that ties follow sheet order without a priority queue.
    while (ready.length > 0) {
      const next: string[] = [];
      for (const n of ready) {
        order.push(n);
        for (const d of this.readBy.get(n) ?? []) {
          if (!subset.has(d) || done.has(d)) continue;
          const k = indegree.get(d)! - 1;
          indegree.set(d, k);
          if (k === 0) next.push(d);
        }
      }
      if (tieOrder) next.sort((a, b) => position(a) - position(b));
      ready = next;
    }
    return order;
  }

  /** Tarjan's strongly connected components of the subgraph `subset`, iteratively. */
  private stronglyConnected(subset: ReadonlySet<string>): string[][] {
    const index = new Map<string, number>();
    const low = new Map<string, number>();
    const onStack = new Set<string>();
    const stack: string[] = [];
    const components: string[][] = [];
    let counter = 0;
    for (const root of subset) {
      if (index.has(root)) continue;
      const work: Array<{ node: string; next: number; succ: string[] }> = [];
      const enter = (node: string) => {
        index.set(node, counter);
        low.set(node, counter);
        counter++;
        stack.push(node);
        onStack.add(node);
        work.push({ node, next: 0, succ: (this.reads.get(node) ?? []).filter((d) => subset.has(d)) });
      };
      enter(root);
      while (work.length > 0) {
        const frame = work[work.length - 1];
        if (frame.next < frame.succ.length) {
          const w = frame.succ[frame.next++];
          if (!index.has(w)) enter(w);
          else if (onStack.has(w)) low.set(frame.node, Math.min(low.get(frame.node)!, index.get(w)!));
          continue;
        }
        work.pop();
        if (work.length > 0) {
          const parent = work[work.length - 1].node;
          low.set(parent, Math.min(low.get(parent)!, low.get(frame.node)!));
        }
        if (low.get(frame.node) === index.get(frame.node)) {
          const component: string[] = [];
          let w: string;
          do {
            w = stack.pop()!;
            onStack.delete(w);
            component.push(w);
          } while (w !== frame.node);
          components.push(component);
        }
      }
    }
    return components;
  }

  /** One shortest cycle from `start` back to itself inside `members` (breadth-first). */
  private cycleThrough(start: string, members: ReadonlySet<string>): string[] {
    const previous = new Map<string, string>();
    const queue = [start];
    for (let i = 0; i < queue.length; i++) {
      const n = queue[i];
      for (const d of this.reads.get(n) ?? []) {
        if (!members.has(d)) continue;
        if (d === start) {
          const path = [start];
          for (let c: string | undefined = n; c !== undefined && c !== start; c = previous.get(c)) path.push(c);
          // path holds start then the chain back; reading order is start -> ... -> start.
          const chain = path.slice(1).reverse();
          return [start, ...chain, start];
        }
        if (!previous.has(d) && d !== start) {
          previous.set(d, n);
          queue.push(d);
        }
      }
    }
    return [start, start];
  }
}
