// The orbits and array sections of the demo sheet (examples/demo.json, an invented scenario) against
// laws that hold whatever the invented numbers are.
import { describe, expect, it } from 'vitest';
import type { Matrix } from 'mathjs';
import { C_SI, G_SI, M_SUN_KG } from '../../src/physics/constants';
import type { SpectrumValue } from '../../src/builtins/spectrumValue';
import { loadDemo, siValues } from '../physics/demoSheet';
import { siOf } from '../physics/sheetHelpers';

const sheet = loadDemo();
const value = (name: string): unknown => {
  const s = sheet.state(name);
  if (s.status !== 'value') throw new Error(`demo cell ${name} has no value: ${JSON.stringify(s)}`);
  return s.value;
};
const plain = (name: string): number[] => ((value(name) as Matrix).toArray() as number[]).map(Number);

describe('demo orbits section', () => {
  it('binaries per bin of width 1/T fall as f^(-11/3) below every ISCO cut (dN/dln f proportional to f^(-8/3), Sesana, Vecchio & Colacino 2008, MNRAS 390, 192; dln f = 1/(f T)), to 1e-9', () => {
    const n = plain('binaries_per_bin');
    const f = siValues(value('freqs'));
    // The three lowest bins: (1+z) f stays below f_ISCO of the heaviest binaries (z <= 5) up to 7.3 nHz.
    expect(6 * f[2]).toBeLessThan(siOf(value('f_isco_heaviest')));
    for (const k of [1, 2]) expect(Math.abs(n[k] / n[0] / Math.pow(f[k] / f[0], -11 / 3) - 1)).toBeLessThan(1e-9);
  });

  it('the stellar-hardened spectrum lies below the GW-only one and approaches it with frequency (factor 1/(1 + (f_t/f_r)^(10/3)), Quinlan 1996, New Astron. 1, 35)', () => {
    const gw = (value('spectrum') as SpectrumValue).hc;
    const st = (value('spectrum_stellar') as SpectrumValue).hc;
    for (let k = 0; k < gw.length; k++) {
      expect(st[k]).toBeLessThan(gw[k]);
      if (k > 0) expect(st[k] / gw[k]).toBeGreaterThan(st[k - 1] / gw[k - 1]);
    }
  });

  it('f_transition equals the closed form a_t^5 = (64/5) G^2 m1 m2 M sigma / (c^5 rho H), f_t = 2 f_orb(a_t) (Quinlan 1996; Peters 1964, Phys. Rev. 136, B1224), with sigma and rho of the reference mass read from the cells, to 1e-12', () => {
    const M = siOf(value('reference_mass'));
    const q = 0.5;
    const rho = siOf(value('reference_density'));
    const sigma = siOf(value('reference_dispersion'));
    const H = Number(value('hardening_H'));
    const m1 = M / (1 + q);
    const m2 = M - m1;
    const a = Math.pow(((64 / 5) * G_SI ** 2 * m1 * m2 * M * sigma) / (C_SI ** 5 * rho * H), 1 / 5);
    const ft = (2 * Math.sqrt((G_SI * M) / a ** 3)) / (2 * Math.PI);
    expect(Math.abs(siOf(value('f_transition')) / ft - 1)).toBeLessThan(1e-12);
  });

  it('the reference host: sigma from log10 M = 8.32 + 5.64 log10(sigma / 200 km/s) (McConnell & Ma 2013, ApJ 764, 184) and rho = sigma^6 / (2 pi G^3 M^2) (isothermal sphere at r_inf = G M / sigma^2), to 1e-12', () => {
    const M = siOf(value('reference_mass'));
    const sigma = siOf(value('reference_dispersion'));
    const expected = 200e3 * Math.pow(10, (Math.log10(M / M_SUN_KG) - 8.32) / 5.64);
    expect(Math.abs(sigma / expected - 1)).toBeLessThan(1e-12);
    expect(sigma / 1e3).toBeGreaterThan(180); // above the single 180 km/s the demo used before
    const rho = siOf(value('reference_density'));
    expect(Math.abs(rho / (sigma ** 6 / (2 * Math.PI * G_SI ** 3 * M * M)) - 1)).toBeLessThan(1e-12);
  });

  it('reference_lifetime lies between the closed-form bounds T_inf - 1/(A a_h) and T_inf = pi/(5 sin(4 pi/5)) / (A a_t) (Int_0^inf x^3/(1+x^5) dx, common practice, no source), with A = G rho H / sigma (Quinlan 1996) and a_t, a_h = G m2/(4 sigma^2) from the cells', () => {
    const M = siOf(value('reference_mass'));
    const q = 0.5;
    const rho = siOf(value('reference_density'));
    const sigma = siOf(value('reference_dispersion'));
    const H = Number(value('hardening_H'));
    const m1 = M / (1 + q);
    const m2 = M - m1;
    const A = (G_SI * rho * H) / sigma;
    const aT = Math.pow(((64 / 5) * G_SI ** 3 * m1 * m2 * M) / (C_SI ** 5 * A), 1 / 5);
    const aH = (G_SI * m2) / (4 * sigma * sigma);
    const tInf = Math.PI / (5 * Math.sin((4 * Math.PI) / 5)) / (A * aT);
    const T = siOf(value('reference_lifetime'));
    expect(T).toBeLessThan(tInf);
    expect(T).toBeGreaterThan(tInf - 1 / (A * aH));
  });

  it('hardening delays (all far below binary_lifetime here) stall fewer binaries than the fixed binary_lifetime and lower A_yr less (the same binaries, shorter delays)', () => {
    expect(siOf(value('reference_lifetime'))).toBeLessThan(siOf(value('binary_lifetime')));
    expect(Number(value('stalled_share_hardened'))).toBeLessThan(Number(value('stalled_share')));
    expect(Number(value('A_yr_hardened'))).toBeGreaterThan(Number(value('A_yr_delayed')));
    expect(Number(value('A_yr_hardened'))).toBeLessThanOrEqual(Number(value('A_yr')));
  });

  it('eccentric A_yr is within 1% of the circular one: at f_yr the orbits started at 1 nHz have circularised (e falls as f^(-19/18) at small e, Peters 1964)', () => {
    const ratio = Number(value('A_yr_eccentric')) / Number(value('A_yr'));
    expect(Math.abs(ratio - 1)).toBeLessThan(1e-2);
  });

  it('the lowest bin, near the start frequency, falls below the circular spectrum, as the demo note says: power moves to higher harmonics (Enoki & Nagashima 2007, PTP 117, 241)', () => {
    const gw = (value('spectrum') as SpectrumValue).hc;
    const ecc = (value('spectrum_eccentric') as SpectrumValue).hc;
    expect(ecc[0] / gw[0]).toBeLessThan(0.9);
  });

  it('the loudest single binary of each bin is weaker than the whole background there (sum of h^2 over the expected binaries, Sesana, Vecchio & Colacino 2008)', () => {
    const h = plain('loudest_strain');
    const gw = (value('spectrum') as SpectrumValue).hc;
    for (let k = 0; k < h.length; k++) {
      expect(h[k]).toBeGreaterThan(0);
      expect(h[k]).toBeLessThan(gw[k]);
    }
  });
});

describe('demo array section', () => {
  it('the span that reaches snr_threshold is shorter than the array span exactly when the S/N at that span exceeds the threshold (S/N grows with span: common practice, no source)', () => {
    const snr = Number(value('snr'));
    const threshold = Number(value('snr_threshold'));
    const span = siOf(value('detection_span'));
    const arraySpan = siOf(value('array_span'));
    expect(snr > threshold).toBe(span < arraySpan);
  });

  it('an edit of rate_norm reaches snr, detection_span and the finite-number cells (h_c^2 and counts linear in the rate, Phinney 2001; Sesana, Vecchio & Colacino 2008)', () => {
    const s = loadDemo();
    const before = plain('binaries_per_bin')[0];
    const snrBefore = Number(value('snr'));
    s.updateCell('rate_norm', { formula: '2.4e-3 Mpc^-3 Gyr^-1' });
    const after = (((s.state('binaries_per_bin') as { value: Matrix }).value.toArray() as number[]).map(Number))[0];
    expect(Math.abs(after / before - 2)).toBeLessThan(1e-9);
    const snrAfter = Number((s.state('snr') as { value: unknown }).value);
    expect(snrAfter).toBeGreaterThan(snrBefore);
    expect(s.state('detection_span').status).toBe('value');
  });
});
