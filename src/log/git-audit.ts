import { execFileSync } from 'node:child_process';
import { dirname, basename } from 'node:path';

/** The last commit that touched a record, when the log is in git. */
export interface LastCommit {
  hash: string;
  author: string;
  date: string;
  /** True when the file has changes that are not committed, so the commit does not describe what was built. */
  modified: boolean;
}

/** Asks git about one file; null when git is missing, the folder is not a repository, or the file was never committed. */
export function lastCommit(file: string): LastCommit | null {
  const run = (args: string[]) => execFileSync('git', args, { cwd: dirname(file), encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'], timeout: 10_000 }).trim();
  try {
    const line = run(['log', '-1', '--format=%H%x1f%an%x1f%aI', '--', basename(file)]);
    if (!line) return null;
    const [hash, author, date] = line.split('\x1f');
    const modified = run(['status', '--porcelain', '--', basename(file)]) !== '';
    return { hash, author, date, modified };
  } catch {
    return null;
  }
}

/** The commit a folder's checkout is at, and whether its work tree has changes; null outside git. */
export function headCommit(folder: string): { hash: string; modified: boolean } | null {
  const run = (args: string[]) => execFileSync('git', args, { cwd: folder, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'], timeout: 10_000 }).trim();
  try {
    return { hash: run(['rev-parse', 'HEAD']), modified: run(['status', '--porcelain']) !== '' };
  } catch {
    return null;
  }
}
