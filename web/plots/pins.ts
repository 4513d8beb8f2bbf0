// Pinned model curves: snapshots of a spectrum kept for comparison, stored beside the autosave.
export interface PinnedCurve {
  id: string;
  label: string;
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
