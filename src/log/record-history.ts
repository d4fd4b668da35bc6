import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { checkLog, type CheckLogOptions, type RecordSource } from './check-log.ts';
import { commitsOfFiles, repositoryTop, textsAt, type FileCommit } from './git-revisions.ts';
import { loadLogConfig } from './log-config.ts';
import { openResultCache } from './result-cache.ts';
import type { BlockResult, RecordResult } from './result-types.ts';

/** A block's result at one version of its record. */
export interface HistoryPoint {
  /** The commit, or null for uncommitted changes in the working tree. */
  commit: FileCommit | null;
  /** The block's id at that version (a block renamed in place keeps one history). */
  id: string;
  status: BlockResult['status'];
  energy: BlockResult['energy'];
  inputHash: string;
}

/** The versions of one block, oldest first; `id` is its id now. */
export interface BlockHistory {
  id: string;
  points: HistoryPoint[];
}

export interface HistoryOptions extends CheckLogOptions {
  /** How many commits back to look, per record (historyDepth in groundwork.config.json). */
  depth: number;
}

/**
 * The history of every block of the given records: each record's text at every commit that changed it (the newest
 * `depth`), evaluated through checkLog, so versions whose blocks are in the cache cost nothing and the rest run in
 * the worker pool under the usual limits. `current` holds the records' results now (the working tree).
 */
export async function recordHistories(current: RecordResult[], options: HistoryOptions): Promise<Map<string, BlockHistory[]>> {
  const histories = new Map<string, BlockHistory[]>();
  const root = options.root ?? process.cwd();
  if (current.length === 0 || options.depth <= 0) return histories;
  // Each record is looked up in the repository that holds it (a log may keep its records outside the tool's own).
  const tops = new Map<string, string | null>();
  const topOf = (folder: string) => {
    if (!tops.has(folder)) {
      try {
        tops.set(folder, repositoryTop(folder));
      } catch {
        tops.set(folder, null);
      }
    }
    return tops.get(folder)!;
  };
  const located = current.map((record) => {
    const absolute = resolve(root, record.file);
    const top = topOf(dirname(absolute));
    const path = top === null ? null : relative(top, absolute).split('\\').join('/');
    return top === null || path === null || path.startsWith('../') ? null : { top, path };
  });
  const commits = new Map<string, FileCommit[]>();
  for (const top of new Set(located.flatMap((l) => (l ? [l.top] : [])))) {
    const paths = located.flatMap((l) => (l && l.top === top ? [l.path] : []));
    for (const [path, list] of commitsOfFiles(top, paths, options.depth)) commits.set(`${top}\0${path}`, list);
  }
  const commitsOf = (i: number) => (located[i] ? (commits.get(`${located[i]!.top}\0${located[i]!.path}`) ?? []) : []);
  // A history is stored under its record, its commits and the record's blocks now, beside the results of the
  // evaluator that made it: a cached build reads it back instead of checking every old version again.
  const store = openResultCache((options.config ?? loadLogConfig(root)).cacheFolder).folder;
  const keyOf = (record: RecordResult, i: number) =>
    join(store, `history-${createHash('sha256').update(JSON.stringify([record.file, commitsOf(i).map((c) => c.hash), record.blocks.map((b) => [b.id, b.line, b.inputHash, b.status])])).digest('hex')}.json`);
  const todo: number[] = [];
  current.forEach((record, i) => {
    try {
      histories.set(record.file, JSON.parse(readFileSync(keyOf(record, i), 'utf8')) as BlockHistory[]);
    } catch {
      todo.push(i);
    }
  });
  const wanted = todo.flatMap((i) => commitsOf(i).map((commit) => ({ record: current[i], commit, top: located[i]!.top, path: located[i]!.path })));
  const texts: Array<string | null> = new Array(wanted.length).fill(null);
  for (const top of new Set(wanted.map((w) => w.top))) {
    const indices = wanted.flatMap((w, i) => (w.top === top ? [i] : []));
    textsAt(top, indices.map((i) => ({ commit: wanted[i].commit.hash, path: wanted[i].path }))).forEach((text, k) => (texts[indices[k]] = text));
  }
  const versions = wanted.flatMap((w, i) => (texts[i] === null ? [] : [{ file: w.record.file, commit: w.commit, source: { name: w.record.file, text: texts[i]! } satisfies RecordSource }]));
  if (versions.length === 0) return histories;
  const { log } = await checkLog(
    versions.map((v) => v.source),
    options,
  );
  for (const record of todo.map((i) => current[i])) {
    const past = versions.flatMap((v, i) => (v.file === record.file ? [{ commit: v.commit, blocks: log.records[i].blocks }] : [])).reverse();
    if (past.length === 0) continue;
    // The working tree is a version too when it differs from the newest commit.
    const newest = past[past.length - 1].blocks;
    const changed = newest.length !== record.blocks.length || newest.some((b, i) => b.inputHash !== record.blocks[i].inputHash || b.id !== record.blocks[i].id);
    const history = threadVersions([...past, ...(changed ? [{ commit: null, blocks: record.blocks }] : [])], record.blocks);
    histories.set(record.file, history);
    try {
      mkdirSync(store, { recursive: true });
      writeFileSync(keyOf(record, current.indexOf(record)), JSON.stringify(history));
    } catch {
      // An unwritable cache only means the history is worked out again next time.
    }
  }
  return histories;
}

/**
 * Threads block results through the versions of a record (oldest first) by id. A block whose id disappears
 * while exactly one new id appears at the same line is the same block renamed; anything less clear starts a
 * new history. Returns the histories of the blocks in `now`, in their order.
 */
export function threadVersions(versions: Array<{ commit: FileCommit | null; blocks: BlockResult[] }>, now: BlockResult[]): BlockHistory[] {
  let open = new Map<string, HistoryPoint[]>();
  for (const { commit, blocks } of versions) {
    const next = new Map<string, HistoryPoint[]>();
    const ids = new Set(blocks.map((b) => b.id));
    const vanished = [...open.keys()].filter((id) => !ids.has(id));
    const arrived = blocks.filter((b) => !open.has(b.id));
    for (const block of blocks) {
      let points = open.get(block.id);
      if (!points && vanished.length === 1 && arrived.length === 1) {
        const before = open.get(vanished[0])!;
        if (lineOf(versions, before) === block.line) points = before;
      }
      next.set(block.id, [...(points ?? []), { commit, id: block.id, status: block.status, energy: block.energy, inputHash: block.inputHash }]);
    }
    open = next;
  }
  return now.map((block) => ({ id: block.id, points: open.get(block.id) ?? [] }));
}

/** The line a block had at its latest version. */
function lineOf(versions: Array<{ commit: FileCommit | null; blocks: BlockResult[] }>, points: HistoryPoint[]): number | null {
  const last = points[points.length - 1];
  const version = versions.find((v) => v.commit === last.commit);
  return version?.blocks.find((b) => b.id === last.id)?.line ?? null;
}
