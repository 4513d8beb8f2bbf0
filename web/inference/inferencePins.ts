// Pinned inference results: the settings, verdict and posterior summaries of a run, kept beside the
// autosave so runs can be compared after the sheet or the settings change.
import type { InferenceResult } from '../../src/statistics/sheetInference';

export interface PinnedPosterior {
  cell: string;
  unit: string;
  median: number;
  /** [lower, upper] of the 68.27% and 95.45% central intervals. */
  i68: [number, number];
  i95: [number, number];
}

export interface PinnedInference {
  id: string;
  label: string;
  likelihood: string;
  settings: string;
  verdict: 'converged' | 'run longer';
  acceptance: number;
  posteriors: PinnedPosterior[];
}

export const INFERENCE_PINS_KEY = 'strainsheet:inference-pins:v1';
export const MAX_INFERENCE_PINS = 12;

export function pinOf(r: InferenceResult, label: string): PinnedInference {
  const post = (p: InferenceResult['derived'][number]): PinnedPosterior => {
    const [a, b] = p.summary.intervals;
    return { cell: p.cell, unit: p.unit, median: p.summary.median, i68: [a.lower, a.upper], i95: [b.lower, b.upper] };
  };
  return {
    id: `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 7)}`,
    label,
    likelihood: r.likelihood,
    settings: `${r.walkers} walkers x ${r.steps} steps, seed ${r.seed}, burn-in ${r.burnIn}, thinning ${r.thin}`,
    verdict: r.diagnostics.verdict,
    acceptance: r.diagnostics.acceptance,
    posteriors: [...r.parameters, ...r.derived].map(post),
  };
}

const isPair = (v: unknown) => Array.isArray(v) && v.length === 2 && v.every((x) => typeof x === 'number' || x === null);

function isPin(v: unknown): v is PinnedInference {
  const p = v as PinnedInference;
  return (
    !!p &&
    typeof p.id === 'string' &&
    typeof p.label === 'string' &&
    typeof p.likelihood === 'string' &&
    typeof p.settings === 'string' &&
    (p.verdict === 'converged' || p.verdict === 'run longer') &&
    Array.isArray(p.posteriors) &&
    p.posteriors.every((q) => q && typeof q.cell === 'string' && typeof q.unit === 'string' && isPair(q.i68) && isPair(q.i95))
  );
}

export function loadInferencePins(): PinnedInference[] {
  try {
    const text = window.localStorage.getItem(INFERENCE_PINS_KEY);
    const parsed: unknown = text ? JSON.parse(text) : [];
    return Array.isArray(parsed) ? parsed.filter(isPin).slice(0, MAX_INFERENCE_PINS) : [];
  } catch {
    return [];
  }
}

export function saveInferencePins(pins: PinnedInference[]): { ok: true } | { ok: false; message: string } {
  if (pins.length > MAX_INFERENCE_PINS) return { ok: false, message: `At most ${MAX_INFERENCE_PINS} inference results can be pinned; remove one first.` };
  try {
    window.localStorage.setItem(INFERENCE_PINS_KEY, JSON.stringify(pins));
    return { ok: true };
  } catch (err) {
    return { ok: false, message: `Pinned inference results could not be stored: ${err instanceof Error ? err.message : String(err)}` };
  }
}
