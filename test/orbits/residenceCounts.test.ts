// Counts per bin and realisations with an environment's residence factor R = (dt/dln f)_total/(dt/dln f)_GW
// (Phinney 2001, astro-ph/0108028; Sesana 2013, arXiv:1307.2600): the count per ln f is the GW-driven one
// times R, the strain of each binary unchanged. Checks: a single power-law hardening whose residence time
// is a closed form; the long-residence share with the total time; the expectation against the
// spectrum integrator with the same model; the sheet's counts and realisations against phenomSpectrum
// and environmentSpectrum; the realise job taking the model from the cell; and R = 1 giving the
// GW-driven numbers.
import { describe, expect, it } from 'vitest';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { chirpMassFromTotal } from '../../src/physics/binaryMasses';
import { GYR_S, MPC_M, M_SUN_KG, PC_M, YEAR_S } from '../../src/physics/constants';
import { circularResidenceTime, finiteBinaryBins, FINITE_DEFAULT_RESOLUTION, singleBinaryStrain } from '../../src/physics/finiteBinaries';
import { iscoSeparationM, type PhenomHardening } from '../../src/physics/phenomHardening';
import { phenomEmissionKernel, phenomResidenceFactor, separationAtGwFrequency } from '../../src/physics/phenomHardeningSpectrum';
import { realisationCells } from '../../src/physics/realisationCells';
import type { RealisationsValue } from '../../src/builtins/realisations';
import type { SpectrumValue } from '../../src/builtins/spectrumValue';
import { runJob } from '../../src/statistics/jobs';
import { boxPopulation, smoothPopulation, testCosmology } from './populations';
import { errorOf, sheetOf, valueOf } from '../physics/sheetHelpers';

const T = 15 * YEAR_S;

// One power law: nu_in = nu_out = nu, so |da/dt|_env = A (a/a_c)^(1 - nu). Without GW emission the
// lifetime from a_0 to a_isco is a_c^(1-nu) (a_0^nu - a_isco^nu) / (nu A) = tau_f, so
// (dt/dln f_r)_env = (2/3) a / |da/dt|_env = (2/3) nu tau_f a^nu / (a_0^nu - a_isco^nu) (Kepler: f proportional to a^(-3/2)).
const NU = 2.5;
const powerLaw: PhenomHardening = { lifetimeS: 0.1 * GYR_S, innerIndex: NU, outerIndex: NU, breakSeparationM: 1 * PC_M, initialSeparationM: 100 * PC_M };

describe('counts per bin with a residence factor', () => {
  // An invented dense box of one kind of binary (10^9.5 Msun, q = 0.6, z = 0.3) seen at 8 nHz.
  const n = 1e12;
  const [z, x, q, f] = [0.3, 9.5, 0.6, 8e-9];
  const pop = boxPopulation(n, z, x, q);
  const [zc, qc] = [z + 0.5e-4, q + 0.5e-3];
  const mKg = Math.pow(10, x + 0.5e-4) * M_SUN_KG;
  const fr = (1 + zc) * f;
  const a = separationAtGwFrequency(fr, mKg);
  const a0 = powerLaw.initialSeparationM;
  const tEnv = ((2 / 3) * NU * powerLaw.lifetimeS * Math.pow(a, NU)) / (Math.pow(a0, NU) - Math.pow(iscoSeparationM(mKg), NU));
  const tGw = circularResidenceTime(fr, chirpMassFromTotal(mKg, qc));
  // Both hardening rates add: the total time per ln f is the harmonic sum of the two.
  const tTotal = 1 / (1 / tEnv + 1 / tGw);
  const perTime = ((n * 1e-4 * 1e-4 * 1e-3) / MPC_M ** 3) * (testCosmology.comovingVolumeElementM3(zc) / testCosmology.dtdzS(zc));
  const expected = (perTime * tTotal) / (f * T);
  const residence = phenomResidenceFactor(powerLaw, M_SUN_KG);

  it('single power-law hardening: the count is n dz dlog10M dq (dV_c/dz)|dz/dt| (dt/dln f)_total / (f T), (dt/dln f)_env in closed form (Hogg 1999 volumes), to 1e-3', () => {
    expect(tEnv / tGw, 'the environment dominates here').toBeLessThan(1e-3);
    const r = finiteBinaryBins(pop, testCosmology, [f], T, {}, residence);
    expect(Math.abs(r.expectedPerBin[0] / expected - 1)).toBeLessThan(1e-3);
    const cells = realisationCells(pop, testCosmology, [f], T, { residence });
    expect(Math.abs(cells.bins[0].expectedCount / expected - 1)).toBeLessThan(1e-3);
  });

  it('the strain of each binary is unchanged: the loudest expected binary is the box binary, h = sqrt(32/5)(G Mc)^(5/3)(pi f_r)^(2/3)/(c^4 D_C) (Sesana, Vecchio & Colacino 2008), to 1e-3', () => {
    const r = finiteBinaryBins(pop, testCosmology, [f], T, {}, residence);
    expect(r.expectedPerBin[0]).toBeGreaterThan(1);
    const h = singleBinaryStrain(fr, chirpMassFromTotal(mKg, qc), testCosmology.comovingDistanceM(zc));
    expect(Math.abs(r.loudestStrain[0] / h - 1)).toBeLessThan(1e-3);
  });

  it('long residence uses the total time: light binaries at the lowest bin outlive the age by GW alone, not with the environment (age Hogg 1999)', () => {
    const light = boxPopulation(1e6, 0.3, 6, 0.6);
    const f1 = 1 / T;
    const m1 = 1e6 * M_SUN_KG;
    const fr1 = 1.3 * f1;
    expect(circularResidenceTime(fr1, chirpMassFromTotal(m1, 0.6)), 'GW time above the age').toBeGreaterThan(testCosmology.ageS(0.3));
    const gw = finiteBinaryBins(light, testCosmology, [f1], T);
    const env = finiteBinaryBins(light, testCosmology, [f1], T, {}, residence);
    expect(gw.longResidencePerBin[0] / gw.expectedPerBin[0]).toBeCloseTo(1, 12);
    expect(env.expectedPerBin[0]).toBeGreaterThan(0);
    expect(env.longResidencePerBin[0]).toBe(0);
    const cells = realisationCells(light, testCosmology, [f1], T, { residence });
    expect(cells.bins[0].expectedCount).toBeGreaterThan(0);
    expect(cells.bins[0].longResidenceCount).toBe(0);
  });

  it("sum of N h^2 with the factor equals Phinney's h_c^2 with the kernel circular x R on the same nodes (identity, Phinney 2001), to 1e-6", () => {
    const smooth = smoothPopulation();
    const h: PhenomHardening = { lifetimeS: 3 * GYR_S, innerIndex: -1, outerIndex: 2.5, breakSeparationM: 100 * PC_M, initialSeparationM: 1e4 * PC_M };
    const freqs = Float64Array.from({ length: 6 }, (_, k) => (2 * k + 1) / T);
    const r = finiteBinaryBins(smooth, testCosmology, freqs, T, {}, phenomResidenceFactor(h, M_SUN_KG));
    const res = FINITE_DEFAULT_RESOLUTION;
    const phinney = characteristicStrainSquared(smooth, freqs, { kernel: phenomEmissionKernel(h, M_SUN_KG), resolution: { ...res } });
    const gw = finiteBinaryBins(smooth, testCosmology, freqs, T);
    freqs.forEach((_, k) => {
      expect(Math.abs(r.smoothHc[k] ** 2 / phinney[k] - 1), `bin ${k + 1}`).toBeLessThan(1e-6);
      expect(r.expectedPerBin[k], 'the environment removes binaries').toBeLessThan(gw.expectedPerBin[k]);
    });
  });

  it('a factor of 1 everywhere gives the GW-driven numbers (the rebuilt sums per bin against the sums built once), to 1e-12', () => {
    const smooth = smoothPopulation(100);
    const freqs = Float64Array.from({ length: 8 }, (_, k) => (k + 1) / T);
    const one = finiteBinaryBins(smooth, testCosmology, freqs, T, {}, () => 1);
    const gw = finiteBinaryBins(smooth, testCosmology, freqs, T);
    for (const key of ['expectedPerBin', 'smoothHc', 'thinnedHc', 'cutLog10M', 'loudestStrain', 'longResidencePerBin'] as const) {
      gw[key].forEach((v, k) => expect(Math.abs(one[key][k] - v), `${key} bin ${k + 1}`).toBeLessThanOrEqual(1e-12 * Math.abs(v)));
    }
  });

  it('a factor that is not finite and >= 0 is refused', () => {
    expect(() => finiteBinaryBins(pop, testCosmology, [f], T, {}, () => NaN)).toThrow(/residence factor is NaN/);
    expect(() => realisationCells(pop, testCosmology, [f], T, { residence: () => -1 })).toThrow(/residence factor is -1/);
  });
});

// An invented scenario (the one of test/physics/phenomHardeningBuiltins.test.ts).
const cells = {
  cosmo: 'flatCosmology(70 km/s/Mpc, 0.3)',
  pop: 'mergerPopulation(cosmo, 1e-3 Mpc^-3 Gyr^-1, 0.2, 1e9 Msun, redshiftPowerExp(2, 1.5, 5), massRatioPowerLaw(-0.5, 0.05))',
  freqs: '[2, 5, 10, 30] nHz',
  model: 'phenomHardening(3 Gyr)',
  env: 'hostEnvironment(16)',
  delayed: 'delayedPopulation(pop, model)',
};

function hcOf(v: unknown): Float64Array {
  return (v as SpectrumValue).spectrum.hc;
}

describe('the sheet: counts and realisations with the environment agree with its spectrum', () => {
  const s = sheetOf({
    ...cells,
    phenomHc: 'phenomSpectrum(pop, freqs, model)',
    envHc: 'environmentSpectrum(pop, freqs, env)',
    rzPhenom: 'realiseBackground(delayed, freqs, 15 yr, 20, 1, 30, false, model)',
    rzEnv: 'realiseBackground(pop, freqs, 15 yr, 20, 1, 30, false, environmentEmission(env))',
    thinPhenom: 'thinnedSpectrum(delayed, freqs, 15 yr, phenomEmission(model))',
    thinEnv: 'thinnedSpectrum(pop, freqs, 15 yr, env, cosmo)',
    countGw: 'binariesPerBin(delayed, freqs, 15 yr)',
    countPhenom: 'binariesPerBin(delayed, freqs, 15 yr, model)',
  });

  it("the realisations' smooth h_c and thinnedSpectrum's smoothHc equal phenomSpectrum and environmentSpectrum (same population, same model; the integrators of Phinney 2001) to 1e-4", () => {
    const pairs: [string, string][] = [
      ['rzPhenom', 'phenomHc'],
      ['rzEnv', 'envHc'],
    ];
    for (const [rz, spec] of pairs) {
      const smooth = (valueOf(s, rz) as RealisationsValue).smoothHc();
      hcOf(valueOf(s, spec)).forEach((h, k) => expect(Math.abs(smooth[k] / h - 1), `${rz} bin ${k + 1}`).toBeLessThan(1e-4));
    }
    for (const [thin, spec] of [
      ['thinPhenom', 'phenomHc'],
      ['thinEnv', 'envHc'],
    ]) {
      const smooth = (valueOf(s, thin) as SpectrumValue).series.smoothHc.values;
      hcOf(valueOf(s, spec)).forEach((h, k) => expect(Math.abs(smooth[k] / h - 1), `${thin} bin ${k + 1}`).toBeLessThan(1e-4));
    }
  });

  it('the environment lowers the counts most at the lowest frequency (R falls towards low f)', () => {
    const gw = (valueOf(s, 'countGw') as { toArray(): number[] }).toArray();
    const env = (valueOf(s, 'countPhenom') as { toArray(): number[] }).toArray();
    const ratio = env.map((x, k) => x / gw[k]);
    ratio.forEach((r) => expect(r).toBeLessThan(1));
    expect(ratio[0]).toBeLessThan(ratio[3]);
  });

  it('the realise job (strainsheet realise, the app) takes the model from the cell: its smooth h_c is the cell\'s', async () => {
    const r = await runJob(s, { kind: 'realise', cell: 'rzPhenom', count: 10, seed: 2 }, undefined, { workers: 1 });
    if (r.kind !== 'realise') throw new Error('unexpected job kind');
    const cell = valueOf(s, 'rzPhenom') as RealisationsValue;
    expect(Array.from(r.result.smoothHc)).toEqual(Array.from(cell.smoothHc()));
    expect(cell.describe()).toMatch(/residence times of phenomenological hardening/);
    expect(cell.toJSON().environment).toMatch(/^phenomenological hardening: lifetime 3 Gyr/);
  });

  it('refusals name the built-in and the argument', () => {
    const bad = sheetOf({
      ...cells,
      ecc: 'binariesPerBin(pop, freqs, 15 yr, eccentricEmission(0.5, 0.1 nHz))',
      twice: 'binariesPerBin(pop, freqs, 15 yr, model, env)',
      plainNumber: 'binariesPerBin(pop, freqs, 15 yr, cosmo, 3)',
      eccEnv: 'realiseBackground(pop, freqs, 15 yr, 5, 1, 30, false, environmentEmission(env, 0.5))',
    });
    expect(errorOf(bad, 'ecc')).toMatch(/environment of binariesPerBin: eccentric GW-driven.*not a residence-time factor/);
    expect(errorOf(bad, 'twice')).toMatch(/binariesPerBin.*an environment is given twice/);
    expect(errorOf(bad, 'plainNumber')).toMatch(/environment of binariesPerBin must be a hardening model or a circular environment emission, got/);
    expect(errorOf(bad, 'eccEnv')).toMatch(/environment of realiseBackground: .*not a residence-time factor/);
  });
});
