// Long jobs: scan one input, map two inputs against the measurement, or sample the uncertain
// cells (Monte Carlo). They run in the job worker on a copy of the sheet, with progress and cancel.
import { createMemo, createSignal, For, Match, onCleanup, Show, Switch } from 'solid-js';
import { useServices } from '../app/services';
import { isSheetObject } from '../engine/engine';
import { math } from '../../src/sheet/mathInstance';
import { JobClient } from './jobClient';
import type { GoalSeekJobResult, JobSpec, SampleResult, ScanAxisSpec } from './jobProtocol';
import { formatNumber } from '../../src/sheet/formatValue';
import { PlotView } from '../plots/PlotView';
import { CellSelect } from './CellSelect';
import { AUTO_WORKERS_HINT, wholeIn } from './JobStatusView';
import { scan1Model, scan2Model, sampleModel } from './scanPlotModels';

type Mode = 'scan1' | 'scan2' | 'sample' | 'goalSeek';

/** A scalar cell's value as a number in its display unit (or SI when it has none). */
function scalarInUnit(v: unknown, unit: string | undefined): { value: number; unit: string } | null {
  if (typeof v === 'number' && Number.isFinite(v)) return { value: v, unit: '' };
  if (math.isUnit(v)) {
    try {
      const u = v as unknown as { toNumber(unit: string): number; formatUnits(): string };
      const target = unit || u.formatUnits();
      return { value: u.toNumber(target), unit: target };
    } catch {
      return null;
    }
  }
  return null;
}

function AxisFields(props: { label: string; axis: ScanAxisSpec; choices: string[]; onChange: (a: ScanAxisSpec) => void; onPick: (cell: string) => void }) {
  return (
    <fieldset class="axis-fields">
      <legend>{props.label}</legend>
      <label>
        cell
        <CellSelect value={props.axis.cell} choices={props.choices} label={`${props.label} cell`} onChange={props.onPick} />
      </label>
      <label>
        from <input type="number" step="any" value={props.axis.lo} onChange={(e) => props.onChange({ ...props.axis, lo: Number(e.currentTarget.value) })} />
      </label>
      <label>
        to <input type="number" step="any" value={props.axis.hi} onChange={(e) => props.onChange({ ...props.axis, hi: Number(e.currentTarget.value) })} />
      </label>
      <label>
        points <input type="number" min="2" max="400" step="1" value={props.axis.n} onChange={(e) => props.onChange({ ...props.axis, n: Math.round(Number(e.currentTarget.value)) })} />
      </label>
      <label class="inline">
        <input type="checkbox" checked={props.axis.log} onChange={(e) => props.onChange({ ...props.axis, log: e.currentTarget.checked })} /> log spacing
      </label>
      <span class="axis-unit">{props.axis.unit ? `in ${props.axis.unit}` : 'plain number'}</span>
    </fieldset>
  );
}

/**
 * The default range of a scanned input around its value v: a decade either side, log spaced, for
 * positive values far from one; linear v +- max(|v|, 0.5) for signed or order-one values (slopes,
 * fractions), where a decade either side would run through zero or meaningless values.
 */
export function defaultRange(v: number): { lo: number; hi: number; log: boolean } {
  const round = (x: number) => Number(x.toPrecision(3));
  if (v > 0 && (v < 0.1 || v > 10)) return { lo: round(v / 10), hi: round(v * 10), log: true };
  const half = Math.max(Math.abs(v), 0.5);
  return { lo: round(v - half), hi: round(v + half), log: false };
}

function sameNames(a: string[], b: string[]): boolean {
  return a.length === b.length && a.every((x, i) => x === b[i]);
}

export function ScanPanel() {
  const services = useServices();
  const { session } = services;
  const client = new JobClient();
  onCleanup(() => client.dispose());
  const [mode, setMode] = createSignal<Mode>('scan1');
  const [formError, setFormError] = createSignal<string | null>(null);

  // Lists of names (strings, compared by content) so that the option lists are rebuilt only when
  // the set of eligible cells changes, not on every recalculation.
  // Read through session.reader(): once per completed recalculation, not one signal per cell.
  const scalarCells = createMemo(() => {
    const r = session.reader();
    return r.cells.filter((c) => scalarInUnit(r.valueOf(c.name), c.unit) !== null).map((c) => c.name);
  }, undefined, { equals: sameNames });
  const measurementCells = createMemo(
    () => {
      const r = session.reader();
      return r.objects
        .filter((c) => {
          const v = r.valueOf(c.name);
          return isSheetObject(v) && v.kind === 'measurement';
        })
        .map((c) => c.name);
    },
    undefined,
    { equals: sameNames },
  );
  const defaultAxis = (cell: string | undefined): ScanAxisSpec => {
    const spec = cell === undefined ? undefined : session.current.get(cell);
    const s = spec ? scalarInUnit(session.current.value(spec.name), spec.unit) : null;
    if (!spec || !s) return { cell: cell ?? '', lo: 0, hi: 1, n: 41, log: false, unit: '' };
    return { cell: spec.name, ...defaultRange(s.value), n: 41, unit: s.unit };
  };
  const [output, setOutput] = createSignal(session.current.has('A_yr') ? 'A_yr' : (scalarCells()[0] ?? ''));
  // Inputs the output depends on (cells with no inputs of their own), the sheet's own sections
  // before cosmology: the merger rate and the mass slope for the demo's A_yr, not H0.
  const upstreamInputs = (out: string): string[] => {
    const seen = new Set<string>();
    const stack = [out];
    while (stack.length) for (const d of session.dependencies(stack.pop()!)) if (!seen.has(d)) (seen.add(d), stack.push(d));
    const scalars = new Set(scalarCells());
    const inputs = session.cells().filter((c) => seen.has(c.name) && scalars.has(c.name) && session.dependencies(c.name).length === 0);
    return [...inputs.filter((c) => c.section !== 'cosmology'), ...inputs.filter((c) => c.section === 'cosmology')].map((c) => c.name);
  };
  const candidates = () => [...upstreamInputs(output()), ...scalarCells()];
  const [axisX, setAxisX] = createSignal<ScanAxisSpec>(defaultAxis(candidates().find((c) => c === 'rate_norm') ?? candidates()[0]));
  const [axisY, setAxisY] = createSignal<ScanAxisSpec>({ ...defaultAxis(candidates().find((c) => c !== axisX().cell)), n: 31 });
  const [measurement, setMeasurement] = createSignal<string>(measurementCells()[0] ?? '');
  const [samples, setSamples] = createSignal(1000);
  const [seed, setSeed] = createSignal(1);
  const [target, setTarget] = createSignal('');
  /** Web Workers for the chunks: empty is automatic (one per core, started once the job proves long). */
  const [workers, setWorkers] = createSignal('');

  const run = () => {
    setFormError(null);
    const checkAxis = (a: ScanAxisSpec, what: string): string | null => {
      if (!a.cell) return `Choose the ${what} cell.`;
      if (!Number.isFinite(a.lo) || !Number.isFinite(a.hi)) return `${what}: both ends must be numbers.`;
      if (!(a.hi > a.lo)) return `${what}: the range must run from a smaller to a larger value (got ${a.lo} to ${a.hi}).`;
      if (a.log && !(a.lo > 0)) return `${what}: log spacing needs a positive range (got ${a.lo}).`;
      if (!(Number.isInteger(a.n) && a.n >= 2 && a.n <= 400)) return `${what}: points must be a whole number from 2 to 400.`;
      return null;
    };
    let job: JobSpec;
    const m = mode();
    if (!output()) return setFormError('Choose the output cell.');
    // What runs is what the form shows: a chosen cell without a value now is refused by name.
    const used = [output(), ...(m === 'scan1' || m === 'goalSeek' ? [axisX().cell] : m === 'scan2' ? [axisX().cell, axisY().cell] : [])];
    const absent = used.find((c) => c && !scalarCells().includes(c));
    if (absent) return setFormError(`${absent} has no number to use right now (see its row); fix it or choose another cell.`);
    if (m === 'scan1') {
      const e = checkAxis(axisX(), 'input');
      if (e) return setFormError(e);
      job = { kind: 'scan1', axis: axisX(), output: output(), measurement: measurement() || null };
    } else if (m === 'scan2') {
      const e = checkAxis(axisX(), 'first input') ?? checkAxis(axisY(), 'second input');
      if (e) return setFormError(e);
      if (axisX().cell === axisY().cell) return setFormError('The two inputs must be different cells.');
      if (!measurement()) return setFormError('A map needs a measurement cell to compare with.');
      job = { kind: 'scan2', x: axisX(), y: axisY(), output: output(), measurement: measurement() };
    } else if (m === 'goalSeek') {
      if (!axisX().cell) return setFormError('Choose the input cell to solve for.');
      if (axisX().cell === output()) return setFormError('The input and the output must be different cells.');
      if (!target().trim()) return setFormError(`Give the target value of ${output()} (a number, or a formula with its unit).`);
      job = { kind: 'goalSeek', input: axisX().cell, output: output(), target: target() };
    } else {
      if (!(Number.isInteger(samples()) && samples() >= 10 && samples() <= 200_000)) return setFormError('Samples must be a whole number from 10 to 200000.');
      job = { kind: 'sample', samples: samples(), seed: seed(), output: output(), measurement: measurement() || null };
    }
    let w: number | undefined;
    if (m !== 'goalSeek' && workers().trim() !== '') {
      const k = wholeIn(workers(), 1, 16);
      if (k === null) return setFormError(`Workers must be a whole number from 1 to 16, or empty for automatic, got "${workers()}".`);
      w = k;
    }
    client.start(session.toFileText(), job, w);
  };

  const status = client.status;
  const applyGoal = (g: GoalSeekJobResult) => {
    const formula = g.unit ? `${g.value} ${g.unit}` : String(g.value);
    const r = session.edit(`set ${g.input} by goal seek`, (sheet) => sheet.updateCell(g.input, { formula }));
    if (!r.ok) services.notify(r.message, 'error');
    else services.notify(`${g.input} is now ${formula}. Undo brings back its formula.`);
  };
  const running = () => {
    const s = status();
    return s.state === 'running' ? s : null;
  };
  const failed = () => {
    const s = status();
    return s.state === 'failed' ? s.message : null;
  };
  const done = () => {
    const s = status();
    return s.state === 'done' ? s : null;
  };
  const resultModel = createMemo(() => {
    const s = status();
    if (s.state !== 'done') return null;
    const r = s.result;
    if (r.kind === 'scan1') return scan1Model(r, measurement() || null);
    if (r.kind === 'scan2') return scan2Model(r);
    if (r.kind !== 'sample') return null;
    return sampleModel(r, measurement() || null);
  });

  return (
    <div class="scan-panel">
      <div class="mode-switch no-print" role="radiogroup" aria-label="Job">
        <label>
          <input type="radio" name="mode" checked={mode() === 'scan1'} onChange={() => setMode('scan1')} /> scan one input
        </label>
        <label>
          <input type="radio" name="mode" checked={mode() === 'scan2'} onChange={() => setMode('scan2')} /> map two inputs
        </label>
        <label>
          <input type="radio" name="mode" checked={mode() === 'sample'} onChange={() => setMode('sample')} /> sample uncertain cells
        </label>
        <label>
          <input type="radio" name="mode" checked={mode() === 'goalSeek'} onChange={() => setMode('goalSeek')} /> solve for a target
        </label>
      </div>
      <div class="job-form no-print">
        <Show when={mode() === 'goalSeek'}>
          <fieldset class="axis-fields">
            <legend>solve</legend>
            <label>
              input to change
              <CellSelect value={axisX().cell} choices={scalarCells()} label="Goal-seek input cell" onChange={(c) => setAxisX(defaultAxis(c))} />
            </label>
            <label>
              target of the output
              <input class="target-input" spellcheck={false} placeholder="e.g. 2.9e-15 or measured_A" value={target()} onInput={(e) => setTarget(e.currentTarget.value)} aria-label="Target value" />
            </label>
            <span class="axis-unit">Brent's method, widening the bracket as needed</span>
          </fieldset>
        </Show>
        <Show when={mode() === 'scan1' || mode() === 'scan2'}>
          <AxisFields label={mode() === 'scan2' ? 'first input' : 'input'} axis={axisX()} choices={scalarCells()} onChange={setAxisX} onPick={(c) => setAxisX(defaultAxis(c))} />
        </Show>
        <Show when={mode() === 'scan2'}>
          <AxisFields label="second input" axis={axisY()} choices={scalarCells()} onChange={setAxisY} onPick={(c) => setAxisY({ ...defaultAxis(c), n: 31 })} />
        </Show>
        <Show when={mode() === 'sample'}>
          <fieldset class="axis-fields">
            <legend>samples</legend>
            <label>
              how many <input type="number" min="10" step="1" value={samples()} onChange={(e) => setSamples(Math.round(Number(e.currentTarget.value)))} />
            </label>
            <label>
              seed <input type="number" step="1" value={seed()} onChange={(e) => setSeed(Math.round(Number(e.currentTarget.value)))} />
            </label>
            <span class="axis-unit">cells with an uncertainty are drawn from it</span>
          </fieldset>
        </Show>
        <fieldset class="axis-fields">
          <legend>result</legend>
          <label>
            output
            <CellSelect value={output()} choices={scalarCells()} label="Output cell" onChange={setOutput} />
          </label>
          <Show when={mode() !== 'goalSeek'}>
            <label>
              workers <input type="number" min="1" max="16" step="1" placeholder="auto" data-field="workers" title={AUTO_WORKERS_HINT} value={workers()} onInput={(e) => setWorkers(e.currentTarget.value)} />
            </label>
            <label>
              measurement
              <CellSelect value={measurement()} choices={measurementCells()} label="Measurement cell" emptyLabel="none" onChange={setMeasurement} />
            </label>
          </Show>
        </fieldset>
        <div class="job-buttons">
          <button type="button" class="primary" data-action="run-job" disabled={status().state === 'running' || status().state === 'cancelling'} onClick={run}>
            Run
          </button>
          <button type="button" data-action="cancel-job" disabled={status().state !== 'running'} onClick={() => client.cancel()}>
            Cancel
          </button>
        </div>
        <Show when={formError()}>
          <div class="form-error" role="alert">{formError()}</div>
        </Show>
      </div>
      <Switch>
        <Match when={running()}>
          {(s) => (
            <div class="job-progress" role="progressbar" aria-valuemin={0} aria-valuemax={s().total} aria-valuenow={s().done}>
              <progress max={s().total} value={s().done} /> {s().done} of {s().total}
            </div>
          )}
        </Match>
        <Match when={status().state === 'cancelling'}>
          <div class="job-progress" data-job-cancelling>Cancelling…</div>
        </Match>
        <Match when={status().state === 'cancelled'}>
          <div class="job-progress" data-job-cancelled>Cancelled. The sheet is as it was.</div>
        </Match>
        <Match when={failed()}>
          {(message) => (
            <div class="form-error" role="alert">
              The job failed: {message()}
            </div>
          )}
        </Match>
        <Match when={done()}>
          {(s) => (
            <div class="job-result" data-job-result={s().result.kind}>
              <div class="job-time">finished in {(s().elapsedMs / 1000).toFixed(2)} s</div>
              <Show when={s().result.kind === 'goalSeek' ? (s().result as GoalSeekJobResult) : null}>
                {(g) => (
                  <div class="goal-result" data-goal-result>
                    <p>
                      <b>
                        {g().input} = {formatNumber(g().value)}
                        {g().unit ? ` ${g().unit}` : ''}
                      </b>{' '}
                      makes {g().output} = {formatNumber(g().achievedSI)} (target {g().target}; {g().evaluations} evaluations).
                    </p>
                    <button type="button" data-action="apply-goal" onClick={() => applyGoal(g())}>
                      Put this value into {g().input}
                    </button>
                  </div>
                )}
              </Show>
              <Show when={s().result.kind === 'sample' ? (s().result as SampleResult).summary : null}>
                {(rows) => (
                  <table class="summary-table">
                    <tbody>
                      <For each={rows()}>
                        {(row) => (
                          <tr>
                            <th>{row.label}</th>
                            <td>{row.value}</td>
                          </tr>
                        )}
                      </For>
                    </tbody>
                  </table>
                )}
              </Show>
            </div>
          )}
        </Match>
      </Switch>
      <Show when={resultModel()}>{(m) => <PlotView model={m} height={340} onMessage={(t) => services.notify(t, 'error')} />}</Show>
    </div>
  );
}
