// The Chebyshev table of the cut mass integral (cutMassTable.ts) against the rule it replaces: the
// Gauss-Legendre partial panel evaluated directly at every cut (an independent evaluation of the same
// integral). Smooth densities, a cutoff that falls inside a panel, and a density with a step (whose
// pieces cannot converge and must read the direct rule) all agree to 1e-13; a spectrum at many
// frequencies (tabulated) equals the same frequencies taken one at a time (direct).
import { describe, expect, it } from 'vitest';
import { KM_S_MPC_SI } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { CutMassTable, TABLE_TOL } from '../../src/physics/cutMassTable';
import { gaussLegendreRule } from '../../src/physics/gaussLegendre';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import { separablePopulation } from '../../src/physics/separablePopulation';

const FIVE_THIRDS_LN10 = (5 / 3) * Math.LN10;
const rel = (a: number, b: number) => (a === b ? 0 : Math.abs(a / b - 1));

/** A table over [lo, hi] in `panels` panels of `order` points for the integrand exp(lnMass(x) + 5/3 ln10 x), and the direct rule. */
function tableAndDirect(lnMass: (x: number) => number, lo = 6, hi = 11, panels = 4, order = 6) {
  const { nodes: u, weights: w } = gaussLegendreRule(order);
  const g = (x: number) => Math.exp(lnMass(x) + FIVE_THIRDS_LN10 * x);
  const partial = (a: number, x: number) => {
    let s = 0;
    for (let i = 0; i < order; i++) s += w[i] * g(0.5 * (a + x) + 0.5 * (x - a) * u[i]);
    return 0.5 * (x - a) * s;
  };
  const width = (hi - lo) / panels;
  const cumulative = new Float64Array(panels + 1);
  for (let p = 0; p < panels; p++) cumulative[p + 1] = cumulative[p] + partial(lo + p * width, lo + (p + 1) * width);
  const direct = (x: number) => {
    if (x >= hi) return cumulative[panels];
    const p = Math.min(panels, Math.max(0, Math.floor((x - lo) / width)));
    const a = lo + p * width;
    return p === panels || !(x > a) ? cumulative[p] : cumulative[p] + partial(a, x);
  };
  return { table: new CutMassTable(lo, hi, width, panels, cumulative, partial), direct };
}

/** Cuts spread over and beyond the mass range, in a fixed pseudo-random order (so pieces are built in varied order). */
function cuts(lo: number, hi: number, n = 3000): number[] {
  let s = 12345;
  return Array.from({ length: n }, () => {
    s = (s * 1103515245 + 12345) % 2147483648;
    return lo - 0.3 + (hi - lo + 0.6) * (s / 2147483648);
  });
}

function worst(lnMass: (x: number) => number, lo = 6, hi = 11) {
  const { table, direct } = tableAndDirect(lnMass, lo, hi);
  return Math.max(...cuts(lo, hi).map((x) => rel(table.value(x), direct(x))));
}

describe('the table of the cut mass integral equals the direct partial-panel rule', () => {
  it('for a power law with an exponential cutoff inside the range (the demo shape)', () => {
    const lnMass = (x: number) => -0.25 * Math.LN10 * (x - 7) - Math.pow(10, x) / 1.2e9;
    expect(worst(lnMass)).toBeLessThan(1e-13);
  });
  it('for a pure power law, and a cutoff at the low end of the range', () => {
    expect(worst((x) => -1.3 * Math.LN10 * x)).toBeLessThan(1e-13);
    expect(worst((x) => 0.5 * Math.LN10 * x - Math.pow(10, x) / 3e6)).toBeLessThan(1e-13);
  });
  it('for a density with a step inside a panel (pieces there read the direct rule)', () => {
    const step = (x: number) => (x < 8.3 ? 0 : -3);
    expect(worst(step)).toBeLessThan(1e-13);
    expect(TABLE_TOL).toBeLessThan(1e-13);
  });
});

describe('a spectrum at many frequencies (tabulated) equals its frequencies one at a time (direct)', () => {
  const cosmo = new FlatLambdaCdm({ hubbleSI: 69 * KM_S_MPC_SI, omegaM: 0.31 });
  // invented populations, no published fit
  const smooth = phenomenologicalPopulation({
    rateNorm: 1.2e-3, alpha: 0.25, cutoffMass: 1.2e9, beta: 2.1, z0: 1.4, zMax: 5, log10MMin: 6, log10MMax: 11,
    massRatio: powerLawMassRatio(-0.4, 0.05), cosmology: cosmo,
  });
  const stepped = separablePopulation(
    { zMin: 0, zMax: 3, log10MMin: 6.5, log10MMax: 10.5, qMin: 0.1, qMax: 1 },
    { redshift: (z) => 1e-3 * Math.exp(-z), lnMass: (x) => (x < 8.7 ? -0.5 * x : -0.5 * x - 2), massRatio: () => 1 },
  );
  const freqs = Float64Array.from({ length: 300 }, (_, k) => 1e-9 * Math.pow(10, (3.5 * k) / 299));
  for (const [name, pop] of [['smooth', smooth], ['stepped', stepped]] as const) {
    it(`${name} density`, () => {
      const many = characteristicStrainSquared(pop, freqs);
      for (let k = 0; k < freqs.length; k++) expect(rel(many[k], characteristicStrainSquared(pop, [freqs[k]])[0])).toBeLessThan(1e-13);
    });
  }
  it('names the mass of a density that is not finite, with a table as without', () => {
    const bad = separablePopulation(
      { zMin: 0, zMax: 3, log10MMin: 6.5, log10MMax: 10.5, qMin: 0.1, qMax: 1 },
      { redshift: () => 1e-3, lnMass: (x) => (x > 9 ? NaN : -x), massRatio: () => 1 },
    );
    const one = () => characteristicStrainSquared(bad, [3e-7]);
    const many = () => characteristicStrainSquared(bad, freqs);
    expect(one).toThrow(/log10M/);
    expect(many).toThrow(/log10M/);
  });
});
