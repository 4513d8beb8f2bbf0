// The always-visible bar of key results: A_yr, the comparison with the measurement across the band
// and at f_yr, and the merger rate the measurement allows — whichever of these the sheet has.
import { createMemo, For, Show } from 'solid-js';
import { useServices } from './services';
import { formatValue, isOffPageValue, isSheetObject, type CellSpec } from '../engine/engine';
import { sectionOf } from '../sheet/sections';
import { ScientificText } from '../sheet/ScientificText';
import { matchingCells } from '../plots/matchingCells';

interface KeyResult {
  role: string;
  cell: CellSpec;
}

/**
 * Picks the key-result cells: by name for A_yr, by value kind or name for the others. `objects`
 * are the cells that may hold a sheet object (every cell when not given), searched for kinds.
 */
export function pickKeyResults(cells: CellSpec[], valueOf: (name: string) => unknown, objects: CellSpec[] = cells): KeyResult[] {
  const out: KeyResult[] = [];
  const ayr = matchingCells(cells, 'A_yr', (c) => c.name === 'A_yr')[0];
  if (ayr) out.push({ role: 'predicted A_yr', cell: ayr });
  // A value held off the page (a slow cell evaluated in the worker) counts as the kind it holds.
  const kindIs = (c: CellSpec, re: RegExp) => {
    const v = valueOf(c.name);
    return isSheetObject(v) && re.test(isOffPageValue(v) ? v.heldKind : v.kind);
  };
  // The headline is the comparison across the band (free spectrum and (A, gamma)); the single number at f_yr follows.
  const band = objects.find((c) => kindIs(c, /^bandComparison$/));
  if (band) out.push({ role: 'across the band', cell: band });
  const comparison =
    objects.find((c) => kindIs(c, /^comparison$/i)) ?? (band ? undefined : matchingCells(cells, 'comparison by name', (c) => /compar|tension|ratio.*meas|meas.*ratio/i.test(c.name))[0]);
  if (comparison) out.push({ role: band ? 'at f_yr' : 'against the measurement', cell: comparison });
  const allowed =
    objects.find((c) => kindIs(c, /allowed|rateSolution|rateRange/i)) ??
    matchingCells(cells, 'allowed rate by name', (c) => /allowed/i.test(c.name) && sectionOf(c) !== 'population')[0];
  if (allowed) out.push({ role: 'allowed merger rate', cell: allowed });
  return out;
}

/**
 * The new picks, except while a card's cell has no value (an error, a recalculation, an edit under
 * way): then every card keeps its cell, so no other cell is swapped in (picks by kind need values).
 */
export function keepPicks(previous: KeyResult[], specOf: (name: string) => CellSpec | undefined, fresh: KeyResult[], noValue: (name: string) => boolean): KeyResult[] {
  if (previous.length && previous.every((p) => specOf(p.cell.name)) && previous.some((p) => noValue(p.cell.name))) {
    return previous.map((p) => ({ role: p.role, cell: specOf(p.cell.name)! }));
  }
  return fresh;
}

/** Values up to this many characters are shown whole; longer ones keep to two lines in one row of cards. */
const SHORT_VALUE = 32;

export function KeyResultsBar() {
  const services = useServices();
  const { session } = services;
  // A card keeps its cell while that cell exists: a cell in error or being edited (no value, so no
  // kind to recognise) shows its own state instead of another cell taking its place.
  // Picks are made again when the cells change or a recalculation is complete (reading the
  // engine's values directly, not one signal per cell, so a long sheet is not scanned per cell).
  const results = createMemo<KeyResult[]>((previous) => {
    const { cells, objects, valueOf, stateOf, specOf } = session.reader();
    return keepPicks(previous, specOf, pickKeyResults(cells, valueOf, objects), (n) => stateOf(n).status !== 'value');
  }, []);
  // Keyed by role and name, so the bar's buttons are rebuilt only when a different cell is picked.
  const keys = createMemo(() => results().map((r) => `${r.role}\u0000${r.cell.name}`), undefined, {
    equals: (a, b) => a.length === b.length && a.every((x, i) => x === b[i]),
  });
  return (
    <section class="key-results" aria-label="Key results">
      <Show when={keys().length} fallback={<span class="key-empty">No result cells yet (a cell named A_yr shows here).</span>}>
        <For each={keys()}>
          {(key) => {
            const [role, name] = key.split('\u0000');
            const unit = () => results().find((x) => x.cell.name === name)?.cell.unit;
            const st = () => session.state(name);
            const text = () => {
              const s = st();
              if (s.status === 'pending') return s.offPage || s.waitsFor !== undefined ? 'evaluating off the page…' : 'computing…';
              if (s.status === 'error') return `error (${s.error.kind}): ${s.error.message}`;
              try {
                return formatValue(s.value, unit());
              } catch {
                return String(s.value);
              }
            };
            return (
              <button type="button" class={`key-result ${st().status}`} classList={{ short: text().length <= SHORT_VALUE }} data-key-result={name} title={`${name}: ${text()}`} onClick={() => services.focusCell(name)}>
                <span class="key-role">{role}</span>
                <span class="key-name">{name}</span>
                <span class="key-value" data-key-value={name} data-raw={text()}>
                  <ScientificText text={text()} />
                </span>
              </button>
            );
          }}
        </For>
      </Show>
    </section>
  );
}
