// The circular strain form (Phinney 2001, astro-ph/0108028, with M_c^(5/3) = M^(5/3) eta, as
// circularStrainForm.ts) for a population that integrates itself in z per (M, q)
// (BinaryPopulation.zIntegral: a density with a step in z at a place that depends on M and q):
//   h_c^2(f) = 4 G^(5/3) / (3 pi^(1/3) c^2) f^(-4/3) Int dlog10M (M/Msun)^(5/3) Int dq eta
//              Int_{(1+z) <= 10^(x_f - log10M)} dz (1+z)^(-1/3) shape((1+z) f / scaleHz) n,
// the mass integral outermost. The ISCO cut x_cut = x_f - log10(1+z) (iscoCut.ts) becomes the upper z
// limit of each mass node, so the mass integrand has kinks where that limit crosses the z range; the
// mass panels that the cut crosses are refined by error control (halving, as adaptiveZRule.ts; Davis &
// Rabinowitz 1984, Methods of Numerical Integration, ch. 6), the others keep the plain composite
// Gauss-Legendre nodes of the resolution, as the z-outer form does. Without an emission
// factor the z integrals of the mass nodes the cut does not reach are kept for the next frequency.
import { symmetricMassRatio } from './binaryMasses';
import { STRAIN_FORM_MSUN_MPC, Z_TOL } from './circularStrainForm';
import { FIVE_THIRDS_LN10 } from './circularMassModels';
import { gaussLegendreRule } from './gaussLegendre';
import { massRatioRule } from './massRatioRule';
import { cutOffsetLog10 } from './iscoCut';
import type { BinaryPopulation, ZRule } from './populationTypes';
import type { IntegrationResolution } from './backgroundIntegral';

/** Deepest halving of a mass panel the cut crosses. */
const MAX_DEPTH = 10;

/** h_c^2 at each frequency (Hz) of a population with zIntegral; see the file comment. */
export function perNodeZStrainForm(pop: BinaryPopulation, freqsHz: ArrayLike<number>, cutFactor: number, res: IntegrationResolution, shape?: (ratio: number) => number, scaleHz = 1): Float64Array {
  const zIntegral = pop.zIntegral!;
  const qr = massRatioRule(pop, res.qPanels, res.order);
  const nq = qr.nodes.length;
  const etaW = Float64Array.from(qr.nodes, (q, j) => qr.weights[j] * symmetricMassRatio(q));
  const zRule: ZRule = { panels: res.zPanels, order: res.order, tol: Z_TOL };
  const x0 = cutOffsetLog10(cutFactor);
  const unit = gaussLegendreRule(res.order);
  const plain = (z: number) => Math.pow(1 + z, -1 / 3);
  // Int dz (1+z)^(-1/3) n at each q node of a mass node the cut does not reach, by log10M
  const uncut = new Map<number, Float64Array>();
  const out = new Float64Array(freqsHz.length);
  for (let k = 0; k < freqsHz.length; k++) {
    const f = freqsHz[k];
    const xf = x0 - Math.log10(f);
    const weight = shape ? (z: number) => Math.pow(1 + z, -1 / 3) * shape(((1 + z) * f) / scaleHz) : plain;
    const massIntegrand = (x: number): number => {
      const zTop = Math.pow(10, xf - x) - 1;
      if (!(zTop > pop.zMin)) return 0;
      const keep = !shape && zTop >= pop.zMax;
      let row = keep ? uncut.get(x) : undefined;
      if (!row) {
        row = new Float64Array(nq);
        for (let j = 0; j < nq; j++) row[j] = zIntegral(x, qr.nodes[j], weight, zTop, zRule);
        if (keep) uncut.set(x, row);
      }
      let s = 0;
      for (let j = 0; j < nq; j++) s += etaW[j] * row[j];
      return Math.exp(FIVE_THIRDS_LN10 * x) * s;
    };
    // above xHi every binary is cut at every z of the population; below xSafe none is
    const xHi = Math.min(pop.log10MMax, xf - Math.log10(1 + pop.zMin));
    const xSafe = xf - Math.log10(1 + pop.zMax);
    let total = 0;
    if (xHi > pop.log10MMin) {
      // the mass panels of the resolution; those the cut crosses are refined by error control
      const width = (pop.log10MMax - pop.log10MMin) / res.log10MPanels;
      const panelSum = (a: number, b: number): number => {
        const mid = 0.5 * (a + b);
        const half = 0.5 * (b - a);
        let sum = 0;
        for (let i = 0; i < res.order; i++) sum += unit.weights[i] * massIntegrand(mid + half * unit.nodes[i]);
        return half * sum;
      };
      const crossed: [number, number, number][] = [];
      let scale = 0;
      for (let p = 0; p < res.log10MPanels; p++) {
        const a = pop.log10MMin + p * width;
        const b = Math.min(xHi, p === res.log10MPanels - 1 ? pop.log10MMax : a + width);
        if (!(b > a)) break;
        const sum = panelSum(a, b);
        scale += Math.abs(sum);
        if (b > xSafe) crossed.push([a, b, sum]);
        else total += sum;
      }
      const refine = (a: number, b: number, sum: number, depth: number): number => {
        const mid = 0.5 * (a + b);
        const left = panelSum(a, mid);
        const right = panelSum(mid, b);
        if (depth >= MAX_DEPTH || !(Math.abs(left + right - sum) > Z_TOL * scale)) return left + right;
        return refine(a, mid, left, depth + 1) + refine(mid, b, right, depth + 1);
      };
      for (const [a, b, sum] of crossed) total += refine(a, b, sum, 0);
    }
    out[k] = STRAIN_FORM_MSUN_MPC * Math.pow(f, -4 / 3) * total;
    if (!Number.isFinite(out[k])) throw new RangeError(`h_c^2 is not finite at f = ${f} Hz${shape ? ' (the emission factor returned a non-finite value?)' : ''}`);
  }
  return out;
}
