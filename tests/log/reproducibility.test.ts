import { spawn } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, readdirSync, rmSync, statSync, symlinkSync, truncateSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { writeSyntheticLog } from '../../scripts/make-synthetic-log.ts';
import { withoutTimings } from './without-timings.ts';

// The command line as a user runs it, in child processes, on copies of one synthetic log: the reference
// for every run is an uninterrupted run with an empty cache.

const made: string[] = [];
const temporaryFolder = (prefix: string) => {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  made.push(dir);
  return dir;
};
afterAll(() => made.forEach((dir) => rmSync(dir, { recursive: true, force: true })));

/**
 * A copy of the tool taken when the tests start: every run below uses the same evaluator even if the
 * sources are edited while the tests run (which would rightly change the cache keys between runs).
 */
function snapshotOfTool(): string {
  const home = new URL('../..', import.meta.url).pathname;
  const copy = temporaryFolder('groundwork-tool-');
  for (const part of ['bin', 'src', 'package.json']) cpSync(join(home, part), join(copy, part), { recursive: true });
  symlinkSync(join(home, 'node_modules'), join(copy, 'node_modules'));
  return copy;
}

const CLI = join(snapshotOfTool(), 'bin', 'groundwork.js');
const BLOCKS = 20;

interface Run {
  code: number | null;
  signal: NodeJS.Signals | null;
  stdout: string;
  stderr: string;
}

/** Runs `groundwork check log --json` in `cwd`; `killWhen` is polled and the run is killed once it holds. */
function check(cwd: string, killWhen?: () => boolean): Promise<Run> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [CLI, 'check', 'log', '--json'], { cwd });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (chunk) => (stdout += chunk));
    child.stderr.on('data', (chunk) => (stderr += chunk));
    const poll = killWhen ? setInterval(() => killWhen() && child.kill('SIGKILL'), 10) : undefined;
    child.on('error', reject);
    child.on('close', (code, signal) => {
      clearInterval(poll);
      resolve({ code, signal, stdout, stderr });
    });
  });
}

const source = temporaryFolder('groundwork-repro-source-');
writeSyntheticLog(join(source, 'log'), BLOCKS);

/** A fresh folder holding a copy of the log and no cache. */
function copy(): string {
  const dir = temporaryFolder('groundwork-repro-');
  cpSync(join(source, 'log'), join(dir, 'log'), { recursive: true });
  return dir;
}

const entries = (dir: string) => {
  const folder = join(dir, '.groundwork-cache');
  return existsSync(folder) ? readdirSync(folder, { recursive: true, encoding: 'utf8' }).filter((name) => name.endsWith('.json')) : [];
};
const counts = (stderr: string) => {
  const match = /groundwork: (\d+) blocks, (\d+) evaluated, (\d+) from cache/.exec(stderr);
  if (!match) throw new Error(`no summary line in: ${stderr}`);
  return { blocks: Number(match[1]), evaluated: Number(match[2]), cached: Number(match[3]) };
};

describe('reproducible checks', () => {
  let reference: string;

  it('gives byte-identical JSON, timings aside, from two runs on separate copies', async () => {
    const [first, second] = [await check(copy()), await check(copy())];
    for (const run of [first, second]) {
      expect(run.code, run.stderr).toBe(0);
      expect(counts(run.stderr)).toEqual({ blocks: BLOCKS, evaluated: BLOCKS, cached: 0 });
    }
    reference = withoutTimings(JSON.parse(first.stdout));
    expect(withoutTimings(JSON.parse(second.stdout))).toBe(reference);
  }, 300_000);

  it('finishes a run killed midway from where it stopped, with the same JSON', async () => {
    const dir = copy();
    const killed = await check(dir, () => entries(dir).length > 0);
    expect(killed.signal).toBe('SIGKILL');
    const kept = entries(dir).length;
    expect(kept).toBeGreaterThan(0);
    expect(kept).toBeLessThan(BLOCKS);
    const restarted = await check(dir);
    expect(restarted.code, restarted.stderr).toBe(0);
    // Every entry the killed run left is whole: all are used, none is found damaged.
    expect(restarted.stderr).not.toMatch(/damaged/);
    expect(counts(restarted.stderr)).toEqual({ blocks: BLOCKS, evaluated: BLOCKS - kept, cached: kept });
    expect(withoutTimings(JSON.parse(restarted.stdout))).toBe(reference);
  }, 300_000);

  it('recomputes a truncated cache entry and says so', async () => {
    const dir = copy();
    await check(dir);
    const victim = join(dir, '.groundwork-cache', entries(dir)[0]);
    truncateSync(victim, Math.floor(statSync(victim).size / 2));
    const again = await check(dir);
    expect(again.stderr).toMatch(/1 damaged cache entry recomputed/);
    expect(counts(again.stderr)).toEqual({ blocks: BLOCKS, evaluated: 1, cached: BLOCKS - 1 });
    expect(withoutTimings(JSON.parse(again.stdout))).toBe(reference);
  }, 300_000);
});
