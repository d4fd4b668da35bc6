import { createHash, randomBytes } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { BlockEntry } from '../spec/types.ts';
import { evaluatorFingerprint } from './evaluator-fingerprint.ts';
import { inputHash } from './input-hash.ts';
import type { BlockResult } from './result-types.ts';

/** A block that parsed: the only kind whose result is worth keeping (a parse failure is cheap to redo). */
export type SpecEntry = Extract<BlockEntry, { kind: 'spec' }>;

/** Raised whenever the layout of an entry file changes, so older entries read as corrupt and are replaced. */
const FORMAT = 1;
const TEMP_SUFFIX = '.tmp';
const GENERATION_LENGTH = 16;
const GENERATION = new RegExp(`^[0-9a-f]{${GENERATION_LENGTH}}$`);

export interface CacheStats {
  hits: number;
  misses: number;
  /** Entries found damaged (truncated, edited, wrong key); each was removed and counted as a miss. */
  corrupt: number;
  /** Results that could not be stored (read-only or full disk); the build goes on without them. */
  writeErrors: number;
}

/** Block results kept one file each, synchronous so the remark plugin can use it as well as the CLI. */
export interface ResultCache {
  /** The folder the entries of the current evaluator are kept in. */
  readonly folder: string;
  readonly stats: CacheStats;
  /** The stored result for this block, placed at the block's current file and line; null on a miss. */
  get(file: string, entry: SpecEntry): BlockResult | null;
  /** Stores a result and returns it as a later `get` will: plain JSON data. */
  put(entry: SpecEntry, result: BlockResult): BlockResult;
  /** The file a block's result is kept in. */
  entryPath(entry: SpecEntry): string;
}

interface StoredEntry {
  format: number;
  key: string;
  checksum: string;
  result: BlockResult;
}

const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');

/**
 * The entry name for a block: its input hash (which leaves line numbers out), the evaluator
 * fingerprint (evaluator-fingerprint.ts) and the block's text. The text is there because the lines
 * inside a result's problems count from the block's fence, so a block whose YAML was re-laid-out
 * must be recomputed, while moving the whole block (prose edited above it) must not.
 */
function cacheKey(entry: SpecEntry, evaluator: string): string {
  return sha256(JSON.stringify({ format: FORMAT, evaluator, input: inputHash(entry.spec), source: entry.source }));
}

/** A stored result moved to the block's current file and opening line, problems included. */
export function rebaseResult(result: BlockResult, file: string, line: number): BlockResult {
  const shift = line - result.line;
  return { ...result, line, problems: result.problems.map((p) => ({ ...p, file, line: p.line + shift })) };
}

/**
 * Opens the cache kept under `root` (created on the first write). Entries live in a subfolder named
 * after the evaluator fingerprint; subfolders of other evaluators can never be hit again and are
 * removed, so the cache does not grow with every change to the engine. Temp files that killed runs
 * left behind are removed too.
 */
export function openResultCache(root: string): ResultCache {
  const evaluator = evaluatorFingerprint();
  const generation = evaluator.replace('sha256:', '').slice(0, GENERATION_LENGTH);
  removeOtherGenerations(root, generation);
  const folder = join(root, generation);
  removeAbandonedTempFiles(folder);
  const stats: CacheStats = { hits: 0, misses: 0, corrupt: 0, writeErrors: 0 };
  const pathOf = (key: string) => join(folder, `${key}.json`);

  const get = (file: string, entry: SpecEntry): BlockResult | null => {
    const key = cacheKey(entry, evaluator);
    const path = pathOf(key);
    let text: string;
    try {
      text = readFileSync(path, 'utf8');
    } catch {
      stats.misses++;
      return null;
    }
    const stored = readEntry(text, key);
    if (stored === null) {
      rmSync(path, { force: true });
      stats.corrupt++;
      stats.misses++;
      return null;
    }
    stats.hits++;
    return rebaseResult(stored, file, entry.spec.line);
  };

  const put = (entry: SpecEntry, result: BlockResult): BlockResult => {
    const key = cacheKey(entry, evaluator);
    const payload = JSON.stringify(result);
    const stored: StoredEntry = { format: FORMAT, key, checksum: `sha256:${sha256(payload)}`, result: JSON.parse(payload) };
    // Write beside the entry and rename over it: a run killed midway leaves a temp file, never half an entry.
    const temp = join(folder, `.${key}.${process.pid}.${randomBytes(4).toString('hex')}${TEMP_SUFFIX}`);
    try {
      mkdirSync(folder, { recursive: true });
    } catch {
      stats.writeErrors++;
      return stored.result;
    }
    try {
      writeFileSync(temp, JSON.stringify(stored));
      renameSync(temp, pathOf(key));
    } catch {
      rmSync(temp, { force: true });
      stats.writeErrors++;
    }
    return stored.result;
  };

  return { folder, stats, get, put, entryPath: (entry) => pathOf(cacheKey(entry, evaluator)) };
}

/** The result in an entry file, or null when the file is not exactly what `put` wrote for this key. */
function readEntry(text: string, key: string): BlockResult | null {
  let stored: StoredEntry;
  try {
    stored = JSON.parse(text);
  } catch {
    return null;
  }
  if (stored === null || typeof stored !== 'object' || stored.format !== FORMAT || stored.key !== key || typeof stored.result !== 'object' || stored.result === null) return null;
  // JSON.stringify of parsed JSON data gives back the exact text that was hashed when it was stored.
  return stored.checksum === `sha256:${sha256(JSON.stringify(stored.result))}` ? stored.result : null;
}

/** Entry folders of other evaluators; only names this module creates are touched. */
function removeOtherGenerations(root: string, current: string): void {
  let names: string[];
  try {
    names = readdirSync(root);
  } catch {
    return;
  }
  for (const name of names) if (name !== current && GENERATION.test(name)) rmSync(join(root, name), { recursive: true, force: true });
}

/** Temp files whose writing process is gone: a write was cut off, and nobody will rename them. */
function removeAbandonedTempFiles(folder: string): void {
  let names: string[];
  try {
    names = readdirSync(folder);
  } catch {
    return;
  }
  for (const name of names) {
    if (!name.endsWith(TEMP_SUFFIX)) continue;
    const pid = Number(name.split('.').at(-3));
    if (!Number.isInteger(pid) || pid === process.pid || !isRunning(pid)) rmSync(join(folder, name), { force: true });
  }
}

function isRunning(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}
