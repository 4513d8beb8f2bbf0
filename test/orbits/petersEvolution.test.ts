// Peters 1964 (Phys. Rev. 136, B1224): closed-form a(e) against a direct integration of da/dt, de/dt.
// Equation numbers of Peters 1964 cited here are unverified; the formulas are eqs. 5.6, 5.7 and the a(e) closed form of that paper.
import { describe, expect, it } from 'vitest';
import {
  eccentricityAtOrbitalFrequency,
  eccentricityFromShape,
  gwEccentricityRate,
  gwSemiMajorAxisRate,
  keplerOrbitalFrequency,
  keplerSemiMajorAxis,
  petersShapeLog,
} from '../../src/physics/petersEvolution';
import { C_SI, G_SI, M_SUN_KG } from '../../src/physics/constants';
import fixture from '../reference/peters_evolution.json';

describe('eccentricity at an orbital frequency (closed form, Peters 1964 eq. 5.11, with Kepler)', () => {
  it(`agrees with scipy.integrate.solve_ivp (${fixture.library_version}) of de/dln a from the Peters rates to 1e-10 relative`, () => {
    for (const run of fixture.runs) {
      for (const p of run.points) {
        const e = eccentricityAtOrbitalFrequency(run.e0, p.frequencyRatio);
        const err = Math.abs(e / p.e - 1);
        expect(err, `e0 = ${run.e0}, f/f0 = ${p.frequencyRatio}: expected ${p.e}, got ${e}`).toBeLessThan(1e-10);
      }
    }
  });

  it(`with the shape of e0 given once, agrees with scipy.integrate.solve_ivp (${fixture.library_version}) to 1e-10 relative, and with the one-call form exactly`, () => {
    for (const run of fixture.runs) {
      if (run.e0 === 0) continue;
      const shape = petersShapeLog(run.e0);
      let guess: number | undefined;
      for (const p of run.points) {
        const e = eccentricityFromShape(run.e0, shape, p.frequencyRatio, guess);
        expect(Math.abs(e / p.e - 1), `e0 = ${run.e0}, f/f0 = ${p.frequencyRatio}`).toBeLessThan(1e-10);
        expect(e).toBe(eccentricityAtOrbitalFrequency(run.e0, p.frequencyRatio, guess));
        guess = e;
      }
    }
    expect(() => eccentricityFromShape(0.5, petersShapeLog(0.5), 0)).toThrow(/ratio f\/f0 must be positive/);
  });

  it('small-e law e proportional to f^(-19/18) (Peters 1964, eq. 5.11 at small e): local slope within 1e-6', () => {
    const e1 = eccentricityAtOrbitalFrequency(0.5, 1e8);
    const e2 = eccentricityAtOrbitalFrequency(0.5, 2e8);
    expect(Math.abs(Math.log(e2 / e1) / Math.log(2) + 19 / 18)).toBeLessThan(1e-6);
  });

  it('e0 = 0 stays circular; ratio 1 returns e0; ratios below 1 (earlier orbits) give larger e, below 1', () => {
    expect(eccentricityAtOrbitalFrequency(0, 37)).toBe(0);
    expect(eccentricityAtOrbitalFrequency(0.42, 1)).toBe(0.42);
    const back = eccentricityAtOrbitalFrequency(0.42, 0.01);
    expect(back).toBeGreaterThan(0.42);
    expect(back).toBeLessThan(1);
    // Round trip: forward from the earlier orbit returns e0 (independent use of the same closed form).
    expect(Math.abs(eccentricityAtOrbitalFrequency(back, 100) / 0.42 - 1)).toBeLessThan(1e-12);
  });

  it('rejects e0 outside [0, 1) and non-positive ratios, naming them', () => {
    expect(() => eccentricityAtOrbitalFrequency(1, 2)).toThrow(/e0 must lie in \[0, 1\), got 1/);
    expect(() => eccentricityAtOrbitalFrequency(0.5, 0)).toThrow(/ratio f\/f0 must be positive/);
    expect(() => eccentricityAtOrbitalFrequency(0.5, NaN)).toThrow(/ratio/);
  });
});

describe('GW-driven rates (Peters 1964, eqs. 5.6 and 5.7)', () => {
  it('circular inspiral time from integrating 1/|da/dt| equals (5/256) c^5 a^4 / (G^3 m1 m2 M) (Peters 1964, eq. 5.10) to 1e-9', () => {
    const m1 = 6e8 * M_SUN_KG;
    const m2 = 2e8 * M_SUN_KG;
    const a0 = keplerSemiMajorAxis(5e-9, m1 + m2);
    // Integrate dt = da / |da/dt| from a0 down to 0 in u = (a/a0)^4 (|da/dt| a^3 is constant at e = 0).
    let t = 0;
    const steps = 2000;
    for (let i = 0; i < steps; i++) {
      const u = (i + 0.5) / steps; // midpoint in u
      const a = a0 * Math.pow(u, 0.25);
      const dadu = (a0 * 0.25 * Math.pow(u, -0.75)) / steps;
      t += dadu / Math.abs(gwSemiMajorAxisRate(a, 0, m1, m2));
    }
    const closed = (5 / 256) * (C_SI ** 5 * a0 ** 4) / (G_SI ** 3 * m1 * m2 * (m1 + m2));
    expect(Math.abs(t / closed - 1)).toBeLessThan(1e-9);
  });

  it('de/da from the two rates equals the slope of the closed-form a(e) (checked by finite differences of eccentricityAtOrbitalFrequency)', () => {
    const m = 1e9 * M_SUN_KG;
    const a = keplerSemiMajorAxis(2e-9, m);
    const e = 0.6;
    const dedlna = (gwEccentricityRate(a, e, 0.5 * m, 0.5 * m) / gwSemiMajorAxisRate(a, e, 0.5 * m, 0.5 * m));
    // ln a = -(2/3) ln f at fixed mass; central difference in ln f of e(f).
    const h = 1e-5;
    const de = eccentricityAtOrbitalFrequency(e, Math.exp(h)) - eccentricityAtOrbitalFrequency(e, Math.exp(-h));
    const fd = de / (2 * h) / (-2 / 3);
    expect(Math.abs(dedlna * a / fd - 1)).toBeLessThan(1e-7);
    expect(Math.abs(keplerOrbitalFrequency(a, m) / 2e-9 - 1)).toBeLessThan(1e-14);
  });
});
