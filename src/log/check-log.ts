import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import type { BlockTask } from './evaluate-task.ts';
import { inputHash } from './input-hash.ts';
import { invalidBlock, unparsedBlock } from './invalid-block.ts';
import { loadLogConfig, type LogConfig } from './log-config.ts';
import { readRecordText, recordResult, type RecordText } from './record-text.ts';
import { openResultCache, type SpecEntry } from './result-cache.ts';
import { sweepPointEntries } from './evaluate-sweep.ts';
import type { BlockResult, LogResult, RecordResult } from './result-types.ts';
import type { RecordSpec } from '../spec/types.ts';
import { toolModule } from './tool-root.ts';
import { TOOL_VERSION } from './tool-version.ts';
import { createWorkerPool, type TaskOutcome } from './worker-pool.ts';

// The workers do the evaluating; this thread never loads the evaluator, whose expression library alone
// takes about half a second to load, which a cached run should not pay. Records are parsed here (the
// parser needs that library too, for quantity-mode blocks), so it is loaded only for a record whose
// text is not in the cache's record index.
const TASK_MODULE = toolModule('log/evaluate-task.ts');
// The expression library the evaluator is built on; workers load it ahead of the TypeScript loader.
const PRELOAD = ['mathjs'];
/** Blocks to evaluate that justify one more worker (common practice: start-up cost against a share of the work). */
const BLOCKS_PER_WORKER = 8;

/** The Markdown files named, with folders searched recursively, in a stable order. */
export function collectRecordFiles(paths: string[]): { files: string[]; missing: string[] } {
  const files: string[] = [];
  const missing: string[] = [];
  const walk = (path: string) => {
    let stats;
    try {
      stats = statSync(path);
    } catch {
      missing.push(path);
      return;
    }
    if (stats.isDirectory()) {
      for (const name of readdirSync(path).sort()) {
        if (!name.startsWith('.') && name !== 'node_modules') {
          const child = join(path, name);
          if (statSync(child).isDirectory() || name.endsWith('.md')) walk(child);
        }
      }
    } else files.push(path);
  };
  paths.forEach(walk);
  return { files: [...new Set(files)], missing };
}

/** A record given by its text instead of a file: an older version of it read from git. `name` is what results call it. */
export interface RecordSource {
  name: string;
  text: string;
}

export interface CheckLogOptions {
  /** The log root: where groundwork.config.json is read, and what record names are relative to (default: the working folder). */
  root?: string;
  /** Evaluate every block even when a stored result exists; the new results are stored. */
  recompute?: boolean;
  /** Use this configuration instead of reading the root's. */
  config?: LogConfig;
  /**
   * The record parser. Without it, it is imported on the first record that is not in the cache; a caller
   * whose module loader cannot import later (the site's integration, run by Vite) passes it.
   */
  parseRecord?: (file: string, text: string) => RecordSpec;
}

export interface CheckStats {
  blocks: number;
  /** Blocks evaluated in this run (timed-out and over-memory ones included). */
  evaluated: number;
  /** Blocks whose result came from the cache. */
  cached: number;
  /** Damaged cache entries found, removed and recomputed. */
  corrupt: number;
  timedOut: number;
  overMemory: number;
  /** Results that could not be stored in the cache (read-only or full disk). */
  writeErrors: number;
  /** The workers the run started: the configured number at most, fewer when few blocks need evaluating (0 when none). */
  workers: number;
  /** The block results of this run that were taken from the cache rather than evaluated (for the table's time column). */
  fromCache: ReadonlySet<BlockResult>;
}

/**
 * Checks every record of a log: a record whose text is unchanged comes whole from the cache, others are
 * parsed here and their blocks with a stored result taken from
 * the cache, the rest are evaluated in a pool of worker threads under the configured limits and then
 * stored. Records and blocks come out in the order of `files` and of the blocks in each file, however
 * the workers finish.
 */
export async function checkLog(files: Array<string | RecordSource>, options: CheckLogOptions = {}): Promise<{ log: LogResult; stats: CheckStats }> {
  const root = options.root ?? process.cwd();
  const config = options.config ?? loadLogConfig(root);
  const cache = openResultCache(config.cacheFolder);
  // Each record is finished from the cache's record index, or parsed: spec and texts kept for the rest.
  const done: Array<RecordResult | null> = [];
  const parsed: Array<{ spec: RecordSpec; text: string } | null> = [];
  let parseRecord = options.parseRecord;
  for (const file of files) {
    const read: RecordText = typeof file === 'string' ? readRecordText(file, root) : { kind: 'text', ...file };
    const hit = read.kind === 'unreadable' ? read.result : options.recompute ? null : cache.getRecord(read.name, read.text);
    done.push(hit);
    if (hit || read.kind === 'unreadable') parsed.push(null);
    else {
      parseRecord ??= (await import('../spec/parse-record.ts')).parseRecord;
      parsed.push({ spec: parseRecord(read.name, read.text), text: read.text });
    }
  }
  const fromCache = new Set<BlockResult>(done.flatMap((hit) => hit?.blocks ?? []));
  const results: BlockResult[][] = parsed.map((p) => (p ? new Array(p.spec.blocks.length) : []));
  const misses: Array<{ record: number; block: number; file: string; entry: SpecEntry }> = [];
  parsed.forEach((p, record) => {
    p?.spec.blocks.forEach((entry, block) => {
      const stored = options.recompute ? null : cache.get(p.spec.file, entry);
      if (stored) fromCache.add((results[record][block] = stored));
      // A block that did not parse only needs its problems turned into a result, which this thread does.
      else if (entry.kind === 'invalid') results[record][block] = cache.put(entry, unparsedBlock(entry));
      else misses.push({ record, block, file: p.spec.file, entry });
    });
  });

  let timedOut = 0;
  let overMemory = 0;
  // Each worker loads the evaluator once (about a second); a few blocks are done sooner by one worker than by two
  // loading at the same time, so another worker is started only for every BLOCKS_PER_WORKER blocks to evaluate.
  const workers = Math.min(config.workers, Math.ceil(misses.length / BLOCKS_PER_WORKER));
  if (misses.length > 0) {
    const pool = createWorkerPool<BlockTask, BlockResult>({
      taskModule: TASK_MODULE,
      preload: PRELOAD,
      workers,
      timeLimitMs: config.timeLimitSeconds * 1000,
      memoryLimitMb: config.memoryLimitMb,
    });
    try {
      await Promise.all(
        misses.map(async ({ record, block, file, entry }) => {
          // A sweep's points are stored one by one as well, so that a changed sweep evaluates only its new points.
          const points = entry.spec.sweep ? sweepPointEntries(entry) : null;
          const knownPoints = points && !options.recompute ? points.map((point) => cache.peek(file, point)) : undefined;
          const outcome = await pool.run({ file, entry, knownPoints });
          if (outcome.kind === 'done') {
            results[record][block] = cache.put(entry, outcome.value);
            outcome.value.sweep?.points.forEach((p, i) => points?.[i] && cache.put(points[i], p.result));
          } else {
            if (outcome.kind === 'timed-out') timedOut++;
            if (outcome.kind === 'out-of-memory') overMemory++;
            results[record][block] = unfinishedBlock(file, entry, outcome);
          }
        }),
      );
    } finally {
      await pool.close();
    }
  }

  parsed.forEach((p) => p && cache.putRecord(p.text, p.spec));
  const records = done.map((hit, index) => hit ?? recordResult(parsed[index]!.spec, results[index]));
  const blocks = records.reduce((n, record) => n + record.blocks.length, 0);
  return {
    log: { tool: { name: 'groundwork', version: TOOL_VERSION }, records },
    stats: { blocks, evaluated: blocks - cache.stats.hits, cached: cache.stats.hits, corrupt: cache.stats.corrupt, timedOut, overMemory, writeErrors: cache.stats.writeErrors, workers, fromCache },
  };
}

/**
 * The result of a block whose evaluation did not finish. Over time it is `unsettled` (a faster
 * machine or a larger limit may settle it); over the memory cap or crashed it is `invalid`. Neither
 * is stored, since both depend on the machine and the limits rather than on the block alone.
 */
export function unfinishedBlock(file: string, entry: SpecEntry, outcome: Exclude<TaskOutcome<BlockResult>, { kind: 'done' }>): BlockResult {
  const { spec } = entry;
  const reason =
    outcome.kind === 'timed-out'
      ? `the evaluation ran over the time limit of ${outcome.limitMs / 1000} s (timeLimitSeconds in groundwork.config.json) and was stopped`
      : outcome.kind === 'out-of-memory'
        ? `the evaluation needed more than the memory cap of ${outcome.limitMb} MB (memoryLimitMb in groundwork.config.json) and was stopped`
        : `the evaluation stopped: ${outcome.message}`;
  const result = invalidBlock(spec.id, spec.line, spec.caption, [{ file, line: spec.line, block: spec.id, field: null, message: reason }], inputHash(spec), performance.now());
  return outcome.kind === 'timed-out' ? { ...result, status: 'unsettled', message: reason, problems: [] } : result;
}
