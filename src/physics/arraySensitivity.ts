// Noise-equivalent characteristic strain of a timing array for a correlated background, on the
// array's own frequency bins, so it can be drawn beside a predicted spectrum h_c(f).
import type { Spectrum } from './spectrum';
import { frequencyBins, pulsarNoisePsd, shortestCadence, strainFromResidualPsd, type PulsarArray, type PulsarNoise } from './pulsarArray';
import { memberNoise, pairLayout, sumOverPairs } from './pulsarPairs';

export interface SensitivityCurve extends Spectrum {
  /** Number of pulsar pairs combined. */
  pulsarPairs: number;
  /** True when pair factors are the expectation over isotropic positions, false when from given positions. */
  skyAveraged: boolean;
}

/**
 * Effective residual PSD of the array for the cross-correlation search in the weak-signal limit:
 * P_eff(f) = [ sum_{I<J} Gamma_IJ^2 / (P_I(f) P_J(f)) ]^(-1/2)
 * (the pair combination of Hazboun, Romano & Smith 2019, PRD 100, 104028; it is the weak-signal
 * limit of the per-bin cross-correlation S/N in detectionSnr.ts: rho_bin^2 = 2 (P_gw / P_eff)^2).
 * Without positions Gamma_IJ^2 is replaced by its isotropic expectation, 1/48 (derived in docs/array.md).
 */
export function effectiveNoisePsd(array: PulsarArray, fHz: number): number {
  const layout = pairLayout(array);
  const noise = memberNoise(layout, fHz, new Float64Array(layout.members.length));
  const s = sumOverPairs(layout, noise, (g2, pI, pJ) => g2 / (pI * pJ));
  return 1 / Math.sqrt(s);
}

/**
 * The array's sensitivity as a characteristic strain on its bins f_k = k/T up to 1/(2 dt):
 * h_n(f) = sqrt(12 pi^2 f^3 P_eff(f)), the strain whose residual PSD equals P_eff (the PSD/strain relation
 * P = h_c^2/(12 pi^2 f^3)). A background with h_c = h_n in one bin gives S/N sqrt(2) from that bin alone
 * (weak-signal limit). White noise alone gives h_n proportional to f^(3/2).
 */
export function arraySensitivity(array: PulsarArray, spanS: number = array.spanS): SensitivityCurve {
  const f = frequencyBins(spanS, shortestCadence(array));
  const layout = pairLayout(array);
  const noise = new Float64Array(layout.members.length);
  const hc = new Float64Array(f.length);
  for (let k = 0; k < f.length; k++) {
    memberNoise(layout, f[k], noise);
    const s = sumOverPairs(layout, noise, (g2, pI, pJ) => g2 / (pI * pJ));
    hc[k] = s > 0 ? strainFromResidualPsd(1 / Math.sqrt(s), f[k]) : Infinity;
  }
  return { frequencyHz: f, hc, pulsarPairs: layout.pulsarPairs, skyAveraged: array.positions === null };
}

/** Noise-equivalent characteristic strain of one pulsar alone, h = sqrt(12 pi^2 f^3 P_I(f)). */
export function pulsarNoiseStrain(p: PulsarNoise, fHz: number): number {
  return strainFromResidualPsd(pulsarNoisePsd(p, fHz), fHz);
}
