// The app's job runner (web/jobs/jobRunner.ts) reports the workers a sample job's chunks actually ran
// on: the job worker alone when the job never started its pool (startAfterMs), the pool's size when
// it did; the samples themselves do not depend on it. The check is the one-thread run of the same job.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runJob } from '../../web/jobs/jobRunner';
import type { SampleResult } from '../../web/jobs/jobProtocol';
import { runChunkInWorker } from '../../src/jobs/chunkRuntime';
import type { ChunkExecutor } from '../../src/jobs/runChunks';
import { SAMPLE_CHUNK } from '../../src/statistics/monteCarloJob';

const DEMO_TEXT = readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8');
const ctl = () => ({ signal: new AbortController().signal, progress: () => {} });
const job = { kind: 'sample' as const, samples: 3 * SAMPLE_CHUNK, seed: 4, output: 'A_yr', measurement: null };

/** Stands in for the Web Workers: runs each chunk here from the file text, as a chunk worker does. */
function standInPool(made: number[]) {
  return (workers: number): ChunkExecutor => {
    made.push(workers);
    return { runChunk: async (kind, text, plan, index) => runChunkInWorker(kind, text, plan, index), close: async () => {} };
  };
}

const summary = (r: SampleResult) => new Map(r.summary.map(({ label, value }) => [label, value]));

describe('workers reported by the app\'s sample job', () => {
  it('1 when the pool never started, the pool size when it did; the rest of the summary is the same', { timeout: 60_000 }, async () => {
    const one = (await runJob(DEMO_TEXT, job, ctl())) as SampleResult;
    const madeShort: number[] = [];
    const short = (await runJob(DEMO_TEXT, job, ctl(), { workers: 2, pool: standInPool(madeShort), startAfterMs: Infinity })) as SampleResult;
    const made: number[] = [];
    const long = (await runJob(DEMO_TEXT, job, ctl(), { workers: 2, pool: standInPool(made), startAfterMs: 0 })) as SampleResult;
    expect(madeShort).toEqual([]);
    expect(made).toEqual([2]);
    expect(summary(short).get('workers')).toMatch(/^1 \(/);
    expect(summary(long).get('workers')).toMatch(/^2 \(/);
    for (const r of [short, long]) {
      for (const [label, value] of summary(one)) if (label !== 'workers') expect(summary(r).get(label), label).toBe(value);
      expect(r.sorted).toEqual(one.sorted);
    }
  });
});
