// The integrator at its default resolution against scipy's adaptive cubature of the same formula
// (fixture test/reference/background_scipy.json, generator test/reference/generate_background.py,
// scipy.integrate.tplquad with epsrel 1e-10): h_c within 0.1% (tolerance of the brief).
import { describe, expect, it } from 'vitest';
import fixture from '../reference/background_scipy.json';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { buildPopulation, fixturePopulations } from './populations';

describe(`background h_c vs ${fixture.library}: ${fixture.call}`, () => {
  for (const c of fixture.cases) {
    it(`population ${c.population}, f = ${c.frequencyHz.toExponential(4)} Hz`, () => {
      const p = fixturePopulations.find((x) => x.label === c.population)!;
      const hc = Math.sqrt(characteristicStrainSquared(buildPopulation(p), [c.frequencyHz])[0]);
      const expected = Math.sqrt(c.hc2);
      const err = Math.abs(hc / expected - 1);
      expect(err, `expected h_c ${expected}, got ${hc}, relative error ${err.toExponential(2)} > 1e-3`).toBeLessThan(1e-3);
    });
  }
});
