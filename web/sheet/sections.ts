// Grouping of cells into the sections shown on screen: the standard ones first, in the order a
// calculation flows, then the user's own in the order they first appear.
import type { CellSpec } from '../engine/engine';

export const STANDARD_SECTIONS = ['cosmology', 'population', 'orbits', 'array', 'measurement', 'results'] as const;
/** Where cells without a section are shown. */
export const LOOSE_SECTION = 'my cells';

export interface SectionGroup {
  name: string;
  cells: CellSpec[];
}

export function sectionOf(spec: CellSpec): string {
  const s = spec.section?.trim();
  return s ? s : LOOSE_SECTION;
}

export function groupBySection(cells: CellSpec[]): SectionGroup[] {
  const groups = new Map<string, CellSpec[]>();
  for (const name of STANDARD_SECTIONS) groups.set(name, []);
  for (const c of cells) {
    const s = sectionOf(c);
    if (!groups.has(s)) groups.set(s, []);
    groups.get(s)!.push(c);
  }
  return [...groups].filter(([, list]) => list.length > 0).map(([name, list]) => ({ name, cells: list }));
}

/** Every section name in use plus the standard ones, for the move menu. */
export function sectionChoices(cells: CellSpec[]): string[] {
  const names = new Set<string>(STANDARD_SECTIONS);
  for (const c of cells) names.add(sectionOf(c));
  return [...names];
}

/** A name not yet used by any cell: base, base_2, base_3, ... */
export function freshName(base: string, taken: Set<string>): string {
  if (!taken.has(base)) return base;
  for (let k = 2; ; k++) if (!taken.has(`${base}_${k}`)) return `${base}_${k}`;
}
