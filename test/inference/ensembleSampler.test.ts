import { describe, expect, it } from 'vitest';
import { runEnsemble, stretchFactor, parameterSeries, type EnsembleOptions } from '../../src/statistics/ensembleSampler';
import { diagnoseRun } from '../../src/statistics/chainDiagnostics';
import { seededRandom } from '../../src/statistics/prng';

// Correlated 2-D Gaussian target (invented): means (1, -2), sds (1, 3), correlation 0.8.
const MU = [1, -2];
const SD = [1, 3];
const RHO = 0.8;
function gaussLogL(x: Float64Array): number {
  const a = (x[0] - MU[0]) / SD[0];
  const b = (x[1] - MU[1]) / SD[1];
  return -(a * a - 2 * RHO * a * b + b * b) / (2 * (1 - RHO * RHO));
}
function startBall(walkers: number, dim: number, seed: number): Float64Array[] {
  const rng = seededRandom(seed);
  return Array.from({ length: walkers }, () => Float64Array.from({ length: dim }, () => rng.normal()));
}
const batch = (f: (x: Float64Array) => number) => (pts: Float64Array[]) => Float64Array.from(pts, f);

function gaussianRun(extra: Partial<EnsembleOptions> = {}) {
  return runEnsemble({
    walkers: 16,
    steps: 8000,
    seed: 7,
    start: startBall(16, 2, 1),
    logPrior: () => 0,
    logLikelihood: batch(gaussLogL),
    ...extra,
  });
}

describe('stretch move', () => {
  it('z has the density g(z) ~ 1/sqrt(z) on [1/a, a]: cdf (sqrt z - a^-1/2)/(a^1/2 - a^-1/2) (Goodman & Weare 2010, Commun. Appl. Math. Comput. Sci. 5, 65, sec. 3)', () => {
    const a = 2;
    for (const u of [0, 0.1, 0.37, 0.5, 0.9, 1]) {
      const z = stretchFactor(u, a);
      const cdf = (Math.sqrt(z) - 1 / Math.sqrt(a)) / (Math.sqrt(a) - 1 / Math.sqrt(a));
      expect(Math.abs(cdf - u), `u=${u} z=${z}`).toBeLessThan(1e-14);
    }
  });
});

describe('ensemble sampler on a correlated 2-D Gaussian (closed-form moments)', () => {
  it('mean, variances and covariance agree with the truth within 4 Monte Carlo errors from the ESS; R-hat < 1.01', async () => {
    const chain = await gaussianRun();
    const burnIn = 2000;
    const diag = diagnoseRun(chain, ['x', 'y'], burnIn);
    const xs = parameterSeries(chain, 0, burnIn).flatMap((s) => Array.from(s));
    const ys = parameterSeries(chain, 1, burnIn).flatMap((s) => Array.from(s));
    const n = xs.length;
    const mx = xs.reduce((s, v) => s + v, 0) / n;
    const my = ys.reduce((s, v) => s + v, 0) / n;
    let vx = 0, vy = 0, cxy = 0;
    for (let i = 0; i < n; i++) {
      vx += (xs[i] - mx) ** 2;
      vy += (ys[i] - my) ** 2;
      cxy += (xs[i] - mx) * (ys[i] - my);
    }
    vx /= n - 1; vy /= n - 1; cxy /= n - 1;
    const essX = diag.parameters[0].ess;
    const essY = diag.parameters[1].ess;
    const ess = Math.min(essX, essY);
    // Monte Carlo errors of normal moments: var(mean) = s^2/ESS, var(s^2) = 2 s^4/ESS,
    // var(cov) = s1^2 s2^2 (1 + rho^2)/ESS (e.g. Anderson 2003, An Introduction to Multivariate Statistical Analysis, 3rd ed., sec. 3.3).
    const checks: Array<[string, number, number, number]> = [
      ['mean x', mx, MU[0], SD[0] / Math.sqrt(essX)],
      ['mean y', my, MU[1], SD[1] / Math.sqrt(essY)],
      ['var x', vx, SD[0] ** 2, SD[0] ** 2 * Math.sqrt(2 / essX)],
      ['var y', vy, SD[1] ** 2, SD[1] ** 2 * Math.sqrt(2 / essY)],
      ['cov', cxy, RHO * SD[0] * SD[1], SD[0] * SD[1] * Math.sqrt((1 + RHO * RHO) / ess)],
    ];
    for (const [what, got, want, err] of checks) {
      expect(Math.abs(got - want), `${what}: got ${got}, want ${want}, MC error ${err}`).toBeLessThan(4 * err);
    }
    for (const p of diag.parameters) expect(p.rhat).toBeLessThan(1.01);
    expect(diag.verdict, diag.reasons.join('; ')).toBe('converged');
    expect(diag.acceptance).toBeGreaterThan(0.2);
    expect(diag.acceptance).toBeLessThan(0.9);
  });

  it('a run of 60 steps from a far-off start is judged "run longer", with the reason named', async () => {
    const chain = await gaussianRun({ steps: 60, start: startBall(16, 2, 2).map((p) => p.map((v) => 50 + 0.01 * v)) });
    const diag = diagnoseRun(chain, ['x', 'y']);
    expect(diag.verdict).toBe('run longer');
    expect(diag.reasons.join('\n')).toMatch(/^(x|y): /m);
  });
});

describe('seeds', () => {
  it('the same seed reproduces a run exactly whatever the batching of evaluations (1 worker or several)', async () => {
    const a = await gaussianRun({ steps: 200 });
    // Several "workers": the batch split into chunks answered out of order.
    const chunked = async (pts: Float64Array[]) => {
      const parts = [0, 1, 2].map((w) => pts.filter((_, i) => i % 3 === w));
      const answers = await Promise.all(parts.map((p, w) => (async () => {
        for (let i = 0; i < 3 - w; i++) await Promise.resolve(); // later chunks answer first
        return p.map(gaussLogL);
      })()));
      const out = new Float64Array(pts.length);
      pts.forEach((_, i) => (out[i] = answers[i % 3][Math.floor(i / 3)]));
      return out;
    };
    const b = await gaussianRun({ steps: 200, logLikelihood: chunked });
    expect(Buffer.from(b.positions.buffer).equals(Buffer.from(a.positions.buffer))).toBe(true);
    expect(Array.from(b.accepted)).toEqual(Array.from(a.accepted));
    const c = await gaussianRun({ steps: 200, seed: 8 });
    expect(Buffer.from(c.positions.buffer).equals(Buffer.from(a.positions.buffer))).toBe(false);
  });
});

describe('zero and failing likelihoods', () => {
  it('NaN counts as zero likelihood and is reported with an example point; walkers never enter it', async () => {
    const chain = await gaussianRun({ steps: 200, logLikelihood: batch((x) => (x[0] > 2.5 ? NaN : gaussLogL(x))) });
    expect(chain.failures).toBeGreaterThan(0);
    expect(chain.failurePoint![0]).toBeGreaterThan(2.5);
    for (let i = 0; i < chain.positions.length; i += 2) expect(chain.positions[i]).toBeLessThanOrEqual(2.5);
  });
  it('all walkers outside the prior support is an error', async () => {
    await expect(gaussianRun({ logPrior: () => -Infinity })).rejects.toThrow(/every walker starts where the prior or the likelihood is zero/);
  });
  it('bad sizes are refused with the number wanted', async () => {
    await expect(gaussianRun({ walkers: 3 })).rejects.toThrow(/even whole number of at least 4/);
    await expect(gaussianRun({ walkers: 4, start: startBall(4, 3, 1) })).rejects.toThrow(/at least twice as many walkers as parameters \(6 for 3\)/);
  });
});
