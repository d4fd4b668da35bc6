import { getCollection } from 'astro:content';
import { newestFirst } from './newest-first.ts';
import { recordPage, type RecordPage } from './record-page.ts';

export interface LogEntry {
  /** The page's name under records/. */
  id: string;
  /** Front matter as groundwork read it, with stand-ins where a record lacks a field (its page lists the problem). */
  meta: { title: string; author: string; date: string; tags: string[] };
  page: RecordPage;
}

/** Every record of the log with its evaluated result and page body, newest first. */
export async function logEntries(): Promise<LogEntry[]> {
  const entries = await getCollection('records');
  const rows = entries.map((entry): LogEntry => {
    const page = recordPage(entry.data.file);
    const fm = page.result.frontMatter;
    return { id: entry.id, meta: { title: fm.title ?? entry.id, author: fm.author ?? '(no author)', date: fm.date ?? '', tags: fm.tags }, page };
  });
  for (const { page } of rows) for (const warning of page.warnings) console.warn(`groundwork: ${warning}`);
  return rows.sort(newestFirst);
}
