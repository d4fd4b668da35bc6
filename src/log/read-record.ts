import { parseRecord } from '../spec/parse-record.ts';
import type { RecordSpec } from '../spec/types.ts';
import { readRecordText } from './record-text.ts';
import type { RecordResult } from './result-types.ts';

/** A record file read and parsed, or the finished result of a file that could not be read. */
export type ReadRecord = { kind: 'parsed'; spec: RecordSpec } | { kind: 'unreadable'; result: RecordResult };

/** Reads and parses one record file, named relative to `root` in every result and problem. */
export function readRecord(file: string, root: string): ReadRecord {
  const read = readRecordText(file, root);
  return read.kind === 'unreadable' ? read : { kind: 'parsed', spec: parseRecord(read.name, read.text) };
}
