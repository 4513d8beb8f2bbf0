// The residence factor of an environment: for a circular binary hardened by its environment as well as
// by GW emission, the time it spends per ln f_r relative to the GW-driven time,
//   R(f_r, M, q, z) = (dt/dln f_r)_total / (dt/dln f_r)_GW   in [0, 1]
// (Phinney 2001, astro-ph/0108028; Sesana 2013, arXiv:1307.2600). The number of binaries per ln f_r
// and the energy they radiate there are the GW-driven ones times R; the strain of each binary is not
// changed. The emission kernels of such models are the circular GW-driven kernel times R
// (phenomHardeningSpectrum.ts, stellarHardening.ts); the counts per bin (finiteBinaries.ts) and the
// realisations (realisationCells.ts) take R itself.

/** R(f_r in Hz, total mass in kg, q, z): (dt/dln f_r)_total / (dt/dln f_r)_GW of one circular binary. */
export type ResidenceFactor = (frHz: number, mKg: number, q: number, z: number) => number;
