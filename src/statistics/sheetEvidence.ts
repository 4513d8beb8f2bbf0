// The evidence of a sheet (its likelihood cell averaged over the priors of its free cells) by
// thermodynamic integration (thermodynamicEvidence.ts), and the Bayes factor of two sheets.
// The likelihood cell must be a normalised density of the data (amplitudeLogLikelihood is one)
// for ln Z of two sheets to be comparable; both sheets must use the same data.
import type { Sheet } from '../sheet/sheet';
import { runEnsemble } from './ensembleSampler';
import { integrateLadder, rungEstimate, temperatureLadder, type EvidenceEstimate, type RungEstimate } from './thermodynamicEvidence';
import { freeParameters, logPriorDensity } from './priors';
import { sheetEvaluator, startingPoints, type InferenceSpec } from './sheetInference';
import { SheetJobError, checkCancelled, yieldToEventLoop, type JobControl } from './sheetValues';

export interface EvidenceSpec extends Omit<InferenceSpec, 'derived' | 'spectrumCell' | 'bandDraws' | 'thin'> {
  /** Rungs of the temperature ladder (odd, at least 3; default 17). */
  rungs?: number;
}

export interface SheetEvidence extends EvidenceEstimate {
  free: string[];
  likelihood: string;
  walkers: number;
  steps: number;
  seed: number;
}

export async function sheetEvidence(sheet: Sheet, spec: EvidenceSpec, control?: JobControl & { onRung?(done: number, total: number): void }): Promise<SheetEvidence> {
  if (!sheet.has(spec.likelihood)) throw new SheetJobError(`likelihood cell ${spec.likelihood}: there is no cell of that name`);
  const rungs = spec.rungs ?? 17;
  if (!Number.isInteger(rungs) || rungs < 3 || rungs % 2 === 0) throw new SheetJobError(`evidence: the number of rungs must be odd and at least 3, got ${rungs}`);
  const params = freeParameters(sheet, spec.free);
  let failure: { point: Float64Array; message: string } | undefined;
  const evaluate = sheetEvaluator(sheet, params, spec.likelihood, [], (u, message) => (failure ??= { point: Float64Array.from(u), message }));
  const logPrior = (u: Float64Array) => logPriorDensity(params, u);
  const take = () => {
    const f = failure;
    failure = undefined;
    return f;
  };
  const ladder = temperatureLadder(rungs);
  const estimates: RungEstimate[] = [];
  let failures = 0;
  const total = rungs * spec.steps;
  for (let i = 0; i < rungs; i++) {
    const start = await startingPoints(spec, params, evaluate, logPrior, take, control, i);
    let last = Date.now();
    const chain = await runEnsemble({
      walkers: spec.walkers,
      steps: spec.steps,
      seed: spec.seed,
      chain: i,
      beta: ladder[i],
      start,
      logPrior,
      logLikelihood: evaluate,
      onStep: async (info) => {
        if (Date.now() - last < 100) return;
        last = Date.now();
        checkCancelled(control);
        control?.onProgress?.(i * spec.steps + info.step, total);
        await yieldToEventLoop();
      },
    });
    failures += chain.failures;
    estimates.push(rungEstimate(chain, spec.burnIn));
    control?.onRung?.(i + 1, rungs);
  }
  let est: Omit<EvidenceEstimate, 'failures'>;
  try {
    est = integrateLadder(estimates);
  } catch (e) {
    throw new SheetJobError(`evidence of ${spec.likelihood}: ${(e as Error).message}`);
  }
  return { ...est, failures, free: params.map((p) => p.cell), likelihood: spec.likelihood, walkers: spec.walkers, steps: spec.steps, seed: spec.seed };
}
