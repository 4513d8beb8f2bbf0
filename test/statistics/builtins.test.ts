// The statistics built-ins through the sheet: values, units and error messages naming the argument.
import { describe, expect, it } from 'vitest';
import jStat from 'jstat';
import { Sheet } from '../../src/sheet/sheet';
import type { CellSpec } from '../../src/sheet/types';
import { F_YR_HZ, KM_S_MPC_SI } from '../../src/physics/constants';
import { seededRandom } from '../../src/statistics/prng';
import type { DistributionObject } from '../../src/builtins/statisticsObjects';

function evaluate(cells: CellSpec[]): Sheet {
  return new Sheet({ cells });
}
function errorOf(sheet: Sheet, name: string): string {
  const st = sheet.state(name);
  if (st.status !== 'error') throw new Error(`${name} has no error: ${JSON.stringify(st)}`);
  return st.error.message;
}
function num(sheet: Sheet, name: string): number {
  const v = sheet.value(name);
  if (typeof v === 'number') return v;
  if (v && typeof v === 'object' && 'value' in v) return (v as { value: number }).value;
  throw new Error(`${name} is not a number: ${JSON.stringify(sheet.state(name))}`);
}

describe('measurement and comparison built-ins', () => {
  // Invented measurement for an invented array.
  const sheet = evaluate([
    { name: 'meas', formula: 'measuredAmplitude(3e-15, 2e-15, 4.5e-15, 90%)' },
    { name: 'plus_minus', formula: 'measuredAmplitudePlusMinus(3e-15, 1e-15, 0.68)' },
    { name: 'log_meas', formula: 'measuredLog10Amplitude(-14.5, 0.1)' },
    { name: 'pred', formula: '4.5e-15' },
    { name: 'tension', formula: 'tensionSigma(pred, meas)' },
    { name: 'ratio', formula: 'amplitudeRatio(pred, meas)' },
    { name: 'rel_like', formula: 'measuredLikelihood(pred, meas)' },
    { name: 'cmp', formula: 'compareToMeasured(pred, meas)' },
    { name: 'pct', formula: 'partOf(cmp, "percentile")' },
    { name: 'inside', formula: 'insideProbability(3e-15, 0, meas)' },
    { name: 'moved', formula: 'amplitudeAtFrequency(2e-15, 10 nHz)' },
    { name: 'moved_meas', formula: 'amplitudeAtFrequency(meas, 10 nHz)' },
    { name: 'omega', formula: 'omegaGwAt(2e-15, 1/(1 yr), 70 km/s/Mpc)' },
    { name: 'rate', formula: '1e-3 Mpc^-3 Gyr^-1' },
    { name: 'allowed', formula: 'allowedRate(rate, 1.5e-15, meas)' },
    { name: 'allowed_median', formula: 'partOf(allowed, "median")' },
    { name: 'today', formula: 'rate * 2.5' },
    { name: 'allowed_d', formula: 'allowedRate(rate, 1.5e-15, meas, today)' },
    { name: 'density_upper', formula: 'partOf(allowed_d, "densityUpper")' },
  ]);
  it('the upper 90% end is +1.6449 sigma (Abramowitz & Stegun 1964, table 26.1), at the 95th percentile', () => {
    expect(num(sheet, 'tension')).toBeCloseTo(1.6449, 4);
    expect(num(sheet, 'ratio')).toBeCloseTo(1.5, 12);
    expect(num(sheet, 'rel_like')).toBeCloseTo(Math.exp(-0.5 * 1.6448536 ** 2), 6);
    expect(num(sheet, 'pct')).toBeCloseTo(0.95, 10);
    expect(num(sheet, 'inside')).toBe(1);
  });
  it('describes itself in one line', () => {
    expect((sheet.value('meas') as { describe(): string }).describe()).toBe('measured A = 3e-15 (2e-15 to 4.5e-15, 90%) at 1/yr, gamma 13/3');
    expect((sheet.value('cmp') as { describe(): string }).describe()).toMatch(/predicted\/measured = 1.5, 1.64 sigma high, inside the 90% interval/);
  });
  it('conversions: (10 nHz / f_yr)^(-2/3) (Phinney 2001) and Omega_gw = 2 pi^2 f^2 A^2 / (3 H0^2) (Thrane & Romano 2013)', () => {
    expect(num(sheet, 'moved') / (2e-15 * (10e-9 / F_YR_HZ) ** (-2 / 3))).toBeCloseTo(1, 12);
    const h0 = 70 * KM_S_MPC_SI;
    expect(num(sheet, 'omega') / ((2 * Math.PI ** 2 * F_YR_HZ ** 2 * 4e-30) / (3 * h0 * h0))).toBeCloseTo(1, 10);
    expect((sheet.value('moved_meas') as { describe(): string }).describe()).toMatch(/at 10 nHz/);
  });
  it('allowed rate: rate (A_meas / A_pred)^2 in the rate unit', () => {
    expect(num(sheet, 'allowed_median') / num(sheet, 'rate')).toBeCloseTo(4, 10);
    expect((sheet.value('allowed_median') as { formatUnits(): string }).formatUnits()).toBe('Mpc^-3 Gyr^-1');
    // A density proportional to the rate scales the same way: 2.5 x rate x (4.5/1.5)^2.
    expect(num(sheet, 'density_upper') / (2.5 * num(sheet, 'rate') * 9)).toBeCloseTo(1, 10);
  });
});

describe('bad arguments give errors naming the function and argument', () => {
  const cases: Array<[string, RegExp]> = [
    ['measuredAmplitude(3e-15, 3.5e-15, 4.5e-15, 90%)', /argument lower of measuredAmplitude: lower end 3.5e-15 must be below the median/],
    ['measuredAmplitude(3e-15, 2e-15, 2.5e-15, 90%)', /argument upper of measuredAmplitude: upper end .* must be above/],
    ['measuredAmplitude(3e-15, 2e-15, 4.5e-15, 90)', /argument level of measuredAmplitude must be a fraction in \(0, 1\).*write 90%/],
    ['measuredAmplitude(3e-15, 2e-15, 4.5e-15, 0)', /argument level of measuredAmplitude must be a fraction in \(0, 1\)/],
    ['measuredAmplitude(3e-15, 2e-15, 4.5e-15)', /argument level of measuredAmplitude is required/],
    ['measuredAmplitude(3e-15, 2e-15, 4.5e-15, "90%")', /without quotes/],
    ['measuredAmplitude(3e-15, 2e-15, 4.5e-15, 90%, 13/3, 0 nHz)', /argument fRef of measuredAmplitude/],
    ['measuredLog10Amplitude(-14.5, -0.1)', /argument sigma of measuredLog10Amplitude/],
    ['normalDist(1, -1)', /argument sd of normalDist: sd must be positive/],
    ['normalDist(1 Mpc, 1 Msun)', /argument sd of normalDist has unit Msun, which does not match Mpc of mean/],
    ['normalDist(1 Mpc, 1)', /argument sd of normalDist is a plain number but mean has unit Mpc/],
    ['lognormalDist(-1, 0.3)', /argument median of lognormalDist: median must be positive/],
    ['uniformDist(2, 1)', /argument hi of uniformDist: hi must be greater than lo/],
    ['logUniformDist(0, 1)', /argument lo of logUniformDist: lo must be positive/],
    ['omegaGwAt(2e-15, 1/(1 yr), 70)', /argument H0 of omegaGwAt needs a unit/],
    ['amplitudeAtFrequency(2e-15, 10)', /argument fNew of amplitudeAtFrequency needs a unit of frequency/],
    ['compareToMeasured(-1, measuredLog10Amplitude(-14.5, 0.1))', /argument predicted of compareToMeasured must be a positive amplitude/],
    ['compareToMeasured(1e-15, 3)', /argument measured of compareToMeasured must be a measurement/],
    ['binsFromText("f_nHz,hc,lo,hi\\n2,abc,1,3", 90%)', /binsFromText: CSV line 2, column hc: "abc" is not a number/],
    ['binsFromText(3, 90%)', /argument csv of binsFromText must be text/],
    ['binsFromTable([2 nHz, 5e-15, 6e-15, 9e-15], "hc", 90%)', /binsFromTable: row 1: lower end 6e-15 is above the value 5e-15/],
    ['binsFromTable([2, 5e-15, 3e-15, 9e-15], "hc", 90%)', /argument rows\[1\] frequency of binsFromTable needs a unit of frequency/],
    ['binsFromTable(3, "hc", 90%)', /argument rows of binsFromTable must be a table/],
    ['binsFromTable([2 nHz, 5e-15, 3e-15, 9e-15], "flux", 90%)', /argument quantity of binsFromTable must be "hc", "omega_gw" or "power"/],
    ['partOf(measuredLog10Amplitude(-14.5, 0.1), "mode")', /a measurement has no part "mode"/],
    ['allowedRate(-1, 1e-15, measuredLog10Amplitude(-14.5, 0.1))', /argument rateNorm of allowedRate must be positive/],
  ];
  const sheet = evaluate(cases.map(([formula], i) => ({ name: `c${i}`, formula })));
  cases.forEach(([formula, pattern], i) => {
    it(formula, () => expect(errorOf(sheet, `c${i}`)).toMatch(pattern));
  });
});

describe('distribution and per-bin built-ins', () => {
  const sheet = evaluate([
    { name: 'd_rate', formula: 'lognormalDist(1e-3 Mpc^-3 Gyr^-1, 0.3)' },
    { name: 'q84', formula: 'distQuantile(d_rate, 0.84)' },
    { name: 'd_u', formula: 'uniformDist(1 yr, 3 yr)' },
    { name: 'bins_csv', formula: 'binsFromText("# invented\\nf_nHz,omega_gw,lo,hi\\n2.5,1e-9,5e-10,2e-9\\n5,2e-9,1e-9,4e-9", 68%)' },
    { name: 'bins_tab', formula: 'binsFromTable([2.5 nHz, 1e-9, 5e-10, 2e-9; 5 nHz, 2e-9, 1e-9, 4e-9], "omega_gw", 0.68)' },
  ]);
  it('log-normal quantile keeps the unit and equals jstat lognormal.inv with mu = ln median, sigma = 0.3 ln 10', () => {
    const perUnit = num(evaluate([{ name: 'u', formula: '1 Mpc^-3 Gyr^-1' }]), 'u');
    expect(num(sheet, 'q84') / perUnit / jStat.lognormal.inv(0.84, Math.log(1e-3), 0.3 * Math.LN10)).toBeCloseTo(1, 10);
  });
  it('samples carry the parameters\' unit and stay in range', () => {
    const d = sheet.value('d_u') as DistributionObject;
    const rng = seededRandom(1);
    const yr = 365.25 * 86400;
    for (let i = 0; i < 100; i++) {
      const s = d.sample(rng) as { value: number; formatUnits(): string };
      expect(s.formatUnits()).toBe('yr');
      expect(s.value >= yr && s.value <= 3 * yr).toBe(true);
    }
  });
  it('CSV text and a table give the same bins', () => {
    const a = (sheet.value('bins_csv') as { toJSON(): { frequencyHz: number[]; value: number[] } }).toJSON();
    const b = (sheet.value('bins_tab') as { toJSON(): { frequencyHz: number[]; value: number[] } }).toJSON();
    expect(a.value).toEqual(b.value);
    a.frequencyHz.forEach((f, i) => expect(f / b.frequencyHz[i]).toBeCloseTo(1, 12));
    expect((sheet.value('bins_csv') as { describe(): string }).describe()).toBe('Omega_gw in 2 bins, 2.5 to 5 nHz, 68% intervals');
  });
});
