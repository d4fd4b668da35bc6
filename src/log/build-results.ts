import { randomBytes } from 'node:crypto';
import { mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { evaluatorFingerprint } from './evaluator-fingerprint.ts';
import type { BlockResult, LogResult } from './result-types.ts';

const FILE = 'build-results.json';

/** Where a block's result sits in a run: its record, its line and its input hash. */
export const blockKey = (file: string, line: number, hash: string) => `${file}\0${line}\0${hash}`;

/**
 * Keeps the results of a parallel run for the pages of the same build. The cache holds only finished
 * evaluations; a block stopped by the time limit or the memory cap is not in it, and a page must show the
 * stopped result rather than evaluate the block again without any limit.
 */
export function writeBuildResults(cacheRoot: string, log: LogResult): void {
  writeJsonAtomically(cacheRoot, FILE, { evaluator: evaluatorFingerprint(), records: log.records });
}

/** Writes a file of the build whole or not at all (a page must never read half of one); a failure only loses it. */
export function writeJsonAtomically(folder: string, file: string, data: unknown): void {
  const temp = join(folder, `.${file}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`);
  try {
    mkdirSync(folder, { recursive: true });
    writeFileSync(temp, JSON.stringify(data));
    renameSync(temp, join(folder, file));
  } catch {
    rmSync(temp, { force: true });
  }
}

/** The results of the last run by this evaluator, by blockKey; empty when there is none or it cannot be read. */
export function readBuildResults(cacheRoot: string): Map<string, BlockResult> {
  const known = new Map<string, BlockResult>();
  try {
    const stored = JSON.parse(readFileSync(join(cacheRoot, FILE), 'utf8')) as { evaluator: string; records: LogResult['records'] };
    if (stored.evaluator !== evaluatorFingerprint()) return known;
    for (const record of stored.records) for (const block of record.blocks) known.set(blockKey(record.file, block.line, block.inputHash), block);
  } catch {
    // No usable results: every block goes to the cache or is evaluated.
  }
  return known;
}
