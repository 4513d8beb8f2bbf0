// Seeded random numbers for the array-view tests, so Monte Carlo checks repeat exactly.

/** Mulberry32 generator (T. Ettinger's public-domain 32-bit generator; common practice, no source). Uniform on [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A uniformly distributed unit vector (Archimedes: z uniform on [-1, 1], azimuth uniform). */
export function unitSphere(rand: () => number): [number, number, number] {
  const z = 2 * rand() - 1;
  const phi = 2 * Math.PI * rand();
  const r = Math.sqrt(1 - z * z);
  return [r * Math.cos(phi), r * Math.sin(phi), z];
}

/** Standard normal deviate by Box-Muller (Box & Muller 1958, Ann. Math. Stat. 29, 610). */
export function normal(rand: () => number): number {
  const u = 1 - rand();
  const v = rand();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}
