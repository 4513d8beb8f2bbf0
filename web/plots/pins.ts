// Pinned model curves: snapshots of a spectrum kept for comparison, stored beside the autosave.
export interface PinnedCurve {
  id: string;
  /** The user's own name for it, or (when `named` is not set) the name it was pinned under. */
  label: string;
  /** The spectrum cell the curve came from. */
  curve?: string;
  /** Every cell's formula when it was pinned: the curve is named by what changed since. */
  formulas?: Record<string, string>;
  /** The user named it: the label is kept as given. */
  named?: boolean;
  frequencyHz: number[];
  hc: number[];
  visible: boolean;
}

export const PINS_KEY = 'strainsheet:pins:v1';
const MAX_PINS = 24;

function isPin(v: unknown): v is PinnedCurve {
  const p = v as PinnedCurve;
  return (
    !!p &&
    typeof p.id === 'string' &&
    typeof p.label === 'string' &&
    typeof p.visible === 'boolean' &&
    (p.curve === undefined || typeof p.curve === 'string') &&
    (p.formulas === undefined || (typeof p.formulas === 'object' && p.formulas !== null && Object.values(p.formulas).every((f) => typeof f === 'string'))) &&
    Array.isArray(p.frequencyHz) &&
    Array.isArray(p.hc) &&
    p.frequencyHz.length === p.hc.length &&
    p.frequencyHz.every((x) => typeof x === 'number') &&
    p.hc.every((x) => typeof x === 'number' || x === null)
  );
}

export function loadPins(): PinnedCurve[] {
  try {
    const text = window.localStorage.getItem(PINS_KEY);
    if (!text) return [];
    const parsed: unknown = JSON.parse(text);
    return Array.isArray(parsed) ? parsed.filter(isPin).map((p) => ({ ...p, hc: p.hc.map((x) => (x === null ? NaN : x)) })).slice(0, MAX_PINS) : [];
  } catch {
    return [];
  }
}

export function savePins(pins: PinnedCurve[]): { ok: true } | { ok: false; message: string } {
  if (pins.length > MAX_PINS) return { ok: false, message: `At most ${MAX_PINS} curves can be pinned; remove one first.` };
  try {
    window.localStorage.setItem(PINS_KEY, JSON.stringify(pins));
    return { ok: true };
  } catch (err) {
    return { ok: false, message: `Pinned curves could not be stored: ${err instanceof Error ? err.message : String(err)}` };
  }
}

/**
 * The name a pinned curve is shown under: the user's, else its cell and what differs between the
 * sheet then and now, e.g. "spectrum: rate_norm = 2e-3 Mpc^-3 Gyr^-1" (at most three changes named).
 */
export function pinLabel(pin: PinnedCurve, now: Record<string, string>): string {
  if (pin.named || !pin.formulas || !pin.curve) return pin.label;
  const then = pin.formulas;
  const changes: string[] = [];
  for (const [name, formula] of Object.entries(then)) {
    if (!(name in now)) changes.push(`${name} = ${formula} (now removed)`);
    else if (now[name] !== formula) changes.push(`${name} = ${formula}`);
  }
  const shown = changes.slice(0, 3).join('; ');
  const more = changes.length > 3 ? ` and ${changes.length - 3} more` : '';
  return `${pin.curve}: ${changes.length ? shown + more : 'as now'}`;
}
