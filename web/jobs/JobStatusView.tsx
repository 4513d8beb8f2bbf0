// The state of a job of the worker as the panels show it: progress (with what the job adds to it),
// cancelling, cancelled, or the failure's message. The result itself is each panel's own.
import { Match, Switch, type JSX } from 'solid-js';
import type { JobStatus } from './jobClient';

export function JobStatusView(props: { status: JobStatus; unit: string; detail?: (s: Extract<JobStatus, { state: 'running' }>) => JSX.Element }) {
  const running = () => (props.status.state === 'running' ? props.status : null);
  const failed = () => (props.status.state === 'failed' ? props.status.message : null);
  return (
    <Switch>
      <Match when={running()}>
        {(s) => (
          <div class="job-progress" data-job-running role="progressbar" aria-valuemin={0} aria-valuemax={s().total} aria-valuenow={s().done}>
            <progress max={s().total} value={s().done} />{' '}
            <span data-job-done={s().done}>
              {s().done} of {s().total} {props.unit}
            </span>
            {props.detail?.(s())}
          </div>
        )}
      </Match>
      <Match when={props.status.state === 'cancelling'}>
        <div class="job-progress" data-job-cancelling>
          Cancelling…
        </div>
      </Match>
      <Match when={props.status.state === 'cancelled'}>
        <div class="job-progress" data-job-cancelled>
          Cancelled: no result. The sheet is as it was.
        </div>
      </Match>
      <Match when={failed()}>
        {(message) => (
          <div class="form-error" role="alert" data-job-failed>
            The job failed: {message()}
          </div>
        )}
      </Match>
    </Switch>
  );
}

/**
 * Why the run panels start with one worker: 1 runs in the job worker, which already holds the sheet;
 * each further Web Worker first loads the engine and rebuilds the sheet (seconds; README, Performance),
 * so more workers pay off only for runs much longer than that.
 */
export const WORKERS_HINT = '1 runs in the job worker itself; each further worker first rebuilds the sheet (seconds), so more pay off only for long runs. The numbers do not depend on it.';

/** The scan panel's workers field, empty by default (the job worker's startAfterMs, jobWorker.ts). */
export const AUTO_WORKERS_HINT = 'Empty: the job runs in the job worker and hands its chunks to one worker per core once it would take over a second there. A number: that many workers from the start. The numbers do not depend on it.';

/** A whole number from a form field, or null when the text is not one within [min, max]. */
export function wholeIn(text: string, min: number, max: number): number | null {
  if (!/^\s*\d+\s*$/.test(text)) return null;
  const n = Number(text);
  return Number.isSafeInteger(n) && n >= min && n <= max ? n : null;
}
