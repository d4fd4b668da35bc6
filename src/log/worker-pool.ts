import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { TOOL_ROOT } from './tool-root.ts';

// Found from the package root rather than from this module, which the site build may bundle elsewhere.
const ENTRY = pathToFileURL(join(TOOL_ROOT, 'src', 'log', 'pool-worker.mjs'));

export interface PoolOptions {
  /** A module whose default export computes one task: `(input) => output` (or a promise of it). */
  taskModule: URL;
  /** Plain-JavaScript packages the task module imports, loaded before the TypeScript loader to start faster. */
  preload?: string[];
  /** Most workers running at once; they are started only when there is work for them. */
  workers: number;
  /** Wall-clock limit of one task, counted from when a ready worker receives it. */
  timeLimitMs: number;
  /** V8 old-generation heap cap of each worker. */
  memoryLimitMb: number;
}

/** How a task ended; only `done` carries the task's value. */
export type TaskOutcome<R> =
  | { kind: 'done'; value: R }
  | { kind: 'timed-out'; limitMs: number }
  | { kind: 'out-of-memory'; limitMb: number }
  | { kind: 'failed'; message: string };

export interface WorkerPool<T, R> {
  /** Queues a task; the promise never rejects, every way a task can end is an outcome. */
  run(input: T): Promise<TaskOutcome<R>>;
  /** Stops every worker; tasks still queued end as `failed`. */
  close(): Promise<void>;
  /** Workers started so far, replacements for stopped ones included. */
  readonly started: number;
}

interface Job<T, R> {
  input: T;
  resolve: (outcome: TaskOutcome<R>) => void;
}

interface Slot<T, R> {
  worker: Worker;
  ready: boolean;
  job: Job<T, R> | null;
  timer: NodeJS.Timeout | undefined;
}

type WorkerMessage<R> = { ready: true } | { ok: true; value: R } | { ok: false; message: string };

/**
 * A fixed-size pool of worker threads with a time limit and a heap cap per task. A worker whose task
 * runs over time is terminated, one that runs out of heap dies by itself; either way a fresh worker
 * takes the next task, so one bad task never stops the others.
 */
export function createWorkerPool<T, R>(options: PoolOptions): WorkerPool<T, R> {
  const queue: Job<T, R>[] = [];
  const slots = new Set<Slot<T, R>>();
  let started = 0;
  let closed = false;

  const finish = (slot: Slot<T, R>, outcome: TaskOutcome<R>, retire: boolean) => {
    clearTimeout(slot.timer);
    const job = slot.job;
    slot.job = null;
    if (retire) {
      slots.delete(slot);
      void slot.worker.terminate();
    }
    job?.resolve(outcome);
    dispatch();
  };

  // A worker that dies before it is ready (its task module does not load) would die again on every
  // restart, so the queued tasks end with its reason instead of waiting for a worker that never comes.
  const failQueued = (message: string) => {
    for (const job of queue.splice(0)) job.resolve({ kind: 'failed', message });
  };

  const start = () => {
    const worker = new Worker(ENTRY, {
      workerData: { taskModule: options.taskModule.href, preload: options.preload ?? [] },
      resourceLimits: { maxOldGenerationSizeMb: options.memoryLimitMb },
    });
    const slot: Slot<T, R> = { worker, ready: false, job: null, timer: undefined };
    started++;
    slots.add(slot);
    worker.on('message', (message: WorkerMessage<R>) => {
      if ('ready' in message) {
        slot.ready = true;
        dispatch();
      } else finish(slot, message.ok ? { kind: 'done', value: message.value } : { kind: 'failed', message: message.message }, false);
    });
    worker.on('error', (error: Error & { code?: string }) => {
      if (!slots.has(slot)) return;
      if (slot.job) {
        finish(slot, error.code === 'ERR_WORKER_OUT_OF_MEMORY' ? { kind: 'out-of-memory', limitMb: options.memoryLimitMb } : { kind: 'failed', message: error.message }, true);
      } else {
        slots.delete(slot);
        if (!slot.ready) failQueued(`the worker could not start: ${error.message}`);
        dispatch();
      }
    });
    worker.on('exit', (code) => {
      if (!slots.has(slot)) return;
      if (slot.job) finish(slot, { kind: 'failed', message: `the worker stopped with exit code ${code}` }, true);
      else {
        slots.delete(slot);
        if (!slot.ready) failQueued(`the worker stopped with exit code ${code} before it was ready`);
        dispatch();
      }
    });
  };

  const dispatch = () => {
    if (closed) return;
    for (const slot of slots) {
      if (queue.length === 0) break;
      if (slot.ready && slot.job === null) {
        const job = queue.shift()!;
        slot.job = job;
        slot.timer = setTimeout(() => finish(slot, { kind: 'timed-out', limitMs: options.timeLimitMs }, true), options.timeLimitMs);
        slot.worker.postMessage(job.input);
      }
    }
    const busy = [...slots].filter((slot) => slot.job !== null).length;
    const wanted = Math.min(options.workers, busy + queue.length);
    while (slots.size < wanted) start();
  };

  return {
    run: (input) =>
      new Promise((resolve) => {
        if (closed) resolve({ kind: 'failed', message: 'the worker pool is closed' });
        else {
          queue.push({ input, resolve });
          dispatch();
        }
      }),
    close: async () => {
      closed = true;
      failQueued('the worker pool is closed');
      const stopping = [...slots].map((slot) => {
        clearTimeout(slot.timer);
        slot.job?.resolve({ kind: 'failed', message: 'the worker pool is closed' });
        return slot.worker.terminate();
      });
      slots.clear();
      await Promise.all(stopping);
    },
    get started() {
      return started;
    },
  };
}
