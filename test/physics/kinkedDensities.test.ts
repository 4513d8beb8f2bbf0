// Accuracy with kinked densities (issue 11, "Accuracy is not traded away"): the default resolution
// against converged scipy quadrature (fixture test/reference/kinked_background_scipy.json, generator
// test/reference/generate_kinked_background.py: QUADPACK with the kinks as break points, epsrel 1e-12)
// for user densities whose z integrand has a kink: the ISCO cut crossing the upper mass limit inside
// the redshift range, and powers z^a with a < 2 at z = 0. Each density is integrated both as a
// separable population (factored fast path) and as a plain density (triple sum); A (h_c) within 1e-4.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/kinked_background_scipy.json';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { separablePopulation } from '../../src/physics/separablePopulation';
import type { BinaryPopulation } from '../../src/physics/populationTypes';

type Density = (typeof fixture.densities)[number];

function populationOf(d: Density): BinaryPopulation {
  const qNorm = d.gamma === -1 ? -Math.log(d.qMin) : (1 - d.qMin ** (d.gamma + 1)) / (d.gamma + 1);
  return separablePopulation(
    { zMin: 0, zMax: d.zMax, log10MMin: d.log10MMin, log10MMax: d.log10MMax, qMin: d.qMin, qMax: 1 },
    {
      redshift: (z) => d.norm * z ** d.a * (1 + z) ** d.b * Math.exp(-z / d.z0),
      lnMass: (x) => -d.alpha * Math.LN10 * (x - 8) - (d.mStar ? 10 ** x / d.mStar : 0),
      massRatio: (q) => q ** d.gamma / qNorm,
    },
  );
}

describe(`kinked densities vs ${fixture.library}`, () => {
  for (const d of fixture.densities) {
    const pop = populationOf(d);
    const plain: BinaryPopulation = { ...pop, separable: undefined };
    for (const c of fixture.cases.filter((x) => x.density === d.id)) {
      it(`${d.id} (${d.label}), f = ${c.frequencyHz.toExponential(3)} Hz`, () => {
        for (const [how, p] of [['separable', pop], ['plain density', plain]] as const) {
          const hc2 = characteristicStrainSquared(p, [c.frequencyHz])[0];
          const err = Math.abs(Math.sqrt(hc2 / c.hc2) - 1);
          console.log(d.id, c.frequencyHz, how, err.toExponential(2));
          expect(err, `${how}: h_c error ${err.toExponential(2)}`).toBeLessThan(1e-4);
        }
      });
    }
  }
});
