// The integrator's fast paths for kernels "circular x shape(f_r / scale)" (src/physics/factoredKernel.ts)
// against the generic energy-form path of the same integrator (Phinney 2001, astro-ph/0108028:
// h_c^2 = 4G/(pi c^2 f^2) Int n/(1+z) dE/dln f_r, the kernel called at every node), which is reached by
// wrapping the kernel in a plain function. The two arrange the sum differently (strain form with cached
// mass sums vs kernel calls), so agreement to 1e-10 checks the fast path; the tolerance allows rounding
// only. The bend, stellar and eccentric factors themselves are checked in their own tests.
import { describe, expect, it } from 'vitest';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { circularGwKernel } from '../../src/physics/circularKernel';
import { M_SUN_KG, PC_M } from '../../src/physics/constants';
import { eccentricEmissionKernel, eccentricTables } from '../../src/physics/eccentricKernel';
import { circularTimesShapeOf } from '../../src/physics/factoredKernel';
import { bendEmissionKernel } from '../../src/physics/bendSpectrum';
import { keplerOrbitalFrequency } from '../../src/physics/petersEvolution';
import { stellarEccentricKernel, stellarEmissionKernel, stellarSuppression, stellarTransitionFrequency, stellarTransitionSemiMajorAxis } from '../../src/physics/stellarHardening';
import { finiteBinaryBins, loudestExpected } from '../../src/physics/finiteBinaries';
import type { BinaryPopulation, EmissionKernel } from '../../src/physics/populationTypes';
import { smoothPopulation, testCosmology } from './populations';

// An invented nucleus (not a fit to any galaxy).
const env = { densityKgM3: (300 * M_SUN_KG) / PC_M ** 3, dispersionMS: 180e3, hardeningRate: 15 };
// 1 to 1000 nHz: spans the stellar turnover, the eccentric start and the ISCO cuts of the heaviest binaries (partial mass panels).
const freqs = Float64Array.from({ length: 16 }, (_, k) => 1e-9 * Math.pow(1000, k / 15));

const generic = (k: EmissionKernel): EmissionKernel => (fr, mc, m, q, z) => k(fr, mc, m, q, z);
const withoutFactors = (p: BinaryPopulation): BinaryPopulation => ({ ...p, separable: undefined });

function maxRelativeDifference(a: Float64Array, b: Float64Array): number {
  let worst = 0;
  for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i] / b[i] - 1));
  return worst;
}

const cases: [string, () => EmissionKernel, number][] = [
  ['eccentric, e0 = 0.5 at orbital 0.5 nHz', () => eccentricEmissionKernel(circularGwKernel, { e0: 0.5, f0OrbitalHz: 0.5e-9 }), 1],
  ['eccentric, e0 = 0.5 at orbital 0.5 nHz, no ISCO cut', () => eccentricEmissionKernel(circularGwKernel, { e0: 0.5, f0OrbitalHz: 0.5e-9 }), Infinity],
  ['bend at 5 nHz, kappa 10/3', () => bendEmissionKernel(circularGwKernel, 5e-9, 10 / 3), 1],
  ['bend at 20 nHz, kappa 7/3', () => bendEmissionKernel(circularGwKernel, 20e-9, 7 / 3), 1],
  ['stellar hardening, circular', () => stellarEmissionKernel(circularGwKernel, env), 1],
  ['stellar hardening, eccentric from the transition with e0 = 0.4', () => stellarEccentricKernel(circularGwKernel, env, 0.4), 1],
];

describe('fast paths equal the generic energy-form path', () => {
  for (const [label, make, cutFactor] of cases) {
    it(`${label}: h_c^2 agrees to 1e-10 (separable and non-separable density)`, () => {
      const kernel = make();
      expect(circularTimesShapeOf(kernel)).toBeDefined();
      for (const pop of [smoothPopulation(), withoutFactors(smoothPopulation())]) {
        const fast = characteristicStrainSquared(pop, freqs, { kernel, cutFactor });
        const slow = characteristicStrainSquared(pop, freqs, { kernel: generic(kernel), cutFactor });
        const err = maxRelativeDifference(fast, slow);
        if (!(err < 1e-10)) throw new Error(`${label}: fast vs generic max relative difference ${err}, threshold 1e-10`);
        expect(fast.every((x) => x > 0)).toBe(true);
      }
    });
  }

  it('a kernel with another base keeps the generic path (no factored description)', () => {
    const base: EmissionKernel = (fr, mc, m, q, z) => 2 * circularGwKernel(fr, mc, m, q, z);
    expect(circularTimesShapeOf(eccentricEmissionKernel(base, { e0: 0.3, f0OrbitalHz: 1e-9 }))).toBeUndefined();
    expect(circularTimesShapeOf(stellarEmissionKernel(base, env))).toBeUndefined();
    expect(circularTimesShapeOf(bendEmissionKernel(base, 5e-9, 10 / 3))).toBeUndefined();
  });

  it('no bend (f_bend = 0) is the circular kernel itself: h_c^2 equals the circular one exactly', () => {
    const pop = smoothPopulation();
    expect(bendEmissionKernel(circularGwKernel, 0, 10 / 3)).toBe(circularGwKernel);
    expect(Array.from(characteristicStrainSquared(pop, freqs, { kernel: bendEmissionKernel(circularGwKernel, 0, 7 / 3) }))).toEqual(Array.from(characteristicStrainSquared(pop, freqs)));
  });
});

describe('factored kernels equal their definitions', () => {
  const [fr, m, q] = [7e-9, 3e9 * M_SUN_KG, 0.4];
  const mc = (m * Math.pow(q / (1 + q) ** 2, 0.6)) as number;

  it('stellar: circular x 1 / (1 + (f_t/f_r)^(10/3)) with f_t from equal hardening rates (Quinlan 1996, New Astron. 1, 35) to 1e-12', () => {
    const k = stellarEmissionKernel(circularGwKernel, env);
    const expected = circularGwKernel(fr, mc, m, q, 0) * stellarSuppression(fr, stellarTransitionFrequency(m, q, env));
    expect(Math.abs(k(fr, mc, m, q, 0) / expected - 1)).toBeLessThan(1e-12);
  });

  it('stellar eccentric: f0 from the semi-major axis where stellar and GW hardening (with F(e0)) are equal, Phi(f_r / f0) (Enoki & Nagashima 2007, PTP 117, 241) to 1e-12', () => {
    const k = stellarEccentricKernel(circularGwKernel, env, 0.6);
    const { tables } = eccentricTables({ e0: 0.6, f0OrbitalHz: 1 });
    // The independent route: a_t(e0) with F(e0) inside (Peters 1964, Phys. Rev. 136, B1224), then Kepler's law.
    for (const f of [fr, 30e-9, 200e-9]) {
      const f0 = keplerOrbitalFrequency(stellarTransitionSemiMajorAxis(m, q, env, 0.6), m);
      const expected = circularGwKernel(f, mc, m, q, 0) * tables[0].at(f / f0);
      const got = k(f, mc, m, q, 0);
      if (expected === 0) expect(got).toBe(0);
      else expect(Math.abs(got / expected - 1)).toBeLessThan(1e-12);
    }
  });
});

describe('finite-number bins', () => {
  it('a separable density gives the same bins as its product evaluated at every node (factors multiply to the density) to 1e-12', () => {
    const T = 12 * 365.25 * 86400;
    const f = Float64Array.from({ length: 8 }, (_, k) => (k + 1) / T);
    const a = finiteBinaryBins(smoothPopulation(), testCosmology, f, T);
    const b = finiteBinaryBins(withoutFactors(smoothPopulation()), testCosmology, f, T);
    for (const key of ['expectedPerBin', 'smoothHc', 'thinnedHc', 'loudestStrain'] as const) {
      for (let i = 0; i < f.length; i++) {
        if (b[key][i] === 0) expect(a[key][i]).toBe(0);
        else expect(Math.abs(a[key][i] / b[key][i] - 1)).toBeLessThan(1e-12);
      }
    }
  });

  it('the loudest-binary search equals a plain full sort (independent method) with ties and strains over 600 decades', () => {
    let seed = 4242;
    const rand = () => (seed = (seed * 16807) % 2147483647) / 2147483647; // Park & Miller 1988, CACM 31, 1192
    for (let trial = 0; trial < 10; trial++) {
      const size = 2000;
      const perLnF = new Float64Array(size);
      const strain = new Float64Array(size);
      for (let i = 0; i < size; i++) {
        perLnF[i] = rand() < 0.2 ? 0 : Math.pow(10, 4 * rand() - 4);
        // Some exact ties, the rest log-uniform from 1e-300 to 1e300.
        strain[i] = rand() < 0.1 ? 1e-15 : Math.pow(10, -300 + 600 * rand());
      }
      const dlnf = 0.05 + rand();
      const order = Array.from({ length: size }, (_, i) => i).filter((i) => perLnF[i] !== 0).sort((x, y) => strain[y] - strain[x]);
      let cum = 0;
      let expected = 0;
      for (const i of order) {
        expected = strain[i];
        if (cum + perLnF[i] * dlnf >= 1) break;
        cum += perLnF[i] * dlnf;
      }
      const total = order.reduce((s, i) => s + perLnF[i] * dlnf, 0);
      expect(total).toBeGreaterThan(1); // the search is defined where one binary or more is expected
      expect(loudestExpected(perLnF, strain, dlnf, new Float64Array(4096))).toBe(expected);
    }
  });
});

describe('loudest binary of the finite-number bins', () => {
  it('equals the per-node search (loudestExpected, itself checked against a full sort) on counts and strains rebuilt from the formulas of Sesana, Vecchio & Colacino 2008 (MNRAS 390, 192) at the same nodes, to 1e-12', async () => {
    const { compositeNodes } = await import('../../src/physics/gaussLegendre');
    const { chirpMassFromTotal } = await import('../../src/physics/binaryMasses');
    const { iscoGwFrequencyHz } = await import('../../src/physics/circularKernel');
    const { circularResidenceTime, singleBinaryStrain, FINITE_DEFAULT_RESOLUTION: R } = await import('../../src/physics/finiteBinaries');
    const { MPC_M } = await import('../../src/physics/constants');
    const { phenomenologicalPopulation } = await import('../../src/physics/phenomenologicalPopulation');
    const { powerLawMassRatio } = await import('../../src/physics/populationShapes');
    // Invented: no mass cutoff up to 1e11 Msun, so binaries past their ISCO weigh in the counts from the top.
    const heavy = phenomenologicalPopulation({ rateNorm: 2e-3, alpha: 0, cutoffMass: 1e14, beta: 1.5, z0: 1.2, zMax: 4, log10MMin: 6, log10MMax: 11, massRatio: powerLawMassRatio(-0.3, 0.1), cosmology: testCosmology });
    const T = 12 * 365.25 * 86400;
    // Bins in any order (the bins are walked by increasing f), one twice, and bins where the heaviest have merged (ISCO).
    const cases: [BinaryPopulation, Float64Array][] = [
      [smoothPopulation(), Float64Array.from([1 / T, 4 / T, 15 / T, 40 / T])],
      [smoothPopulation(), Float64Array.from([120 / T, 2 / T, 40 / T, 40 / T, 7 / T, 70 / T])],
      [heavy, Float64Array.from([30 / T, 1 / T, 12 / T, 12 / T, 3 / T, 20 / T])],
    ];
    for (const [pop, f] of cases) {
      const zr = compositeNodes(pop.zMin, pop.zMax, R.zPanels, R.order);
      const mr = compositeNodes(pop.log10MMin, pop.log10MMax, R.log10MPanels, R.order);
      const qr = compositeNodes(pop.qMin, pop.qMax, R.qPanels, R.order);
      const got = finiteBinaryBins(pop, testCosmology, f, T).loudestStrain;
      for (let k = 0; k < f.length; k++) {
        const perLnF: number[] = [];
        const strain: number[] = [];
        for (let iz = 0; iz < zr.nodes.length; iz++) {
          const z = zr.nodes[iz];
          const fr = (1 + z) * f[k];
          const perTime = testCosmology.comovingVolumeElementM3(z) / testCosmology.dtdzS(z) / MPC_M ** 3;
          for (let im = 0; im < mr.nodes.length; im++) {
            const mKg = M_SUN_KG * 10 ** mr.nodes[im];
            for (let iq = 0; iq < qr.nodes.length; iq++) {
              const mcKg = chirpMassFromTotal(mKg, qr.nodes[iq]);
              const emits = fr <= iscoGwFrequencyHz(mKg);
              const n = zr.weights[iz] * mr.weights[im] * qr.weights[iq] * pop.density(z, mr.nodes[im], qr.nodes[iq]) * perTime;
              perLnF.push(emits ? n * circularResidenceTime(fr, mcKg) : 0);
              strain.push(emits ? singleBinaryStrain(fr, mcKg, testCosmology.comovingDistanceM(z)) : 0);
            }
          }
        }
        const expected = loudestExpected(Float64Array.from(perLnF), Float64Array.from(strain), 1 / (f[k] * T), new Float64Array(4096));
        expect(expected).toBeGreaterThan(0);
        if (!(Math.abs(got[k] / expected - 1) < 1e-12)) throw new Error(`f = ${f[k]} Hz: loudest strain ${got[k]}, per-node search ${expected}, threshold 1e-12 relative`);
      }
    }
  });
});
