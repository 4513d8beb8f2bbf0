// The page's side of the job worker: starts one job at a time, reports progress, cancels.
// Cancel wins: once the user asks to cancel, the job's outcome is 'cancelled' whatever the worker
// sends next (a result that was already on its way is dropped), so a job that ends while a cancel
// is in flight has one well-defined outcome.
import { createSignal } from 'solid-js';
import type { FromWorker, JobResult, JobSpec, ToWorker } from './jobProtocol';
import type { InferProgressDetail } from '../inference/inferRun';
import jobWorkerUrl from './jobWorker.ts?shared-worker-url';

export type JobStatus =
  | { state: 'idle' }
  | { state: 'running'; done: number; total: number; startedAt: number; detail?: InferProgressDetail }
  | { state: 'done'; result: JobResult; elapsedMs: number }
  | { state: 'cancelling' }
  | { state: 'cancelled' }
  | { state: 'failed'; message: string };

/** What the client needs of a worker (a Web Worker in the page; a stand-in in unit tests). */
export interface JobWorkerLike {
  onmessage: ((e: MessageEvent<FromWorker>) => void) | null;
  onerror: ((e: ErrorEvent) => void) | null;
  postMessage(m: ToWorker): void;
  terminate(): void;
}

const defaultWorker = (): JobWorkerLike => new Worker(jobWorkerUrl, { type: 'module', name: 'strainsheet-jobs' });

/** How long a cancelled job may take to stop before its worker is ended. */
export const CANCEL_GRACE_MS = 1000;

export class JobClient {
  private worker: JobWorkerLike | null = null;
  private jobId = 0;
  readonly status;
  private setStatus;

  constructor(private readonly makeWorker: () => JobWorkerLike = defaultWorker) {
    [this.status, this.setStatus] = createSignal<JobStatus>({ state: 'idle' });
  }

  private ensureWorker(): JobWorkerLike {
    if (this.worker) return this.worker;
    const w = this.makeWorker();
    w.onmessage = (e: MessageEvent<FromWorker>) => this.receive(e.data);
    w.onerror = (e) => {
      e.preventDefault();
      this.setStatus({ state: 'failed', message: `The job worker stopped: ${e.message || 'unknown error'}` });
      this.worker?.terminate();
      this.worker = null;
    };
    this.worker = w;
    return w;
  }

  /** Starts a job (on `workers` Web Workers; default one per core); refused (false) while another one is running or being cancelled. */
  start(sheetText: string, job: JobSpec, workers?: number): boolean {
    const st = this.status().state;
    if (st === 'running' || st === 'cancelling') return false;
    const id = ++this.jobId;
    this.setStatus({ state: 'running', done: 0, total: 1, startedAt: performance.now() });
    const msg: ToWorker = { type: 'start', jobId: id, sheetText, job, ...(workers === undefined ? {} : { workers }) };
    this.ensureWorker().postMessage(msg);
    return true;
  }

  /**
   * Asks the job to stop. The status is 'cancelling' until the worker's next word on the job
   * (cancelled, a result, an error: all end as 'cancelled'); without one within CANCEL_GRACE_MS
   * the worker is ended and the job is 'cancelled'.
   */
  cancel(): void {
    const s = this.status();
    if (s.state !== 'running' || !this.worker) return;
    const id = this.jobId;
    const msg: ToWorker = { type: 'cancel', jobId: id };
    this.setStatus({ state: 'cancelling' });
    this.worker.postMessage(msg);
    setTimeout(() => {
      if (this.jobId === id && this.status().state === 'cancelling') {
        this.worker?.terminate();
        this.worker = null;
        this.setStatus({ state: 'cancelled' });
      }
    }, CANCEL_GRACE_MS);
  }

  dispose(): void {
    this.worker?.terminate();
    this.worker = null;
  }

  private receive(m: FromWorker): void {
    if (m.jobId !== this.jobId) return; // a late message from an older job
    const s = this.status();
    if (s.state === 'cancelling') {
      if (m.type !== 'progress') this.setStatus({ state: 'cancelled' });
      return;
    }
    if (s.state !== 'running') return;
    if (m.type === 'progress' && s.state === 'running') this.setStatus({ ...s, done: m.done, total: m.total, detail: m.detail ?? s.detail });
    else if (m.type === 'result') this.setStatus({ state: 'done', result: m.result, elapsedMs: m.elapsedMs });
    else if (m.type === 'cancelled') this.setStatus({ state: 'cancelled' });
    else if (m.type === 'error') this.setStatus({ state: 'failed', message: m.message });
  }
}
