// Plain-text outputs of an inference run: the chains as CSV, the summary as JSON and as lines of text.
import type { InferenceResult } from './sheetInference';
import type { SheetEvidence } from './sheetEvidence';

function num(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(15))) : '';
}
function field(name: string, unit: string): string {
  const t = unit ? `${name} [${unit}]` : name;
  return /[",\n]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t;
}
function g4(x: number): string {
  return Number.isFinite(x) ? Number(x.toPrecision(4)).toString() : String(x);
}

/** One row per walker and step (burn-in included, marked by `kept`), values in each cell's display unit. */
export function chainsCsv(r: InferenceResult): string {
  const { names, units, values, logLikelihood, logPrior } = r.chain;
  const lines = [
    `# seed ${r.seed}, ${r.walkers} walkers x ${r.steps} steps, burn-in ${r.burnIn} steps, thinning ${r.thin}; likelihood ${r.likelihood}; ln prior in the sampler's coordinates (ln x for log-scale parameters)`,
    ['step', 'walker', 'kept', ...names.map((n, i) => field(n, units[i])), 'ln_likelihood', 'ln_prior'].join(','),
  ];
  for (let t = 0; t < r.steps; t++) {
    const kept = t >= r.burnIn && (t - r.burnIn) % r.thin === 0 ? '1' : '0';
    for (let k = 0; k < r.walkers; k++) {
      const j = t * r.walkers + k;
      lines.push([String(t + 1), String(k + 1), kept, ...values.map((v) => num(v[j])), num(logLikelihood[j]), num(logPrior[j])].join(','));
    }
  }
  return lines.join('\n') + '\n';
}

/** The summary as plain data (for JSON): settings, posteriors, diagnostics, verdict, failures. */
export function inferenceSummary(r: InferenceResult): Record<string, unknown> {
  const post = (p: { cell: string; unit: string; summary: InferenceResult['parameters'][number]['summary'] }) => ({
    cell: p.cell,
    unit: p.unit,
    median: p.summary.median,
    medianError: p.summary.medianError,
    intervals: p.summary.intervals,
    draws: p.summary.count,
  });
  return {
    likelihood: r.likelihood,
    walkers: r.walkers,
    steps: r.steps,
    seed: r.seed,
    burnIn: r.burnIn,
    thin: r.thin,
    evaluations: r.evaluations,
    parameters: r.parameters.map((p, i) => ({ ...post(p), prior: p.prior, priorFrom: p.from, sampledIn: p.logScale ? 'ln x' : 'x', ...r.diagnostics.parameters[i] })),
    derived: r.derived.map(post),
    acceptance: r.diagnostics.acceptance,
    verdict: r.diagnostics.verdict,
    reasons: r.diagnostics.reasons,
    warnings: r.diagnostics.warnings,
    failures: r.failures,
    failureExample: r.failureExample,
    stopped: r.stopped,
    band: r.band && { cell: r.band.cell, draws: r.band.draws, levels: r.band.levels, frequencyHz: Array.from(r.band.frequencyHz), hc: r.band.quantiles.map((q) => Array.from(q)) },
  };
}

/** Lines for a terminal: one per parameter and derived cell, then the diagnostics and verdict. */
export function inferenceSummaryLines(r: InferenceResult): string[] {
  const out: string[] = [];
  out.push(`${r.walkers} walkers x ${r.steps} steps (seed ${r.seed}), burn-in ${r.burnIn} steps, thinning ${r.thin}: ${r.parameters[0]?.summary.count ?? 0} draws kept; likelihood ${r.likelihood}`);
  const line = (p: InferenceResult['derived'][number], extra: string) => {
    const s = p.summary;
    const [i68, i95] = s.intervals;
    const u = p.unit ? ` [${p.unit}]` : '';
    out.push(`${p.cell}${u}: median ${g4(s.median)}, 68% ${g4(i68.lower)} to ${g4(i68.upper)}, 95% ${g4(i95.lower)} to ${g4(i95.upper)}${extra}`);
  };
  r.parameters.forEach((p, i) => {
    const d = r.diagnostics.parameters[i];
    line(p, `; tau ${g4(d.tau)} steps, ESS ${Math.round(d.ess)}, R-hat ${d.rhat.toFixed(4)}; prior ${p.prior}${p.from === 'uncertainty' ? ' (from its uncertainty)' : ''}`);
  });
  for (const d of r.derived) line(d, ' (derived)');
  out.push(`acceptance ${r.diagnostics.acceptance.toFixed(3)}; verdict: ${r.diagnostics.verdict}`);
  for (const why of r.diagnostics.reasons) out.push(`  run longer: ${why}`);
  for (const w of r.diagnostics.warnings) out.push(`  note: ${w}`);
  if (r.failureExample) {
    const at = Object.entries(r.failureExample.point).map(([k, v]) => `${k} = ${g4(v)}`).join(', ');
    out.push(`  ${r.failures} likelihood evaluation${r.failures === 1 ? '' : 's'} failed (counted as zero likelihood), e.g. at ${at}: ${r.failureExample.message}`);
  }
  if (r.stopped) out.push('  the run was stopped early');
  return out;
}

export function evidenceLines(e: SheetEvidence, label: string): string[] {
  return [
    `${label}: ln Z = ${g4(e.logEvidence)} +- ${g4(e.error)} (statistical ${g4(e.statisticalError)}, ladder ${g4(e.discretisationError)}); ${e.rungs.length} rungs x ${e.walkers} walkers x ${e.steps} steps; free ${e.free.join(', ')}` +
      (e.failures ? `; ${e.failures} failed evaluations counted as zero likelihood` : ''),
  ];
}
