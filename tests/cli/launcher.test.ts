import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

// The launcher is plain JavaScript without type declarations; it is loaded the way node loads it.
const { compiledIsFresh } = (await import(new URL('../../bin/compiled-is-fresh.js', import.meta.url).href)) as { compiledIsFresh: (root: string) => boolean };

/** A tool tree with one source and its compiled file; the compile started at `stamp` (seconds), the source was saved at `source`. */
function tree(stamp: number | null, source: number): string {
  const root = mkdtempSync(join(tmpdir(), 'groundwork-launch-'));
  mkdirSync(join(root, 'src', 'log'), { recursive: true });
  mkdirSync(join(root, 'compiled', 'log'), { recursive: true });
  writeFileSync(join(root, 'src', 'log', 'a.ts'), 'export const a: number = 1;\n');
  writeFileSync(join(root, 'compiled', 'log', 'a.js'), 'export const a = 1;\n');
  utimesSync(join(root, 'src', 'log', 'a.ts'), source, source);
  if (stamp !== null) {
    writeFileSync(join(root, 'compiled', '.stamp'), '');
    utimesSync(join(root, 'compiled', '.stamp'), stamp, stamp);
  }
  return root;
}

describe('the launcher', () => {
  it('runs the compiled code only when no source of it changed after the compile started', () => {
    expect(compiledIsFresh(tree(2_000_000_000, 1_900_000_000))).toBe(true);
    expect(compiledIsFresh(tree(1_900_000_000, 2_000_000_000))).toBe(false);
    // No stamp: the compile never finished.
    expect(compiledIsFresh(tree(null, 1_900_000_000))).toBe(false);
    expect(compiledIsFresh(mkdtempSync(join(tmpdir(), 'groundwork-launch-')))).toBe(false);
  });

  it('prints the version of package.json from a child process, compiled or not', () => {
    const bin = new URL('../../bin/groundwork.js', import.meta.url).pathname;
    const run = spawnSync(process.execPath, [bin, '--version'], { encoding: 'utf8', timeout: 60_000 });
    expect(run.status).toBe(0);
    expect(run.stdout.trim()).toBe(JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')).version);
  }, 60_000);
});
