// Which rows of a long sheet are drawn: the items (section titles and cell rows) are laid out one
// under the other with measured heights (an estimate until a row was drawn once), and only the
// items that meet the view, plus a margin, are drawn; spacers stand for the rest.

/** Sheets with at most this many cells draw every row (longer ones draw them all only while printed; find: FindBar.tsx). */
export const DRAW_ALL_UP_TO = 400;
/** Pixels drawn above and below the view, so that a short scroll shows drawn rows at once. */
export const OVERSCAN_PX = 600;

export interface RowLayout {
  /** offsets[i] is the top of item i; offsets[n] the height of all items. */
  offsets: Float64Array;
}

/** Tops of the items from their heights (a measured height, else the estimate for its kind). */
export function layoutRows(keys: readonly string[], height: (key: string) => number): RowLayout {
  const offsets = new Float64Array(keys.length + 1);
  for (let i = 0; i < keys.length; i++) offsets[i + 1] = offsets[i] + height(keys[i]);
  return { offsets };
}

/** First index i with offsets[i + 1] > y (the item under y), clamped to [0, n]. */
function itemAt(offsets: Float64Array, y: number): number {
  let lo = 0;
  let hi = offsets.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (offsets[mid + 1] > y) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/** The items [start, end) that meet the band [top, bottom] (pixels from the top of the first item). */
export function itemsInBand(layout: RowLayout, top: number, bottom: number): { start: number; end: number } {
  const n = layout.offsets.length - 1;
  if (n === 0) return { start: 0, end: 0 };
  const start = itemAt(layout.offsets, Math.max(0, top));
  const end = Math.max(start, Math.min(n, itemAt(layout.offsets, bottom) + 1));
  return { start, end };
}
