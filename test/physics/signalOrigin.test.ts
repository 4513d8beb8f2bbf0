// Origin breakdowns: the profiles dh_c^2/dz and dh_c^2/dlog10 M_c must integrate back to h_c^2 from
// the integrator (an independent path: different variables and quadrature), and a narrow population
// must be found where it is.
import { describe, expect, it } from 'vitest';
import { F_YR_HZ } from '../../src/physics/constants';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { chirpMassFromTotal } from '../../src/physics/binaryMasses';
import { chirpMassOrigin, redshiftOrigin } from '../../src/physics/signalOrigin';
import type { BinaryPopulation } from '../../src/physics/populationTypes';
import { buildPopulation, fixturePopulations } from './populations';

describe('origin profiles integrate to h_c^2 (Phinney 2001, astro-ph/0108028)', () => {
  for (const fp of fixturePopulations) {
    for (const f of [F_YR_HZ, 1e-7]) {
      it(`population ${fp.label}, f = ${f.toExponential(3)} Hz`, () => {
        const pop = buildPopulation(fp);
        const total = characteristicStrainSquared(pop, [f])[0];
        const byZ = redshiftOrigin(pop, f, { gridPoints: 400 });
        const byMc = chirpMassOrigin(pop, f, { gridPoints: 400 });
        // Trapezoid rule on 400 points: 2e-3 relative is ample (the grid error is O(h^2)).
        expect(Math.abs(byZ.total / total - 1)).toBeLessThan(2e-3);
        expect(Math.abs(byMc.total / total - 1)).toBeLessThan(2e-3);
        for (const p of [byZ, byMc]) {
          expect(p.range90[0]).toBeLessThanOrEqual(p.range50[0]);
          expect(p.range50[0]).toBeLessThanOrEqual(p.median);
          expect(p.median).toBeLessThanOrEqual(p.range50[1]);
          expect(p.range50[1]).toBeLessThanOrEqual(p.range90[1]);
        }
      });
    }
  }
});

describe('the chirp-mass profile of a density factored as redshift x exp(lnMass) x massRatio (its q factors kept across z)', () => {
  for (const fp of fixturePopulations) {
    it(`is the profile of the same density called node by node, bit for bit: population ${fp.label}`, () => {
      const pop = buildPopulation(fp);
      const plain: BinaryPopulation = { ...pop, separable: undefined };
      for (const f of [F_YR_HZ, 1e-7]) expect(chirpMassOrigin(pop, f).density).toEqual(chirpMassOrigin(plain, f).density);
    });
  }
});

describe('a narrow population is found where it is', () => {
  // Uniform box of half-width 0.02 in z, 0.02 dex in M and 0.01 in q around (1.2, 9, 0.5).
  const pop: BinaryPopulation = { zMin: 1.18, zMax: 1.22, log10MMin: 8.98, log10MMax: 9.02, qMin: 0.49, qMax: 0.51, density: () => 1 };
  it('redshift median and 90% range lie inside [1.18, 1.22]', () => {
    const o = redshiftOrigin(pop, F_YR_HZ);
    expect(Math.abs(o.median - 1.2)).toBeLessThan(0.005);
    expect(o.range90[0]).toBeGreaterThanOrEqual(1.18);
    expect(o.range90[1]).toBeLessThanOrEqual(1.22);
  });
  it('chirp-mass median is the chirp mass of (1e9 Msun, q = 0.5) (M_c = M eta^(3/5))', () => {
    const o = chirpMassOrigin(pop, F_YR_HZ);
    expect(Math.abs(o.median - Math.log10(chirpMassFromTotal(1e9, 0.5)))).toBeLessThan(0.01);
  });
});
