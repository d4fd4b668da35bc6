import { existsSync, readFileSync, statSync } from 'node:fs';
import os from 'node:os';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { z } from 'zod';

/** The file at the log root that overrides the defaults below. */
export const CONFIG_FILE = 'groundwork.config.json';

/** How a log is built: limits per block and where results are kept. */
export interface LogConfig {
  /** Wall-clock limit for one block's evaluation; a block over it becomes `unsettled`. */
  timeLimitSeconds: number;
  /** Heap cap of each worker (V8 old generation); a block over it becomes `invalid`. */
  memoryLimitMb: number;
  /** How many blocks are evaluated at once, each in its own worker thread. */
  workers: number;
  /** Absolute path of the results cache folder. */
  cacheFolder: string;
  /** How many commits back a record's history goes (the newest that changed it). */
  historyDepth: number;
}

/** Defaults, written once and used by code, docs and tests alike. */
export const DEFAULTS = {
  timeLimitSeconds: 60,
  memoryLimitMb: 512,
  cacheFolder: '.groundwork-cache',
  historyDepth: 20,
} as const;

const overrides = z
  .object({
    timeLimitSeconds: z.number({ invalid_type_error: 'must be a number of seconds' }).positive('must be more than 0 seconds').finite('must be finite'),
    memoryLimitMb: z.number({ invalid_type_error: 'must be a number of megabytes' }).int('must be a whole number of megabytes').min(64, 'must be at least 64 MB (the evaluator itself needs that much)'),
    workers: z.number({ invalid_type_error: 'must be a number' }).int('must be a whole number').min(1, 'must be at least 1'),
    cacheFolder: z.string({ invalid_type_error: 'must be a folder path written as text' }).min(1, 'must not be empty'),
    historyDepth: z.number({ invalid_type_error: 'must be a number of commits' }).int('must be a whole number of commits').min(0, 'must be 0 (no history) or more'),
  })
  .partial()
  .strict();

/** A configuration file that cannot be used; the message names the file and the field. */
export class LogConfigError extends Error {
  constructor(
    readonly file: string,
    readonly field: string | null,
    reason: string,
  ) {
    super(`${file}${field ? `: ${field}` : ''}: ${reason}`);
    this.name = 'LogConfigError';
  }
}

/**
 * The configuration of the log rooted at `root`: the defaults, overridden by `groundwork.config.json`
 * there when it exists. Relative cache folders are taken from the root. Throws LogConfigError.
 */
export function loadLogConfig(root: string): LogConfig {
  const file = join(root, CONFIG_FILE);
  let text: string | null;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOENT') throw new LogConfigError(file, null, `cannot be read: ${(error as Error).message}`);
    text = null;
  }
  let data: unknown = {};
  if (text !== null) {
    try {
      data = JSON.parse(text);
    } catch (error) {
      throw new LogConfigError(file, null, `is not valid JSON: ${(error as Error).message}`);
    }
  }
  if (data === null || typeof data !== 'object' || Array.isArray(data)) throw new LogConfigError(file, null, 'must be a JSON object of fields');
  const parsed = overrides.safeParse(data);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = issue.code === 'unrecognized_keys' ? issue.keys.join(', ') : issue.path.join('.');
    const reason = issue.code === 'unrecognized_keys' ? `unknown field (known: ${Object.keys(overrides.shape).join(', ')})` : issue.message;
    throw new LogConfigError(file, field, reason);
  }
  const set = parsed.data;
  return {
    timeLimitSeconds: set.timeLimitSeconds ?? DEFAULTS.timeLimitSeconds,
    memoryLimitMb: set.memoryLimitMb ?? DEFAULTS.memoryLimitMb,
    workers: set.workers ?? os.availableParallelism(),
    cacheFolder: resolve(root, set.cacheFolder ?? DEFAULTS.cacheFolder),
    historyDepth: set.historyDepth ?? DEFAULTS.historyDepth,
  };
}

/**
 * The log root for a run over `paths`: the nearest folder holding groundwork.config.json at or above the
 * deepest folder containing every path, so a log kept elsewhere is checked with its own limits and keeps
 * its own cache wherever the command is started; the working folder when no such file is found.
 */
export function findLogRoot(paths: string[], cwd: string): string {
  const folders = paths.map((path) => {
    const full = resolve(cwd, path);
    try {
      return statSync(full).isDirectory() ? full : dirname(full);
    } catch {
      return dirname(full);
    }
  });
  let common = folders[0] ?? cwd;
  const outside = (folder: string) => {
    const path = relative(common, folder);
    return path === '..' || path.startsWith(`..${sep}`);
  };
  for (const folder of folders) while (outside(folder)) common = dirname(common);
  for (let folder = common; ; folder = dirname(folder)) {
    if (existsSync(join(folder, CONFIG_FILE))) return folder;
    if (dirname(folder) === folder) return cwd;
  }
}
