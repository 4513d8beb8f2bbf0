import { describe, expect, it } from 'vitest';
import { binTensions, strainAtFrequency } from '../../src/statistics/binnedComparison';
import { binsFromRows } from '../../src/statistics/binnedSpectrum';
import { F_YR_HZ, KM_S_MPC_SI } from '../../src/physics/constants';

// Model: h_c = A (f/f_yr)^(-2/3) (Phinney 2001) on 30 frequencies k/T, T = 12 yr (invented).
const T = 12 / F_YR_HZ;
const f = Float64Array.from({ length: 30 }, (_, k) => (k + 1) / T);
const A = 2e-15;
const hcOf = (x: number) => A * (x / F_YR_HZ) ** (-2 / 3);
const hc = f.map(hcOf);

describe('model spectrum against per-bin values', () => {
  it('log-log interpolation is exact for a power law between grid points', () => {
    const x = 2.37 / T;
    expect(strainAtFrequency(f, hc, x) / hcOf(x)).toBeCloseTo(1, 12);
  });
  it('tension 0 at the value, +1.6449 at the upper 90% end (Abramowitz & Stegun 1964, table 26.1), 0 below an upper limit', () => {
    const x1 = 3.5 / T;
    const x2 = 7 / T;
    const x3 = 11 / T;
    const bins = binsFromRows(
      [
        [x1, hcOf(x1), hcOf(x1) / 2, hcOf(x1) * 2],
        [x2, hcOf(x2) / 10 ** 0.2, hcOf(x2) / 10 ** 0.5, hcOf(x2)], // the model sits on the upper end
        [x3, hcOf(x3) * 3, 0, hcOf(x3) * 5], // an upper limit above the model
      ],
      'hc',
      0.9,
    );
    const r = binTensions(f, hc, bins);
    expect(r.tension[0]).toBeCloseTo(0, 12);
    expect(r.tension[1]).toBeCloseTo(1.6449, 4);
    expect(r.tension[2]).toBe(0);
    expect(r.chiSquare).toBeCloseTo(1.6448536 ** 2, 5);
    expect(r.bins).toBe(3);
  });
  it('Omega_gw and residual-power bins: the model converted by 2 pi^2 f^2 h_c^2/(3 H0^2) and h_c^2/(12 pi^2 f^3) worked by hand', () => {
    const h0 = 70 * KM_S_MPC_SI;
    const x = 5 / T;
    const omega = (2 * Math.PI ** 2 * x * x * hcOf(x) ** 2) / (3 * h0 * h0);
    const power = hcOf(x) ** 2 / (12 * Math.PI ** 2 * x ** 3);
    const ro = binTensions(f, hc, binsFromRows([[x, omega, omega / 3, omega * 3]], 'omegaGw', 0.68), h0);
    const rp = binTensions(f, hc, binsFromRows([[x, power, power / 3, power * 3]], 'residualPower', 0.68));
    expect(ro.tension[0]).toBeCloseTo(0, 10);
    expect(rp.tension[0]).toBeCloseTo(0, 10);
  });
  it('refuses bins outside the model grid and Omega_gw bins without H0', () => {
    expect(() => binTensions(f, hc, binsFromRows([[50 / T, 1e-15, 5e-16, 2e-15]], 'hc', 0.9))).toThrow(/lies outside the model spectrum/);
    expect(() => binTensions(f, hc, binsFromRows([[5 / T, 1e-9, 5e-10, 2e-9]], 'omegaGw', 0.9))).toThrow(/need H0/);
  });
});
