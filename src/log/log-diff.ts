import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, relative, resolve } from 'node:path';
import { parse } from 'yaml';
import { STATUS_ORDER } from '../engine/status.ts';
import { findSpecBlocks } from '../spec/find-blocks.ts';
import { checkLog, collectRecordFiles, type CheckLogOptions, type CheckStats } from './check-log.ts';
import { markdownFilesAt, repositoryTop, resolveRevision, textsAt } from './git-revisions.ts';
import type { BlockResult, LogResult, RecordResult } from './result-types.ts';

/** A block's numbers at one side of a comparison; energies in the block's own unit, with hartree beside for comparing. */
export interface BlockSnapshot {
  status: BlockResult['status'];
  energy: BlockResult['energy'];
  upper: number | null;
  lower: number | null;
  energyHartree: number | null;
  line: number;
}

export interface BlockChange {
  file: string;
  id: string;
  change: 'added' | 'removed' | 'changed';
  /** The spec fields whose written value differs (top-level keys), for a changed block. */
  fields: string[];
  before: BlockSnapshot | null;
  after: BlockSnapshot | null;
  /** Why the change made things worse (status lower, energy higher, a new block not confirmed), or null. */
  worse: string | null;
}

export interface LogDiff {
  revision: string;
  commit: string;
  changes: BlockChange[];
  unchanged: number;
  /** The evaluation work of each side: a cached working tree evaluates nothing, the old side only what the cache lacks. */
  stats: { before: CheckStats; after: CheckStats };
}

/** An energy that rose by more than this fraction (1e-8 hartree at least) got worse; below it is the evaluator's own scatter. */
const ENERGY_TOLERANCE = 1e-8;

/**
 * The log under `paths` at a git revision against the working tree: both sides go through checkLog (the
 * working tree usually entirely from the cache, the old side evaluating only blocks the cache has not seen),
 * then blocks are matched by record and id.
 */
export async function diffLog(revision: string, paths: string[], options: CheckLogOptions & { root: string }): Promise<LogDiff> {
  const { root } = options;
  const absolute = paths.map((p) => resolve(root, p));
  // The repository that holds the records, which need not be the one the tool runs from.
  const first = absolute[0] ?? root;
  const top = repositoryTop(existsSync(first) && statSync(first).isDirectory() ? first : dirname(first));
  const commit = resolveRevision(top, revision);
  const oldFiles = markdownFilesAt(top, commit, absolute);
  const texts = textsAt(top, oldFiles.map((path) => ({ commit, path })));
  const oldSources = oldFiles.flatMap((path, i) => (texts[i] === null ? [] : [{ name: relative(root, resolve(top, path)), text: texts[i]! }]));
  const { files } = collectRecordFiles(absolute);
  const [before, after] = [await checkLog(oldSources, options), await checkLog(files, options)];
  const sides = { before: new Map(oldSources.map((s) => [s.name, s.text])), after: new Map<string, string>() };
  for (const f of files) sides.after.set(relative(root, f), readFileSync(f, 'utf8'));
  const changes = compareLogs(before.log, after.log, sides);
  const total = after.log.records.reduce((n, r) => n + r.blocks.length, 0);
  return { revision, commit, changes, unchanged: total - changes.filter((c) => c.change !== 'added').length, stats: { before: before.stats, after: after.stats } };
}

const snapshot = (b: BlockResult): BlockSnapshot => {
  const toHartree = (v: number | null) => (v === null || !b.quantity ? v : v / b.quantity.energy.perHartree);
  return { status: b.status, energy: b.energy, upper: b.bounds.upper, lower: b.bounds.lower, energyHartree: toHartree(b.energy?.value ?? null), line: b.line };
};

/** Blocks of two results of a log matched by record and id; `texts` are the records' texts, for naming the fields that changed. */
export function compareLogs(before: LogResult, after: LogResult, texts: { before: Map<string, string>; after: Map<string, string> }): BlockChange[] {
  const byKey = (log: LogResult) => new Map(log.records.flatMap((r: RecordResult) => r.blocks.map((b) => [`${r.file}\0${b.id}`, { file: r.file, block: b }] as const)));
  const old = byKey(before);
  const now = byKey(after);
  const changes: BlockChange[] = [];
  for (const [key, { file, block }] of now) {
    const was = old.get(key);
    if (!was) {
      const worse = block.status === 'confirmed' ? null : `a new block that is ${block.status}`;
      changes.push({ file, id: block.id, change: 'added', fields: [], before: null, after: snapshot(block), worse });
    } else if (was.block.inputHash !== block.inputHash) {
      const fields = changedFields(texts.before.get(file), texts.after.get(file), block.id);
      changes.push({ file, id: block.id, change: 'changed', fields, before: snapshot(was.block), after: snapshot(block), worse: worsening(snapshot(was.block), snapshot(block)) });
    }
  }
  for (const [key, { file, block }] of old) if (!now.has(key)) changes.push({ file, id: block.id, change: 'removed', fields: [], before: snapshot(block), after: null, worse: null });
  return changes;
}

/** Why `after` is worse than `before`, or null: a status further down STATUS_ORDER, or a higher energy. */
export function worsening(before: BlockSnapshot, after: BlockSnapshot): string | null {
  const rank = (s: BlockSnapshot['status']) => STATUS_ORDER.indexOf(s);
  if (rank(after.status) < rank(before.status)) return `status ${before.status} -> ${after.status}`;
  const [e0, e1] = [before.energyHartree, after.energyHartree];
  if (e0 !== null && e1 !== null && e1 - e0 > ENERGY_TOLERANCE * Math.max(1, Math.abs(e0))) return `energy rose by ${(e1 - e0).toPrecision(3)} hartree`;
  if (e0 !== null && e1 === null) return 'no energy any more';
  return null;
}

/** The top-level spec fields of block `id` whose written values differ between two texts of its record. */
function changedFields(before: string | undefined, after: string | undefined, id: string): string[] {
  if (before === undefined || after === undefined) return [];
  const fieldsOf = (text: string): Record<string, unknown> => {
    for (const fenced of findSpecBlocks(text)) {
      try {
        const data = parse(fenced.text) as unknown;
        if (data && typeof data === 'object' && String((data as Record<string, unknown>).id) === id) return data as Record<string, unknown>;
      } catch {
        // A block whose YAML does not parse has no fields to compare.
      }
    }
    return {};
  };
  const [a, b] = [fieldsOf(before), fieldsOf(after)];
  return [...new Set([...Object.keys(a), ...Object.keys(b)])].filter((k) => JSON.stringify(a[k]) !== JSON.stringify(b[k])).sort();
}
