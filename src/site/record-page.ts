import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { checkRecord } from '../log/check-record.ts';
import { lastCommit, type LastCommit } from '../log/git-audit.ts';
import { loadLogConfig } from '../log/log-config.ts';
import { provenance } from '../log/provenance.ts';
import { openResultCache, type ResultCache } from '../log/result-cache.ts';
import type { RecordResult } from '../log/result-types.ts';
import { recordHtml } from '../render/record-html.ts';

export type LoggedRecord = RecordResult & { git: LastCommit | null };

export interface RecordPage {
  result: LoggedRecord;
  html: string;
  warnings: string[];
}

// One build asks for a record from its page, the index and the exports; the text decides whether it changed (dev reloads).
const rendered = new Map<string, { text: string; page: RecordPage }>();
const caches = new Map<string, ResultCache>();

/** The results cache of the log at `root`, shared by every page of one build. */
export function siteCache(root: string): ResultCache {
  let cache = caches.get(root);
  if (!cache) caches.set(root, (cache = openResultCache(loadLogConfig(root).cacheFolder)));
  return cache;
}

/** Evaluates a record (through the same path and cache as `groundwork check`) and renders its page body. */
export function recordPage(path: string, root = process.cwd()): RecordPage {
  const absolute = resolve(root, path);
  const text = readFileSync(absolute, 'utf8');
  const known = rendered.get(absolute);
  if (known && known.text === text) return known.page;
  const cache = siteCache(root);
  const missesBefore = cache.stats.misses;
  const record = checkRecord(absolute, { cwd: root, cache });
  const evaluated = cache.stats.misses - missesBefore;
  if (evaluated > 0) console.info(`groundwork: ${record.file}: ${evaluated} block${evaluated > 1 ? 's' : ''} evaluated while rendering`);
  const result: LoggedRecord = { ...record, git: lastCommit(absolute) };
  const { html, warnings } = recordHtml(record.file, text, result, { file: record.file, git: result.git, provenance: provenance() });
  const page = { result, html, warnings };
  rendered.set(absolute, { text, page });
  return page;
}
