import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeSyntheticLog } from '../scripts/make-synthetic-log.ts';
import { summaryLine, timedCli } from './cli-run.ts';

/** Wall time of one `groundwork check log --json`, and its summary line. */
async function timedCheck(cwd: string): Promise<{ ms: number; summary: string }> {
  const { ms, stderr } = await timedCli(['check', 'log', '--json'], cwd);
  return { ms, summary: summaryLine(stderr) };
}

/**
 * Builds a synthetic log of `blocks` blocks in a temp folder and checks it twice through the CLI:
 * cold (empty cache) and then cached. `cachedEvaluated` is how many blocks the cached run still evaluated.
 */
export async function benchSyntheticLog(blocks: number): Promise<{ coldMs: number; cachedMs: number; cachedEvaluated: number }> {
  const dir = mkdtempSync(join(tmpdir(), 'groundwork-bench-'));
  try {
    writeSyntheticLog(join(dir, 'log'), blocks);
    const cold = await timedCheck(dir);
    process.stderr.write(`log${blocks} cold: ${Math.round(cold.ms)} ms; ${cold.summary}\n`);
    const cached = await timedCheck(dir);
    process.stderr.write(`log${blocks} cached: ${Math.round(cached.ms)} ms; ${cached.summary}\n`);
    const evaluated = /, (\d+) evaluated,/.exec(cached.summary);
    return { coldMs: Math.round(cold.ms), cachedMs: Math.round(cached.ms), cachedEvaluated: evaluated ? Number(evaluated[1]) : NaN };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
