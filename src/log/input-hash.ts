import { createHash } from 'node:crypto';
import { TOOL_VERSION } from './tool-version.ts';

/**
 * sha256 of the tool version and a block's meaning (keys sorted, line numbers left out), so moving
 * a block within its record or reformatting its YAML does not count as a change.
 */
export function inputHash(meaning: unknown): string {
  const text = JSON.stringify([TOOL_VERSION, meaning], (key, value) =>
    key === 'line' ? undefined : value && typeof value === 'object' && !Array.isArray(value) ? Object.fromEntries(Object.entries(value).sort(([a], [b]) => (a < b ? -1 : 1))) : value,
  );
  return 'sha256:' + createHash('sha256').update(text).digest('hex');
}
