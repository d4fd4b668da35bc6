import { blockKey } from './build-results.ts';
import { evaluateBlock } from './evaluate-block.ts';
import { inputHash } from './input-hash.ts';
import { readRecord } from './read-record.ts';
import { recordResult } from './record-text.ts';
import type { ResultCache } from './result-cache.ts';
import type { BlockResult, RecordResult } from './result-types.ts';

export interface CheckRecordOptions {
  /** Folder that record names are given relative to (default: the working folder). */
  cwd?: string;
  /** Where results are looked up and stored; without one every block is evaluated. */
  cache?: ResultCache | null;
  /** Results of this build's parallel run (readBuildResults), taken before the cache: they include stopped blocks. */
  known?: Map<string, BlockResult>;
}

/**
 * One record, synchronously and in this thread, for callers that cannot wait (the remark plugin).
 * It shares the cache with the parallel `checkLog`, so a page built after a check evaluates nothing.
 */
export function checkRecord(file: string, options: CheckRecordOptions = {}): RecordResult {
  const read = readRecord(file, options.cwd ?? process.cwd());
  if (read.kind === 'unreadable') return read.result;
  const { spec } = read;
  const cache = options.cache ?? null;
  const known = options.known;
  return recordResult(
    spec,
    spec.blocks.map((entry) => {
      const ran = known?.size && entry.kind === 'spec' ? known.get(blockKey(spec.file, entry.spec.line, inputHash(entry.spec))) : undefined;
      if (ran) return ran;
      return cache ? (cache.get(spec.file, entry) ?? cache.put(entry, evaluateBlock(spec.file, entry))) : evaluateBlock(spec.file, entry);
    }),
  );
}
