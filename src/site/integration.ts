import type { AstroIntegration } from 'astro';
import { writeBuildResults } from '../log/build-results.ts';
import { writeBuildReview } from '../log/build-review.ts';
import { checkLog, collectRecordFiles } from '../log/check-log.ts';
import { loadLogConfig } from '../log/log-config.ts';
import { diffLog } from '../log/log-diff.ts';
import { recordHistories } from '../log/record-history.ts';
import { findSystems } from '../log/systems.ts';
import { SINCE_REVISION } from './records-folder.ts';
import { parseRecord } from '../spec/parse-record.ts';

export interface IntegrationOptions {
  /** Folder of the records, relative to the log root. */
  records: string;
}

/**
 * Before pages render, checks the whole log in parallel worker threads so every page then finds its results
 * in the cache (a page that still has to evaluate a block says so in the build log).
 */
export default function groundwork(options: IntegrationOptions): AstroIntegration {
  const root = process.cwd();
  return {
    name: 'groundwork',
    hooks: {
      'astro:build:start': async ({ logger }) => {
        const { files } = collectRecordFiles([options.records]);
        const config = loadLogConfig(root);
        // Vite, which runs this module, cannot import anything once the config is loaded: the parser is passed.
        const { log, stats } = await checkLog(files, { root, config, parseRecord });
        writeBuildResults(config.cacheFolder, log);
        logger.info(`${stats.blocks} blocks: ${stats.evaluated} evaluated, ${stats.cached} from cache (${stats.workers} workers)${stats.corrupt ? `, ${stats.corrupt} damaged cache entries replaced` : ''}${stats.timedOut ? `, ${stats.timedOut} over the time limit` : ''}`);
        // The review of the whole log: systems across records, each record's history, and the changes since a revision.
        const started = performance.now();
        const histories = await recordHistories(log.records, { root, config, parseRecord, depth: config.historyDepth });
        const changes = SINCE_REVISION ? await diffLog(SINCE_REVISION, [options.records], { root, config, parseRecord }) : null;
        const systems = findSystems(log.records);
        writeBuildReview(config.cacheFolder, { systems, histories: Object.fromEntries(histories), changes });
        logger.info(`review: ${systems.length} systems, ${histories.size} record histories${changes ? `, ${changes.changes.length} block${changes.changes.length === 1 ? '' : 's'} changed since ${SINCE_REVISION}` : ''} (${Math.round(performance.now() - started)} ms)`);
      },
    },
  };
}
