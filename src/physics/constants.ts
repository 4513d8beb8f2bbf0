// Physical and astronomical constants, SI. Each value cites its source.

/** Newtonian constant of gravitation, m^3 kg^-1 s^-2 (CODATA 2018, Tiesinga et al. 2021, RMP 93, 025010). */
export const G_SI = 6.6743e-11;
/** Speed of light in vacuum, m/s (exact; SI definition, CODATA 2018). */
export const C_SI = 299_792_458;
/** Nominal solar mass parameter GM_sun, m^3 s^-2 (IAU 2015 Resolution B3). */
export const GM_SUN_SI = 1.3271244e20;
/** Solar mass, kg, derived as GM_sun / G (IAU 2015 Resolution B3 with CODATA 2018 G). */
export const M_SUN_KG = GM_SUN_SI / G_SI;
/** Astronomical unit, m (exact; IAU 2012 Resolution B2). */
export const AU_M = 149_597_870_700;
/** Parsec, m: (648000 / pi) au (IAU 2015 Resolution B2). */
export const PC_M = (648_000 / Math.PI) * AU_M;
/** Megaparsec, m. */
export const MPC_M = 1e6 * PC_M;
/** Day, s (SI). */
export const DAY_S = 86_400;
/** Julian year, s: 365.25 days (IAU; used for f_yr by the trade). */
export const YEAR_S = 365.25 * DAY_S;
/** Gigayear (Julian), s. */
export const GYR_S = 1e9 * YEAR_S;
/** Reference frequency of the trade, f_yr = 1 / Julian year, Hz. */
export const F_YR_HZ = 1 / YEAR_S;
/** Hubble-constant unit: 1 km/s/Mpc in s^-1. */
export const KM_S_MPC_SI = 1e3 / MPC_M;
