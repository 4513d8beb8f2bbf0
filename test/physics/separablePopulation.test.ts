// The fully factored fast path of the circular strain form (src/physics/circularStrainForm.ts: each
// factor's node values once per spectrum, the ISCO cut as a sum of logarithms, one exp per mass node)
// against the same quadrature evaluated as the plain triple sum of the density at every node (Phinney
// 2001, astro-ph/0108028, strain form with M_c^(5/3) = M^(5/3) eta). The two differ in the order of
// operations only, so they must agree to rounding (1e-13 relative).
import { describe, expect, it } from 'vitest';
import { characteristicStrainSquared, DEFAULT_RESOLUTION } from '../../src/physics/backgroundIntegral';
import { compositeNodes } from '../../src/physics/gaussLegendre';
import { circularGwKernel } from '../../src/physics/circularKernel';
import { F_YR_HZ } from '../../src/physics/constants';
import { eccentricEmissionKernel } from '../../src/physics/eccentricKernel';
import { bendEmissionKernel } from '../../src/physics/bendSpectrum';
import { separablePopulation } from '../../src/physics/separablePopulation';
import type { BinaryPopulation } from '../../src/physics/populationTypes';
import type { PopulationValue } from '../../src/builtins/populationValue';
import { buildPopulation, fixturePopulations } from './populations';
import { loadDemo, siValues } from './demoSheet';

const demo = loadDemo();
// the demo grid, f_yr, and frequencies where the ISCO cut crosses every mass panel
const freqs = [F_YR_HZ, ...siValues(demo.value('freqs')), 1e-7, 3e-7, 1e-6, 3e-6];
const populations: [string, BinaryPopulation][] = [
  ['demo (examples/demo.json)', (demo.value('pop') as PopulationValue).population],
  ...fixturePopulations.map((p) => [`test population ${p.label}`, buildPopulation(p)] as [string, BinaryPopulation]),
];
const tripleSum = (p: BinaryPopulation): BinaryPopulation => ({ ...p, separable: undefined });
const zMassOnly = (p: BinaryPopulation): BinaryPopulation => ({ ...p, separable: { zMass: p.separable!.zMass, massRatio: p.separable!.massRatio } });

function worst(a: Float64Array, b: Float64Array): number {
  let w = 0;
  for (let i = 0; i < a.length; i++) w = Math.max(w, Math.abs(a[i] / b[i] - 1));
  return w;
}

describe('factored densities: the fast path equals the triple sum to rounding', () => {
  for (const [label, pop] of populations) {
    it(label, () => {
      expect(pop.separable?.redshift && pop.separable.lnMass, 'the population declares its z and mass factors').toBeTruthy();
      const kernels = [
        { label: 'circular', opts: {} },
        { label: 'circular, cut at 2 f_ISCO', opts: { cutFactor: 2 } },
        { label: 'circular, 3 x 5 x 2 panels of 7 points', opts: { resolution: { zPanels: 3, log10MPanels: 5, qPanels: 2, order: 7 } } },
        { label: 'bend at 5 nHz', opts: { kernel: bendEmissionKernel(circularGwKernel, 5e-9, 10 / 3) } },
        { label: 'eccentric e0 = 0.5 from 0.5 nHz', opts: { kernel: eccentricEmissionKernel(circularGwKernel, { e0: 0.5, f0OrbitalHz: 0.5e-9 }) } },
      ];
      for (const k of kernels) {
        const fast = characteristicStrainSquared(pop, freqs, k.opts);
        expect(worst(fast, characteristicStrainSquared(tripleSum(pop), freqs, k.opts)), `${k.label} vs triple sum`).toBeLessThan(1e-13);
        expect(worst(fast, characteristicStrainSquared(zMassOnly(pop), freqs, k.opts)), `${k.label} vs zMass x massRatio`).toBeLessThan(1e-13);
      }
    });
  }
});

describe('separablePopulation', () => {
  const limits = { zMin: 0, zMax: 3, log10MMin: 7, log10MMax: 10, qMin: 0.1, qMax: 1 };
  const factors = { redshift: (z: number) => 1e-3 * (1 + z) ** 2 * Math.exp(-z), lnMass: (x: number) => -0.5 * (x - 8.5) ** 2, massRatio: (q: number) => q ** -0.3 };
  it('density, zMass and the factors agree (density = redshift x exp(lnMass) x massRatio)', () => {
    const p = separablePopulation(limits, factors);
    for (const [z, x, q] of [[0.3, 7.2, 0.5], [2.9, 9.9, 0.11], [1, 8.5, 1]]) {
      const expected = factors.redshift(z) * Math.exp(factors.lnMass(x)) * factors.massRatio(q);
      expect(Math.abs(p.density(z, x, q) / expected - 1)).toBeLessThan(1e-15);
      expect(Math.abs(p.separable!.zMass(z, x) / (expected / factors.massRatio(q)) - 1)).toBeLessThan(1e-15);
    }
  });
  it('a mass factor of 0 is lnMass = -Infinity', () => {
    const p = separablePopulation(limits, { ...factors, lnMass: (x) => (x > 9 ? -Infinity : factors.lnMass(x)) });
    const cut = characteristicStrainSquared(p, [1e-9, F_YR_HZ]);
    const full = characteristicStrainSquared(tripleSum(p), [1e-9, F_YR_HZ]);
    expect(worst(cut, full)).toBeLessThan(1e-13);
  });
  it('names a bad factor and where it happened', () => {
    expect(() => characteristicStrainSquared(separablePopulation(limits, { ...factors, lnMass: (x) => (x > 9.5 ? NaN : 0) }), [1e-9])).toThrow(/ln\(mass factor\) is NaN at log10M = 9\.[5-9]/);
    // bad only off the whole-panel nodes, so only a partial panel at the ISCO cut (3e-7 Hz) meets it
    const base = new Set(compositeNodes(limits.log10MMin, limits.log10MMax, DEFAULT_RESOLUTION.log10MPanels, DEFAULT_RESOLUTION.order).nodes);
    const offNodes = separablePopulation(limits, { ...factors, lnMass: (x) => (x > 9 && x < 10 && !base.has(x) ? Infinity : 0) });
    expect(() => characteristicStrainSquared(offNodes, [1e-9])).not.toThrow();
    expect(() => characteristicStrainSquared(offNodes, [3e-7])).toThrow(/ln\(mass factor\) is Infinity at log10M = 9\./);
    expect(() => characteristicStrainSquared(separablePopulation(limits, { ...factors, redshift: (z) => (z > 2 ? -1 : 1) }), [1e-9])).toThrow(/redshift factor is -1 at \(2\./);
    expect(() => characteristicStrainSquared(separablePopulation(limits, { ...factors, massRatio: () => NaN }), [1e-9])).toThrow(/mass-ratio factor is NaN/);
  });
});
