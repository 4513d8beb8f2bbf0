// One random stream per realisation (or per chunk) index, derived from the run's seed, so that a run
// split into chunks on any number of workers draws exactly what one worker draws: stream i is
// xoshiro128** seeded with a SplitMix64 hash of (seed, i) (Steele, Lea & Flood 2014, OOPSLA '14, 453).
import { seededRandom, splitMix64, type RandomSource } from './prng';

const MASK53 = (1n << 53n) - 1n;

/** The seed of stream `index` of a run seeded with `seed` (both non-negative safe integers). */
export function streamSeed(seed: number, index: number): number {
  if (!Number.isSafeInteger(seed) || seed < 0) throw new RangeError(`seed must be a non-negative whole number, got ${seed}`);
  if (!Number.isSafeInteger(index) || index < 0) throw new RangeError(`stream index must be a non-negative whole number, got ${index}`);
  // Two SplitMix64 steps: the seed's first output, mixed with the index, hashed again.
  const [a] = splitMix64(BigInt(seed), 1);
  const [b] = splitMix64(a ^ BigInt(index), 1);
  return Number(b & MASK53);
}

/** The random stream `index` of a run seeded with `seed`. */
export function indexedStream(seed: number, index: number): RandomSource {
  return seededRandom(streamSeed(seed, index));
}
