// Evidence (marginal likelihood) by thermodynamic integration over power posteriors
// p_beta(x) ~ prior(x) L(x)^beta (Lartillot & Philippe 2006, Syst. Biol. 55, 195; Friel &
// Pettitt 2008, J. R. Stat. Soc. B 70, 589):  ln Z = integral_0^1 E_beta[ln L] d beta.
// Each beta gets its own ensemble run (ensembleSampler.ts) and the integral is the trapezoid rule
// over the ladder beta_i = (i/n)^5 (Friel & Pettitt 2008).
//
// The trapezoid sums over the full ladder (T1) and over every second rung (T2) are combined by
// Richardson extrapolation, ln Z = (4 T1 - T2)/3, the first step of Romberg integration (Press et
// al. 2007, Numerical Recipes, 3rd ed., sec. 4.3; the ladder is uniform in u = beta^(1/5), so the
// trapezoid error goes as h^2 in u). Reported error = statistical (Monte Carlo error of each
// E_beta[ln L] from its effective sample size, propagated through the weights) and, in
// quadrature, |T1 - T2|/3: the estimated error of T1, a bound on the error left after extrapolating.
//
// Limits: the prior must be proper (normalised) for ln Z to mean anything; a multimodal power
// posterior that the ensemble does not mix between gives a biased E_beta[ln L]; the error
// estimate assumes each tempered run has converged.
import { runEnsemble, type EnsembleChain, type EnsembleOptions } from './ensembleSampler';
import { integratedAutocorrelationTime } from './autocorrelation';
import { defaultBurnIn } from './chainDiagnostics';

/** The ladder beta_i = (i / (n-1))^power, i = 0..n-1 (power 5: Friel & Pettitt 2008). */
export function temperatureLadder(n: number, power = 5): Float64Array {
  if (!Number.isInteger(n) || n < 3) throw new RangeError(`the temperature ladder needs at least 3 rungs, got ${n}`);
  return Float64Array.from({ length: n }, (_, i) => Math.pow(i / (n - 1), power));
}

export interface RungEstimate {
  beta: number;
  meanLogLikelihood: number;
  /** Monte Carlo error of the mean (sd / sqrt(ESS)). */
  error: number;
  tau: number;
  acceptance: number;
}

export interface EvidenceEstimate {
  logEvidence: number;
  /** Total error (statistical and discretisation in quadrature). */
  error: number;
  statisticalError: number;
  discretisationError: number;
  rungs: RungEstimate[];
  failures: number;
}

/** E[ln L] over one tempered run after burn-in, with its error from the autocorrelation time. */
export function rungEstimate(chain: EnsembleChain, burnIn = defaultBurnIn(chain.steps)): RungEstimate {
  const W = chain.walkers;
  const series = Array.from({ length: W }, (_, k) => {
    const out = new Float64Array(chain.steps - burnIn);
    for (let t = burnIn; t < chain.steps; t++) out[t - burnIn] = chain.logLikelihood[t * W + k];
    return out;
  });
  let sum = 0;
  let n = 0;
  for (const s of series) for (const x of s) {
    sum += x;
    n++;
  }
  const mean = sum / n;
  let v = 0;
  for (const s of series) for (const x of s) v += (x - mean) ** 2;
  v /= n - 1;
  const ac = integratedAutocorrelationTime(series);
  const tau = Number.isFinite(ac.tau) ? Math.max(1, ac.tau) : 1;
  let acc = 0;
  for (const a of chain.accepted) acc += a;
  return { beta: chain.beta, meanLogLikelihood: mean, error: Math.sqrt((v * tau) / n), tau, acceptance: acc / (W * chain.steps) };
}

/** Trapezoid weights of the rungs (zero for rungs left out). */
function trapezoidWeights(betas: number[], use: boolean[]): Float64Array {
  const w = new Float64Array(betas.length);
  let prev = -1;
  for (let i = 0; i < betas.length; i++) {
    if (!use[i]) continue;
    if (prev >= 0) {
      const h = betas[i] - betas[prev];
      w[i] += 0.5 * h;
      w[prev] += 0.5 * h;
    }
    prev = i;
  }
  return w;
}

/** ln Z from the rung estimates (ladder ascending from 0 to 1, an odd number of rungs). */
export function integrateLadder(rungs: RungEstimate[]): Omit<EvidenceEstimate, 'failures'> {
  const n = rungs.length;
  if (n < 3 || n % 2 === 0) throw new RangeError(`thermodynamic integration needs an odd number of rungs, at least 3, got ${n}`);
  if (rungs[0].beta !== 0 || rungs[n - 1].beta !== 1) throw new RangeError('the ladder must run from beta = 0 to beta = 1');
  for (const r of rungs) if (!Number.isFinite(r.meanLogLikelihood)) throw new RangeError(`E[ln L] at beta = ${r.beta} is not finite: the tempered run found no likelihood there`);
  const betas = rungs.map((r) => r.beta);
  const w1 = trapezoidWeights(betas, betas.map(() => true));
  const w2 = trapezoidWeights(betas, betas.map((_, i) => i % 2 === 0));
  let t1 = 0;
  let t2 = 0;
  let v = 0;
  rungs.forEach((r, i) => {
    t1 += w1[i] * r.meanLogLikelihood;
    t2 += w2[i] * r.meanLogLikelihood;
    v += (((4 * w1[i] - w2[i]) / 3) * r.error) ** 2;
  });
  const stat = Math.sqrt(v);
  const disc = Math.abs(t1 - t2) / 3;
  return { logEvidence: (4 * t1 - t2) / 3, error: Math.hypot(stat, disc), statisticalError: stat, discretisationError: disc, rungs };
}

export interface EvidenceOptions extends Omit<EnsembleOptions, 'beta' | 'chain' | 'onStep'> {
  rungs?: number;
  burnIn?: number;
  onRung?(done: number, total: number): void;
}

/** Runs one ensemble per rung (rung i uses stream key i) and integrates. */
export async function thermodynamicEvidence(o: EvidenceOptions): Promise<EvidenceEstimate> {
  const ladder = temperatureLadder(o.rungs ?? 17);
  const rungs: RungEstimate[] = [];
  let failures = 0;
  for (let i = 0; i < ladder.length; i++) {
    const chain = await runEnsemble({ ...o, beta: ladder[i], chain: i });
    failures += chain.failures;
    rungs.push(rungEstimate(chain, o.burnIn));
    o.onRung?.(i + 1, ladder.length);
  }
  return { ...integrateLadder(rungs), failures };
}

/** ln B = ln Z_1 - ln Z_2 with errors added in quadrature (independent runs). */
export function logBayesFactor(a: EvidenceEstimate, b: EvidenceEstimate): { logBayesFactor: number; error: number } {
  return { logBayesFactor: a.logEvidence - b.logEvidence, error: Math.hypot(a.error, b.error) };
}
