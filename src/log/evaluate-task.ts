import type { BlockEntry } from '../spec/types.ts';
import { evaluateBlock } from './evaluate-block.ts';
import type { BlockResult } from './result-types.ts';

/** One block sent to a pool worker: the record's name (for problem locations) and the parsed block. */
export interface BlockTask {
  file: string;
  entry: BlockEntry;
  /** A sweep's points found in the cache, in order, null where a point is new. */
  knownPoints?: Array<BlockResult | null>;
}

/** The pool's task module for blocks (see worker-pool.ts): evaluates one block in the worker. */
export default function evaluateTask({ file, entry, knownPoints }: BlockTask): BlockResult {
  return evaluateBlock(file, entry, knownPoints);
}
