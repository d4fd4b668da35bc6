import { checkLog, collectRecordFiles, type CheckStats } from '../log/check-log.ts';
import { CONFIG_FILE, DEFAULTS, LogConfigError, loadLogConfig, type LogConfig } from '../log/log-config.ts';
import { TOOL_VERSION } from '../log/tool-version.ts';
import { formatTable } from './format-table.ts';

const OPTIONS = ['--json', '--recompute'];

const USAGE = `groundwork ${TOOL_VERSION}

usage: groundwork check [files or folders...] [--json] [--recompute]

  check        recompute every variational block of the records (default folder: content/records)
  --json       print the machine-readable result instead of the table
  --recompute  evaluate every block again instead of taking stored results from the cache

Blocks are evaluated in parallel worker threads and their results kept in ${DEFAULTS.cacheFolder}/;
${CONFIG_FILE} in the working folder sets timeLimitSeconds, memoryLimitMb, workers and cacheFolder.

Exit code 0 only when every block is confirmed.`;

/** Runs the command line; resolves to the exit code instead of exiting, so tests can call it. */
export async function main(argv: string[], out: (text: string) => void, err: (text: string) => void): Promise<number> {
  const [command, ...rest] = argv;
  if (command === undefined || command === '--help' || command === '-h' || command === 'help') {
    out(USAGE);
    return command === undefined ? 2 : 0;
  }
  if (command === '--version') {
    out(TOOL_VERSION);
    return 0;
  }
  if (command !== 'check') {
    err(`groundwork: unknown command ${command}\n\n${USAGE}`);
    return 2;
  }
  const unknown = rest.filter((a) => a.startsWith('-') && !OPTIONS.includes(a));
  if (unknown.length > 0) {
    err(`groundwork check: unknown option ${unknown.join(', ')}\n\n${USAGE}`);
    return 2;
  }
  let config: LogConfig;
  try {
    config = loadLogConfig(process.cwd());
  } catch (error) {
    if (!(error instanceof LogConfigError)) throw error;
    err(`groundwork check: ${error.message}`);
    return 2;
  }
  const paths = rest.filter((a) => !a.startsWith('-'));
  const { files, missing } = collectRecordFiles(paths.length > 0 ? paths : ['content/records']);
  for (const path of missing) err(`groundwork check: ${path}: no such file or folder`);
  const { log, stats } = await checkLog(files, { config, recompute: rest.includes('--recompute') });
  err(summary(stats));
  out(rest.includes('--json') ? JSON.stringify(log, null, 2) : formatTable(log));
  const allConfirmed = log.records.every((r) => r.problems.length === 0 && r.blocks.every((b) => b.status === 'confirmed'));
  return allConfirmed && missing.length === 0 ? 0 : 1;
}

const count = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** One line on stderr: how much work the run did and how much it took from the cache. */
function summary(stats: CheckStats): string {
  const extra = [
    stats.corrupt > 0 ? `${count(stats.corrupt, 'damaged cache entry', 'damaged cache entries')} recomputed` : '',
    stats.timedOut > 0 ? `${stats.timedOut} over the time limit` : '',
    stats.overMemory > 0 ? `${stats.overMemory} over the memory cap` : '',
    stats.writeErrors > 0 ? `${count(stats.writeErrors, 'result')} not stored (cache folder not writable)` : '',
  ].filter(Boolean);
  return `groundwork: ${count(stats.blocks, 'block')}, ${stats.evaluated} evaluated, ${stats.cached} from cache${extra.map((e) => `, ${e}`).join('')} (${count(stats.workers, 'worker')})`;
}
