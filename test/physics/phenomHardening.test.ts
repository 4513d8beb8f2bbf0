// The phenomenological hardening model with a total lifetime (form of Agazie et al. 2023, ApJL 952, L37)
// against scipy (test/reference/phenom_hardening.json, generate_phenom_hardening.py): the normalisation
// A that gives the lifetime (quad + brentq), the lifetime at other A (quad), the residence factor, and
// h_c^2 of a population (dblquad, Phinney 2001 integral with the same factor). Limits: in the pure-GW
// limit the spectrum is today's circular spectrum, no delay leaves the population as it is, and a
// lifetime longer than the age of the universe removes the population.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/phenom_hardening.json';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { GYR_S, KM_S_MPC_SI, M_SUN_KG, PC_M } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import { gwHardeningConstant, gwOnlyLifetime, LifetimeIntegral, phenomNormalisation, type PhenomHardening } from '../../src/physics/phenomHardening';
import { normalisationTable, phenomDelayedPopulation, phenomEmissionKernel, phenomStalledFraction, residenceRatio } from '../../src/physics/phenomHardeningSpectrum';
import { phenomenologicalPopulation } from '../../src/physics/phenomenologicalPopulation';
import { powerLawMassRatio } from '../../src/physics/populationShapes';
import { separablePopulation } from '../../src/physics/separablePopulation';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

function modelOf(label: string): PhenomHardening {
  const m = fixture.models.find((x) => x.label === label);
  if (!m) throw new Error(`no model ${label} in the fixture`);
  return { lifetimeS: m.tau_Gyr * GYR_S, innerIndex: m.nu_in, outerIndex: m.nu_out, breakSeparationM: m.a_c_pc * PC_M, initialSeparationM: m.a_0_pc * PC_M };
}

describe('normalisation, lifetime and residence factor against scipy quad/brentq (phenom_hardening.json)', () => {
  for (const c of fixture.lifetime_cases) {
    const h = modelOf(c.model);
    const m = c.M_sun * M_SUN_KG;
    it(`${c.model}, M = ${c.M_sun} Msun, q = ${c.q}: A = ${c.A_m_s.toPrecision(6)} m/s to 1e-9 (root solve and table)`, () => {
      const A = phenomNormalisation(new LifetimeIntegral(m, h), c.q);
      expect(rel(A, c.A_m_s), `expected ${c.A_m_s}, got ${A}`).toBeLessThan(1e-9);
      const fromTable = normalisationTable(h, M_SUN_KG)(m, c.q);
      expect(rel(fromTable, c.A_m_s), `table: expected ${c.A_m_s}, got ${fromTable}`).toBeLessThan(1e-9);
    });
    it(`${c.model}, M = ${c.M_sun} Msun, q = ${c.q}: T(A) at A/10 and 10 A to 1e-10`, () => {
      const integral = new LifetimeIntegral(m, h);
      for (const t of c.times) {
        const T = integral.time(t.A_m_s, gwHardeningConstant(m, c.q));
        expect(rel(T, t.T_s), `A = ${t.A_m_s}: expected ${t.T_s} s, got ${T} s`).toBeLessThan(1e-10);
      }
    });
    it(`${c.model}, M = ${c.M_sun} Msun, q = ${c.q}: residence factor at 1 to 100 nHz to 1e-8 (absolute)`, () => {
      for (const r of c.residence) {
        const R = residenceRatio(r.f_r_Hz, m, c.q, c.A_m_s, h);
        expect(Math.abs(R - r.R), `f_r = ${r.f_r_Hz} Hz: expected ${r.R}, got ${R}`).toBeLessThan(1e-8);
      }
    });
  }
});

describe('closed form: one power law, GW emission negligible', () => {
  it('nu_in = nu_out = 2: T = (a_0^2 - a_isco^2) / (2 a_c A), so A = (a_0^2 - a_isco^2) / (2 a_c tau) to 1e-9 (M = 1e9 Msun, q = 1, tau = 1 Gyr)', () => {
    // The hardening time grows as a^2, so the binary spends its lifetime near a_0 = 1e4 pc; GW emission
    // takes over near 1e-3 pc, where the time left is a fraction (a_t/a_0)^2 ~ 1e-14 of it.
    const h: PhenomHardening = { lifetimeS: GYR_S, innerIndex: 2, outerIndex: 2, breakSeparationM: 100 * PC_M, initialSeparationM: 1e4 * PC_M };
    const m = 1e9 * M_SUN_KG;
    const ai = (6 * 6.6743e-11 * m) / 299792458 ** 2; // ISCO 6GM/c^2, G of CODATA 2018, c exact
    const expected = (h.initialSeparationM ** 2 - ai * ai) / (2 * h.breakSeparationM * h.lifetimeS);
    const A = phenomNormalisation(new LifetimeIntegral(m, h), 1);
    expect(rel(A, expected), `expected ${expected}, got ${A}`).toBeLessThan(1e-9);
  });
});

describe('spectrum bend against scipy dblquad of the same integrand (phenom_hardening.json)', () => {
  const p = fixture.spectrum_population;
  const pop = separablePopulation(
    { zMin: p.zMin, zMax: p.zMax, log10MMin: p.log10MMin, log10MMax: p.log10MMax, qMin: p.q0, qMax: p.q0 + p.dq },
    { redshift: (z) => p.n0_per_Mpc3 * (1 + z) ** 2 * Math.exp(-z), lnMass: (x) => -0.5 * Math.LN10 * (x - 8), massRatio: () => 1 / p.dq },
  );
  // 8 x 8 panels of 10 points in z and log10 M; one panel in q, whose range is 1e-8 wide.
  const resolution = { zPanels: 8, log10MPanels: 8, qPanels: 1, order: 10 };
  for (const c of fixture.spectrum_cases) {
    it(`${c.model}, f = ${c.f_Hz} Hz: h_c^2 = ${c.hc2.toPrecision(6)} to 1e-6, and the circular spectrum to 1e-6`, () => {
      const [hc2] = characteristicStrainSquared(pop, [c.f_Hz], { kernel: phenomEmissionKernel(modelOf(c.model), M_SUN_KG), resolution });
      expect(rel(hc2, c.hc2), `expected ${c.hc2}, got ${hc2}`).toBeLessThan(1e-6);
      const [gw] = characteristicStrainSquared(pop, [c.f_Hz], { resolution });
      expect(rel(gw, c.hc2_gw_only), `GW only: expected ${c.hc2_gw_only}, got ${gw}`).toBeLessThan(1e-6);
    });
  }
});

describe('limits', () => {
  const cosmo = new FlatLambdaCdm({ hubbleSI: 70 * KM_S_MPC_SI, omegaM: 0.3 });
  const base = phenomenologicalPopulation({
    rateNorm: 1e-3, alpha: 0.2, cutoffMass: 3e9, beta: 2, z0: 1.5, zMax: 5, log10MMin: 6, log10MMax: 11,
    massRatio: powerLawMassRatio(0, 0.05), cosmology: cosmo,
  });
  const freqs = [2e-9, 1e-8, 3.17e-8, 1e-7];
  const defaults = modelOf('defaults');

  it('pure-GW limit (lifetime at least the GW time from a_0): every factor is exactly 1 and the spectrum is the circular one to rounding (1e-12)', () => {
    // From a_0 = 1 pc the GW time of the lightest, most unequal binary is below 1e40 s (Peters 1964 closed form),
    // and every binary in the band (a < 0.2 pc at 1 nHz for M <= 1e11 Msun) is inside a_0.
    const h: PhenomHardening = { ...defaults, lifetimeS: 1e40, initialSeparationM: PC_M };
    expect(gwOnlyLifetime(1e6 * M_SUN_KG, 0.05, h)).toBeLessThan(h.lifetimeS);
    const a = characteristicStrainSquared(base, freqs);
    const b = characteristicStrainSquared(base, freqs, { kernel: phenomEmissionKernel(h, M_SUN_KG) });
    a.forEach((x, i) => expect(rel(b[i], x), `f = ${freqs[i]}: circular ${x}, model ${b[i]}`).toBeLessThan(1e-12));
  });

  it('no delay (lifetime 0): the delayed population is the population itself, so its spectrum is today\'s exactly', () => {
    const h: PhenomHardening = { ...defaults, lifetimeS: 0 };
    const pop = phenomDelayedPopulation(base, cosmo, h, M_SUN_KG);
    expect(pop).toBe(base);
    expect(Array.from(characteristicStrainSquared(pop, freqs))).toEqual(Array.from(characteristicStrainSquared(base, freqs)));
    expect(phenomStalledFraction(base, cosmo, h, M_SUN_KG)).toBe(0);
  });

  it('a lifetime longer than the age of the universe removes the population: spectrum 0, stalled share 1', () => {
    const h: PhenomHardening = { ...defaults, lifetimeS: 1.01 * cosmo.ageS(0) };
    const pop = phenomDelayedPopulation(base, cosmo, h, M_SUN_KG);
    const hc2 = characteristicStrainSquared(pop, freqs, { kernel: phenomEmissionKernel(h, M_SUN_KG) });
    expect(Array.from(hc2)).toEqual([0, 0, 0, 0]);
    expect(phenomStalledFraction(base, cosmo, h, M_SUN_KG)).toBe(1);
  });

  it('the bend lowers h_c^2 below the circular spectrum and vanishes at high frequency (a factor in [0, 1], 1 where GW emission dominates)', () => {
    const a = characteristicStrainSquared(base, freqs);
    const b = characteristicStrainSquared(base, freqs, { kernel: phenomEmissionKernel(defaults, M_SUN_KG) });
    b.forEach((x, i) => expect(x).toBeLessThan(a[i]));
    expect(b[0] / a[0]).toBeLessThan(b[3] / a[3]);
    expect(rel(b[3], a[3])).toBeLessThan(1e-3);
  });

  it('a lifetime of 0 in the emission: coalescence at formation leaves no residence time (factor 0)', () => {
    const h: PhenomHardening = { ...defaults, lifetimeS: 0 };
    expect(residenceRatio(1e-8, 1e9 * M_SUN_KG, 1, normalisationTable(h, M_SUN_KG)(1e9 * M_SUN_KG, 1), h)).toBe(0);
  });
});
