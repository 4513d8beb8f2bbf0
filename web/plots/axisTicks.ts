// Tick positions for the SVG writer: powers of ten on log axes, 1-2-5 steps on linear axes.

export function axisTicks(scale: 'log' | 'linear', lo: number, hi: number): number[] {
  if (!(hi > lo)) return [];
  if (scale === 'log') {
    const first = Math.ceil(Math.log10(lo));
    const last = Math.floor(Math.log10(hi));
    const ticks: number[] = [];
    // Every decade, or every second/third one when there are many.
    const step = Math.max(1, Math.ceil((last - first + 1) / 8));
    for (let k = first; k <= last; k += step) ticks.push(10 ** k);
    return ticks;
  }
  const raw = (hi - lo) / 6;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const ticks: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) ticks.push(Math.abs(t) < step * 1e-9 ? 0 : t);
  return ticks;
}

/** Short tick label: 1e-15, 3e-9, 0.5, 120. */
export function formatTick(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e4 || a < 1e-3) {
    const [mant, exp] = v.toExponential(2).split('e');
    return `${Number(mant)}e${Number(exp)}`;
  }
  return String(Number(v.toPrecision(3)));
}
