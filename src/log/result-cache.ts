import { createHash, randomBytes } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { BlockEntry, FrontMatter, RecordSpec, SpecProblem } from '../spec/types.ts';
import { evaluatorFingerprint } from './evaluator-fingerprint.ts';
import { inputHash } from './input-hash.ts';
import type { BlockResult, RecordResult } from './result-types.ts';

/** A block that parsed. */
export type SpecEntry = Extract<BlockEntry, { kind: 'spec' }>;

/** Raised whenever the layout of an entry file changes, so older entries read as corrupt and are replaced. */
const FORMAT = 2;
const TEMP_SUFFIX = '.tmp';
const INDEX_SUFFIX = '.record';
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
  get(file: string, entry: BlockEntry): BlockResult | null;
  /** The same for a part of a block (a sweep point), not counted as a block's hit or miss. */
  peek(file: string, entry: BlockEntry): BlockResult | null;
  /** Stores a result and returns it as a later `get` will: plain JSON data. */
  put(entry: BlockEntry, result: BlockResult): BlockResult;
  /** The file a block's result is kept in. */
  entryPath(entry: BlockEntry): string;
  /**
   * The result of a record whose text (under this name) is exactly as when `putRecord` last saw it and
   * whose every block result is stored, without parsing it; null otherwise. Each block counts as a hit.
   */
  getRecord(file: string, text: string): RecordResult | null;
  /** Remembers which stored blocks a record's text parsed into, for `getRecord`. */
  putRecord(text: string, spec: RecordSpec): void;
}

interface StoredEntry<T> {
  format: number;
  key: string;
  checksum: string;
  result: T;
}

/** What a record's text parsed into, its blocks by entry key: an unchanged record is not parsed again. */
interface RecordIndex {
  title: string | null;
  frontMatter: FrontMatter;
  problems: SpecProblem[];
  blocks: Array<{ key: string; line: number }>;
}

const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');

/**
 * The entry name for a block: its input hash (which leaves line numbers out), the evaluator
 * fingerprint (evaluator-fingerprint.ts) and the block's text. The text is there because the lines
 * inside a result's problems count from the block's fence, so a block whose YAML was re-laid-out
 * must be recomputed, while moving the whole block (prose edited above it) must not. A block that
 * did not parse is stored too, so that a rebuild with nothing changed evaluates nothing; its text alone
 * does not fix its problems (a repeated id depends on the blocks before it), so they are hashed with it,
 * their lines counted from the fence.
 */
function cacheKey(entry: BlockEntry, evaluator: string): string {
  const input =
    entry.kind === 'spec'
      ? inputHash(entry.spec)
      : inputHash({ id: entry.id, caption: entry.caption, problems: entry.problems.map((p) => ({ ...p, file: null, fromFence: p.line - entry.line })) });
  return sha256(JSON.stringify({ format: FORMAT, evaluator, kind: entry.kind, input, source: entry.source }));
}

/** The name of a record's index: the record's name (it is in every problem) and its whole text. */
function recordKey(file: string, text: string, evaluator: string): string {
  return sha256(JSON.stringify({ format: FORMAT, evaluator, kind: 'record', file, text }));
}

/** The opening line of a block, parsed or not. */
const lineOf = (entry: BlockEntry) => (entry.kind === 'spec' ? entry.spec.line : entry.line);

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
  const indexPathOf = (key: string) => join(folder, `${key}${INDEX_SUFFIX}`);

  /** The stored payload under `key`: 'missing', or null after removing an entry that is damaged. */
  const read = <T extends object>(path: string, key: string): T | null | 'missing' => {
    let text: string;
    try {
      text = readFileSync(path, 'utf8');
    } catch {
      return 'missing';
    }
    const stored = readEntry<T>(text, key);
    if (stored === null) {
      rmSync(path, { force: true });
      stats.corrupt++;
    }
    return stored;
  };

  // Write beside the entry and rename over it: a run killed midway leaves a temp file, never half an entry.
  // Returns the payload as a later read gives it (plain JSON data), and whether it was stored.
  const write = <T extends object>(path: string, key: string, payload: T): { value: T; stored: boolean } => {
    const text = JSON.stringify(payload);
    const stored: StoredEntry<T> = { format: FORMAT, key, checksum: `sha256:${sha256(text)}`, result: JSON.parse(text) };
    const temp = join(folder, `.${key}.${process.pid}.${randomBytes(4).toString('hex')}${TEMP_SUFFIX}`);
    try {
      mkdirSync(folder, { recursive: true });
    } catch {
      return { value: stored.result, stored: false };
    }
    try {
      writeFileSync(temp, JSON.stringify(stored));
      renameSync(temp, path);
      return { value: stored.result, stored: true };
    } catch {
      rmSync(temp, { force: true });
      return { value: stored.result, stored: false };
    }
  };

  const peek = (file: string, entry: BlockEntry): BlockResult | null => {
    const key = cacheKey(entry, evaluator);
    const stored = read<BlockResult>(pathOf(key), key);
    return stored === null || stored === 'missing' ? null : rebaseResult(stored, file, lineOf(entry));
  };
  const get = (file: string, entry: BlockEntry): BlockResult | null => {
    const found = peek(file, entry);
    if (found) stats.hits++;
    else stats.misses++;
    return found;
  };

  const put = (entry: BlockEntry, result: BlockResult): BlockResult => {
    const key = cacheKey(entry, evaluator);
    const { value, stored } = write(pathOf(key), key, result);
    if (!stored) stats.writeErrors++;
    return value;
  };

  const getRecord = (file: string, text: string): RecordResult | null => {
    const key = recordKey(file, text, evaluator);
    const index = read<RecordIndex>(indexPathOf(key), key);
    if (index === null || index === 'missing') return null;
    const blocks: BlockResult[] = [];
    for (const block of index.blocks) {
      const stored = read<BlockResult>(pathOf(block.key), block.key);
      // A block whose result was not stored (stopped by a limit) or was damaged: the record is parsed again.
      if (stored === null || stored === 'missing') return null;
      blocks.push(rebaseResult(stored, file, block.line));
    }
    stats.hits += blocks.length;
    const { title, frontMatter, problems } = index;
    return { file, title, frontMatter, problems, blocks };
  };

  const putRecord = (text: string, spec: RecordSpec): void => {
    const key = recordKey(spec.file, text, evaluator);
    const blocks = spec.blocks.map((entry) => ({ key: cacheKey(entry, evaluator), line: lineOf(entry) }));
    // An index that cannot be written only means the record is parsed again next time.
    write<RecordIndex>(indexPathOf(key), key, { title: spec.frontMatter.title, frontMatter: spec.frontMatter, problems: spec.problems, blocks });
  };

  return { folder, stats, get, peek, put, getRecord, putRecord, entryPath: (entry) => pathOf(cacheKey(entry, evaluator)) };
}

/** The payload in an entry file, or null when the file is not exactly what `write` wrote for this key. */
function readEntry<T extends object>(text: string, key: string): T | null {
  let stored: StoredEntry<T>;
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
