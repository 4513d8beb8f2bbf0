// The page's job client against a stand-in worker (node, no browser): a cancel always ends as
// 'cancelled', whichever message of the job arrives after it (issue 15: a job that ends while a
// cancel is in flight has one well-defined outcome).
import { describe, expect, it, vi } from 'vitest';
import { CANCEL_GRACE_MS, JobClient, type JobWorkerLike } from '../../web/jobs/jobClient';
import type { FromWorker, JobResult, ToWorker } from '../../web/jobs/jobProtocol';

class StandInWorker implements JobWorkerLike {
  onmessage: ((e: MessageEvent<FromWorker>) => void) | null = null;
  onerror: ((e: ErrorEvent) => void) | null = null;
  sent: ToWorker[] = [];
  terminated = false;
  postMessage(m: ToWorker): void {
    this.sent.push(m);
  }
  terminate(): void {
    this.terminated = true;
  }
  reply(m: FromWorker): void {
    this.onmessage?.({ data: m } as MessageEvent<FromWorker>);
  }
}

const RESULT: JobResult = { kind: 'goalSeek', input: 'x', output: 'y', target: '1', value: 1, unit: '', achievedSI: 1, evaluations: 3 };
const JOB = { kind: 'goalSeek', input: 'x', output: 'y', target: '1' } as const;

function started(): { client: JobClient; worker: StandInWorker; jobId: number } {
  const worker = new StandInWorker();
  const client = new JobClient(() => worker);
  expect(client.start('{}', JOB)).toBe(true);
  const start = worker.sent[0];
  if (start.type !== 'start') throw new Error('expected a start message');
  return { client, worker, jobId: start.jobId };
}

describe('job client: cancel wins', () => {
  it('a result that arrives after the cancel request is dropped: the job ends cancelled', () => {
    const { client, worker, jobId } = started();
    client.cancel();
    expect(client.status().state).toBe('cancelling');
    expect(worker.sent.at(-1)).toEqual({ type: 'cancel', jobId });
    worker.reply({ type: 'progress', jobId, done: 5, total: 10 });
    expect(client.status().state).toBe('cancelling');
    worker.reply({ type: 'result', jobId, result: RESULT, elapsedMs: 1 });
    expect(client.status().state).toBe('cancelled');
    // A late duplicate changes nothing.
    worker.reply({ type: 'result', jobId, result: RESULT, elapsedMs: 1 });
    expect(client.status().state).toBe('cancelled');
  });

  it('an error after the cancel request also ends cancelled, and no second job starts meanwhile', () => {
    const { client, worker, jobId } = started();
    client.cancel();
    expect(client.start('{}', JOB)).toBe(false);
    worker.reply({ type: 'error', jobId, message: 'stopped' });
    expect(client.status().state).toBe('cancelled');
    expect(client.start('{}', JOB)).toBe(true);
  });

  it('a worker that does not answer is ended after the grace period', () => {
    vi.useFakeTimers();
    try {
      const { client, worker } = started();
      client.cancel();
      vi.advanceTimersByTime(CANCEL_GRACE_MS - 1);
      expect(worker.terminated).toBe(false);
      vi.advanceTimersByTime(1);
      expect(worker.terminated).toBe(true);
      expect(client.status().state).toBe('cancelled');
    } finally {
      vi.useRealTimers();
    }
  });

  it('without a cancel, the result is kept', () => {
    const { client, worker, jobId } = started();
    worker.reply({ type: 'result', jobId, result: RESULT, elapsedMs: 2 });
    expect(client.status()).toEqual({ state: 'done', result: RESULT, elapsedMs: 2 });
  });

  it('progress carries the acceptance and autocorrelation estimate of an inference, kept until the next one', () => {
    const { client, worker, jobId } = started();
    const detail = { step: 30, steps: 100, acceptance: 0.41, tau: 3.2 };
    worker.reply({ type: 'progress', jobId, done: 30, total: 100, detail });
    expect(client.status()).toMatchObject({ state: 'running', done: 30, total: 100, detail });
    worker.reply({ type: 'progress', jobId, done: 31, total: 100 });
    expect(client.status()).toMatchObject({ state: 'running', done: 31, detail });
  });

  it('starts a job on the number of workers asked for', () => {
    const worker = new StandInWorker();
    const client = new JobClient(() => worker);
    client.start('{}', JOB, 3);
    expect(worker.sent[0]).toMatchObject({ type: 'start', workers: 3 });
  });
});
