// runChunks with a pool whose chunks finish in scrambled order (an in-thread stand-in for workers,
// each chunk run on a sheet rebuilt from the file text as a worker does): the combined result must
// equal the one-thread run exactly. The check is the independent one-thread run of the same job.
import { describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { monteCarlo } from '../../src/statistics/sheetMonteCarlo';
import { scan2D } from '../../src/statistics/sheetScan';
import { runChunkInWorker } from '../../src/jobs/chunkRuntime';
import { shardChunks, chunkRange } from '../../src/jobs/chunkedJob';
import type { ChunkExecutor } from '../../src/jobs/runChunks';
import { TOY_CELLS } from '../statistics/toySheet';
import { SAMPLE_CHUNK } from '../../src/statistics/monteCarloJob';

const cells = TOY_CELLS.map((c) =>
  c.name === 'rate_norm' ? { ...c, uncertainty: 'lognormalDist(1e-3 Mpc^-3 Gyr^-1, 0.3)' } : c.name === 'slope' ? { ...c, uncertainty: 'normalDist(0.7, 0.1)' } : c,
);
const sheet = new Sheet({ title: 'toy', cells });

/** A pool that runs chunks in this thread and resolves them in reverse order of submission. */
function scrambledPool(log: number[]): (workers: number) => ChunkExecutor {
  return () => {
    let pending = 0;
    return {
      async runChunk(kind, sheetText, plan, index) {
        const delay = 40 - 5 * pending++;
        await new Promise((r) => setTimeout(r, Math.max(0, delay)));
        log.push(index);
        return runChunkInWorker(kind, sheetText, plan, index);
      },
      async close() {},
    };
  };
}

describe('runChunks: the same result whatever order and place the chunks run in', () => {
  it('Monte Carlo: 3 scrambled workers equal one thread, bit for bit', async () => {
    const opts = { samples: 4 * SAMPLE_CHUNK + 3, seed: 21, outputs: ['A_yr', 'bent'] };
    const one = await monteCarlo(sheet, opts);
    const log: number[] = [];
    const three = await monteCarlo(sheet, opts, undefined, { workers: 3, pool: scrambledPool(log) });
    expect(log).not.toEqual([...log].sort((a, b) => a - b)); // they really finished out of order
    expect(three.outputs.A_yr).toEqual(one.outputs.A_yr);
    expect(three.outputs.bent).toEqual(one.outputs.bent);
    expect(three.inputDraws).toEqual(one.inputDraws);
    expect(three.summaries).toEqual(one.summaries);
    expect(three.evaluations).toBe(one.evaluations);
  });

  it('two-input map: 3 scrambled workers equal one thread', async () => {
    const x = { cell: 'slope', lo: 0.1, hi: 1.5, n: 11, log: false };
    const y = { cell: 'K_coef', lo: 1e-27 * 3.0857e22 ** 3 * 3.15576e16, hi: 5e-27 * 3.0857e22 ** 3 * 3.15576e16, n: 9, log: true };
    const one = await scan2D(sheet, x, y, 'bent');
    const three = await scan2D(sheet, x, y, 'bent', {}, undefined, { workers: 3, pool: scrambledPool([]) });
    expect(one.evaluations).toBe(99);
    expect(three.values).toEqual(one.values);
  });

  it('shards cover every chunk once, in order, for any N', () => {
    for (const chunks of [0, 1, 7, 20]) {
      for (const n of [1, 2, 3, 8, 25]) {
        const seen: number[] = [];
        for (let k = 1; k <= n; k++) {
          const { first, end } = shardChunks(chunks, k, n);
          for (let c = first; c < end; c++) seen.push(c);
        }
        expect(seen).toEqual(Array.from({ length: chunks }, (_, i) => i));
      }
    }
    expect(chunkRange(1003, 500, 2)).toEqual({ start: 1000, end: 1003 });
  });

  it('cancelling closes the pool and reports the cancellation', async () => {
    const ctl = new AbortController();
    let closed = false;
    const pool = (): ChunkExecutor => ({
      runChunk: () => new Promise((_, reject) => ctl.signal.addEventListener('abort', () => reject(new Error('worker terminated')))),
      close: async () => void (closed = true),
    });
    const run = monteCarlo(sheet, { samples: 5000, seed: 1, outputs: ['A_yr'] }, { signal: ctl.signal }, { workers: 2, pool });
    setTimeout(() => ctl.abort(), 20);
    await expect(run).rejects.toThrow(/cancelled/);
    expect(closed).toBe(true);
  });

  describe('workers started only when they pay (startAfterMs)', () => {
    const opts = { samples: 5 * SAMPLE_CHUNK, seed: 8, outputs: ['A_yr'] };
    /** A pool that runs chunks here (as a worker would, from the file text) and records what it was given. */
    const recordingPool = (given: number[], made: number[]) => (workers: number): ChunkExecutor => {
      made.push(workers);
      return { runChunk: async (kind, text, plan, index) => (given.push(index), runChunkInWorker(kind, text, plan, index)), close: async () => {} };
    };

    it('a run projected to be short never starts the pool; one projected long hands every chunk not started to it; both equal one thread', async () => {
      const one = await monteCarlo(sheet, opts);
      const givenShort: number[] = [];
      const madeShort: number[] = [];
      const heardShort: number[] = [];
      const short = await monteCarlo(sheet, opts, undefined, { workers: 3, pool: recordingPool(givenShort, madeShort), startAfterMs: Infinity, onPoolStart: (n) => heardShort.push(n) });
      expect(madeShort).toEqual([]);
      expect(heardShort).toEqual([]);
      expect(short.outputs.A_yr).toEqual(one.outputs.A_yr);
      const given: number[] = [];
      const made: number[] = [];
      const progress: number[] = [];
      const heard: number[] = [];
      const long = await monteCarlo(sheet, opts, { onProgress: (d) => progress.push(d) }, { workers: 3, pool: recordingPool(given, made), startAfterMs: 0, onPoolStart: (n) => heard.push(n) });
      // chunks run here until the pace is known (at least the first), then every chunk not started goes to one pool of 3 workers
      expect(made).toEqual([3]);
      expect(heard).toEqual([3]);
      const first = Math.min(...given);
      expect(first).toBeGreaterThanOrEqual(1);
      expect(given.sort((a, b) => a - b)).toEqual(Array.from({ length: 5 - first }, (_, k) => first + k));
      expect(long.outputs.A_yr).toEqual(one.outputs.A_yr);
      expect(long.inputDraws).toEqual(one.inputDraws);
      expect(progress.at(-1)).toBe(opts.samples);
    });

    it('cancelling after the hand-over closes the pool', async () => {
      const ctl = new AbortController();
      let closed = false;
      // the pool's chunks never finish; the user cancels once the pool has them
      const pool = (): ChunkExecutor => ({
        runChunk: () => {
          setTimeout(() => ctl.abort(), 0);
          return new Promise((_, reject) => ctl.signal.addEventListener('abort', () => reject(new Error('worker terminated'))));
        },
        close: async () => void (closed = true),
      });
      const run = monteCarlo(sheet, opts, { signal: ctl.signal }, { workers: 2, pool, startAfterMs: 0 });
      await expect(run).rejects.toThrow(/cancelled/);
      expect(closed).toBe(true);
    });
  });
});
