// The pulsar pairs of an array, laid out once so that per-frequency pair sums are cheap.
// With sky positions every pair carries its own Hellings & Downs factor. Without them, pulsars with
// identical noise are grouped, and each group pair carries the expectation over isotropic positions
// (see skyAverageRule), so N identical pulsars cost one pair, not N(N-1)/2.
import { angularSeparation, hellingsDowns, skyAverageRule } from './hellingsDowns';
import { pulsarNoisePsd, type PulsarArray, type PulsarNoise } from './pulsarArray';

export interface PairLayout {
  /** Noise of each member: every pulsar (positions known) or one per group of identical pulsars. */
  members: PulsarNoise[];
  /** Member indices of each pair. */
  first: Int32Array;
  second: Int32Array;
  /** How many pulsar pairs each entry stands for. */
  count: Float64Array;
  /** Hellings & Downs factor of each pair (positions known), or null: use the sky-average rule. */
  gamma: Float64Array | null;
  /** Total number of distinct pulsar pairs, N(N-1)/2. */
  pulsarPairs: number;
}

// Layouts are cached per array object: arrays are treated as immutable once built.
const layouts = new WeakMap<PulsarArray, PairLayout>();

/** Lays out the pairs of an array (O(N^2) with positions, O(groups^2) without); cached per array object. */
export function pairLayout(array: PulsarArray): PairLayout {
  let layout = layouts.get(array);
  if (!layout) {
    layout = buildLayout(array);
    layouts.set(array, layout);
  }
  return layout;
}

function buildLayout(array: PulsarArray): PairLayout {
  const n = array.pulsars.length;
  const pulsarPairs = (n * (n - 1)) / 2;
  if (array.positions) {
    const pos = array.positions;
    const first = new Int32Array(pulsarPairs);
    const second = new Int32Array(pulsarPairs);
    const gamma = new Float64Array(pulsarPairs);
    let k = 0;
    for (let i = 0; i < n; i++) {
      for (let j = i + 1; j < n; j++, k++) {
        first[k] = i;
        second[k] = j;
        gamma[k] = hellingsDowns(angularSeparation(pos[i][0], pos[i][1], pos[j][0], pos[j][1]));
      }
    }
    return { members: array.pulsars, first, second, count: new Float64Array(pulsarPairs).fill(1), gamma, pulsarPairs };
  }
  // Group identical noise descriptions (exact equality of all four numbers).
  const members: PulsarNoise[] = [];
  const sizes: number[] = [];
  const key = (p: PulsarNoise) => `${p.precisionS}|${p.cadenceS}|${p.redAmplitude}|${p.redGamma}`;
  const index = new Map<string, number>();
  for (const p of array.pulsars) {
    const k = key(p);
    const at = index.get(k);
    if (at === undefined) {
      index.set(k, members.length);
      members.push(p);
      sizes.push(1);
    } else sizes[at]++;
  }
  const first: number[] = [];
  const second: number[] = [];
  const count: number[] = [];
  for (let a = 0; a < members.length; a++) {
    for (let b = a; b < members.length; b++) {
      const c = a === b ? (sizes[a] * (sizes[a] - 1)) / 2 : sizes[a] * sizes[b];
      if (c === 0) continue;
      first.push(a);
      second.push(b);
      count.push(c);
    }
  }
  return {
    members,
    first: Int32Array.from(first),
    second: Int32Array.from(second),
    count: Float64Array.from(count),
    gamma: null,
    pulsarPairs,
  };
}

/** Noise PSD of every member at frequency fHz, written into `out`. */
export function memberNoise(layout: PairLayout, fHz: number, out: Float64Array): Float64Array {
  for (let m = 0; m < layout.members.length; m++) out[m] = pulsarNoisePsd(layout.members[m], fHz);
  return out;
}

/**
 * Sum over all pulsar pairs of term(gamma^2, P_I, P_J), with the sky-average expectation over
 * gamma where positions are unknown. `noise` holds the members' PSDs at the frequency in question.
 */
export function sumOverPairs(
  layout: PairLayout,
  noise: Float64Array,
  term: (gammaSq: number, pI: number, pJ: number) => number,
): number {
  const { first, second, count, gamma } = layout;
  let total = 0;
  if (gamma) {
    for (let k = 0; k < first.length; k++) total += term(gamma[k] * gamma[k], noise[first[k]], noise[second[k]]);
    return total;
  }
  const rule = skyAverageRule();
  for (let k = 0; k < first.length; k++) {
    const pI = noise[first[k]];
    const pJ = noise[second[k]];
    let e = 0;
    for (let r = 0; r < rule.gamma.length; r++) e += rule.weight[r] * term(rule.gamma[r] * rule.gamma[r], pI, pJ);
    total += count[k] * e;
  }
  return total;
}
