// Chunk streams for parallel jobs: chunk c is the seeded xoshiro128** stream advanced by c jumps.
import { describe, expect, it } from 'vitest';
import { seedState, seededRandom, xoshiroFromState } from '../../src/statistics/prng';
import { applyMatrix, chunkRandom, chunkState, jumpState, matrixOf, squareMatrix, stepState, type State128 } from '../../src/statistics/prngStreams';

describe('xoshiro128** jump and chunk streams (Blackman & Vigna 2021, ACM Trans. Math. Softw. 47(4), 36)', () => {
  it('the jump polynomial equals 2^64 steps: the step matrix over GF(2) squared 64 times (independent method)', () => {
    // T is the linear state update; T^(2^64) by 64 squarings must map every state as jump() does.
    let t = matrixOf(stepState);
    for (let k = 0; k < 64; k++) t = squareMatrix(t);
    for (const seed of [0, 1, 7, 2 ** 40 + 3]) {
      const s = seedState(seed) as State128;
      expect(applyMatrix(t, s), `seed ${seed}`).toEqual(jumpState(s));
    }
  });

  it('chunk c equals c successive reference jumps of the seeded state', () => {
    for (const seed of [3, 20261202]) {
      let s = seedState(seed) as State128;
      for (let c = 0; c <= 40; c++) {
        expect(chunkState(seed, c), `seed ${seed}, chunk ${c}`).toEqual(s);
        s = jumpState(s);
      }
    }
  });

  it('chunks asked for out of order, and far chunks (through the jump matrices), equal successive reference jumps', () => {
    const reference: State128[] = [seedState(9) as State128];
    for (let c = 1; c <= 300; c++) reference.push(jumpState(reference[c - 1]));
    for (const c of [5, 3, 3, 70, 69, 140, 0, 300, 299, 1, 236]) expect(chunkState(9, c), `chunk ${c}`).toEqual(reference[c]);
    // Another seed in between does not disturb the next chunk of this one.
    chunkState(10, 4);
    expect(chunkState(9, 237)).toEqual(reference[237]);
    // The state handed out is a copy: changing it changes no later answer.
    const s = chunkState(9, 238);
    s[0] ^= 1;
    expect(chunkState(9, 238)).toEqual(reference[238]);
  });

  it('chunk 0 is the plain seeded stream; other chunks differ from it and from each other', () => {
    const a = seededRandom(11);
    const b = chunkRandom(11, 0);
    for (let i = 0; i < 100; i++) expect(b.nextUint32()).toBe(a.nextUint32());
    const firsts = new Set([0, 1, 2, 3, 1000, 65537].map((c) => chunkRandom(11, c).nextUint32()));
    expect(firsts.size).toBe(6);
  });

  it('a stream rebuilt from a state continues the same numbers', () => {
    const s = chunkState(5, 9);
    const a = xoshiroFromState(s);
    const b = xoshiroFromState(s);
    for (let i = 0; i < 20; i++) expect(a.uniform()).toBe(b.uniform());
  });

  it('refuses bad chunk indices and the all-zero state', () => {
    expect(() => chunkState(1, -1)).toThrow(/chunk index/);
    expect(() => chunkState(1, 0.5)).toThrow(/chunk index/);
    expect(() => chunkState(1, 2 ** 32)).toThrow(/chunk index/);
    expect(() => xoshiroFromState([0, 0, 0, 0])).toThrow(/all-zero/);
  });
});
