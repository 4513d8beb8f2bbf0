// Finite number of binaries per frequency bin (Sesana, Vecchio & Colacino 2008, MNRAS 390, 192).
import { describe, expect, it } from 'vitest';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { chirpMassFromTotal } from '../../src/physics/binaryMasses';
import { MPC_M, M_SUN_KG, YEAR_S } from '../../src/physics/constants';
import { circularResidenceTime, finiteBinaryBins, loudestExpected, singleBinaryStrain, FINITE_DEFAULT_RESOLUTION } from '../../src/physics/finiteBinaries';
import type { BinaryPopulation } from '../../src/physics/populationTypes';
import { boxPopulation, smoothPopulation, testCosmology } from './populations';

const T = 15 * YEAR_S;
// Below every ISCO cut of the smooth population (M <= 1e10 Msun: f_ISCO >= 440 nHz; z <= 4).
const freqs = Float64Array.from({ length: 10 }, (_, k) => (2 * k + 1) / T);

describe('counts and strains per bin', () => {
  it("summing single-binary h^2 over the expected number per ln f reproduces Phinney's h_c^2 (identity; Phinney 2001 strain form in the project's integrator, same quadrature nodes) to 1e-6", () => {
    const pop = smoothPopulation();
    const r = finiteBinaryBins(pop, testCosmology, freqs, T);
    const res = FINITE_DEFAULT_RESOLUTION;
    const phinney = characteristicStrainSquared(pop, freqs, { resolution: { zPanels: res.zPanels, log10MPanels: res.log10MPanels, qPanels: res.qPanels, order: res.order } });
    for (let k = 0; k < freqs.length; k++) {
      const err = Math.abs((r.smoothHc[k] * r.smoothHc[k]) / phinney[k] - 1);
      expect(err, `f = ${freqs[k]} Hz: ${r.smoothHc[k] ** 2} vs ${phinney[k]}`).toBeLessThan(1e-6);
    }
  });

  it('one kind of binary in a thin shell: the count equals n dz dlog10M dq (dV_c/dz) |dz/dt| (dt/dln f) / (f T) at the box centre (Hogg 1999 volumes), to 1e-3', () => {
    const n = 1e7; // Mpc^-3 per unit z, dex, q (a dense invented box, so that the bin holds more than one binary)
    const z = 0.3;
    const x = 9.5;
    const pop = boxPopulation(n, z, x, 0.6);
    const f = 8e-9;
    const r = finiteBinaryBins(pop, testCosmology, [f], T);
    const zc = z + 0.5e-4;
    const qc = 0.6 + 0.5e-3;
    const mc = chirpMassFromTotal(Math.pow(10, x + 0.5e-4) * M_SUN_KG, qc);
    const boxDensity = (n * 1e-4 * 1e-4 * 1e-3) / MPC_M ** 3; // per m^3
    const perLnF = (boxDensity * testCosmology.comovingVolumeElementM3(zc)) / testCosmology.dtdzS(zc) * circularResidenceTime((1 + zc) * f, mc);
    const expected = perLnF / (f * T);
    expect(Math.abs(r.expectedPerBin[0] / expected - 1)).toBeLessThan(1e-3);
    // The loudest binary of a one-kind population is that binary: h = sqrt(32/5)(G Mc)^(5/3)(pi f_r)^(2/3)/(c^4 D_C).
    if (r.expectedPerBin[0] >= 1) {
      const h = singleBinaryStrain((1 + zc) * f, mc, testCosmology.comovingDistanceM(zc));
      expect(Math.abs(r.loudestStrain[0] / h - 1)).toBeLessThan(1e-3);
    }
    expect(r.expectedPerBin[0]).toBeGreaterThan(1); // so the strain check above ran
  });

  it('counts are linear in the merger-rate normalisation; thinned h_c <= smooth h_c and approaches it as binaries become plentiful', () => {
    const a = finiteBinaryBins(smoothPopulation(1), testCosmology, freqs, T);
    const b = finiteBinaryBins(smoothPopulation(100), testCosmology, freqs, T);
    for (let k = 0; k < freqs.length; k++) {
      expect(Math.abs(b.expectedPerBin[k] / (100 * a.expectedPerBin[k]) - 1)).toBeLessThan(1e-12);
      expect(a.thinnedHc[k]).toBeLessThanOrEqual(a.smoothHc[k]);
      expect(b.thinnedHc[k] / b.smoothHc[k]).toBeGreaterThanOrEqual(a.thinnedHc[k] / a.smoothHc[k]);
      expect(b.cutLog10M[k]).toBeGreaterThanOrEqual(a.cutLog10M[k]);
    }
  });

  it('the cut mass is where one binary is expected above it: recounting with the population restricted to masses above the cut gives 1 within 3% (each mass node count spread over its cell)', () => {
    const pop = smoothPopulation();
    const r = finiteBinaryBins(pop, testCosmology, freqs, T);
    for (const k of [0, 4, 9]) {
      const above: BinaryPopulation = { ...pop, density: pop.density, log10MMin: r.cutLog10M[k] };
      const recount = finiteBinaryBins(above, testCosmology, [freqs[k]], T, { log10MPanels: 8 });
      expect(Math.abs(recount.expectedPerBin[0] - 1), `bin ${k}: cut 10^${r.cutLog10M[k]} Msun`).toBeLessThan(0.03);
    }
  });

  it('the loudest-binary search gives what a plain full sort gives (independent method), on seeded random counts and strains', () => {
    let seed = 2008;
    const rand = () => (seed = (seed * 16807) % 2147483647) / 2147483647; // Park & Miller 1988, CACM 31, 1192
    for (let trial = 0; trial < 20; trial++) {
      const size = 3000;
      const perLnF = new Float64Array(size);
      const strain = new Float64Array(size);
      for (let i = 0; i < size; i++) {
        perLnF[i] = rand() < 0.1 ? 0 : Math.pow(10, 6 * rand() - 3);
        strain[i] = Math.pow(10, -17 + 3 * rand());
      }
      const dlnf = 0.01 + rand();
      const order = Array.from({ length: size }, (_, i) => i).sort((a, b) => strain[b] - strain[a]);
      let cum = 0;
      let expected = 0;
      for (const i of order) {
        if (perLnF[i] === 0) continue;
        if (cum + perLnF[i] * dlnf >= 1) {
          expected = strain[i];
          break;
        }
        cum += perLnF[i] * dlnf;
      }
      expect(loudestExpected(perLnF, strain, dlnf, new Float64Array(4096))).toBe(expected);
    }
  });

  it('the thinned spectrum falls increasingly below the smooth one towards high frequency, where heavy binaries are rare (Sesana, Vecchio & Colacino 2008)', () => {
    const r = finiteBinaryBins(smoothPopulation(), testCosmology, freqs, T);
    for (let k = 1; k < freqs.length; k++) expect(r.thinnedHc[k] / r.smoothHc[k]).toBeLessThan(r.thinnedHc[k - 1] / r.smoothHc[k - 1]);
    expect(r.thinnedHc[freqs.length - 1] / r.smoothHc[freqs.length - 1]).toBeLessThan(0.9);
  });

  it('a bin expecting fewer than one binary has thinned h_c = 0 and loudest strain 0', () => {
    const sparse = finiteBinaryBins(boxPopulation(1e-12, 0.5, 9), testCosmology, [5e-9], T);
    expect(sparse.expectedPerBin[0]).toBeLessThan(1);
    expect(sparse.thinnedHc[0]).toBe(0);
    expect(sparse.loudestStrain[0]).toBe(0);
    expect(sparse.smoothHc[0]).toBeGreaterThan(0);
  });

  it('rejects a non-positive span, frequency or resolution, and a negative density', () => {
    const pop = smoothPopulation();
    expect(() => finiteBinaryBins(pop, testCosmology, freqs, 0)).toThrow(/observing span must be positive/);
    expect(() => finiteBinaryBins(pop, testCosmology, [-1e-9], T)).toThrow(/frequency 1 must be positive/);
    expect(() => finiteBinaryBins(pop, testCosmology, freqs, T, { order: 0 })).toThrow(/resolution order/);
    expect(() => finiteBinaryBins({ ...boxPopulation(1, 0.1, 9), density: () => -1 }, testCosmology, freqs, T)).toThrow(/density is -1/);
  });
});
