import { readFileSync } from 'node:fs';
import { relative } from 'node:path';
import { parseRecord } from '../spec/parse-record.ts';
import type { RecordSpec } from '../spec/types.ts';
import type { BlockResult, RecordResult } from './result-types.ts';

/** A record file read and parsed, or the finished result of a file that could not be read. */
export type ReadRecord = { kind: 'parsed'; spec: RecordSpec } | { kind: 'unreadable'; result: RecordResult };

/** Reads and parses one record file, named relative to `root` in every result and problem. */
export function readRecord(file: string, root: string): ReadRecord {
  const name = relative(root, file) || file;
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    const frontMatter = { title: null, author: null, date: null, tags: [] };
    const problems = [{ file: name, line: 1, block: null, field: null, message: `cannot read the record: ${reason}` }];
    return { kind: 'unreadable', result: { file: name, title: null, frontMatter, problems, blocks: [] } };
  }
  return { kind: 'parsed', spec: parseRecord(name, text) };
}

/** A parsed record's result, given the results of its blocks in order. */
export function recordResult(spec: RecordSpec, blocks: BlockResult[]): RecordResult {
  return { file: spec.file, title: spec.frontMatter.title, frontMatter: spec.frontMatter, problems: spec.problems, blocks };
}
