// Things a row can carry beside its formula that say how uncertain the cell is: today the
// uncertainty (a distribution that "sample uncertain cells" draws from). Each kind is one entry
// here: how to read it from the cell, the patch that sets or clears it, and a check run before an
// edit is made. Another kind (e.g. a prior for inference) is added as one more entry; the row's
// badge and editor (AnnotationBadges.tsx) need no change.
import type { CellSpec, Sheet } from '../engine/engine';
import { loadBuiltinsNamedIn } from '../engine/builtinsNeeded';

export interface RowAnnotationKind {
  id: string;
  /** Word on the badge and in messages, e.g. 'uncertainty'. */
  label: string;
  /** Short mark before the text on the badge. */
  symbol: string;
  placeholder: string;
  read(spec: CellSpec): string | undefined;
  /** The updateCell patch that sets the text (undefined clears it). */
  patch(text: string | undefined): Partial<CellSpec>;
  /** Null when the text may be stored for this cell, else what is wrong (names the cell). */
  check(sheet: Sheet, cell: string, text: string): Promise<string | null>;
}

export const UNCERTAINTY: RowAnnotationKind = {
  id: 'uncertainty',
  label: 'uncertainty',
  symbol: '±',
  placeholder: 'e.g. lognormalDist(1e-3 Mpc^-3 Gyr^-1, 0.3)',
  read: (spec) => spec.uncertainty,
  patch: (text) => ({ uncertainty: text }),
  async check(sheet, cell, text) {
    // Loaded on first use: the Monte Carlo code is not needed to show the sheet.
    const [checks] = await Promise.all([import('./annotationChecks'), loadBuiltinsNamedIn(text)]);
    return checks.uncertaintyProblem(sheet, cell, text);
  },
};

/** The prior of a free cell of inference (docs/inference.md); refused as `strainsheet infer` refuses it. */
export const PRIOR: RowAnnotationKind = {
  id: 'prior',
  label: 'prior',
  symbol: 'π',
  placeholder: 'e.g. logUniformDist(1e-5 Mpc^-3 Gyr^-1, 1e-1 Mpc^-3 Gyr^-1)',
  read: (spec) => spec.prior,
  patch: (text) => ({ prior: text }),
  async check(sheet, cell, text) {
    const [checks] = await Promise.all([import('./annotationChecks'), loadBuiltinsNamedIn(text)]);
    return checks.priorProblem(sheet, cell, text);
  },
};

export const ROW_ANNOTATION_KINDS: RowAnnotationKind[] = [UNCERTAINTY, PRIOR];
