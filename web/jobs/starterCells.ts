// Cells a run panel can offer to add when the sheet has none of the kind it needs, built from the
// sheet's own cells: a realisations set-up from its population and frequency grid, a likelihood
// from its predicted A_yr and an amplitude measurement. Null when the sheet lacks the ingredients.
import { isSheetObject, type CellSpec } from '../engine/engine';

export interface StarterCell {
  name: string;
  formula: string;
  section?: string;
}

function freeName(cells: CellSpec[], base: string): string {
  const taken = new Set(cells.map((c) => c.name));
  if (!taken.has(base)) return base;
  for (let i = 2; ; i++) if (!taken.has(`${base}_${i}`)) return `${base}_${i}`;
}

const kindOf = (v: unknown) => (isSheetObject(v) ? v.kind : null);

/** realiseBackground(pop, freqs, span, 100, 1) from the first population and the first frequencyGrid(span, ...) cell. */
export function realisationStarter(cells: CellSpec[], valueOf: (name: string) => unknown): StarterCell | null {
  const pop = cells.find((c) => kindOf(valueOf(c.name)) === 'population');
  const grid = cells.map((c) => ({ c, m: /^\s*frequencyGrid\(\s*([A-Za-z_][A-Za-z0-9_]*)\s*,/.exec(c.formula) })).find((x) => x.m && valueOf(x.c.name) !== undefined);
  if (!pop || !grid) return null;
  return { name: freeName(cells, 'realisations'), formula: `realiseBackground(${pop.name}, ${grid.c.name}, ${grid.m![1]}, 100, 1)`, section: pop.section };
}

/** amplitudeLogLikelihood(A_yr, measured) from the A_yr cell and the first amplitude measurement. */
export function likelihoodStarter(cells: CellSpec[], valueOf: (name: string) => unknown): StarterCell | null {
  const ayr = cells.find((c) => c.name === 'A_yr' && typeof valueOf(c.name) === 'number');
  const measured = cells.find((c) => {
    const v = valueOf(c.name);
    return kindOf(v) === 'measurement' && !!(v as { measurement?: unknown }).measurement;
  });
  if (!ayr || !measured) return null;
  return { name: freeName(cells, 'lnL_amplitude'), formula: `amplitudeLogLikelihood(${ayr.name}, ${measured.name})`, section: measured.section };
}
