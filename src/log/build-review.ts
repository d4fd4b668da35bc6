import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { writeJsonAtomically } from './build-results.ts';
import { evaluatorFingerprint } from './evaluator-fingerprint.ts';
import type { LogDiff } from './log-diff.ts';
import type { BlockHistory } from './record-history.ts';
import type { LogSystem } from './systems.ts';

const FILE = 'build-review.json';

/** What the build works out about the whole log before pages render: systems, each record's history, and the changes since a revision. */
export interface BuildReview {
  systems: LogSystem[];
  /** Block histories by record file. */
  histories: Record<string, BlockHistory[]>;
  /** The comparison with GROUNDWORK_SINCE, when it was set. */
  changes: LogDiff | null;
}

export function writeBuildReview(cacheRoot: string, review: BuildReview): void {
  writeJsonAtomically(cacheRoot, FILE, { evaluator: evaluatorFingerprint(), ...review });
}

/** The review of the last build by this evaluator; empty when there is none (a dev server that never ran the build step). */
export function readBuildReview(cacheRoot: string): BuildReview {
  try {
    const stored = JSON.parse(readFileSync(join(cacheRoot, FILE), 'utf8')) as BuildReview & { evaluator: string };
    if (stored.evaluator === evaluatorFingerprint()) return { systems: stored.systems, histories: stored.histories, changes: stored.changes };
  } catch {
    // Nothing stored: pages go without the review.
  }
  return { systems: [], histories: {}, changes: null };
}
