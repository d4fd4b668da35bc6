import { copyFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { summaryLine, timedCli } from './cli-run.ts';

const RUNS = 5;
const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];

async function medianMs(args: string[], cwd: string): Promise<number> {
  const times: number[] = [];
  for (let run = 0; run < RUNS; run++) {
    const { ms, stderr } = await timedCli(args, cwd);
    if (args[0] === 'check' && !/, 0 evaluated,/.test(summaryLine(stderr))) throw new Error(`the cached check evaluated blocks: ${stderr}`);
    times.push(ms);
  }
  return Math.round(median(times));
}

/**
 * What a user waits for before any numerics: `groundwork --version` (`startupMs`), and a check of one
 * record whose results are all cached (`cachedOneFileMs`); each the median of separate child processes.
 */
export async function benchStartup(record: string): Promise<{ startupMs: number; cachedOneFileMs: number }> {
  const dir = mkdtempSync(join(tmpdir(), 'groundwork-startup-'));
  try {
    const startupMs = await medianMs(['--version'], dir);
    copyFileSync(record, join(dir, basename(record)));
    await timedCli(['check', basename(record)], dir);
    const cachedOneFileMs = await medianMs(['check', basename(record)], dir);
    process.stderr.write(`startup: ${startupMs} ms; cached one-file check: ${cachedOneFileMs} ms\n`);
    return { startupMs, cachedOneFileMs };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
