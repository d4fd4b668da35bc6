/** Keys whose values are measured durations: the only part of a result that may differ between runs. */
const TIMING_KEYS = new Set(['timeMs', 'variationalMs', 'referenceMs', 'sensitivityMs']);

/** The JSON text of a value with every timing field left out, for byte-for-byte comparisons of runs. */
export function withoutTimings(value: unknown): string {
  return JSON.stringify(value, (key, v) => (TIMING_KEYS.has(key) ? undefined : v), 2);
}
