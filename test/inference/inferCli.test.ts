// `strainsheet infer` on the toy sheet: the chains do not depend on --workers, bad input is refused
// naming the cell or option, and --evidence --compare gives the Bayes factor of two priors, checked
// against its closed form.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import { toySheet, toyAmplitude } from '../statistics/toySheet';
import { normalCdf } from '../../src/statistics/normal';

const dir = mkdtempSync(join(tmpdir(), 'strainsheet-infer-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const file = (name: string) => join(dir, name);
const M = -14.6;
const S = 0.2;
function writeToy(name: string, lo: number, hi: number): string {
  const s = toySheet({ rate_norm: { prior: `logUniformDist(${lo} Mpc^-3 Gyr^-1, ${hi} Mpc^-3 Gyr^-1)` } });
  s.updateCell('measured', { formula: `measuredLog10Amplitude(${M}, ${S})` });
  s.setCell({ name: 'logL', formula: 'amplitudeLogLikelihood(A_yr, measured)' });
  writeFileSync(file(name), s.toFileText());
  return file(name);
}
const wide = writeToy('wide.json', 1e-5, 1e-1);
const narrow = writeToy('narrow.json', 1e-4, 1e-2);

async function run(...argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { out: (t) => void (out += t), err: (t) => void (err += t) });
  return { code, out, err };
}

describe('strainsheet infer', () => {
  it('one and two worker threads write the same chains and summary', async () => {
    const args = ['infer', wide, '--likelihood', 'logL', '--steps', '40', '--walkers', '8', '--seed', '3', '--derived', 'local_rate', '--quiet'];
    const one = await run(...args, '--workers', '1', '--csv', file('c1.csv'), '--json', file('s1.json'), '--corner', file('c1.svg'));
    const two = await run(...args, '--workers', '2', '--csv', file('c2.csv'), '--json', file('s2.json'));
    expect([one.code, two.code], one.err + two.err).toEqual([0, 0]);
    const csv = readFileSync(file('c1.csv'), 'utf8');
    expect(csv.split('\n')[1]).toBe('step,walker,kept,rate_norm [Mpc^-3 Gyr^-1],local_rate [Mpc^-3 Gyr^-1],ln_likelihood,ln_prior');
    expect(csv.trim().split('\n')).toHaveLength(2 + 40 * 8);
    expect(readFileSync(file('c2.csv'), 'utf8')).toBe(csv);
    expect(readFileSync(file('s2.json'), 'utf8')).toBe(readFileSync(file('s1.json'), 'utf8'));
    const summary = JSON.parse(readFileSync(file('s1.json'), 'utf8'));
    expect(summary.parameters[0].cell).toBe('rate_norm');
    expect(['converged', 'run longer']).toContain(summary.verdict);
    expect(one.out).toMatch(/rate_norm \[Mpc\^-3 Gyr\^-1\]: median .* 68% .* 95% .*R-hat/);
    expect(one.err).toBe(''); // not a terminal: no progress line
    expect(readFileSync(file('c1.svg'), 'utf8')).toMatch(/^<svg[\s\S]*log10 rate_norm \[Mpc\^-3 Gyr\^-1\][\s\S]*<\/svg>\n$/);
  }, 120_000);

  it('bad input: no likelihood option, a normal prior on a scale parameter, an unknown free cell', async () => {
    const base = ['infer', wide, '--steps', '10', '--walkers', '8', '--seed', '1', '--quiet'];
    const a = await run(...base);
    expect(a.code).toBe(2);
    expect(a.err).toMatch(/--likelihood CELL/);
    const b = await run(...base, '--likelihood', 'logL', '--prior', 'rate_norm=normalDist(1e-3 Mpc^-3 Gyr^-1, 1e-3 Mpc^-3 Gyr^-1)');
    expect(b.code).toBe(2);
    expect(b.err).toMatch(/strainsheet infer: the prior of rate_norm .* reaches below zero, but rate_norm is a scale parameter/);
    const c = await run(...base, '--likelihood', 'logL', '--free', 'nosuch');
    expect(c.code).toBe(2);
    expect(c.err).toMatch(/free cell nosuch: there is no cell of that name/);
  });

  it('--evidence --compare: ln B of two log-uniform priors matches the closed form within 3 reported errors', async () => {
    // Z = (1/w) int_a^b N(x/2 + c; M, S) dx over x = log10 rate (per dex of A), w = b - a:
    // = (2/w) [Phi((b/2 + c - M)/S) - Phi((a/2 + c - M)/S)] (change of variables, closed form).
    const c = Math.log10(toyAmplitude(1));
    const Z = (a: number, b: number) => (2 / (b - a)) * (normalCdf((b / 2 + c - M) / S) - normalCdf((a / 2 + c - M) / S));
    const want = Math.log(Z(-5, -1)) - Math.log(Z(-4, -2));
    const r = await run('infer', wide, '--evidence', '--compare', narrow, '--rungs', '9', '--likelihood', 'logL', '--steps', '300', '--walkers', '8', '--seed', '4', '--quiet', '--json', file('ev.json'));
    expect(r.code, r.err).toBe(0);
    const ev = JSON.parse(readFileSync(file('ev.json'), 'utf8'));
    const got = ev.logBayesFactor.logBayesFactor;
    const err = ev.logBayesFactor.error;
    expect(err).toBeLessThan(0.3);
    expect(Math.abs(got - want), `ln B ${got} +- ${err}, want ${want}`).toBeLessThan(3 * err);
    expect(r.out).toMatch(/ln B \(.*wide.json over .*narrow.json\) = /);
  }, 120_000);
});
