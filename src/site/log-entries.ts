import { getCollection, type CollectionEntry } from 'astro:content';
import { recordPage, type RecordPage } from './record-page.ts';

export interface LogEntry {
  entry: CollectionEntry<'records'>;
  page: RecordPage;
}

/** Every record of the log with its evaluated result and page body, newest first. */
export async function logEntries(): Promise<LogEntry[]> {
  const entries = await getCollection('records');
  const rows = entries.map((entry) => ({ entry, page: recordPage(entry.filePath!) }));
  for (const { page } of rows) for (const warning of page.warnings) console.warn(`groundwork: ${warning}`);
  return rows.sort((a, b) => (a.entry.data.date === b.entry.data.date ? a.entry.id.localeCompare(b.entry.id) : a.entry.data.date < b.entry.data.date ? 1 : -1));
}
