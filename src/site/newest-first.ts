/**
 * Orders log rows newest first by their YYYY-MM-DD date, ties by id. A record without a valid date (the spec layer
 * drops a refused one) sorts after every dated record, never as the newest.
 */
export function newestFirst<T extends { id: string; meta: { date: string } }>(a: T, b: T): number {
  if (a.meta.date === b.meta.date) return a.id.localeCompare(b.id);
  if (!a.meta.date || !b.meta.date) return a.meta.date ? -1 : 1;
  return a.meta.date < b.meta.date ? 1 : -1;
}
