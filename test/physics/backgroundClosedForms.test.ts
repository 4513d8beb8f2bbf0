// The circular background integrator against closed forms of Phinney 2001 (astro-ph/0108028).
import { describe, expect, it } from 'vitest';
import { C_SI, F_YR_HZ, G_SI, MPC_M, M_SUN_KG } from '../../src/physics/constants';
import { characteristicStrainSquared, backgroundSpectrum } from '../../src/physics/backgroundIntegral';
import { chirpMassFromComponents, chirpMassFromTotal, componentMasses, symmetricMassRatio } from '../../src/physics/binaryMasses';
import { circularGwKernel, iscoGwFrequencyHz } from '../../src/physics/circularKernel';
import { localSpectralSlope } from '../../src/physics/spectrumConversions';
import type { BinaryPopulation, EmissionKernel } from '../../src/physics/populationTypes';
import { buildPopulation, fixturePopulations } from './populations';

function rel(a: number, b: number): number {
  return Math.abs(a / b - 1);
}

/** A box of uniform density holding numberMpc3 remnants per Mpc^3 around (z0, x0, q0), tiny widths. */
function narrowBox(numberMpc3: number, z0: number, x0: number, q0: number, half = 1e-5): BinaryPopulation {
  const d = numberMpc3 / (8 * half * half * half);
  return { zMin: z0 - half, zMax: z0 + half, log10MMin: x0 - half, log10MMax: x0 + half, qMin: q0 - half, qMax: q0 + half, density: () => d };
}

describe('chirp mass and symmetric mass ratio (definitions: M_c = (m1 m2)^(3/5) / M^(1/5), eta = m1 m2 / M^2)', () => {
  it('equal masses: eta = 1/4 and M_c = 2^(-6/5) M', () => {
    expect(symmetricMassRatio(1)).toBe(0.25);
    expect(rel(chirpMassFromTotal(2, 1), Math.pow(2, -6 / 5) * 2)).toBeLessThan(1e-15);
  });
  it('total mass and q give the same chirp mass as the components (independent formula)', () => {
    for (const [m, q] of [[1e8, 0.1], [3e9, 0.5], [7, 0.999]]) {
      const [m1, m2] = componentMasses(m, q);
      expect(rel(m1 + m2, m)).toBeLessThan(1e-15);
      expect(rel(m2 / m1, q)).toBeLessThan(1e-15);
      expect(rel(chirpMassFromTotal(m, q), chirpMassFromComponents(m1, m2))).toBeLessThan(1e-14);
    }
  });
});

describe('delta-function population (Phinney 2001, with one chirp mass and one redshift)', () => {
  // h_c^2 = 4 G^(5/3) / (3 pi^(1/3) c^2) f^(-4/3) N M_c^(5/3) (1+z)^(-1/3), N per m^3.
  const cases = [
    { n: 1e-4, z: 0.5, x: 9, q: 0.4, f: F_YR_HZ },
    { n: 3e-6, z: 2.0, x: 10, q: 0.9, f: 5e-9 },
  ];
  for (const c of cases) {
    it(`N = ${c.n} Mpc^-3, z = ${c.z}, log10M = ${c.x}, q = ${c.q}, f = ${c.f.toExponential(3)} Hz`, () => {
      const mc = chirpMassFromTotal(Math.pow(10, c.x) * M_SUN_KG, c.q);
      const expected = ((4 * Math.pow(G_SI, 5 / 3)) / (3 * Math.cbrt(Math.PI) * C_SI * C_SI)) * Math.pow(c.f, -4 / 3) * (c.n / MPC_M ** 3) * Math.pow(mc, 5 / 3) * Math.pow(1 + c.z, -1 / 3);
      const actual = characteristicStrainSquared(narrowBox(c.n, c.z, c.x, c.q), [c.f])[0];
      // Tolerance 1e-8: the box has half-widths 1e-5 and the integrand's curvature gives O(width^2).
      expect(rel(actual, expected), `expected ${expected}, got ${actual}`).toBeLessThan(1e-8);
    });
  }
  it('a binary above its ISCO frequency contributes nothing (cut c^3/(6^(3/2) pi G M))', () => {
    const m = 1e10 * M_SUN_KG;
    const fIsco = iscoGwFrequencyHz(m); // rest frame
    const z = 1;
    const below = characteristicStrainSquared(narrowBox(1e-4, z, 10, 0.5, 1e-7), [(0.99 * fIsco) / (1 + z)])[0];
    const above = characteristicStrainSquared(narrowBox(1e-4, z, 10, 0.5, 1e-7), [(1.01 * fIsco) / (1 + z)])[0];
    expect(below).toBeGreaterThan(0);
    expect(above).toBe(0);
  });
});

describe('spectral shape', () => {
  it('slope is exactly -2/3 where no binary reaches its ISCO (Phinney 2001)', () => {
    const p = { ...fixturePopulations[1], log10MMax: 8 }; // f_ISCO(1e8 Msun) is about 44 uHz
    const freqs = [1e-9, 3e-9, 1e-8, 3e-8, 1e-7];
    const s = backgroundSpectrum(buildPopulation(p), freqs);
    for (const slope of localSpectralSlope(s)) expect(Math.abs(slope + 2 / 3)).toBeLessThan(1e-12);
  });
  it('the ISCO cut steepens the spectrum of heavy binaries at high frequency', () => {
    const s = backgroundSpectrum(buildPopulation(fixturePopulations[2]), [1e-9, 1e-7, 3e-7]);
    const slope = localSpectralSlope(s);
    expect(slope[2]).toBeLessThan(-2 / 3 - 0.05);
  });
});

describe('energy form and strain form agree', () => {
  // A kernel that is not the circularGwKernel object sends the integral down the energy-form path
  // (4G/(pi c^2 f^2) Int n/(1+z) dE/dln f_r); the circular kernel takes the strain form.
  const energyKernel: EmissionKernel = (fr, mc, m, q, z) => circularGwKernel(fr, mc, m, q, z);
  for (const p of fixturePopulations) {
    it(`population ${p.label}`, () => {
      const freqs = [1e-9, F_YR_HZ, 1e-7, 3e-7];
      const strain = characteristicStrainSquared(buildPopulation(p), freqs);
      const energy = characteristicStrainSquared(buildPopulation(p), freqs, { kernel: energyKernel });
      for (let i = 0; i < freqs.length; i++) expect(rel(energy[i], strain[i])).toBeLessThan(1e-12);
    });
  }
});

describe('separable populations', () => {
  it('the q integral done once (separable factors) equals the full triple sum (Mc^(5/3) = M^(5/3) eta)', () => {
    for (const fp of fixturePopulations) {
      const p = buildPopulation(fp);
      const freqs = [1e-9, F_YR_HZ, 3e-7];
      const fast = characteristicStrainSquared(p, freqs);
      const full = characteristicStrainSquared({ ...p, separable: undefined }, freqs);
      for (let i = 0; i < freqs.length; i++) expect(rel(fast[i], full[i])).toBeLessThan(1e-12);
      // and the same through the energy form (generic kernel path), with and without the factors
      const kernel: EmissionKernel = (fr, mc, m, q, z) => circularGwKernel(fr, mc, m, q, z);
      const eSep = characteristicStrainSquared(p, freqs, { kernel });
      const eFull = characteristicStrainSquared({ ...p, separable: undefined }, freqs, { kernel });
      for (let i = 0; i < freqs.length; i++) {
        expect(rel(eSep[i], full[i])).toBeLessThan(1e-12);
        expect(rel(eFull[i], full[i])).toBeLessThan(1e-12);
      }
    }
  });
});

describe('normalisation', () => {
  it('A_yr^2 is linear in the merger-rate normalisation (Phinney 2001: h_c^2 linear in n)', () => {
    const p = fixturePopulations[0];
    const a1 = characteristicStrainSquared(buildPopulation(p), [F_YR_HZ])[0];
    const a3 = characteristicStrainSquared(buildPopulation(p, 3.7), [F_YR_HZ])[0];
    expect(rel(a3, 3.7 * a1)).toBeLessThan(1e-13);
  });
});

describe('bad input', () => {
  const p = buildPopulation(fixturePopulations[0]);
  it('names the bad frequency', () => {
    expect(() => characteristicStrainSquared(p, [1e-9, -1])).toThrow(/frequency 2 must be positive/);
  });
  it('names bad population limits', () => {
    expect(() => characteristicStrainSquared({ ...p, zMax: -1, density: p.density }, [1e-9])).toThrow(/redshift limits/);
    expect(() => characteristicStrainSquared({ ...p, qMin: 0, density: p.density }, [1e-9])).toThrow(/mass-ratio limits/);
  });
  it('names a negative or NaN density and where it happened', () => {
    // separable: undefined, or the integrator would use the factors copied from p
    const bad: BinaryPopulation = { ...p, separable: undefined, density: (z) => (z > 1 ? -1 : 1) };
    expect(() => characteristicStrainSquared(bad, [1e-9])).toThrow(/density is -1 at z = /);
    expect(() => characteristicStrainSquared({ ...p, separable: undefined, density: () => NaN }, [1e-9])).toThrow(/density is NaN/);
    const badFactor: BinaryPopulation = { ...p, separable: { zMass: () => -2, massRatio: () => 1 } };
    expect(() => characteristicStrainSquared(badFactor, [1e-9])).toThrow(/density is -2 at/);
  });
  it('rejects a bad resolution', () => {
    expect(() => characteristicStrainSquared(p, [1e-9], { resolution: { order: 0 } })).toThrow(/resolution order/);
  });
});
