import { describe, expect, it } from 'vitest';
import jStat from 'jstat';
import { centralIntervalSigmas, erfc, normalCdf, normalQuantile, probabilityWithinSigmas } from '../../src/statistics/normal';
import { expectClose, reference } from './reference';

describe('standard normal', () => {
  it('two-sided 90% point is 1.6449 (Abramowitz & Stegun 1964, table 26.1)', () => {
    expect(centralIntervalSigmas(0.9)).toBeCloseTo(1.6449, 4);
  });
  it('P(1.96) = 0.9750021 (Abramowitz & Stegun 1964, table 26.1)', () => {
    expect(normalCdf(1.96)).toBeCloseTo(0.9750021, 7);
  });
  it('68.27% central interval is 1 sigma; 2 sigma holds 95.45% (Abramowitz & Stegun 1964, table 26.1: P(1) = 0.8413447, P(2) = 0.9772499)', () => {
    expect(centralIntervalSigmas(0.6827)).toBeCloseTo(1.0, 3);
    expect(probabilityWithinSigmas(1)).toBeCloseTo(2 * 0.8413447 - 1, 6);
    expect(probabilityWithinSigmas(2)).toBeCloseTo(2 * 0.9772499 - 1, 6);
  });
  it('quantile matches scipy.stats.norm.ppf to 1e-13 (fixture)', () => {
    const f = reference.normal_ppf;
    f.p.forEach((p: number, i: number) => expectClose(normalQuantile(p), f.value[i], 1e-13, `Phi^-1(${p})`));
  });
  it('cdf matches scipy.stats.norm.cdf to 1e-13 relative (fixture), deep into both tails', () => {
    const f = reference.normal_cdf;
    f.z.forEach((z: number, i: number) => expectClose(normalCdf(z), f.value[i], 1e-13, `Phi(${z})`));
  });
  it('agrees with jstat 1.9.6 normal.inv and normal.cdf (independent library)', () => {
    for (const p of [0.001, 0.02, 0.16, 0.5, 0.77, 0.99]) expect(normalQuantile(p)).toBeCloseTo(jStat.normal.inv(p, 0, 1), 9);
    for (const z of [-4, -1.2, 0.3, 2.2]) expectClose(normalCdf(z), jStat.normal.cdf(z, 0, 1), 1e-9, `jstat cdf ${z}`);
  });
  it('quantile inverts cdf (round trip; z <= 1, where Phi(z) keeps its digits in double precision)', () => {
    for (let z = -8; z <= 1; z += 0.37) expect(normalQuantile(normalCdf(z))).toBeCloseTo(z, 9);
  });
  it('special values: erfc(0) = 1, Phi(0) = 1/2, quantile ends and NaN', () => {
    expect(erfc(0)).toBe(1);
    expect(normalCdf(0)).toBe(0.5);
    expect(normalQuantile(0)).toBe(-Infinity);
    expect(normalQuantile(1)).toBe(Infinity);
    expect(normalQuantile(1.2)).toBeNaN();
    expect(normalQuantile(NaN)).toBeNaN();
    expect(normalCdf(-40)).toBe(0);
    expect(normalCdf(40)).toBe(1);
  });
});
