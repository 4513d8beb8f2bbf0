// Bins whose steady-state count needs binaries that cannot be there yet: the share of each bin's expected
// binaries whose residence time dt/dln f_r exceeds the age of the Universe at their redshift
// (longResidenceShare; finiteBinaryBins in src/physics/finiteBinaries.ts). Checked against the closed
// form of a population with a count flat in log10 M, against the separate per-node sum of
// src/physics/realisationCells.ts, and on the demo sheet (examples/demo.json, invented).
import { describe, expect, it } from 'vitest';
import type { Matrix } from 'mathjs';
import { chirpMassFromTotal } from '../../src/physics/binaryMasses';
import { M_SUN_KG, YEAR_S } from '../../src/physics/constants';
import { circularResidenceTime, finiteBinaryBins } from '../../src/physics/finiteBinaries';
import type { BinaryPopulation } from '../../src/physics/populationTypes';
import { realisationCells } from '../../src/physics/realisationCells';
import { loadDemo } from '../physics/demoSheet';
import { testCosmology } from '../orbits/populations';

const T = 15 * YEAR_S;
const Z0 = 0.5;
const X1 = 6;
const X2 = 9;
const Q0 = 0.9995;

/**
 * Binaries at z = 0.5 and q = 1 (narrow boxes), with density proportional to M^(5/3) per dex so that
 * the count per bin, n dt/dln f proportional to M^(5/3) M_c^(-5/3), is flat in log10 M (Peters 1964,
 * Phys. Rev. 136, B1224 for dt/dln f).
 */
const flatCountPopulation: BinaryPopulation = {
  zMin: Z0,
  zMax: Z0 + 1e-4,
  log10MMin: X1,
  log10MMax: X2,
  qMin: Q0,
  qMax: 1,
  density: (_z, x) => Math.pow(10, (5 / 3) * (x - 8)),
};

/**
 * Closed form: with the count flat in log10 M, the share below the total mass whose residence time
 * equals the age at z is (x_c - x1)/(x2 - x1), clipped to [0, 1]. tau = tau(f_r, 1 kg) M_c^(-5/3), so
 * M_c,crit = (tau(f_r, 1 kg) / age)^(3/5) (Peters 1964; age: Hogg 1999, astro-ph/9905116).
 */
function closedFormShare(f: number): number {
  const fr = (1 + Z0) * f;
  const mcCrit = Math.pow(circularResidenceTime(fr, 1) / testCosmology.ageS(Z0), 3 / 5);
  const mcPerMsun = chirpMassFromTotal(M_SUN_KG, 1); // M_c / M at q = 1 (Finn & Chernoff 1993 definition)
  const xc = Math.log10(mcCrit / mcPerMsun);
  return Math.min(1, Math.max(0, (xc - X1) / (X2 - X1)));
}

describe('share of a bin in binaries with residence times longer than the age of the Universe', () => {
  it('matches the closed form for a count flat in log10 M, to 0.008 (the widest Gauss-Legendre node of the default grid holds 0.022 dex of the 3 dex: a node is long or not as a whole)', () => {
    const freqs = [1, 2, 3, 5, 8, 13].map((k) => k / T);
    const r = finiteBinaryBins(flatCountPopulation, testCosmology, freqs, T);
    const shares = Array.from(r.expectedPerBin, (n, k) => r.longResidencePerBin[k] / n);
    const expected = freqs.map(closedFormShare);
    // The frequencies span shares strictly inside (0, 1), so the test sees the cut move.
    expect(expected.some((s) => s > 0.2 && s < 0.8)).toBe(true);
    for (let k = 0; k < freqs.length; k++) {
      expect(Math.abs(shares[k] - expected[k]), `f = ${freqs[k]} Hz: got ${shares[k]}, closed form ${expected[k]}`).toBeLessThan(0.008);
    }
  });
});

describe('two implementations agree', () => {
  it('the prefix-sum count of finiteBinaryBins equals the per-node count of realisationCells on the same default grid (4 x 32 x 1 panels of 6 points), to 1e-9', () => {
    const pop: BinaryPopulation = { ...flatCountPopulation, zMin: 0.05, zMax: 3, qMin: 0.1, density: (z, x, q) => Math.exp(-z) * Math.pow(10, -0.3 * (x - 8)) * Math.pow(q, -0.5) };
    const freqs = [1, 2, 4, 9, 20].map((k) => k / T);
    const a = finiteBinaryBins(pop, testCosmology, freqs, T);
    const b = realisationCells(pop, testCosmology, freqs, T, { threshold: 0 }).bins;
    for (let k = 0; k < freqs.length; k++) {
      expect(Math.abs(a.expectedPerBin[k] / b[k].expectedCount - 1), `count, bin ${k + 1}`).toBeLessThan(1e-9);
      expect(Math.abs(a.longResidencePerBin[k] - b[k].longResidenceCount) / b[k].expectedCount, `long count, bin ${k + 1}`).toBeLessThan(1e-9);
    }
    expect(a.longResidencePerBin[0] / a.expectedPerBin[0]).toBeGreaterThan(0.05);
  });
});

describe('longResidenceShare on the demo sheet', () => {
  const sheet = loadDemo();
  sheet.setCell({ name: 'share_test', formula: 'longResidenceShare(pop, freqs, array_span)' });
  const state = sheet.state('share_test');

  it('gives one share per bin, in [0, 1], falling with frequency (tau proportional to f^(-8/3), Peters 1964)', () => {
    if (state.status !== 'value') throw new Error(JSON.stringify(state));
    const s = ((state.value as Matrix).toArray() as number[]).map(Number);
    expect(s.length).toBe(40);
    for (let k = 0; k < s.length; k++) {
      expect(s[k]).toBeGreaterThanOrEqual(0);
      expect(s[k]).toBeLessThanOrEqual(1);
      if (k > 0) expect(s[k]).toBeLessThanOrEqual(s[k - 1] + 1e-12);
    }
    // The lowest bin is flagged: light binaries dominate its count (the finding, checked here
    // from the closed-form residence time: 1e6 Msun at 2 nHz needs far longer than a Hubble time).
    expect(circularResidenceTime(2.26e-9, chirpMassFromTotal(1e6 * M_SUN_KG, 1))).toBeGreaterThan(testCosmology.ageS(0));
    expect(s[0]).toBeGreaterThan(0.5);
  });

  it('refuses a span that is not a time, naming the argument', () => {
    sheet.setCell({ name: 'bad_share', formula: 'longResidenceShare(pop, freqs, 3 kg)' });
    const bad = sheet.state('bad_share');
    expect(bad.status).toBe('error');
    expect(JSON.stringify(bad)).toMatch(/span of longResidenceShare/);
  });
});
