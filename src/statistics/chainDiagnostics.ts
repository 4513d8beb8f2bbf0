// Convergence diagnostics of an ensemble run and a verdict with stated thresholds:
//  - R-hat (rank-normalised split, splitRhat.ts) below 1.01 and an effective sample size of at
//    least 400 per parameter (both Vehtari et al. 2021, Bayesian Analysis 16, 667, sec. 4);
//  - the kept chain at least 50 autocorrelation times long and Sokal's window found (common
//    practice for ensemble samplers, no source);
//  - acceptance fraction outside [0.2, 0.5] only gives a warning (Foreman-Mackey et al. 2013,
//    Publ. Astron. Soc. Pac. 125, 306, advice on the acceptance fraction).
import { acceptanceFraction, parameterSeries, type EnsembleChain } from './ensembleSampler';
import { integratedAutocorrelationTime } from './autocorrelation';
import { rankNormalisedSplitRhat } from './splitRhat';

export const RHAT_THRESHOLD = 1.01;
export const MIN_ESS = 400;
export const MIN_TAUS = 50;
export const ACCEPTANCE_RANGE: readonly [number, number] = [0.2, 0.5];

export interface ParameterDiagnostics {
  tau: number;
  tauError: number;
  /** Effective sample size: kept draws (walkers x kept steps) / tau. */
  ess: number;
  rhat: number;
  /** Kept steps per autocorrelation time. */
  stepsPerTau: number;
}

export interface RunDiagnostics {
  burnIn: number;
  thin: number;
  keptSteps: number;
  acceptance: number;
  parameters: ParameterDiagnostics[];
  verdict: 'converged' | 'run longer';
  /** Why the verdict is 'run longer', and warnings; each names the parameter and the threshold. */
  reasons: string[];
  warnings: string[];
}

/** Default burn-in: the first half of the steps (Gelman et al. 2013, Bayesian Data Analysis, 3rd ed., sec. 11.4). */
export function defaultBurnIn(steps: number): number {
  return Math.floor(steps / 2);
}

export function diagnoseRun(chain: EnsembleChain, names: string[], burnIn = defaultBurnIn(chain.steps), thin = 1): RunDiagnostics {
  if (!Number.isInteger(burnIn) || burnIn < 0 || burnIn >= chain.steps) throw new RangeError(`burn-in must be a whole number of steps below ${chain.steps}, got ${burnIn}`);
  if (!Number.isInteger(thin) || thin < 1) throw new RangeError(`thinning must be a positive whole number, got ${thin}`);
  const keptSteps = Math.ceil((chain.steps - burnIn) / thin);
  const reasons: string[] = [];
  const warnings: string[] = [];
  const parameters = names.map((name, i) => {
    const series = parameterSeries(chain, i, burnIn, thin);
    const ac = integratedAutocorrelationTime(series);
    const rh = rankNormalisedSplitRhat(series);
    const tau = ac.tau;
    const ess = (chain.walkers * keptSteps) / Math.max(1, tau);
    const stepsPerTau = keptSteps / tau;
    if (!ac.windowFound || !Number.isFinite(tau)) reasons.push(`${name}: the autocorrelation time could not be estimated (the kept chain of ${keptSteps} steps is too short)`);
    else if (stepsPerTau < MIN_TAUS) reasons.push(`${name}: the kept chain is ${stepsPerTau.toFixed(1)} autocorrelation times long (at least ${MIN_TAUS} wanted)`);
    if (!(rh.rhat < RHAT_THRESHOLD)) reasons.push(`${name}: R-hat ${Number.isFinite(rh.rhat) ? rh.rhat.toFixed(4) : 'undefined'} (below ${RHAT_THRESHOLD} wanted)`);
    if (!(ess >= MIN_ESS)) reasons.push(`${name}: effective sample size ${Math.round(ess)} (at least ${MIN_ESS} wanted)`);
    return { tau, tauError: ac.error, ess, rhat: rh.rhat, stepsPerTau };
  });
  const acceptance = acceptanceFraction(chain);
  if (!(acceptance >= ACCEPTANCE_RANGE[0] && acceptance <= ACCEPTANCE_RANGE[1])) {
    warnings.push(`acceptance fraction ${acceptance.toFixed(3)} is outside ${ACCEPTANCE_RANGE[0]}-${ACCEPTANCE_RANGE[1]}`);
  }
  if (chain.failures > 0) warnings.push(`${chain.failures} likelihood evaluations failed and counted as zero likelihood`);
  return { burnIn, thin, keptSteps, acceptance, parameters, verdict: reasons.length ? 'run longer' : 'converged', reasons, warnings };
}
