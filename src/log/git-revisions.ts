import { execFileSync } from 'node:child_process';
import { relative, resolve } from 'node:path';

/** Git, run synchronously in `cwd`; throws GitError with git's own message when it fails. */
function git(cwd: string, args: string[]): string {
  try {
    return execFileSync('git', args, { cwd, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 256 * 1024 * 1024, timeout: 60_000 });
  } catch (error) {
    const stderr = (error as { stderr?: string }).stderr?.trim();
    throw new GitError(stderr || (error as Error).message);
  }
}

export class GitError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'GitError';
  }
}

/** One commit that changed a file. */
export interface FileCommit {
  hash: string;
  author: string;
  /** ISO 8601, as git gives the author date. */
  date: string;
  subject: string;
}

/** The top folder of the repository holding `folder`; throws GitError outside a repository. */
export function repositoryTop(folder: string): string {
  return git(folder, ['rev-parse', '--show-toplevel']).trim();
}

/** The full hash a revision names (HEAD~1, a branch, a tag); throws GitError for an unknown one. */
export function resolveRevision(top: string, revision: string): string {
  return git(top, ['rev-parse', '--verify', '--quiet', '--end-of-options', `${revision}^{commit}`]).trim();
}

/**
 * For each file (relative to the repository top), the newest `limit` commits that changed it, newest first, from one
 * `git log` over all of them (one process for the whole log, not one per record).
 */
export function commitsOfFiles(top: string, paths: string[], limit: number): Map<string, FileCommit[]> {
  const found = new Map<string, FileCommit[]>(paths.map((p) => [p, []]));
  if (paths.length === 0 || limit <= 0) return found;
  const out = git(top, ['log', '--format=%x1e%H%x1f%an%x1f%aI%x1f%s', '--name-only', '--no-renames', '--', ...paths]);
  for (const entry of out.split('\x1e').slice(1)) {
    const [header, ...names] = entry.split('\n');
    const [hash, author, date, subject] = header.split('\x1f');
    for (const name of names) {
      const commits = found.get(name);
      if (commits && commits.length < limit) commits.push({ hash, author, date, subject });
    }
  }
  return found;
}

/** The texts of files at commits (`commit:path` each), read by one `git cat-file --batch`; null where there is no such file. */
export function textsAt(top: string, wanted: Array<{ commit: string; path: string }>): Array<string | null> {
  if (wanted.length === 0) return [];
  const input = wanted.map((w) => `${w.commit}:${w.path.split('\\').join('/')}\n`).join('');
  let out: Buffer;
  try {
    out = execFileSync('git', ['cat-file', '--batch'], { cwd: top, input, maxBuffer: 1024 * 1024 * 1024, stdio: ['pipe', 'pipe', 'pipe'], timeout: 120_000 });
  } catch (error) {
    throw new GitError((error as { stderr?: Buffer }).stderr?.toString().trim() || (error as Error).message);
  }
  const texts: Array<string | null> = [];
  let at = 0;
  for (let i = 0; i < wanted.length; i++) {
    const end = out.indexOf(10, at);
    const header = out.subarray(at, end).toString();
    at = end + 1;
    const size = / blob (\d+)$/.exec(header);
    if (!size) {
      texts.push(null);
      continue;
    }
    texts.push(out.subarray(at, at + Number(size[1])).toString('utf8'));
    at += Number(size[1]) + 1;
  }
  return texts;
}

/** The Markdown files under `paths` (absolute) at a commit, relative to the repository top. */
export function markdownFilesAt(top: string, commit: string, paths: string[]): string[] {
  const inside = paths.map((p) => relative(top, p) || '.');
  const out = git(top, ['ls-tree', '-r', '--name-only', '--full-tree', commit, '--', ...inside]);
  return out.split('\n').filter((name) => name.endsWith('.md') && !name.split('/').some((part) => part.startsWith('.') || part === 'node_modules'));
}
