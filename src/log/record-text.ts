import { readFileSync } from 'node:fs';
import { relative } from 'node:path';
import type { RecordSpec } from '../spec/types.ts';
import type { BlockResult, RecordResult } from './result-types.ts';

/**
 * A record file's text, or the finished result of a file that could not be read. Kept apart from the
 * parser (which loads the expression library) so a run whose records are all cached never loads it.
 */
export type RecordText = { kind: 'text'; name: string; text: string } | { kind: 'unreadable'; result: RecordResult };

/** Reads one record file, named relative to `root` in every result and problem. */
export function readRecordText(file: string, root: string): RecordText {
  const name = relative(root, file) || file;
  try {
    return { kind: 'text', name, text: readFileSync(file, 'utf8') };
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    const frontMatter = { title: null, author: null, date: null, tags: [] };
    const problems = [{ file: name, line: 1, block: null, field: null, message: `cannot read the record: ${reason}` }];
    return { kind: 'unreadable', result: { file: name, title: null, frontMatter, problems, blocks: [] } };
  }
}

/** A parsed record's result, given the results of its blocks in order. */
export function recordResult(spec: RecordSpec, blocks: BlockResult[]): RecordResult {
  return { file: spec.file, title: spec.frontMatter.title, frontMatter: spec.frontMatter, problems: spec.problems, blocks };
}
