import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { checkRecord } from '../log/check-record.ts';
import { lastCommit, type LastCommit } from '../log/git-audit.ts';
import { readBuildResults } from '../log/build-results.ts';
import { readBuildReview, type BuildReview } from '../log/build-review.ts';
import type { BlockHistory } from '../log/record-history.ts';
import { renderHistory, systemLinks } from '../render/review-html.ts';
import { siteLinks } from './site-links.ts';
import { loadLogConfig } from '../log/log-config.ts';
import { provenance } from '../log/provenance.ts';
import { openResultCache, type ResultCache } from '../log/result-cache.ts';
import type { BlockResult, RecordResult } from '../log/result-types.ts';
import { recordHtml } from '../render/record-html.ts';

/** A record's result as its page and its JSON give it: with its last commit and each block's history. */
export type LoggedRecord = RecordResult & { git: LastCommit | null; history: BlockHistory[] };

export interface RecordPage {
  result: LoggedRecord;
  html: string;
  warnings: string[];
}

// One build asks for a record from its page, the index and the exports; the text decides whether it changed (dev reloads).
const rendered = new Map<string, { text: string; page: RecordPage }>();
const stores = new Map<string, { cache: ResultCache; known: Map<string, BlockResult>; review: BuildReview }>();

/** The results cache of the log at `root` and the results of this build's parallel run, shared by every page. */
function siteResults(root: string): { cache: ResultCache; known: Map<string, BlockResult>; review: BuildReview } {
  let store = stores.get(root);
  if (!store) {
    const folder = loadLogConfig(root).cacheFolder;
    stores.set(root, (store = { cache: openResultCache(folder), known: readBuildResults(folder), review: readBuildReview(folder) }));
  }
  return store;
}

/** The systems, histories and changes the build step worked out (empty under a dev server, which has no build step). */
export function buildReview(root = process.cwd()): BuildReview {
  return siteResults(root).review;
}

/** Evaluates a record (through the same path and cache as `groundwork check`) and renders its page body. */
export function recordPage(path: string, root = process.cwd()): RecordPage {
  const absolute = resolve(root, path);
  const text = readFileSync(absolute, 'utf8');
  const previous = rendered.get(absolute);
  if (previous && previous.text === text) return previous.page;
  const { cache, known, review } = siteResults(root);
  const missesBefore = cache.stats.misses;
  const record = checkRecord(absolute, { cwd: root, cache, known });
  const evaluated = cache.stats.misses - missesBefore;
  if (evaluated > 0) console.info(`groundwork: ${record.file}: ${evaluated} block${evaluated > 1 ? 's' : ''} evaluated while rendering`);
  const history = review.histories[record.file] ?? [];
  const result: LoggedRecord = { ...record, git: lastCommit(absolute), history };
  const systems = systemLinks(review.systems, record.file, siteLinks);
  const body = recordHtml(record.file, text, result, { file: record.file, git: result.git, provenance: provenance(), systemOf: (id) => systems.get(id) ?? null });
  const page = { result, html: body.html + renderHistory(history), warnings: body.warnings };
  rendered.set(absolute, { text, page });
  return page;
}
