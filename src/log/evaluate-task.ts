import type { BlockEntry } from '../spec/types.ts';
import { evaluateBlock } from './evaluate-block.ts';
import type { BlockResult } from './result-types.ts';

/** One block sent to a pool worker: the record's name (for problem locations) and the parsed block. */
export interface BlockTask {
  file: string;
  entry: BlockEntry;
}

/** The pool's task module for blocks (see worker-pool.ts): evaluates one block in the worker. */
export default function evaluateTask({ file, entry }: BlockTask): BlockResult {
  return evaluateBlock(file, entry);
}
