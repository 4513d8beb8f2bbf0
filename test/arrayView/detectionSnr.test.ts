import { describe, it, expect } from 'vitest';
import { detectionSnr, detectionSpan, pairBinSnrSquared } from '../../src/physics/detectionSnr';
import { hellingsDowns, hellingsDownsOfX } from '../../src/physics/hellingsDowns';
import { frequencyBins, pulsarNoisePsd, residualPsdFromStrain, type PulsarArray, type PulsarNoise } from '../../src/physics/pulsarArray';
import { powerLawModel, spectrumModel } from '../../src/physics/strainOnBins';
import { DAY_S, F_YR_HZ, YEAR_S } from '../../src/physics/constants';
import { mulberry32, normal, unitSphere } from './seededRandom';

// Invented arrays and amplitudes only. Scaling laws from Siemens, Ellis, Jenet & Romano 2013, CQG 30, 224015:
// weak signal rho proportional to A^2 T^(13/3) N / sigma^2 (white noise, gamma = 13/3); strong signal
// rho proportional to T^(1/2), independent of amplitude, set by the number of pairs.
const CADENCE = 14 * DAY_S;
const white = (precisionS: number, cadenceS = CADENCE): PulsarNoise => ({ precisionS, cadenceS, redAmplitude: 0, redGamma: 0 });
const identical = (n: number, precisionS: number, spanYr: number): PulsarArray => ({
  pulsars: Array.from({ length: n }, () => white(precisionS)),
  spanS: spanYr * YEAR_S,
  positions: null,
});

describe('per-pair, per-bin S/N of the cross-correlation', () => {
  it('equals mean^2/variance of Re(a conj b) for simulated correlated Gaussian Fourier amplitudes (seeded Monte Carlo)', () => {
    // Independent method: draw complex amplitudes with <|a|^2> = P_I + P_g, <|b|^2> = P_J + P_g, <a conj b> = Gamma P_g,
    // form x = Re(a conj b) and compare mean^2/var with the closed form 2 G^2 Pg^2 / [(P_I+Pg)(P_J+Pg) + G^2 Pg^2].
    const rand = mulberry32(424242);
    for (const [pI, pJ, pg, gamma] of [
      [1, 1.5, 0.3, 0.4],
      [1, 1, 5, -0.15],
      [2, 0.5, 1, 0.25],
    ]) {
      const sI = pI + pg;
      const sJ = pJ + pg;
      const c = gamma * pg;
      // Each real component: var(a_r) = sI/2, var(b_r) = sJ/2, cov(a_r, b_r) = c/2 (Cholesky of the 2x2 covariance).
      const l11 = Math.sqrt(sI / 2);
      const l21 = c / 2 / l11;
      const l22 = Math.sqrt(sJ / 2 - l21 * l21);
      const n = 400_000;
      let sum = 0;
      let sumSq = 0;
      for (let i = 0; i < n; i++) {
        const z1 = normal(rand);
        const z2 = normal(rand);
        const z3 = normal(rand);
        const z4 = normal(rand);
        const ar = l11 * z1;
        const br = l21 * z1 + l22 * z2;
        const ai = l11 * z3;
        const bi = l21 * z3 + l22 * z4;
        const x = ar * br + ai * bi;
        sum += x;
        sumSq += x * x;
      }
      const mean = sum / n;
      const variance = sumSq / n - mean * mean;
      const mc = (mean * mean) / variance;
      const closed = pairBinSnrSquared(gamma * gamma, pI, pJ, pg);
      // Relative Monte Carlo error of mean^2/var with 4e5 samples is about 1-3 % here; allow 6 %.
      expect(Math.abs(mc / closed - 1), `pI=${pI} pJ=${pJ} pg=${pg} G=${gamma}: MC ${mc} closed ${closed}`).toBeLessThan(0.06);
    }
  });
});

describe('the S/N sums the Monte-Carlo-checked per-pair term in every regime', () => {
  // Links the per-bin sums of detectionSnr (a separate, callback-free loop) to pairBinSnrSquared above,
  // for an intermediate signal (neither limit holds) with mixed white and red noise.
  const noises: PulsarNoise[] = [
    { precisionS: 1e-7, cadenceS: CADENCE, redAmplitude: 0, redGamma: 0 },
    { precisionS: 3e-7, cadenceS: CADENCE, redAmplitude: 2e-15, redGamma: 3.5 },
    { precisionS: 5e-8, cadenceS: CADENCE, redAmplitude: 0, redGamma: 0 },
    { precisionS: 2e-7, cadenceS: CADENCE, redAmplitude: 5e-15, redGamma: 5 },
  ];
  const model = powerLawModel(3e-15);

  it('with positions: each bin equals the sum over pairs of pairBinSnrSquared (to 1e-12)', () => {
    const pos: Array<[number, number]> = [
      [0.2, 0.1],
      [1.9, -0.6],
      [3.3, 0.9],
      [5.0, -1.2],
    ];
    const arr: PulsarArray = { pulsars: noises, spanS: 8 * YEAR_S, positions: pos };
    const r = detectionSnr(arr, model);
    for (const k of [0, 1, 5, 40]) {
      const f = r.frequencyHz[k];
      const pg = residualPsdFromStrain(model(f), f);
      let sum = 0;
      for (let i = 0; i < 4; i++) {
        for (let j = i + 1; j < 4; j++) {
          const c = Math.sin(pos[i][1]) * Math.sin(pos[j][1]) + Math.cos(pos[i][1]) * Math.cos(pos[j][1]) * Math.cos(pos[i][0] - pos[j][0]);
          const g = hellingsDowns(Math.acos(c));
          sum += pairBinSnrSquared(g * g, pulsarNoisePsd(noises[i], f), pulsarNoisePsd(noises[j], f), pg);
        }
      }
      expect(Math.abs(r.binSnrSquared[k] / sum - 1), `bin ${k + 1}`).toBeLessThan(1e-12);
    }
  });

  it('sky-averaged: each bin equals the pair sum of the term averaged over x uniform on [0, 1] (20000-point midpoint rule, 1e-6)', () => {
    const arr: PulsarArray = { pulsars: noises, spanS: 8 * YEAR_S, positions: null };
    const r = detectionSnr(arr, model);
    for (const k of [0, 2, 30]) {
      const f = r.frequencyHz[k];
      const pg = residualPsdFromStrain(model(f), f);
      let sum = 0;
      const m = 20_000;
      for (let i = 0; i < 4; i++) {
        for (let j = i + 1; j < 4; j++) {
          let e = 0;
          for (let q = 0; q < m; q++) {
            const g = hellingsDownsOfX((q + 0.5) / m);
            e += pairBinSnrSquared(g * g, pulsarNoisePsd(noises[i], f), pulsarNoisePsd(noises[j], f), pg) / m;
          }
          sum += e;
        }
      }
      expect(Math.abs(r.binSnrSquared[k] / sum - 1), `bin ${k + 1}`).toBeLessThan(1e-6);
    }
  });
});

describe('weak-signal regime (Siemens et al. 2013, CQG 30, 224015)', () => {
  const A = 1e-19; // P_g / P_n < 1e-4 in every bin: deep in the weak regime
  const model = powerLawModel(A);

  it('grows as T^(13/3) for h_c proportional to f^(-2/3) and white noise', () => {
    const r10 = detectionSnr(identical(20, 1e-7, 10), model).snr;
    const r20 = detectionSnr(identical(20, 1e-7, 20), model).snr;
    const r15 = detectionSnr(identical(20, 1e-7, 15), model).snr;
    expect(Math.abs(r20 / r10 / 2 ** (13 / 3) - 1), `ratio ${r20 / r10}`).toBeLessThan(1e-3);
    expect(Math.abs(r15 / r10 / 1.5 ** (13 / 3) - 1)).toBeLessThan(1e-3);
  });

  it('grows as A^2, falls as sigma^-2, and grows as sqrt(N(N-1)/2) (so as N for large arrays)', () => {
    const base = detectionSnr(identical(20, 1e-7, 12), model).snr;
    expect(Math.abs(detectionSnr(identical(20, 1e-7, 12), powerLawModel(2 * A)).snr / base / 4 - 1)).toBeLessThan(1e-3);
    expect(Math.abs(detectionSnr(identical(20, 2e-7, 12), model).snr / base / 0.25 - 1)).toBeLessThan(1e-3);
    const n80 = detectionSnr(identical(80, 1e-7, 12), model).snr;
    expect(Math.abs(n80 / base / Math.sqrt((80 * 79) / (20 * 19)) - 1)).toBeLessThan(1e-3);
  });

  it('matches the weak-signal limit 2 sum_k sum_pairs Gamma^2 P_g^2 / (P_I P_J) reported beside it', () => {
    const r = detectionSnr(identical(20, 1e-7, 12), model);
    expect(Math.abs(r.snr / r.weakSignalSnr - 1)).toBeLessThan(1e-3);
  });
});

describe('strong-signal regime (Siemens et al. 2013, CQG 30, 224015)', () => {
  // 1 ns precision and A = 1e-10 (invented, far above any real background) make P_g / P_n > 1e6 in every bin.
  const precision = 1e-9;

  it('no longer depends on the amplitude', () => {
    const a = detectionSnr(identical(20, precision, 12), powerLawModel(1e-10)).snr;
    const b = detectionSnr(identical(20, precision, 12), powerLawModel(1e-9)).snr;
    expect(Math.abs(a / b - 1)).toBeLessThan(1e-4);
  });

  it('tends to rho^2 = 2 K N_pairs <Gamma^2/(1+Gamma^2)> and grows as sqrt(K) ~ T^(1/2)', () => {
    // <Gamma^2/(1+Gamma^2)> over isotropic skies by a 200000-point midpoint rule in x (independent of the code's rule).
    let e = 0;
    const m = 200_000;
    for (let i = 0; i < m; i++) {
      const g = hellingsDownsOfX((i + 0.5) / m);
      e += (g * g) / (1 + g * g) / m;
    }
    for (const [n, years] of [
      [20, 10],
      [20, 40],
      [50, 25],
    ]) {
      const K = frequencyBins(years * YEAR_S, CADENCE).length;
      const r = detectionSnr(identical(n, precision, years), powerLawModel(1e-10)).snr;
      const expected = Math.sqrt(2 * K * ((n * (n - 1)) / 2) * e);
      expect(Math.abs(r / expected - 1), `N=${n} T=${years} yr: ${r} vs ${expected}`).toBeLessThan(1e-4);
    }
    const r10 = detectionSnr(identical(20, precision, 10), powerLawModel(1e-10)).snr;
    const r40 = detectionSnr(identical(20, precision, 40), powerLawModel(1e-10)).snr;
    expect(Math.abs(r40 / r10 - 2)).toBeLessThan(0.01); // sqrt(4): T^(1/2), up to the floor in K
  });

  it('with explicit positions equals sqrt(2 K sum_pairs Gamma^2/(1+Gamma^2))', () => {
    const pos: Array<[number, number]> = [
      [0, 0],
      [1.1, 0.4],
      [2.5, -0.9],
      [4.0, 1.2],
    ];
    const arr: PulsarArray = { pulsars: pos.map(() => white(precision)), spanS: 11 * YEAR_S, positions: pos };
    let s = 0;
    for (let i = 0; i < 4; i++) {
      for (let j = i + 1; j < 4; j++) {
        const [ra1, d1] = pos[i];
        const [ra2, d2] = pos[j];
        const cos = Math.sin(d1) * Math.sin(d2) + Math.cos(d1) * Math.cos(d2) * Math.cos(ra1 - ra2);
        const g = hellingsDowns(Math.acos(cos));
        s += (g * g) / (1 + g * g);
      }
    }
    const K = frequencyBins(arr.spanS, CADENCE).length;
    const r = detectionSnr(arr, powerLawModel(1e-10)).snr;
    expect(Math.abs(r / Math.sqrt(2 * K * s) - 1)).toBeLessThan(1e-4);
  });
});

describe('red pulsar noise with the background’s own slope', () => {
  it('gives rho^2 = K N_pairs <2 G^2 r^2 / ((1+r)^2 + G^2 r^2)> with r = (A/A_red)^2 in every bin (closed form derived here)', () => {
    // Red noise P_red = A_red^2/(12 pi^2) f_yr^-3 (f/f_yr)^(-13/3) has the same shape as the signal's P_g, so
    // P_g/P_red = (A/A_red)^2 = r in every bin; with negligible white noise the per-bin term is a constant.
    const A = 1e-15;
    const aRed = 4e-15;
    const r = (A / aRed) ** 2;
    const n = 12;
    const arr: PulsarArray = {
      pulsars: Array.from({ length: n }, () => ({ precisionS: 1e-13, cadenceS: CADENCE, redAmplitude: aRed, redGamma: 13 / 3 })),
      spanS: 9 * YEAR_S,
      positions: null,
    };
    let e = 0;
    const m = 200_000;
    for (let i = 0; i < m; i++) {
      const g = hellingsDownsOfX((i + 0.5) / m);
      e += (2 * g * g * r * r) / ((1 + r) ** 2 + g * g * r * r) / m;
    }
    const K = frequencyBins(arr.spanS, CADENCE).length;
    const expected = Math.sqrt(K * ((n * (n - 1)) / 2) * e);
    const got = detectionSnr(arr, powerLawModel(A)).snr;
    // White noise of 0.1 ps adds < 1e-6 relative to the red noise in every bin.
    expect(Math.abs(got / expected - 1), `${got} vs ${expected}`).toBeLessThan(1e-5);
  });
});

describe('sky positions', () => {
  it('random isotropic positions give close to the sky-averaged S/N for a large array (seeded)', () => {
    const rand = mulberry32(99);
    const n = 300;
    const pos: Array<[number, number]> = [];
    for (let i = 0; i < n; i++) {
      const v = unitSphere(rand);
      pos.push([Math.atan2(v[1], v[0]), Math.asin(v[2])]);
    }
    const model = powerLawModel(1e-17);
    const onSky = detectionSnr({ pulsars: pos.map(() => white(1e-7)), spanS: 10 * YEAR_S, positions: pos }, model).snr;
    const averaged = detectionSnr(identical(n, 1e-7, 10), model).snr;
    expect(Math.abs(onSky / averaged - 1), `on sky ${onSky}, averaged ${averaged}`).toBeLessThan(0.015); // seeds tried: |ratio - 1| < 0.5 %
  });
});

describe('spectrum input', () => {
  it('a spectrum sampled from a power law gives the same S/N as the power law (log-log interpolation is exact for power laws)', () => {
    const A = 2e-15;
    const n = 40;
    const f = new Float64Array(n);
    const hc = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      f[i] = 1e-9 * Math.pow(1000, i / (n - 1));
      hc[i] = A * Math.pow(f[i] / F_YR_HZ, -2 / 3);
    }
    const arr = identical(25, 2e-7, 15);
    const a = detectionSnr(arr, spectrumModel({ frequencyHz: f, hc })).snr;
    const b = detectionSnr(arr, powerLawModel(A)).snr;
    expect(Math.abs(a / b - 1)).toBeLessThan(1e-10);
  });

  it('refuses bins below the spectrum and counts bins above it as no signal', () => {
    const f = Float64Array.of(3e-9, 1e-8);
    const hc = Float64Array.of(1e-15, 5e-16);
    const model = spectrumModel({ frequencyHz: f, hc });
    expect(() => detectionSnr(identical(5, 1e-7, 20), model)).toThrow(/below the spectrum/);
    // T = 10 yr: bins at 3.17, 6.34, 9.51 nHz inside, the rest above 10 nHz contribute nothing.
    const r = detectionSnr(identical(5, 1e-7, 10), model);
    const inside = r.binSnrSquared.slice(0, 3);
    expect(inside.every((x) => x > 0)).toBe(true);
    expect(r.binSnrSquared.slice(3).every((x) => x === 0)).toBe(true);
  });
});

describe('detection span (root find over T)', () => {
  it('returns the span where S/N first reaches the threshold', () => {
    const arr = identical(30, 2e-7, 10);
    const model = powerLawModel(2e-15);
    const r = detectionSpan(arr, model, 4, 60 * YEAR_S);
    expect(r.reached).toBe(true);
    expect(detectionSnr(arr, model, r.spanS).snr).toBeGreaterThanOrEqual(4);
    expect(detectionSnr(arr, model, r.spanS * (1 - 2e-10)).snr).toBeLessThan(4);
  });

  it('finds a crossing that sits on a jump of S/N, where bin k enters at T = 2 k dt (bins k/T up to 1/(2 dt), common practice, no source), to 1e-10', () => {
    // A strong signal (P_g >> P_n): S/N grows with the number of bins, hardly with T between them.
    const arr = identical(30, 2e-7, 10);
    const model = powerLawModel(1e-10);
    const jump = 2 * 3 * CADENCE; // bin 3 enters here
    const below = detectionSnr(arr, model, jump * (1 - 1e-9)).snr;
    const above = detectionSnr(arr, model, jump * (1 + 1e-9)).snr;
    expect(above - below).toBeGreaterThan(1e-3 * above); // a jump, not the smooth growth over 2e-9 of T
    const thr = 0.5 * (below + above);
    const r = detectionSpan(arr, model, thr, 60 * YEAR_S);
    expect(Math.abs(r.spanS / jump - 1)).toBeLessThan(1e-10);
    expect(detectionSnr(arr, model, r.spanS).snr).toBeGreaterThanOrEqual(thr);
  });

  it('in the weak regime follows T_det = T_ref (threshold / rho_ref)^(3/13) (inverse of rho proportional to T^(13/3))', () => {
    const arr = identical(20, 1e-6, 10);
    const model = powerLawModel(3e-18); // P_g / P_n < 1e-3 in every bin up to 13 yr
    const ref = detectionSnr(arr, model, 10 * YEAR_S);
    expect(ref.snr / ref.weakSignalSnr).toBeGreaterThan(0.999); // confirms the weak regime at the reference
    const thr = ref.snr * 3; // reached near 10 * 3^(3/13) = 12.9 yr, still weak
    const r = detectionSpan(arr, model, thr, 80 * YEAR_S);
    const predicted = 10 * YEAR_S * Math.pow(thr / ref.snr, 3 / 13);
    expect(Math.abs(r.spanS / predicted - 1), `found ${r.spanS / YEAR_S} yr, predicted ${predicted / YEAR_S} yr`).toBeLessThan(1e-4);
  });

  it('says so when the threshold is not reached within the search', () => {
    const r = detectionSpan(identical(3, 1e-6, 10), powerLawModel(1e-17), 5, 30 * YEAR_S);
    expect(r.reached).toBe(false);
    expect(Number.isNaN(r.spanS)).toBe(true);
    expect(r.snr).toBeLessThan(5);
  });
});
