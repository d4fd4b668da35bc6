import { buildReview } from './record-page.ts';
import type { LogSystem } from '../log/systems.ts';
import type { LogDiff } from '../log/log-diff.ts';

/** The systems of the log, as the build step found them across every record. */
export function logSystems(): LogSystem[] {
  return buildReview().systems;
}

/** The changes since GROUNDWORK_SINCE, or null when the build was not asked for them. */
export function logChanges(): LogDiff | null {
  return buildReview().changes;
}
