// Black-hole mass against host bulge stellar mass, log10 M_BH = a + b log10(M_bulge / 1e11 Msun),
// with log-normal intrinsic scatter (dex). Masses in Msun.

export interface BlackHoleBulgeRelation {
  /** Normalisation a: log10 M_BH at M_bulge = 1e11 Msun. */
  a: number;
  /** Slope b. */
  b: number;
  /** Intrinsic scatter, dex. */
  scatterDex: number;
  /** Where the numbers come from. */
  source: string;
}

/**
 * McConnell & Ma 2013 (ApJ 764, 184), M_BH-M_bulge fit: a = 8.46, b = 1.05 (the full-sample fit
 * of their abstract); intrinsic scatter 0.34 dex (unverified: their Table 2 was not seen here; an
 * independent implementation quotes its first M_BH-M_bulge row as 8.46, 1.05 and 0.34 dex).
 */
export const MCCONNELL_MA_2013: BlackHoleBulgeRelation = Object.freeze({ a: 8.46, b: 1.05, scatterDex: 0.34, source: 'McConnell & Ma 2013, ApJ 764, 184 (scatter unverified)' });

/**
 * Kormendy & Ho 2013 (ARA&A 51, 511): M_BH / 1e9 Msun = 0.49 (M_bulge / 1e11 Msun)^1.16, so
 * a = 9 + log10 0.49 = 8.690 and b = 1.16; intrinsic scatter 0.29 dex (unverified: the paper's text was
 * not seen here, and two independent implementations quote its eq. 10 as exponent 1.17 and scatter 0.28 dex).
 */
export const KORMENDY_HO_2013: BlackHoleBulgeRelation = Object.freeze({ a: 9 + Math.log10(0.49), b: 1.16, scatterDex: 0.29, source: 'Kormendy & Ho 2013, ARA&A 51, 511 (scatter unverified)' });

/** Median log10 M_BH for a bulge of the given stellar mass. */
export function medianLog10BlackHoleMass(r: BlackHoleBulgeRelation, bulgeMass: number): number {
  return r.a + r.b * Math.log10(bulgeMass / 1e11);
}
