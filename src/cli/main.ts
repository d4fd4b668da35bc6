import type { CheckStats } from '../log/check-log.ts';
import type { LogResult } from '../log/result-types.ts';
import { TOOL_VERSION } from '../log/tool-version.ts';

// Only the version is loaded up front: `--version` and `--help` must not pay for the record parser, the
// configuration schema or the cache, which `check` imports when it runs.

const OPTIONS: Record<string, string[]> = { check: ['--json', '--plots', '--recompute'], diff: ['--json'], new: ['--space', '--units'] };
/** Options that take the next argument as their value. */
const VALUED = ['--space', '--units'];

/** Exit codes: every block confirmed; something checked is not; the check could not run at all. */
export const EXIT = { confirmed: 0, notConfirmed: 1, couldNotRun: 2 } as const;

/** Why a check could not run; `path` is the file or folder concerned, when there is one. */
export interface RunError {
  path: string | null;
  message: string;
}

/** What `check --json` prints: the log's result and the reasons the check could not run (empty when it ran). */
export type CheckOutput = LogResult & { errors: RunError[] };

async function usage(): Promise<string> {
  const { CONFIG_FILE, DEFAULTS } = await import('../log/log-config.ts');
  return `groundwork ${TOOL_VERSION}

usage: groundwork check [files or folders...] [--json [--plots]] [--recompute]
       groundwork diff <git revision> [files or folders...] [--json]
       groundwork new <name> [--space line|radial] [--units <length>,<energy>]

  check        recompute every variational block of the records (default folder: content/records)
  diff         compare the log at a git revision (HEAD~1, main, a commit) with the working tree:
               blocks added, removed or with changed inputs, their energy, bounds and status before and after
  new          write a record skeleton (content/records/<name>.md when that folder exists) whose one
               commented block builds as confirmed; --units nm,meV writes it in quantity mode
  --json       print the machine-readable result instead of the table (with an "errors" list and
               each block's "verdict"); the plot samples are left out ("plots": null)
  --plots      with --json, keep each block's plot samples
  --recompute  evaluate every block again instead of taking stored results from the cache

Blocks are evaluated in parallel worker threads and their results kept in ${DEFAULTS.cacheFolder}/.
The log root is the nearest folder holding ${CONFIG_FILE}, looked for from the folder of the
paths checked upwards (the working folder when there is none); the file sets timeLimitSeconds,
memoryLimitMb, workers and cacheFolder, a relative cacheFolder being taken from that folder.

Exit codes:
  0  every block is confirmed and every record read cleanly (diff: no block got worse)
  1  some block is not confirmed, or some record has a problem (each is listed)
     (diff: some block got worse: a lower status, a higher energy, or a new block not confirmed)
  2  the command could not run: a path that does not exist, no records or no blocks found,
     a bad ${CONFIG_FILE}, an unknown revision, an unknown command or option`;
}

/** Runs the command line; resolves to the exit code instead of exiting, so tests can call it. */
export async function main(argv: string[], out: (text: string) => void, err: (text: string) => void): Promise<number> {
  const [command, ...rest] = argv;
  if (command === undefined || command === '--help' || command === '-h' || command === 'help') {
    out(await usage());
    return command === undefined ? EXIT.couldNotRun : EXIT.confirmed;
  }
  if (command === '--version') {
    out(TOOL_VERSION);
    return EXIT.confirmed;
  }
  const json = rest.includes('--json');
  const tell = (errors: RunError[]) => {
    for (const e of errors) err(`groundwork${command in OPTIONS ? ` ${command}` : ''}: ${e.path ? `${e.path}: ` : ''}${e.message}`);
  };
  // Whatever stops the run is said on stderr and, with --json, in the document a script reads instead.
  const refuse = async (errors: RunError[], withUsage: boolean): Promise<number> => {
    tell(errors);
    if (withUsage) err(`\n${await usage()}`);
    if (json) out(JSON.stringify({ tool: { name: 'groundwork', version: TOOL_VERSION }, records: [], errors } satisfies CheckOutput, null, 2));
    return EXIT.couldNotRun;
  };
  if (!Object.hasOwn(OPTIONS, command)) return refuse([{ path: null, message: `unknown command ${command}` }], true);
  if (rest.includes('--help') || rest.includes('-h')) {
    out(await usage());
    return EXIT.confirmed;
  }
  const unknown = rest.filter((a) => a.startsWith('-') && !OPTIONS[command].includes(a));
  if (unknown.length > 0) return refuse([{ path: null, message: `unknown option ${unknown.join(', ')}` }], true);
  const valueOf = (option: string) => {
    const at = rest.indexOf(option);
    return at < 0 ? undefined : (rest[at + 1] ?? '');
  };
  const positional = rest.filter((a, i) => !a.startsWith('-') && !VALUED.includes(rest[i - 1]));
  if (command === 'new') {
    const { newCommand } = await import('./new-command.ts');
    const outcome = newCommand(positional, { space: valueOf('--space'), units: valueOf('--units') }, process.cwd());
    if ('error' in outcome) return refuse([{ path: null, message: outcome.error }], false);
    out(`wrote ${outcome.path}: check it with groundwork check ${outcome.path}`);
    return EXIT.confirmed;
  }

  const { checkLog, collectRecordFiles } = await import('../log/check-log.ts');
  const { findLogRoot, LogConfigError, loadLogConfig } = await import('../log/log-config.ts');
  const cwd = process.cwd();
  if (command === 'diff' && positional.length === 0) return refuse([{ path: null, message: 'diff needs a git revision to compare with (HEAD~1, main, a commit hash)' }], true);
  const given = command === 'diff' ? positional.slice(1) : positional;
  const paths = given.length > 0 ? given : ['content/records'];
  const { files, missing } = collectRecordFiles(paths);
  if (missing.length > 0) return refuse(missing.map((path) => ({ path, message: 'no such file or folder' })), false);
  if (files.length === 0) return refuse([{ path: paths.join(', '), message: 'no records (Markdown files) found, so nothing was checked' }], false);
  let config;
  try {
    config = loadLogConfig(findLogRoot(paths, cwd));
  } catch (error) {
    if (!(error instanceof LogConfigError)) throw error;
    return refuse([{ path: null, message: error.message }], false);
  }
  if (command === 'diff') {
    const { diffCommand } = await import('./diff-command.ts');
    const outcome = await diffCommand(positional[0], paths, { root: cwd, config });
    if ('error' in outcome) return refuse([{ path: null, message: outcome.error }], false);
    const { before, after } = outcome.diff.stats;
    err(`groundwork: diff: ${count(outcome.diff.changes.length, 'block')} changed, ${before.evaluated + after.evaluated} evaluated (${before.evaluated} at ${positional[0]}, ${after.evaluated} in the working tree), ${before.cached + after.cached} from cache`);
    out(json ? JSON.stringify({ ...outcome.diff, errors: [] }, null, 2) : outcome.text);
    return outcome.diff.changes.some((c) => c.worse !== null) ? EXIT.notConfirmed : EXIT.confirmed;
  }
  const { log, stats } = await checkLog(files, { root: cwd, config, recompute: rest.includes('--recompute') });
  // Records without a single block leave a CI gate with nothing checked: that is not a pass.
  const errors: RunError[] = stats.blocks === 0 ? [{ path: paths.join(', '), message: `no variational blocks found in ${count(files.length, 'Markdown file')}, so nothing was checked` }] : [];
  tell(errors);
  if (errors.length === 0) err(summary(stats));
  if (json) {
    const { withVerdicts } = await import('../log/block-verdict.ts');
    out(JSON.stringify({ ...withVerdicts(log, { plots: rest.includes('--plots') }), errors } satisfies CheckOutput, null, 2));
  } else out((await import('./format-table.ts')).formatTable(log, stats.fromCache));
  if (errors.length > 0) return EXIT.couldNotRun;
  const allConfirmed = log.records.every((r) => r.problems.length === 0 && r.blocks.every((b) => b.status === 'confirmed'));
  return allConfirmed ? EXIT.confirmed : EXIT.notConfirmed;
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
