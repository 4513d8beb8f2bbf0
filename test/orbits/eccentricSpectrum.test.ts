// Eccentric GW-driven background (Enoki & Nagashima 2007, PTP 117, 241) through the project's integrator.
import { describe, expect, it } from 'vitest';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { circularGwKernel } from '../../src/physics/circularKernel';
import { YEAR_S } from '../../src/physics/constants';
import { eccentricEmissionKernel, eccentricTables, eccentricityNodes, harmonicSumTableFor, uniformEccentricity } from '../../src/physics/eccentricKernel';
import { smoothPopulation } from './populations';

const T = 12 * YEAR_S;
const freqs = Float64Array.from({ length: 12 }, (_, k) => (k + 1) / T);

describe('eccentric spectrum', () => {
  it('circular limit: e0 = 0 with f0 below every emitted f_r/2 reproduces the circular spectrum exactly (Peters & Mathews 1963: only n = 2 at e = 0)', () => {
    const pop = smoothPopulation();
    const ecc = characteristicStrainSquared(pop, freqs, { kernel: eccentricEmissionKernel(circularGwKernel, { e0: 0, f0OrbitalHz: 1e-12 }) });
    const circularEnergyForm = characteristicStrainSquared(pop, freqs, { kernel: (fr, mc, m, q, z) => circularGwKernel(fr, mc, m, q, z) });
    const circularStrainForm = characteristicStrainSquared(pop, freqs);
    for (let k = 0; k < freqs.length; k++) {
      expect(ecc[k]).toBe(circularStrainForm[k]); // the fast path: the circular strain form times a factor of exactly 1
      expect(Math.abs(ecc[k] / circularEnergyForm[k] - 1)).toBeLessThan(1e-12); // the integrator's other algebraic form (kernel at every node)
    }
  });

  it('energy conservation: Int Phi(x) x^(2/3) dln x from 1 to X equals the circular (3/2)(X^(2/3) - 2^(2/3)) to 1e-6, since the binding energy -G m1 m2/(2a) fixes the energy radiated between two orbital frequencies whatever e (Peters 1964, Phys. Rev. 136, B1224)', () => {
    for (const e0 of [0.3, 0.7, 0.9]) {
      const t = harmonicSumTableFor(e0);
      const X = 1e5;
      const points = 400_000;
      const h = Math.log(X) / points;
      let s = 0;
      for (let i = 0; i < points; i++) {
        const x = Math.exp((i + 0.5) * h);
        s += t.at(x) * Math.pow(x, 2 / 3) * h;
      }
      const circular = 1.5 * (Math.pow(X, 2 / 3) - Math.pow(2, 2 / 3));
      expect(Math.abs(s / circular - 1), `e0 = ${e0}: eccentric ${s}, circular ${circular}`).toBeLessThan(1e-6);
    }
  });

  it('far above the start frequency the spectrum returns to the circular one (orbits have circularised, Peters 1964): ratio within 1e-3 at f_r/f0 > 1e4', () => {
    const pop = smoothPopulation();
    const f = [50e-9, 100e-9];
    const ecc = characteristicStrainSquared(pop, f, { kernel: eccentricEmissionKernel(circularGwKernel, { e0: 0.7, f0OrbitalHz: 1e-12 }) });
    const circ = characteristicStrainSquared(pop, f);
    for (let k = 0; k < f.length; k++) expect(Math.abs(ecc[k] / circ[k] - 1)).toBeLessThan(1e-3);
  });

  it('a narrow e0 distribution approaches the single value; 12 and 24 e0 nodes agree to 1e-4 for uniform e0 on [0.1, 0.6]', () => {
    const narrow = eccentricTables({ e0: uniformEccentricity(0.5, 0.5 + 1e-6), f0OrbitalHz: 1 });
    const single = harmonicSumTableFor(0.5);
    const coarse = eccentricTables({ e0: uniformEccentricity(0.1, 0.6), f0OrbitalHz: 1 });
    const fine = eccentricTables({ e0: uniformEccentricity(0.1, 0.6), f0OrbitalHz: 1, e0Panels: 4 });
    const mix = (t: ReturnType<typeof eccentricTables>, x: number) => t.tables.reduce((s, tab, k) => s + t.weights[k] * tab.at(x), 0);
    for (const x of [3.5, 12, 40, 150, 2000]) {
      expect(Math.abs(mix(narrow, x) / single.at(x) - 1)).toBeLessThan(1e-4);
      expect(Math.abs(mix(coarse, x) / mix(fine, x) - 1), `x = ${x}`).toBeLessThan(1e-4);
    }
  });

  it('e0 quadrature weights are normalised and reject a negative or all-zero density', () => {
    const w = eccentricityNodes(uniformEccentricity(0, 0.5)).weights;
    expect(Math.abs(w.reduce((a, b) => a + b, 0) - 1)).toBeLessThan(1e-14);
    expect(() => eccentricityNodes({ lo: 0, hi: 0.5, density: () => -1, label: 'bad' })).toThrow(/density must be finite and >= 0/);
    expect(() => eccentricityNodes({ lo: 0, hi: 0.5, density: () => 0, label: 'zero' })).toThrow(/zero everywhere/);
    expect(() => harmonicSumTableFor(0.97)).toThrow(/e0 must lie in \[0, 0.95\]/);
    expect(() => eccentricEmissionKernel(circularGwKernel, { e0: 0.5, f0OrbitalHz: 0 })).toThrow(/f0 must be positive/);
  });
});
