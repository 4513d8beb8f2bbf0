import { describe, expect, it } from 'vitest';
import { thermodynamicEvidence, logBayesFactor, temperatureLadder } from '../../src/statistics/thermodynamicEvidence';
import { seededRandom } from '../../src/statistics/prng';

// Two models for one 2-D datum y = (1, 0.5) with Gaussian noise s = 0.5 (invented):
// prior x ~ N(0, s0^2 I) with s0 = 3 (model A) or s0 = 1 (model B). The evidence is the density
// of y under N(0, (s0^2 + s^2) I) (conjugate normal model, e.g. Gelman et al. 2013, Bayesian Data
// Analysis, 3rd ed., sec. 2.5), so ln B_AB is known in closed form.
const Y = [1, 0.5];
const S = 0.5;
const logLike = (x: Float64Array) => {
  let q = 0;
  for (let i = 0; i < 2; i++) q += (x[i] - Y[i]) ** 2;
  return -q / (2 * S * S) - Math.log(2 * Math.PI * S * S);
};
const analyticLogZ = (s0: number) => {
  const v = s0 * s0 + S * S;
  return -(Y[0] ** 2 + Y[1] ** 2) / (2 * v) - Math.log(2 * Math.PI * v);
};

async function evidence(s0: number, seed: number) {
  const rng = seededRandom(seed + 1000);
  const start = Array.from({ length: 16 }, () => Float64Array.of(s0 * rng.normal(), s0 * rng.normal()));
  return thermodynamicEvidence({
    walkers: 16,
    steps: 1500,
    seed,
    rungs: 17,
    start,
    logPrior: (x) => -(x[0] * x[0] + x[1] * x[1]) / (2 * s0 * s0), // unnormalised: the estimate does not need the constant
    logLikelihood: (pts) => Float64Array.from(pts, logLike),
  });
}

describe('evidence by thermodynamic integration (Lartillot & Philippe 2006, Syst. Biol. 55, 195)', () => {
  it('ladder (i/n)^5 from 0 to 1 (Friel & Pettitt 2008, J. R. Stat. Soc. B 70, 589)', () => {
    const l = temperatureLadder(5);
    expect(Array.from(l)).toEqual([0, 0.25 ** 5, 0.5 ** 5, 0.75 ** 5, 1]);
  });
  it('ln Z of each model and the Bayes factor match the conjugate-normal closed form within 3 reported errors, errors below 0.1', async () => {
    const a = await evidence(3, 21);
    const b = await evidence(1, 22);
    for (const [name, est, s0] of [['A', a, 3], ['B', b, 1]] as const) {
      const want = analyticLogZ(s0);
      expect(est.error, `model ${name}`).toBeLessThan(0.1);
      expect(Math.abs(est.logEvidence - want), `model ${name}: ln Z ${est.logEvidence} +- ${est.error}, want ${want}`).toBeLessThan(3 * est.error);
    }
    const bf = logBayesFactor(a, b);
    const want = analyticLogZ(3) - analyticLogZ(1);
    expect(Math.abs(bf.logBayesFactor - want), `ln B ${bf.logBayesFactor} +- ${bf.error}, want ${want}`).toBeLessThan(3 * bf.error);
  });
});
