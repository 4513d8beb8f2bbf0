import { describe, it, expect } from 'vitest';
import { arraySensitivity, effectiveNoisePsd, pulsarNoiseStrain } from '../../src/physics/arraySensitivity';
import { hellingsDowns } from '../../src/physics/hellingsDowns';
import {
  frequencyBins,
  pulsarNoisePsd,
  redNoisePsd,
  residualPsdFromStrain,
  whiteNoisePsd,
  type PulsarArray,
  type PulsarNoise,
} from '../../src/physics/pulsarArray';
import { DAY_S, F_YR_HZ, YEAR_S } from '../../src/physics/constants';
import { mulberry32, normal } from './seededRandom';

// Invented arrays only (no real array's numbers): 100 ns, two-week cadence, a dozen years.
const white = (precisionS: number, cadenceS = 14 * DAY_S): PulsarNoise => ({ precisionS, cadenceS, redAmplitude: 0, redGamma: 0 });
const identical = (n: number, p: PulsarNoise, spanS = 12 * YEAR_S): PulsarArray => ({ pulsars: Array.from({ length: n }, () => p), spanS, positions: null });

function logSlope(f: Float64Array, h: Float64Array, i: number, j: number): number {
  return Math.log(h[j] / h[i]) / Math.log(f[j] / f[i]);
}

describe('frequency bins (k/T up to the Nyquist frequency 1/(2 dt): common practice, no source)', () => {
  it('holds floor(T/(2 dt)) bins at k/T', () => {
    const T = 10 * YEAR_S;
    const dt = 14 * DAY_S;
    const f = frequencyBins(T, dt);
    expect(f.length).toBe(Math.floor(T / (2 * dt)));
    expect(f[0]).toBe(1 / T);
    expect(Math.abs(f[f.length - 1] * T - f.length)).toBeLessThan(1e-9);
    expect(f[f.length - 1]).toBeLessThanOrEqual(1 / (2 * dt));
  });
  it('refuses a span shorter than two cadences (no bin below Nyquist)', () => {
    expect(() => frequencyBins(20 * DAY_S, 14 * DAY_S)).toThrow(/no frequency bin/);
  });
});

describe('white-noise PSD P = 2 sigma^2 dt (Parseval; Hazboun, Romano & Smith 2019, PRD 100, 104028)', () => {
  it('agrees with the averaged one-sided periodogram of simulated white residuals (seeded, 5 standard errors)', () => {
    // Independent method: simulate N samples of variance sigma^2 every dt, one-sided periodogram
    // P_k = (2 dt / N) |sum_n x_n e^(-2 pi i k n / N)|^2 for 0 < k < N/2 (its bins sum, times df = 1/(N dt), to the variance).
    const sigma = 1.3e-7;
    const dt = 9 * DAY_S;
    const N = 256;
    const rand = mulberry32(11);
    const values: number[] = [];
    for (let r = 0; r < 24; r++) {
      const x = Array.from({ length: N }, () => sigma * normal(rand));
      for (let k = 1; k < N / 2; k++) {
        let re = 0;
        let im = 0;
        for (let n = 0; n < N; n++) {
          re += x[n] * Math.cos((2 * Math.PI * k * n) / N);
          im -= x[n] * Math.sin((2 * Math.PI * k * n) / N);
        }
        values.push(((2 * dt) / N) * (re * re + im * im));
      }
    }
    const mean = values.reduce((a, b) => a + b, 0) / values.length;
    const sd = Math.sqrt(values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1));
    const expected = whiteNoisePsd(sigma, dt);
    expect(expected).toBe(2 * sigma * sigma * dt);
    expect(Math.abs(mean - expected), `periodogram ${mean} vs 2 sigma^2 dt ${expected}`).toBeLessThan((5 * sd) / Math.sqrt(values.length));
  });
});

describe('red-noise PSD', () => {
  it('is the residual PSD of the strain-like power law A (f/f_yr)^((3-gamma)/2) through P = h^2/(12 pi^2 f^3) (PSD/strain relation, docs/array.md)', () => {
    for (const [A, g] of [
      [1e-14, 13 / 3],
      [3e-15, 3.1],
      [5e-13, 6],
    ]) {
      for (const f of [1e-9, F_YR_HZ, 1e-7]) {
        const viaStrain = residualPsdFromStrain(A * Math.pow(f / F_YR_HZ, (3 - g) / 2), f);
        expect(Math.abs(redNoisePsd(A, g, f) / viaStrain - 1)).toBeLessThan(1e-12);
      }
    }
  });
  it('adds to the white noise, and a pulsar has infinite noise above its own Nyquist frequency', () => {
    const p: PulsarNoise = { precisionS: 1e-7, cadenceS: 14 * DAY_S, redAmplitude: 1e-14, redGamma: 4 };
    const f = 5e-9;
    expect(pulsarNoisePsd(p, f)).toBeCloseTo(whiteNoisePsd(1e-7, 14 * DAY_S) + redNoisePsd(1e-14, 4, f), 30);
    expect(pulsarNoisePsd(p, 1.01 / (2 * p.cadenceS))).toBe(Infinity);
  });
});

describe('array sensitivity curve h_n = sqrt(12 pi^2 f^3 P_eff)', () => {
  it('rises as f^(3/2) for white noise alone (h^2 = 12 pi^2 f^3 P with P constant)', () => {
    const c = arraySensitivity(identical(20, white(1e-7)));
    expect(Math.abs(logSlope(c.frequencyHz, c.hc, 0, c.hc.length - 1) - 1.5)).toBeLessThan(1e-12);
    expect(Math.abs(logSlope(c.frequencyHz, c.hc, 3, 40) - 1.5)).toBeLessThan(1e-12);
  });

  it('falls as f^((3-gamma)/2) where red noise dominates', () => {
    const red: PulsarNoise = { precisionS: 1e-9, cadenceS: 14 * DAY_S, redAmplitude: 1e-13, redGamma: 5 };
    const c = arraySensitivity(identical(10, red));
    // At the lowest bins the red term exceeds the white one by > 1e8, so the slope is (3-5)/2 = -1 to ~1e-8.
    expect(Math.abs(logSlope(c.frequencyHz, c.hc, 0, 2) - (3 - 5) / 2)).toBeLessThan(1e-6);
  });

  it('combines N identical pulsars as P_eff = P / sqrt(N(N-1)/2 * <Gamma^2>), <Gamma^2> = 1/48 (isotropic sky, derived in hellingsDowns.test.ts)', () => {
    const p = white(2e-7);
    for (const n of [2, 10, 45]) {
      const pairs = (n * (n - 1)) / 2;
      const f = 3e-9;
      const expected = whiteNoisePsd(p.precisionS, p.cadenceS) / Math.sqrt(pairs / 48);
      expect(Math.abs(effectiveNoisePsd(identical(n, p), f) / expected - 1)).toBeLessThan(1e-9);
    }
    // Scaling of the curve itself: h_n proportional to N_pairs^(-1/4).
    const h10 = arraySensitivity(identical(10, p)).hc[5];
    const h40 = arraySensitivity(identical(40, p)).hc[5];
    expect(Math.abs(h10 / h40 - ((40 * 39) / (10 * 9)) ** 0.25)).toBeLessThan(1e-9);
  });

  it('uses each pair’s own Hellings & Downs factor when positions are given', () => {
    // Two pulsars on the equator 90 deg apart: P_eff = P / |Gamma(90 deg)|.
    const p = white(1e-7);
    const arr: PulsarArray = { pulsars: [p, p], spanS: 10 * YEAR_S, positions: [[0, 0], [Math.PI / 2, 0]] };
    const f = 4e-9;
    expect(Math.abs(effectiveNoisePsd(arr, f) / (whiteNoisePsd(1e-7, p.cadenceS) / Math.abs(hellingsDowns(Math.PI / 2))) - 1)).toBeLessThan(1e-12);
  });

  it('groups unequal pulsars correctly: mixed precisions equal the explicit pair sum', () => {
    const a = white(1e-7);
    const b = white(3e-7);
    const arr: PulsarArray = { pulsars: [a, a, a, b, b], spanS: 10 * YEAR_S, positions: null };
    const pa = whiteNoisePsd(1e-7, a.cadenceS);
    const pb = whiteNoisePsd(3e-7, b.cadenceS);
    // 3 a-a pairs, 1 b-b pair, 6 a-b pairs, each weighted by <Gamma^2> = 1/48.
    const sum = (3 / (pa * pa) + 1 / (pb * pb) + 6 / (pa * pb)) / 48;
    expect(Math.abs(effectiveNoisePsd(arr, 2e-9) * Math.sqrt(sum) - 1)).toBeLessThan(1e-9);
  });

  it('drops a pulsar from pairs above its own Nyquist frequency', () => {
    const fast = white(1e-7, 7 * DAY_S);
    const slow = white(1e-7, 28 * DAY_S);
    const mixed: PulsarArray = { pulsars: [fast, fast, fast, slow], spanS: 10 * YEAR_S, positions: null };
    const onlyFast: PulsarArray = { pulsars: [fast, fast, fast], spanS: 10 * YEAR_S, positions: null };
    const f = 1.1 / (2 * slow.cadenceS); // above the slow pulsar's Nyquist, below the fast one's
    expect(effectiveNoisePsd(mixed, f)).toBe(effectiveNoisePsd(onlyFast, f));
    const below = 0.5 / (2 * slow.cadenceS);
    expect(effectiveNoisePsd(mixed, below)).toBeLessThan(effectiveNoisePsd(onlyFast, below));
  });

  it('single-pulsar noise strain follows h = sqrt(12 pi^2 f^3 P)', () => {
    const p = white(5e-8);
    const f = 1e-8;
    expect(Math.abs(pulsarNoiseStrain(p, f) - Math.sqrt(12 * Math.PI ** 2 * f ** 3 * 2 * 5e-8 ** 2 * p.cadenceS))).toBeLessThan(1e-25);
  });
});
