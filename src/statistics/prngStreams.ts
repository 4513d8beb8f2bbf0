// Independent random streams for the chunks of a parallel job. Chunk c of a run with seed S draws
// from xoshiro128** seeded with S (prng.ts) and then advanced by c jumps of 2^64 steps each: the
// jump of Blackman & Vigna (2021, ACM Trans. Math. Softw. 47(4), 36; their reference code), which
// gives non-overlapping subsequences for parallel computations. The stream of a chunk depends only
// on the seed and the chunk's index, never on how many workers run the chunks. Chunk 0 is the
// plain seeded stream, so a run of one chunk draws what seededRandom(S) draws.
//
// A few jumps are applied one by one, from the last chunk's state when chunks come in order; many
// at once through the matrices of the jump over GF(2) (xoshiro's state update is linear in the 128
// state bits): J^(2^k) for each bit k of c, built once by repeated squaring.
import { seedState, xoshiroFromState, type RandomSource } from './prng';

/** The jump polynomial of xoshiro128** (Blackman & Vigna 2021, reference code): 2^64 steps. */
export const XOSHIRO128_JUMP = [0x8764000b, 0xf542d2d3, 0x6fa035c3, 0x77f2db5b] as const;

/** A 128-bit state as four 32-bit words (s0 first). */
export type State128 = [number, number, number, number];

/** One step of the xoshiro128** state update (the output scrambler does not touch the state). */
export function stepState(s: State128): State128 {
  let [s0, s1, s2, s3] = s;
  const t = (s1 << 9) >>> 0;
  s2 = (s2 ^ s0) >>> 0;
  s3 = (s3 ^ s1) >>> 0;
  s1 = (s1 ^ s2) >>> 0;
  s0 = (s0 ^ s3) >>> 0;
  s2 = (s2 ^ t) >>> 0;
  s3 = ((s3 << 11) | (s3 >>> 21)) >>> 0;
  return [s0, s1, s2, s3];
}

/** The reference jump(): the state after 2^64 steps, by the jump polynomial (Blackman & Vigna 2021). */
export function jumpState(start: State128): State128 {
  let s = start;
  const acc: State128 = [0, 0, 0, 0];
  for (const word of XOSHIRO128_JUMP) {
    for (let b = 0; b < 32; b++) {
      if ((word >>> b) & 1) for (let i = 0; i < 4; i++) acc[i] = (acc[i] ^ s[i]) >>> 0;
      s = stepState(s);
    }
  }
  return acc;
}

/** A linear map of 128-bit states over GF(2), stored as the images of the 128 unit states. */
export type BitMatrix = Uint32Array; // 128 columns x 4 words

export function matrixOf(map: (s: State128) => State128): BitMatrix {
  const m = new Uint32Array(128 * 4);
  for (let bit = 0; bit < 128; bit++) {
    const e: State128 = [0, 0, 0, 0];
    e[bit >>> 5] = (1 << (bit & 31)) >>> 0;
    m.set(map(e), bit * 4);
  }
  return m;
}

export function applyMatrix(m: BitMatrix, s: State128): State128 {
  const out: State128 = [0, 0, 0, 0];
  for (let bit = 0; bit < 128; bit++) {
    if ((s[bit >>> 5] >>> (bit & 31)) & 1) for (let i = 0; i < 4; i++) out[i] = (out[i] ^ m[bit * 4 + i]) >>> 0;
  }
  return out;
}

export function squareMatrix(m: BitMatrix): BitMatrix {
  const out = new Uint32Array(128 * 4);
  for (let bit = 0; bit < 128; bit++) out.set(applyMatrix(m, [m[bit * 4], m[bit * 4 + 1], m[bit * 4 + 2], m[bit * 4 + 3]]), bit * 4);
  return out;
}

/** Chunk indices up to 2^32 - 1 (far beyond any run's chunk count). */
const MAX_CHUNK_BITS = 32;
const jumpPowers: BitMatrix[] = [];

/** J^(2^k) for k = 0..bits-1, built on first use as far as asked (a run of n chunks needs log2(n) of them). */
function powersOfJump(bits: number): BitMatrix[] {
  if (bits > 0 && jumpPowers.length === 0) jumpPowers.push(matrixOf(jumpState));
  while (jumpPowers.length < bits) jumpPowers.push(squareMatrix(jumpPowers[jumpPowers.length - 1]));
  return jumpPowers;
}

/** Up to this many jumps are applied one by one (a jump is 128 steps); further ones through the matrices. */
const SEQUENTIAL_JUMPS = 64;
/** The last chunk state given: chunks are mostly asked for in order, each one jump from the last. */
let lastChunk: { seed: number; chunk: number; state: State128 } | null = null;

/** The state of seededRandom(seed) advanced by `chunk` jumps. */
export function chunkState(seed: number, chunk: number): State128 {
  if (!Number.isInteger(chunk) || chunk < 0 || chunk >= 2 ** MAX_CHUNK_BITS) throw new RangeError(`chunk index must be a whole number from 0 to 2^32 - 1, got ${chunk}`);
  let s: State128;
  let at: number;
  const last = lastChunk;
  if (last && last.seed === seed && last.chunk <= chunk && chunk - last.chunk <= SEQUENTIAL_JUMPS) {
    s = last.state;
    at = last.chunk;
  } else if (chunk <= SEQUENTIAL_JUMPS) {
    s = seedState(seed);
    at = 0;
  } else {
    s = seedState(seed);
    let bits = 0;
    while (2 ** bits <= chunk) bits++;
    const powers = powersOfJump(bits);
    for (let k = 0; k < bits; k++) {
      if (Math.floor(chunk / 2 ** k) % 2 === 1) s = applyMatrix(powers[k], s);
    }
    at = chunk;
  }
  for (; at < chunk; at++) s = jumpState(s);
  lastChunk = { seed, chunk, state: s };
  return [...s] as State128;
}

/** The random stream of chunk `chunk` of a run with `seed` (see the top of this file). */
export function chunkRandom(seed: number, chunk: number): RandomSource {
  return xoshiroFromState(chunkState(seed, chunk));
}
