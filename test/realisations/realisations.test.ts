// Realisations of a finite population per frequency bin (src/physics/realisationCells.ts,
// binaryRealisations.ts): moments against Phinney's smooth value and the compound-Poisson second
// moment, empty bins against Poisson's exp(-N), the loudest binary against its closed form, the
// smooth-plus-Gaussian approximation against exact draws, and reproducibility.
import { describe, expect, it } from 'vitest';
import { characteristicStrainSquared, HIGH_RESOLUTION } from '../../src/physics/backgroundIntegral';
import { chirpMassFromTotal } from '../../src/physics/binaryMasses';
import { MPC_M, M_SUN_KG, YEAR_S } from '../../src/physics/constants';
import { circularResidenceTime, finiteBinaryBins, singleBinaryStrain } from '../../src/physics/finiteBinaries';
import { realisationCells } from '../../src/physics/realisationCells';
import { drawRealisations } from '../../src/physics/binaryRealisations';
import type { BinaryPopulation } from '../../src/physics/populationTypes';
import { joinDraws, summariseRealisations } from '../../src/statistics/realisationSummary';
import { boxPopulation, smoothPopulation, testCosmology } from '../orbits/populations';

const T = 15 * YEAR_S;

/** The invented smooth population without its nearest and lightest binaries, thinned: bins of 10^1 to 10^4 binaries. */
function heavyPopulation(scale = 1e-3): BinaryPopulation {
  return { ...smoothPopulation(scale), zMin: 0.3, log10MMin: 8.5 };
}

/** Sum of h^2 of realisation r in bin k (h_c^2 / (f T)). */
function sumH2(hc: Float64Array, r: number, k: number, bins: number, f: number): number {
  return (hc[r * bins + k] * hc[r * bins + k]) / (f * T);
}

/** Two-sided Kolmogorov-Smirnov critical value at the 0.1% level, c(alpha) sqrt(n_eff) with c = 1.949 (the limiting Kolmogorov distribution: scipy.stats.kstwobign.isf(0.001) = 1.9495, Debian python3-scipy). */
const KS_999 = 1.949;

describe('moments of the realisations', () => {
  const freqs = [1 / T, 3 / T];
  const pop = heavyPopulation();
  const R = 3000;
  const exact = realisationCells(pop, testCosmology, freqs, T, { threshold: Infinity });
  const exactDraws = drawRealisations(exact, 11, 0, R);

  it("exact per-cell draws: the mean h_c^2 equals Phinney's smooth h_c^2 (Phinney 2001, the project's high-resolution integrator) within 4 Monte Carlo standard errors plus 0.5% for the uniform placement inside cells", () => {
    const cells = exact;
    const d = exactDraws;
    const phinney = characteristicStrainSquared(pop, freqs, { resolution: HIGH_RESOLUTION });
    freqs.forEach((f, k) => {
      let mean = 0;
      for (let r = 0; r < R; r++) mean += d.hc[r * 2 + k] ** 2;
      mean /= R;
      // Standard error from the analytic variance of h_c^2 = f T sum h^2: (f T)^2 sum N h^4 (compound Poisson).
      const se = (f * T * Math.sqrt(cells.bins[k].varianceH2)) / Math.sqrt(R);
      const err = Math.abs(mean - phinney[k]);
      expect(err, `bin ${k + 1}: mean ${mean}, Phinney ${phinney[k]}, MC error ${se}`).toBeLessThan(4 * se + 5e-3 * phinney[k]);
    });
  });

  it("the smooth part's expectation, sum over cells of N h^2 times f T, equals Phinney's h_c^2 (high-resolution integrator) to 1e-4", () => {
    const cells = realisationCells(pop, testCosmology, freqs, T, { threshold: 0 });
    const phinney = characteristicStrainSquared(pop, freqs, { resolution: HIGH_RESOLUTION });
    cells.bins.forEach((b, k) => {
      expect(b.sparseNode.length, 'threshold 0 leaves no cell to draw').toBe(0);
      expect(Math.abs((b.denseH2 * b.hc2PerH2) / phinney[k] - 1), `bin ${k + 1}`).toBeLessThan(1e-4);
    });
  });

  it('the variance of sum h^2 per bin equals the compound-Poisson second moment sum N h^4 within 4 standard errors of a sample variance, sqrt((kappa4 + 2 kappa2^2) / R), plus 2% for placement inside cells', () => {
    const b = exact.bins[0];
    const d = exactDraws;
    let m = 0;
    let m2 = 0;
    for (let r = 0; r < R; r++) {
      const s = sumH2(d.hc, r, 0, 2, freqs[0]);
      m += s;
      m2 += s * s;
    }
    m /= R;
    const variance = (m2 / R - m * m) * (R / (R - 1));
    const se = Math.sqrt((b.fourthCumulantH2 + 2 * b.varianceH2 ** 2) / R);
    expect(Math.abs(variance - b.varianceH2), `sample variance ${variance}, sum N h^4 ${b.varianceH2}, standard error ${se}`).toBeLessThan(4 * se + 0.02 * b.varianceH2);
  });

  it("the default threshold's mixture (drawn loud cells, Gaussian rest) on a population with 10^11 binaries in the lowest bin: mean h_c^2 within 4 standard errors plus 0.5% of Phinney's value", () => {
    const full = smoothPopulation();
    const f = [1 / T, 4 / T];
    const cells = realisationCells(full, testCosmology, f, T);
    expect(cells.bins[0].expectedCount).toBeGreaterThan(1e11);
    const d = drawRealisations(cells, 13, 0, 2000);
    const phinney = characteristicStrainSquared(full, f, { resolution: HIGH_RESOLUTION });
    f.forEach((fk, k) => {
      let mean = 0;
      for (let r = 0; r < 2000; r++) mean += d.hc[r * 2 + k] ** 2;
      mean /= 2000;
      const se = (fk * T * Math.sqrt(cells.bins[k].varianceH2)) / Math.sqrt(2000);
      expect(Math.abs(mean - phinney[k]), `bin ${k + 1}: ${mean} vs ${phinney[k]} (MC error ${se})`).toBeLessThan(4 * se + 5e-3 * phinney[k]);
    });
  });

  it('the work per bin stays bounded: with 10^11 binaries in a bin, the cells drawn one by one expect fewer than K binaries in all (definition of the split)', () => {
    const cells = realisationCells(smoothPopulation(), testCosmology, [1 / T], T, { threshold: 30 });
    const b = cells.bins[0];
    expect(b.expectedCount).toBeGreaterThan(1e11);
    expect(b.sparseCumulative[b.sparseCumulative.length - 1]).toBeLessThan(30);
    expect(b.sparseCumulative[b.sparseCumulative.length - 1]).toBeGreaterThan(0);
  });
});

describe('a delta population: one kind of binary in one cell', () => {
  it('P(no binary in the bin) = exp(-N) (Poisson), with N from finiteBinaryBins (an independent code path), within 4 binomial standard errors', () => {
    const f = 8e-9;
    const probe = finiteBinaryBins(boxPopulation(1e7, 0.3, 9.5, 0.6), testCosmology, [f], T).expectedPerBin[0];
    const n = (1e7 * 1.3) / probe; // about 1.3 binaries expected in the bin
    const pop = boxPopulation(n, 0.3, 9.5, 0.6);
    const N = finiteBinaryBins(pop, testCosmology, [f], T).expectedPerBin[0];
    for (const threshold of [Infinity, 30]) {
      const cells = realisationCells(pop, testCosmology, [f], T, { threshold, grid: { zPanels: 1, log10MPanels: 1, qPanels: 1, order: 2 } });
      expect(Math.abs(cells.bins[0].expectedCount / N - 1)).toBeLessThan(1e-6);
      const R = 20000;
      const d = drawRealisations(cells, 21, 0, R);
      let empty = 0;
      for (let r = 0; r < R; r++) if (d.hc[r] === 0) empty++;
      const p = Math.exp(-N);
      const se = Math.sqrt((p * (1 - p)) / R);
      expect(Math.abs(empty / R - p), `threshold ${threshold}: empty fraction ${empty / R}, exp(-N) = ${p}, N = ${N}`).toBeLessThan(4 * se);
    }
  });
});

describe('the loudest binary', () => {
  // Invented power law in mass at one redshift and mass ratio: dn/dlog10M = n0 10^(beta (x - 8)), 8 <= x <= 10.
  const z = 0.5;
  const q = 0.9995;
  const beta = 0.5;
  const f = 3 / T;
  const dz = 1e-4;
  const dq = 1e-3;
  const n0 = 3; // Mpc^-3 per unit z, dex and q: about 19 binaries in the bin
  const pop: BinaryPopulation = { zMin: z, zMax: z + dz, log10MMin: 8, log10MMax: 10, qMin: q - dq / 2, qMax: q + dq / 2, density: (_z, x) => n0 * Math.pow(10, beta * (x - 8)) };
  // Count per dex and strain of a binary of log10 mass x, from the published single-binary formulas
  // (Sesana, Vecchio & Colacino 2008; Peters 1964 residence time; Hogg 1999 volume element).
  const fr = (1 + z) * f;
  const perDexAt = (x: number) => {
    const mc = chirpMassFromTotal(Math.pow(10, x) * M_SUN_KG, q);
    const volumePerTime = testCosmology.comovingVolumeElementM3(z) / testCosmology.dtdzS(z) / MPC_M ** 3;
    return (n0 * Math.pow(10, beta * (x - 8)) * dz * dq * volumePerTime * circularResidenceTime(fr, mc)) / (f * T);
  };
  const strainAt = (x: number) => singleBinaryStrain(fr, chirpMassFromTotal(Math.pow(10, x) * M_SUN_KG, q), testCosmology.comovingDistanceM(z));
  // dN/dx = A 10^(s x) with s = beta - 5/3, so N(> x) = A (10^(10 s) - 10^(s x)) / (s ln 10); x(h) inverts h = B 10^(5 x / 3).
  const s = beta - 5 / 3;
  const A = perDexAt(8) / Math.pow(10, 8 * s);
  const countAbove = (x: number) => (A * (Math.pow(10, 10 * s) - Math.pow(10, s * x))) / (s * Math.LN10);
  const xOfStrain = (h: number) => 8 + 0.6 * Math.log10(h / strainAt(8));
  /** P(loudest <= h) = exp(-N(>h)): the void probability of a Poisson process above h (derived here: the count above h is Poisson with mean N(>h), and P(0) = exp(-mean); Kingman 1993, Poisson Processes, Oxford Studies in Probability; unverified: section number). */
  const closedCdf = (h: number) => Math.exp(-countAbove(Math.min(10, Math.max(8, xOfStrain(h)))));

  for (const threshold of [Infinity, 5]) {
    it(`the loudest strain of a power law in mass follows P(h_max <= h) = exp(-N(>h)) (Kolmogorov-Smirnov at 0.1%, threshold ${threshold})`, () => {
      const cells = realisationCells(pop, testCosmology, [f], T, { threshold, grid: { zPanels: 1, log10MPanels: 64, qPanels: 1, order: 2 } });
      const N = countAbove(8);
      expect(Math.abs(cells.bins[0].expectedCount / N - 1), `cells ${cells.bins[0].expectedCount} vs closed form ${N}`).toBeLessThan(2e-3);
      const R = 4000;
      const d = drawRealisations(cells, 31, 0, R);
      const loud = Float64Array.from(d.loudestStrain).sort();
      let D = 0;
      for (let i = 0; i < R; i++) {
        const F = closedCdf(loud[i]);
        D = Math.max(D, Math.abs(F - i / R), Math.abs(F - (i + 1) / R));
      }
      expect(D, `KS distance ${D} (N = ${N})`).toBeLessThan(KS_999 / Math.sqrt(R));
      // Each loudest binary's recorded chirp mass and mass ratio give back its strain.
      for (let r = 0; r < 20; r++) {
        const h = singleBinaryStrain(fr, d.loudestChirpMassKg[r], testCosmology.comovingDistanceM(d.loudestRedshift[r]));
        expect(Math.abs(h / d.loudestStrain[r] - 1)).toBeLessThan(1e-3);
        expect(Math.abs(d.loudestMassRatio[r] - q)).toBeLessThan(dq);
      }
    });
  }
});

describe('smooth-plus-Gaussian approximation', () => {
  it('a low threshold (K = 3) and a high one (K = 1000) give the same h_c distribution per bin (two-sample Kolmogorov-Smirnov at 0.1%)', () => {
    const pop = smoothPopulation();
    const freqs = [2 / T, 10 / T, 30 / T];
    const R = 1500;
    const lo = drawRealisations(realisationCells(pop, testCosmology, freqs, T, { threshold: 3 }), 41, 0, R);
    const hi = drawRealisations(realisationCells(pop, testCosmology, freqs, T, { threshold: 1000 }), 42, 0, R);
    for (let k = 0; k < freqs.length; k++) {
      const a = Float64Array.from({ length: R }, (_, r) => lo.hc[r * 3 + k]).sort();
      const b = Float64Array.from({ length: R }, (_, r) => hi.hc[r * 3 + k]).sort();
      let i = 0;
      let j = 0;
      let D = 0;
      while (i < R && j < R) {
        if (a[i] <= b[j]) i++;
        else j++;
        D = Math.max(D, Math.abs(i / R - j / R));
      }
      expect(D, `bin ${k + 1}: KS distance ${D}`).toBeLessThan(KS_999 * Math.sqrt(2 / R));
    }
  });
});

describe('reproducibility', () => {
  const pop = heavyPopulation(1e-2);
  const freqs = [1 / T, 2 / T, 5 / T];
  const cells = realisationCells(pop, testCosmology, freqs, T);

  it('the same seed gives the same realisations; another seed does not', () => {
    const a = drawRealisations(cells, 7, 0, 50);
    const b = drawRealisations(cells, 7, 0, 50);
    const c = drawRealisations(cells, 8, 0, 50);
    expect(Array.from(b.hc)).toEqual(Array.from(a.hc));
    expect(Array.from(b.loudestStrain)).toEqual(Array.from(a.loudestStrain));
    expect(Array.from(c.hc)).not.toEqual(Array.from(a.hc));
  });

  it('chunks drawn separately and joined equal one run (any split, any order)', () => {
    const whole = drawRealisations(cells, 7, 0, 50);
    const parts = [drawRealisations(cells, 7, 37, 13), drawRealisations(cells, 7, 0, 20), drawRealisations(cells, 7, 20, 17)];
    const joined = joinDraws(parts);
    expect(Array.from(joined.hc)).toEqual(Array.from(whole.hc));
    expect(Array.from(joined.loudestChirpMassKg)).toEqual(Array.from(whole.loudestChirpMassKg));
    expect(Array.from(joined.outshines)).toEqual(Array.from(whole.outshines));
    expect(() => joinDraws([parts[0], parts[1]])).toThrow(/tile/);
  });

  it('the summary bands are ordered and the outshine fraction is a probability', () => {
    const s = summariseRealisations(drawRealisations(cells, 9, 0, 400));
    for (let k = 0; k < freqs.length; k++) {
      expect(s.lower95[k]).toBeLessThanOrEqual(s.lower68[k]);
      expect(s.lower68[k]).toBeLessThanOrEqual(s.medianHc[k]);
      expect(s.medianHc[k]).toBeLessThanOrEqual(s.upper68[k]);
      expect(s.upper68[k]).toBeLessThanOrEqual(s.upper95[k]);
      expect(s.outshineProbability[k]).toBeGreaterThanOrEqual(0);
      expect(s.outshineProbability[k]).toBeLessThanOrEqual(1);
    }
  });
});

describe('residence time against the age of the Universe', () => {
  // dt_r/dln f_r = (5/96) (G M_c/c^3)^(-5/3) (pi f_r)^(-8/3) (Peters 1964) against t(z) (Hogg 1999).
  it('light binaries at the lowest frequency are flagged (residence time longer than the age at z), heavy ones are not; dropping them empties the bin of the light ones', () => {
    const f = 1 / T;
    for (const [x, long] of [
      [6.5, true],
      [9.5, false],
    ] as const) {
      const pop = boxPopulation(1e3, 1, x, 0.6);
      const mc = chirpMassFromTotal(Math.pow(10, x) * M_SUN_KG, 0.6);
      const tau = circularResidenceTime(2 * f, mc);
      expect(tau > testCosmology.ageS(1), `log10M ${x}: residence ${tau / YEAR_S} yr`).toBe(long);
      const grid = { zPanels: 1, log10MPanels: 1, qPanels: 1, order: 2 };
      const kept = realisationCells(pop, testCosmology, [f], T, { grid }).bins[0];
      expect(kept.longResidenceCount / kept.expectedCount).toBe(long ? 1 : 0);
      const dropped = realisationCells(pop, testCosmology, [f], T, { grid, dropLongResidence: true }).bins[0];
      expect(dropped.expectedCount).toBe(long ? 0 : kept.expectedCount);
    }
  });
});
