import type { AstroIntegration } from 'astro';
import { writeBuildResults } from '../log/build-results.ts';
import { checkLog, collectRecordFiles } from '../log/check-log.ts';
import { loadLogConfig } from '../log/log-config.ts';
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
      },
    },
  };
}
