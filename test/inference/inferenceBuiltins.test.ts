import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { lognormalDistribution, normalDistribution, truncatedDistribution } from '../../src/statistics/distributions';
import { amplitudeLogLikelihood } from '../../src/statistics/amplitudeLikelihood';
import { measurementFromInterval, measurementFromLog10 } from '../../src/statistics/measurement';
import { Sheet } from '../../src/sheet/sheet';

const ref = JSON.parse(readFileSync(new URL('../reference/inference_reference.json', import.meta.url), 'utf8'));

describe('truncated priors against scipy.stats.truncnorm (test/reference/generate_inference.py)', () => {
  for (const c of ref.truncated) {
    it(`${c.family} ${c.p !== undefined ? `quantile p = ${c.p}` : `density x = ${c.x}`}: ${c.call} (scipy ${ref.version})`, () => {
      const base = c.family === 'normal' ? normalDistribution(c.mean, c.sd) : lognormalDistribution(c.median, c.sigmaDex);
      const d = truncatedDistribution(base, c.lo, c.hi);
      const got = c.p !== undefined ? d.quantile(c.p) : d.density(c.x);
      const want = c.p !== undefined ? c.quantile : c.density;
      expect(Math.abs(got / want - 1), `got ${got}, want ${want}`).toBeLessThan(1e-9);
    });
  }
  it('outside the bounds the density is zero and samples stay inside', () => {
    const d = truncatedDistribution(normalDistribution(0.7, 0.3), 0.5, 1.5);
    expect(d.density(0.49)).toBe(0);
    expect(d.density(1.51)).toBe(0);
    expect(d.support).toEqual([0.5, 1.5]);
  });
});

describe('likelihood of a measured amplitude', () => {
  it('log-normal measurement: ln L = -t^2/2 - ln(sigma sqrt(2 pi)) (normal density in log10 A)', () => {
    const m = measurementFromLog10(-14.6, 0.2);
    expect(amplitudeLogLikelihood(m, 10 ** -14.6)).toBeCloseTo(-Math.log(0.2 * Math.sqrt(2 * Math.PI)), 12);
    expect(amplitudeLogLikelihood(m, 10 ** -14.2) - amplitudeLogLikelihood(m, 10 ** -14.6)).toBeCloseTo(-2, 12);
    expect(amplitudeLogLikelihood(m, 0)).toBe(-Infinity);
  });
  it('an asymmetric interval uses the width of each side', () => {
    const m = measurementFromInterval(2e-15, 1e-15, 5e-15, 0.9);
    const above = amplitudeLogLikelihood(m, 5e-15);
    expect(above).toBeCloseTo(-0.5 * 1.6448536269514722 ** 2 - Math.log(m.sigmaHighDex * Math.sqrt(2 * Math.PI)), 10); // 90% -> 1.6449 sigma (A&S 1964, table 26.1)
  });
  it('as cells: amplitudeLogLikelihood and truncatedDist, with argument errors naming the function', () => {
    const s = new Sheet({
      cells: [
        { name: 'meas', formula: 'measuredLog10Amplitude(-14.6, 0.2)' },
        { name: 'lnL', formula: 'amplitudeLogLikelihood(10^-14.6, meas)' },
        { name: 'bad', formula: 'amplitudeLogLikelihood(-1, meas)' },
        { name: 'd', formula: 'truncatedDist(lognormalDist(1e-3 Mpc^-3 Gyr^-1, 0.3), 1e-4 Mpc^-3 Gyr^-1, Infinity)' },
        { name: 'dBad', formula: 'truncatedDist(lognormalDist(1e-3 Mpc^-3 Gyr^-1, 0.3), 1e-4, 1)' },
      ],
    });
    expect(s.value('lnL') as number).toBeCloseTo(-Math.log(0.2 * Math.sqrt(2 * Math.PI)), 12);
    const err = (n: string) => {
      const st = s.state(n);
      return st.status === 'error' ? st.error.message : '';
    };
    expect(err('bad')).toMatch(/argument predicted of amplitudeLogLikelihood must be an amplitude >= 0, got -1/);
    expect((s.value('d') as { describe(): string }).describe()).toMatch(/log-normal, median 0.001 Mpc\^-3 Gyr\^-1, 0.3 dex, truncated to 0.0001 to inf/);
    expect(err('dBad')).toMatch(/argument lo of truncatedDist must be in the unit of the distribution/);
  });
});
