// One seeded random stream per walker (and per tempered chain), so that an ensemble run depends on
// the seed alone: the coordinator draws every random number, workers only evaluate densities.
// Seeds are mixed with SplitMix64 (Steele, Lea & Flood 2014, OOPSLA '14, 453) one key at a time.
import { seededRandom, splitMix64, type RandomSource } from './prng';

/** A 53-bit seed for the stream with the given keys (e.g. [chain, walker]) under the run's seed. */
export function streamSeed(seed: number, keys: number[]): number {
  if (!Number.isSafeInteger(seed) || seed < 0) throw new RangeError(`seed must be a non-negative whole number, got ${seed}`);
  let h = splitMix64(BigInt(seed), 1)[0];
  for (const k of keys) {
    if (!Number.isSafeInteger(k) || k < 0) throw new RangeError(`stream key must be a non-negative whole number, got ${k}`);
    h = splitMix64(h ^ BigInt(k), 1)[0];
  }
  return Number(h >> 11n);
}

/** The random stream of one walker of one chain. */
export function walkerStream(seed: number, chain: number, walker: number): RandomSource {
  return seededRandom(streamSeed(seed, [chain, walker]));
}
