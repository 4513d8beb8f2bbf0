import { describe, expect, it } from 'vitest';
import { runInference } from '../../src/statistics/sheetInference';
import { freeParameters } from '../../src/statistics/priors';
import { normalCdf, normalQuantile } from '../../src/statistics/normal';
import { toySheet, toyAmplitude } from '../statistics/toySheet';
import { Sheet } from '../../src/sheet/sheet';

// The toy sheet (test/statistics/toySheet.ts): A_yr = sqrt(rate_norm K) (1 + slope^2), so A_yr^2 is
// linear in the rate (Phinney 2001, astro-ph/0108028). A log-normal measured amplitude, log10 A ~
// N(m, s), and a prior flat in x = log10 rate on [-5, -1] give a posterior in x that is a normal
// N(2 (m - c), 2 s) truncated to [-5, -1], c = log10 A(rate = 1) (change of variables, closed form).
const M = -14.6;
const S = 0.2;
const C = Math.log10(toyAmplitude(1));
const MU_X = 2 * (M - C);
const SD_X = 2 * S;
function truncatedNormalQuantile(p: number): number {
  const a = normalCdf((-5 - MU_X) / SD_X);
  const b = normalCdf((-1 - MU_X) / SD_X);
  return MU_X + SD_X * normalQuantile(a + p * (b - a));
}

function rateSheet(extra: Record<string, object> = {}): Sheet {
  const s = toySheet({ rate_norm: { prior: 'logUniformDist(1e-5 Mpc^-3 Gyr^-1, 1e-1 Mpc^-3 Gyr^-1)' }, ...extra });
  s.updateCell('measured', { formula: `measuredLog10Amplitude(${M}, ${S})` });
  s.setCell({ name: 'logL', formula: 'amplitudeLogLikelihood(A_yr, measured)' });
  return s;
}

describe('posterior of the rate normalisation alone (closed form)', () => {
  it('median and 68%/95% interval ends of rate_norm and of local_rate = 0.8 rate_norm match the truncated-normal quantiles within 4 Monte Carlo errors (from the ESS)', async () => {
    const sheet = rateSheet();
    const r = await runInference(sheet, { likelihood: 'logL', walkers: 8, steps: 2500, seed: 5, burnIn: 500, derived: ['local_rate'] });
    expect(r.parameters.map((p) => p.cell)).toEqual(['rate_norm']);
    expect(r.parameters[0].unit).toBe('Mpc^-3 Gyr^-1');
    expect(r.diagnostics.parameters[0].ess).toBeGreaterThan(400);
    const check = (got: number, err: number, p: number, scale: number, what: string) => {
      const want = scale * 10 ** truncatedNormalQuantile(p);
      expect(err / want, `${what}: the error must be small enough to test`).toBeLessThan(0.1);
      expect(Math.abs(got - want), `${what} at p = ${p}: got ${got} +- ${err}, want ${want}`).toBeLessThan(4 * err);
    };
    for (const [post, scale] of [[r.parameters[0], 1], [r.derived[0], 0.8]] as const) {
      const s = post.summary;
      check(s.median, s.medianError, 0.5, scale, post.cell);
      const [i68, i95] = s.intervals;
      check(i68.lower, i68.lowerError, 0.5 - i68.level / 2, scale, post.cell);
      check(i68.upper, i68.upperError, 0.5 + i68.level / 2, scale, post.cell);
      check(i95.lower, i95.lowerError, 0.5 - i95.level / 2, scale, post.cell);
      check(i95.upper, i95.upperError, 0.5 + i95.level / 2, scale, post.cell);
    }
    expect(sheet.get('rate_norm')!.formula).toBe('1e-3 Mpc^-3 Gyr^-1'); // the sheet is untouched
  }, 60_000);

  it('the same seed reproduces the run exactly; another seed does not', async () => {
    const a = await runInference(rateSheet(), { likelihood: 'logL', walkers: 8, steps: 60, seed: 9 });
    const b = await runInference(rateSheet(), { likelihood: 'logL', walkers: 8, steps: 60, seed: 9 });
    const c = await runInference(rateSheet(), { likelihood: 'logL', walkers: 8, steps: 60, seed: 10 });
    expect(Array.from(b.chain.values[0])).toEqual(Array.from(a.chain.values[0]));
    expect(Array.from(c.chain.values[0])).not.toEqual(Array.from(a.chain.values[0]));
  });
});

describe('priors', () => {
  it("the cell's uncertainty is the default prior when the cell is named free", () => {
    const s = toySheet({ slope: { uncertainty: 'normalDist(0.7, 0.1)' } });
    const [p] = freeParameters(s, ['slope']);
    expect(p.from).toBe('uncertainty');
    expect(p.description).toMatch(/normal, mean 0.7, sd 0.1/);
    expect(p.logScale).toBe(false);
  });
  it('a normal prior on a scale parameter is refused with the reason; truncated at a positive end it is accepted', () => {
    expect(() => freeParameters(toySheet({ rate_norm: { prior: 'normalDist(1e-3 Mpc^-3 Gyr^-1, 1e-3 Mpc^-3 Gyr^-1)' } }))).toThrow(
      /prior of rate_norm .* reaches below zero, but rate_norm is a scale parameter/,
    );
    const [p] = freeParameters(toySheet({ rate_norm: { prior: 'truncatedDist(normalDist(1e-3 Mpc^-3 Gyr^-1, 1e-3 Mpc^-3 Gyr^-1), 1e-5 Mpc^-3 Gyr^-1, 1 Mpc^-3 Gyr^-1)' } }));
    expect(p.logScale).toBe(true);
    expect(p.description).toMatch(/truncated to 0.00001 to 1 Mpc\^-3 Gyr\^-1/);
  });
  it('a prior with no support, a prior in the wrong unit and a free cell with neither prior nor uncertainty are errors naming the cell', () => {
    expect(() => freeParameters(toySheet({ slope: { prior: 'truncatedDist(uniformDist(0, 1), 2, 3)' } }))).toThrow(/the prior of slope.*holds no probability/);
    expect(() => freeParameters(toySheet({ rate_norm: { prior: 'uniformDist(1, 2)' } }))).toThrow(/the prior of rate_norm gives values in no unit, but rate_norm is in Mpc/);
    expect(() => freeParameters(toySheet(), ['slope'])).toThrow(/free cell slope has neither a prior nor an uncertainty/);
    expect(() => freeParameters(toySheet())).toThrow(/no cell has a prior/);
  });
  it('a prior follows a rename of a cell it reads', () => {
    const s = toySheet({ slope: { prior: 'uniformDist(0, 2 * K_scale)' } });
    s.setCell({ name: 'K_scale', formula: '1' });
    s.renameCell('K_scale', 'K_range');
    expect(s.get('slope')!.prior).toBe('uniformDist(0, 2 * K_range)');
  });
});

describe('zero and failing likelihoods', () => {
  it('a likelihood failing for some values counts as zero there; failures are counted and reported with a point and the message', async () => {
    const s = rateSheet();
    s.updateCell('logL', { formula: 'amplitudeLogLikelihood(rate_norm > 2e-3 Mpc^-3 Gyr^-1 ? -1 : A_yr, measured)' });
    const r = await runInference(s, { likelihood: 'logL', walkers: 8, steps: 200, seed: 1 });
    expect(r.failures).toBeGreaterThan(0);
    expect(r.failureExample!.point.rate_norm).toBeGreaterThan(2e-3);
    expect(r.failureExample!.message).toMatch(/argument predicted of amplitudeLogLikelihood must be an amplitude >= 0/);
    expect(Math.max(...r.samples.rate_norm)).toBeLessThanOrEqual(2e-3);
  });
  it('walkers that all start in zero likelihood are an error naming the likelihood cell and the free cells', async () => {
    const s = rateSheet();
    s.updateCell('logL', { formula: 'amplitudeLogLikelihood(-1, measured)' });
    await expect(runInference(s, { likelihood: 'logL', walkers: 8, steps: 10, seed: 1 })).rejects.toThrow(
      /likelihood cell logL is zero \(or fails\) at every starting point drawn from the priors of rate_norm.*first failure: .*predicted of amplitudeLogLikelihood must be an amplitude/,
    );
  });
  it('a likelihood cell holding something other than a number is a failure with a message', async () => {
    const s = rateSheet();
    s.updateCell('logL', { formula: 'A_yr * 1 m' });
    await expect(runInference(s, { likelihood: 'logL', walkers: 8, steps: 10, seed: 1 })).rejects.toThrow(/logL must hold a plain number \(ln L\)/);
  });
});
