import { describe, expect, it } from 'vitest';
import { createWorkerPool } from '../../src/log/worker-pool.ts';
import type { PoolTask } from './fixtures/pool-tasks.ts';

// The tasks are injected (fixtures/pool-tasks.ts), so each way a task can end is produced on purpose;
// the expected squares are plain arithmetic.
const TASKS = new URL('./fixtures/pool-tasks.ts', import.meta.url);

function pool(options: { workers?: number; timeLimitMs?: number; memoryLimitMb?: number } = {}) {
  return createWorkerPool<PoolTask, number>({ taskModule: TASKS, workers: options.workers ?? 2, timeLimitMs: options.timeLimitMs ?? 20_000, memoryLimitMb: options.memoryLimitMb ?? 256 });
}

describe('worker pool', () => {
  it('runs every task in a worker and starts no more workers than its size', async () => {
    const p = pool({ workers: 2 });
    try {
      const outcomes = await Promise.all([1, 2, 3, 4, 5, 6].map((x) => p.run({ kind: 'square', x })));
      expect(outcomes).toEqual([1, 4, 9, 16, 25, 36].map((value) => ({ kind: 'done', value })));
      expect(p.started).toBe(2);
    } finally {
      await p.close();
    }
  }, 60_000);

  it('stops a task over the time limit, replaces its worker and finishes the rest', async () => {
    const p = pool({ workers: 1, timeLimitMs: 1500 });
    try {
      const [spun, after] = await Promise.all([p.run({ kind: 'spin' }), p.run({ kind: 'square', x: 7 })]);
      expect(spun).toEqual({ kind: 'timed-out', limitMs: 1500 });
      expect(after).toEqual({ kind: 'done', value: 49 });
      expect(p.started).toBe(2);
    } finally {
      await p.close();
    }
  }, 60_000);

  it('reports a task over the memory cap as out of memory and goes on with a fresh worker', async () => {
    const p = pool({ workers: 1, memoryLimitMb: 64 });
    try {
      const [hog, after] = await Promise.all([p.run({ kind: 'hog' }), p.run({ kind: 'square', x: 3 })]);
      expect(hog).toEqual({ kind: 'out-of-memory', limitMb: 64 });
      expect(after).toEqual({ kind: 'done', value: 9 });
    } finally {
      await p.close();
    }
  }, 60_000);

  it('turns an exception in a task into a failed outcome without losing the worker', async () => {
    const p = pool({ workers: 1 });
    try {
      expect(await p.run({ kind: 'throw', message: 'no such level' })).toEqual({ kind: 'failed', message: 'no such level' });
      expect(await p.run({ kind: 'square', x: 5 })).toEqual({ kind: 'done', value: 25 });
      expect(p.started).toBe(1);
    } finally {
      await p.close();
    }
  }, 60_000);

  it('ends the tasks with the reason when the task module cannot load', async () => {
    const p = createWorkerPool<number, number>({ taskModule: new URL('./fixtures/unloadable-task.ts', import.meta.url), workers: 2, timeLimitMs: 20_000, memoryLimitMb: 256 });
    try {
      const outcomes = await Promise.all([1, 2, 3].map((x) => p.run(x)));
      for (const outcome of outcomes) {
        expect(outcome.kind).toBe('failed');
        expect(outcome.kind === 'failed' && outcome.message).toMatch(/refuses to load/);
      }
    } finally {
      await p.close();
    }
  }, 60_000);
});
