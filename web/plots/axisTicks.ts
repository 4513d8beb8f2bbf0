// Tick marks shared by the chart on screen and the figure writer, so both show the same ticks:
// on log axes a major tick at every decade (labelled 10^n; every k-th decade labelled when there
// are many) and minor ticks at 2..9 x 10^n; on linear axes 1-2-5 steps with minor ticks between.

export interface Tick {
  value: number;
  major: boolean;
  /** Label in the figure text notation (figureText.ts), e.g. '10^{-15}', '0.5'; '' for none. */
  label: string;
}

/** At most this many labelled decades on a log axis. */
const MAX_DECADE_LABELS = 8;

export function axisTicks(scale: 'log' | 'linear', lo: number, hi: number): number[] {
  return ticksFor(scale, lo, hi).filter((t) => t.label !== '').map((t) => t.value);
}

export function ticksFor(scale: 'log' | 'linear', lo: number, hi: number): Tick[] {
  if (!(hi > lo) || !Number.isFinite(lo) || !Number.isFinite(hi)) return [];
  return scale === 'log' ? logTicks(lo, hi) : linearTicks(lo, hi);
}

function logTicks(lo: number, hi: number): Tick[] {
  if (!(lo > 0)) return [];
  const first = Math.floor(Math.log10(lo));
  const last = Math.ceil(Math.log10(hi));
  const decadesInside = Math.floor(Math.log10(hi) + 1e-12) - Math.ceil(Math.log10(lo) - 1e-12) + 1;
  const every = Math.max(1, Math.ceil(decadesInside / MAX_DECADE_LABELS));
  // Few decades: label 2 and 5 too, else an axis shorter than a decade would have no label at all.
  const fewDecades = Math.log10(hi / lo) < 1.2;
  const build = (labelAll: boolean): Tick[] => {
    const out: Tick[] = [];
    for (let k = first; k <= last; k++) {
      for (let m = 1; m <= 9; m++) {
        const v = m * 10 ** k;
        if (v < lo * (1 - 1e-12) || v > hi * (1 + 1e-12)) continue;
        const major = m === 1;
        const labelled = major ? k % every === 0 : fewDecades && (labelAll || m === 2 || m === 5);
        out.push({ value: v, major, label: labelled ? (major ? `10^{${k}}` : formatTick(v)) : '' });
      }
    }
    return out;
  };
  const ticks = build(false);
  // An axis much shorter than a decade (an amplitude posterior) would show one or two labels: label
  // every whole mantissa then.
  return fewDecades && ticks.filter((t) => t.label !== '').length < 3 ? build(true) : ticks;
}

function linearTicks(lo: number, hi: number): Tick[] {
  const raw = (hi - lo) / 6;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const mult = [1, 2, 5, 10].find((m) => m * mag >= raw) ?? 10;
  const step = mult * mag;
  const minor = step / (mult === 2 ? 4 : 5);
  const out: Tick[] = [];
  const start = Math.ceil(lo / minor - 1e-9);
  for (let i = start; i * minor <= hi + minor * 1e-9; i++) {
    const v = Math.abs(i * minor) < minor * 1e-9 ? 0 : Number((i * minor).toPrecision(12));
    const major = Math.abs(v / step - Math.round(v / step)) < 1e-6;
    out.push({ value: v, major, label: major ? formatTick(v) : '' });
  }
  return out;
}

/** Short tick label in figure notation: 1.5·10^{-15} for very small or large numbers, else 0.5, 120. */
export function formatTick(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e4 || a < 1e-3) {
    const exp = Math.floor(Math.log10(a) + 1e-12);
    const mant = Number((v / 10 ** exp).toPrecision(3));
    return mant === 1 ? `10^{${exp}}` : mant === -1 ? `−10^{${exp}}` : `${mant}·10^{${exp}}`;
  }
  return String(Number(v.toPrecision(3)));
}
