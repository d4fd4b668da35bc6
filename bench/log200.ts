import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { writeSyntheticLog } from '../scripts/make-synthetic-log.ts';

const CLI = new URL('../bin/groundwork.js', import.meta.url).pathname;

/** Wall time of one `groundwork check log --json` as a user runs it (process start-up included), and its summary line. */
function timedCheck(cwd: string): Promise<{ ms: number; summary: string }> {
  return new Promise((resolve, reject) => {
    const started = performance.now();
    const child = spawn(process.execPath, [CLI, 'check', 'log', '--json'], { cwd, stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (chunk) => (stderr += chunk));
    child.on('error', reject);
    child.on('close', () => {
      const summary = stderr.split('\n').find((line) => line.startsWith('groundwork: '));
      if (!summary) reject(new Error(`the check printed no summary line:\n${stderr}`));
      else resolve({ ms: performance.now() - started, summary });
    });
  });
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
