import { diffLog, type BlockChange, type BlockSnapshot, type LogDiff } from '../log/log-diff.ts';
import { GitError } from '../log/git-revisions.ts';
import type { LogConfig } from '../log/log-config.ts';

/** `groundwork diff`: the comparison, or why it could not be made (not a repository, an unknown revision). */
export async function diffCommand(revision: string, paths: string[], options: { root: string; config: LogConfig }): Promise<{ diff: LogDiff; text: string } | { error: string }> {
  try {
    const diff = await diffLog(revision, paths, options);
    return { diff, text: formatDiff(diff) };
  } catch (error) {
    if (error instanceof GitError) return { error: `git: ${error.message}` };
    throw error;
  }
}

const show = (s: BlockSnapshot | null) =>
  s === null ? '—' : `${s.status}, E = ${s.energy ? `${Number(s.energy.value.toPrecision(10))} ${s.energy.unit}` : '—'}${s.lower !== null ? `, lower bound ${Number(s.lower.toPrecision(10))}` : ''}`;

/** The comparison as a reviewer reads it: one paragraph per block that changed. */
export function formatDiff(diff: LogDiff): string {
  const lines = [`groundwork diff ${diff.revision} (${diff.commit.slice(0, 12)}) against the working tree: ${diff.changes.length} block${diff.changes.length === 1 ? '' : 's'} changed, ${diff.unchanged} unchanged`];
  const order: Record<BlockChange['change'], number> = { changed: 0, added: 1, removed: 2 };
  for (const c of [...diff.changes].sort((a, b) => order[a.change] - order[b.change] || a.file.localeCompare(b.file))) {
    lines.push('', `${c.change} ${c.file} ${c.id}${c.fields.length > 0 ? ` (fields: ${c.fields.join(', ')})` : ''}${c.worse ? `  WORSE: ${c.worse}` : ''}`);
    if (c.before) lines.push(`  before: ${show(c.before)}`);
    if (c.after) lines.push(`  after:  ${show(c.after)}`);
  }
  return lines.join('\n');
}
