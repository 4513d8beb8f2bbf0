// The built-ins' documentation for the help in the page (completions, the call hint under a formula
// box, the Reference tab), loaded on first use as a chunk of its own: the engine the page starts with
// carries the built-ins' code only (scripts/builtinDocsInApp.mjs). Until it has arrived the list is
// empty, and whatever reads it is drawn again when it comes.
import { createSignal } from 'solid-js';
import type { Builtin } from '../engine/engine';

/** What help shows of a built-in: everything but its implementation. */
export type BuiltinDoc = Omit<Builtin, 'fn'>;

const [docs, setDocs] = createSignal<readonly BuiltinDoc[]>([]);
let loading: Promise<void> | null = null;

/** The documentation of every built-in, or none while it loads (the first call starts loading it). */
export function builtinDocs(): readonly BuiltinDoc[] {
  loading ??= import('virtual:builtin-docs').then(
    (m) => {
      setDocs(m.default);
    },
    () => {
      loading = null; // asked again on the next read
    },
  );
  return docs();
}
