// The page's side of the job worker: starts one job at a time, reports progress, cancels.
import { createSignal } from 'solid-js';
import type { FromWorker, JobResult, JobSpec, ToWorker } from './jobProtocol';

export type JobStatus =
  | { state: 'idle' }
  | { state: 'running'; done: number; total: number; startedAt: number }
  | { state: 'done'; result: JobResult; elapsedMs: number }
  | { state: 'cancelled' }
  | { state: 'failed'; message: string };

export class JobClient {
  private worker: Worker | null = null;
  private jobId = 0;
  readonly status;
  private setStatus;

  constructor() {
    [this.status, this.setStatus] = createSignal<JobStatus>({ state: 'idle' });
  }

  private ensureWorker(): Worker {
    if (this.worker) return this.worker;
    const w = new Worker(new URL('./jobWorker.ts', import.meta.url), { type: 'module', name: 'strainsheet-jobs' });
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

  start(sheetText: string, job: JobSpec): void {
    const id = ++this.jobId;
    this.setStatus({ state: 'running', done: 0, total: 1, startedAt: performance.now() });
    const msg: ToWorker = { type: 'start', jobId: id, sheetText, job };
    this.ensureWorker().postMessage(msg);
  }

  /** Asks the job to stop; if it does not answer within a second the worker is ended. */
  cancel(): void {
    const s = this.status();
    if (s.state !== 'running' || !this.worker) return;
    const id = this.jobId;
    const msg: ToWorker = { type: 'cancel', jobId: id };
    this.worker.postMessage(msg);
    setTimeout(() => {
      if (this.jobId === id && this.status().state === 'running') {
        this.worker?.terminate();
        this.worker = null;
        this.setStatus({ state: 'cancelled' });
      }
    }, 1000);
  }

  dispose(): void {
    this.worker?.terminate();
    this.worker = null;
  }

  private receive(m: FromWorker): void {
    if (m.jobId !== this.jobId) return; // a late message from an older job
    const s = this.status();
    if (m.type === 'progress' && s.state === 'running') this.setStatus({ ...s, done: m.done, total: m.total });
    else if (m.type === 'result') this.setStatus({ state: 'done', result: m.result, elapsedMs: m.elapsedMs });
    else if (m.type === 'cancelled') this.setStatus({ state: 'cancelled' });
    else if (m.type === 'error') this.setStatus({ state: 'failed', message: m.message });
  }
}
