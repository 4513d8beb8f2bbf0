// Seeded pseudo-random numbers for Monte Carlo runs: xoshiro128** 1.0 (Blackman & Vigna 2021,
// ACM Trans. Math. Softw. 47(4), 36), its 128-bit state filled from the seed by SplitMix64
// (Steele, Lea & Flood 2014, OOPSLA '14, 453), as the xoshiro authors recommend.
import { normalQuantile } from './normal';

export interface RandomSource {
  /** Uniform double in the open interval (0, 1), 53 random bits. */
  uniform(): number;
  /** Standard normal deviate by inversion of one uniform (keeps streams reproducible). */
  normal(): number;
  /** The raw next 32-bit output (unsigned), for reference tests. */
  nextUint32(): number;
}

const MASK64 = (1n << 64n) - 1n;

/** SplitMix64 outputs from a seed, as BigInts (used only when seeding). */
export function splitMix64(seed: bigint, count: number): bigint[] {
  let s = seed & MASK64;
  const out: bigint[] = [];
  for (let i = 0; i < count; i++) {
    s = (s + 0x9e3779b97f4a7c15n) & MASK64;
    let z = s;
    z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
    z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
    out.push(z ^ (z >> 31n));
  }
  return out;
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}

/** The 128-bit starting state for a seed: two SplitMix64 outputs give the four 32-bit words (low word first). */
export function seedState(seed: number): [number, number, number, number] {
  if (!Number.isSafeInteger(seed) || seed < 0) {
    throw new RangeError(`seed must be a non-negative whole number, got ${seed}`);
  }
  const [w0, w1] = splitMix64(BigInt(seed), 2);
  const s: [number, number, number, number] = [Number(w0 & 0xffffffffn) >>> 0, Number(w0 >> 32n) >>> 0, Number(w1 & 0xffffffffn) >>> 0, Number(w1 >> 32n) >>> 0];
  if ((s[0] | s[1] | s[2] | s[3]) === 0) s[0] = 1; // the all-zero state is forbidden (cannot happen from SplitMix64 in practice)
  return s;
}

/** A xoshiro128** generator seeded with a non-negative integer (any safe integer). */
export function seededRandom(seed: number): RandomSource {
  return xoshiroFromState(seedState(seed));
}

/** A xoshiro128** generator starting from the given state (four 32-bit words, not all zero). */
export function xoshiroFromState(state: readonly number[]): RandomSource {
  let [s0, s1, s2, s3] = state.map((w) => w >>> 0);
  if ((s0 | s1 | s2 | s3) === 0) throw new RangeError('the all-zero state is not a valid xoshiro128** state');

  function nextUint32(): number {
    const result = Math.imul(rotl(Math.imul(s1, 5) >>> 0, 7), 9) >>> 0;
    const t = (s1 << 9) >>> 0;
    s2 = (s2 ^ s0) >>> 0;
    s3 = (s3 ^ s1) >>> 0;
    s1 = (s1 ^ s2) >>> 0;
    s0 = (s0 ^ s3) >>> 0;
    s2 = (s2 ^ t) >>> 0;
    s3 = rotl(s3, 11);
    return result;
  }
  function uniform(): number {
    const hi = nextUint32() >>> 5; // 27 bits
    const lo = nextUint32() >>> 6; // 26 bits
    return (hi * 67108864 + lo + 0.5) / 9007199254740992; // (k + 1/2) / 2^53, never 0 or 1
  }
  return { nextUint32, uniform, normal: () => normalQuantile(uniform()) };
}
