// Time a bound binary takes from the hard-binary separation to coalescence, hardened by stars
// (da/dt = -G rho H a^2 / sigma, Quinlan 1996, New Astron. 1, 35) and by GW emission (circular,
// da/dt = -(64/5) G^3 m1 m2 M / (c^5 a^3), Peters 1964, Phys. Rev. 136, B1224, eq. 5.6):
//   T = Int_0^{a_h} da / (A a^2 + B a^-3) = I(a_h / a_t) / (A a_t),  a_t = (B / A)^(1/5),
//   I(X) = Int_0^X x^3 / (1 + x^5) dx,
// with A = G rho H / sigma, B = (64/5) G^3 m1 m2 M / c^5. Optionally the dynamical-friction phase that
// brings the lighter black hole from a start radius to a_h is added before it (dynamicalFriction.ts, in
// the singular isothermal sphere of the same sigma). The eccentricity is not modelled (docs/orbits.md).
import { C_SI, G_SI } from './constants';
import { frictionTime, type FrictionPhase } from './dynamicalFriction';
import { compositeNodes } from './gaussLegendre';
import { checkEnvironment, type MassEnvironment, type StellarEnvironment } from './stellarHardening';

/** Separation at which the binary becomes hard, m: a_h = G m2 / (4 sigma^2), m2 the lighter mass (Quinlan 1996). */
export function hardSeparation(m2Kg: number, sigmaMS: number): number {
  return (G_SI * m2Kg) / (4 * sigmaMS * sigmaMS);
}

// 2 panels of 16 Gauss-Legendre points on [0, 1]: the integrands below are analytic on a neighbourhood of
// [0, 1] (their nearest poles, the fifth roots of -1, lie 0.59 from the interval), so this is exact to rounding.
const UNIT = compositeNodes(0, 1, 2, 16);

/** Int_0^t x^3 / (1 + x^5) dx for 0 <= t <= 1. */
function lowPart(t: number): number {
  let s = 0;
  for (let i = 0; i < UNIT.nodes.length; i++) {
    const x = t * UNIT.nodes[i];
    s += UNIT.weights[i] * ((x * x * x) / (1 + x * x * x * x * x));
  }
  return s * t;
}

/** I(1), the same sum every time. */
const LOW_PART_AT_ONE = lowPart(1);

/** Int_0^X x^3 / (1 + x^5) dx for X >= 0 (for X > 1 via y = 1/x: I(1) + Int_{1/X}^1 dy / (1 + y^5)). */
export function hardeningIntegral(X: number): number {
  if (!(X >= 0)) throw new RangeError(`hardening integral needs X >= 0, got ${X}`);
  if (X <= 1) return lowPart(X);
  const lo = 1 / X;
  let s = 0;
  for (let i = 0; i < UNIT.nodes.length; i++) {
    const y = lo + (1 - lo) * UNIT.nodes[i];
    s += UNIT.weights[i] / (1 + y * y * y * y * y);
  }
  return LOW_PART_AT_ONE + s * (1 - lo);
}

const G_CUBED = G_SI ** 3;
const C_FIFTH = C_SI ** 5;

/** Time from separation a0 to coalescence under stars and GW emission, s (formula at the top). */
export function hardeningTime(mKg: number, q: number, env: StellarEnvironment, a0M: number): number {
  checkEnvironment(env);
  if (!(mKg > 0 && Number.isFinite(mKg))) throw new RangeError(`total mass must be positive and finite, got ${mKg} kg`);
  if (!(q > 0 && q <= 1)) throw new RangeError(`mass ratio must lie in (0, 1], got ${q}`);
  if (!(a0M >= 0 && Number.isFinite(a0M))) throw new RangeError(`starting separation must be finite and >= 0, got ${a0M} m`);
  const m1 = mKg / (1 + q);
  const m2 = mKg - m1;
  const A = (G_SI * env.densityKgM3 * env.hardeningRate) / env.dispersionMS;
  const B = ((64 / 5) * G_CUBED * m1 * m2 * mKg) / C_FIFTH;
  const aT = Math.pow(B / A, 0.2);
  return hardeningIntegral(a0M / aT) / (A * aT);
}

/** Lifetime from the hard-binary separation G m2 / (4 sigma^2) to coalescence, s. */
export function hardBinaryLifetime(mKg: number, q: number, env: StellarEnvironment): number {
  const m2 = mKg - mKg / (1 + q);
  return hardeningTime(mKg, q, env, hardSeparation(m2, env.dispersionMS));
}

/**
 * Time the lighter black hole m2 takes to sink by dynamical friction from the phase's start radius to the
 * hard-binary separation G m2 / (4 sigma^2), s (Chandrasekhar's drag in a singular isothermal sphere; 0 when
 * it starts inside a_h).
 */
export function frictionPhaseTime(mKg: number, q: number, env: StellarEnvironment, friction: FrictionPhase): number {
  const m2 = mKg - mKg / (1 + q);
  return frictionTime(m2, env.dispersionMS, friction.startRadiusM, hardSeparation(m2, env.dispersionMS), friction.coulombLog);
}

/**
 * The lifetime of each binary in a mass-scaled environment, as a function of (log10 M/Msun, q), s: the
 * hardening time from a_h, plus the dynamical-friction time to a_h when a friction phase is given.
 */
export function lifetimeFunction(env: MassEnvironment, mSunKg: number, friction?: FrictionPhase): (log10M: number, q: number) => number {
  // callers run through the mass ratios of one mass at a time: its environment is kept
  let lastM = NaN;
  let local: StellarEnvironment | undefined;
  return (log10M, q) => {
    const m = Math.pow(10, log10M) * mSunKg;
    if (m !== lastM || !local) {
      local = env.ofMass(m);
      lastM = m;
    }
    const hard = hardBinaryLifetime(m, q, local);
    return friction ? hard + frictionPhaseTime(m, q, local, friction) : hard;
  };
}
