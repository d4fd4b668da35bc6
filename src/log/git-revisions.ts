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

/** The newest `limit` commits that changed the file, newest first; empty when it was never committed or git is missing. */
export function fileCommits(file: string, limit: number): FileCommit[] {
  try {
    const top = repositoryTop(resolve(file, '..'));
    const out = git(top, ['log', `-n${limit}`, '--format=%H%x1f%an%x1f%aI%x1f%s', '--', relative(top, resolve(file))]);
    return out
      .split('\n')
      .filter(Boolean)
      .map((line) => {
        const [hash, author, date, subject] = line.split('\x1f');
        return { hash, author, date, subject };
      });
  } catch {
    return [];
  }
}

/** A file's text at a commit (path relative to the repository top); null when the commit has no such file. */
export function textAt(top: string, commit: string, path: string): string | null {
  try {
    return git(top, ['show', `${commit}:${path.split('\\').join('/')}`]);
  } catch {
    return null;
  }
}

/** The Markdown files under `paths` (absolute) at a commit, relative to the repository top. */
export function markdownFilesAt(top: string, commit: string, paths: string[]): string[] {
  const inside = paths.map((p) => relative(top, p) || '.');
  const out = git(top, ['ls-tree', '-r', '--name-only', '--full-tree', commit, '--', ...inside]);
  return out.split('\n').filter((name) => name.endsWith('.md') && !name.split('/').some((part) => part.startsWith('.') || part === 'node_modules'));
}
