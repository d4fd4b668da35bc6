import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { writeSyntheticLog } from '../scripts/make-synthetic-log.ts';
import { checkLog, collectRecordFiles } from '../src/log/check-log.ts';
import { loadLogConfig } from '../src/log/log-config.ts';
import { recordHistories } from '../src/log/record-history.ts';
import { findSystems } from '../src/log/systems.ts';
import { timedCli } from './cli-run.ts';

const CHANGED = 5;
const RUNS = 5;
const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];

/**
 * The review of a synthetic log kept in git (two commits, the second rewriting the trial of 5 blocks without changing
 * its meaning): `groundwork diff HEAD~1` through the CLI with the working tree cached (how many blocks it evaluated,
 * and its wall time), then, in this process, a cached check of the log against the same check plus systems and
 * histories, the extra work a cached site build does (medians of RUNS).
 */
export async function benchReview(blocks: number) {
  const dir = mkdtempSync(join(tmpdir(), 'groundwork-bench-review-'));
  try {
    const git = (...args: string[]) => execFileSync('git', ['-c', 'user.name=Bench', '-c', 'user.email=bench@example.invalid', '-c', 'commit.gpgsign=false', ...args], { cwd: dir, stdio: 'pipe' });
    writeSyntheticLog(join(dir, 'log'), blocks);
    git('init', '-q');
    git('add', '-A');
    git('commit', '-q', '-m', 'synthetic log');
    let left = CHANGED;
    const { files } = collectRecordFiles([join(dir, 'log')]);
    for (const file of files) {
      if (left === 0) break;
      const text = readFileSync(file, 'utf8');
      const edited = text.replace(/trial: exp\(-a\*x\^2\)\n/g, (match) => (left > 0 ? (left--, 'trial: exp(-a*x*x)\n') : match));
      if (edited !== text) writeFileSync(file, edited);
    }
    git('commit', '-q', '-am', `rewrite ${CHANGED} trials`);
    await timedCli(['check', 'log'], dir);
    const diff = await timedCli(['diff', 'HEAD~1', 'log'], dir);
    const summary = diff.stderr.split('\n').find((l) => l.startsWith('groundwork: diff:')) ?? '';
    process.stderr.write(`diff HEAD~1: ${Math.round(diff.ms)} ms; ${summary}\n`);
    const evaluated = /, (\d+) evaluated/.exec(summary);

    const config = loadLogConfig(dir);
    const checkMs: number[] = [];
    const reviewMs: number[] = [];
    for (let run = 0; run < RUNS; run++) {
      const started = performance.now();
      const { log } = await checkLog(files, { root: dir, config });
      const checked = performance.now();
      findSystems(log.records);
      await recordHistories(log.records, { root: dir, config, depth: config.historyDepth });
      checkMs.push(checked - started);
      reviewMs.push(performance.now() - checked);
    }
    const cachedCheckMs = median(checkMs);
    const review = median(reviewMs);
    process.stderr.write(`review of log${blocks}: cached check ${Math.round(cachedCheckMs)} ms, systems and histories ${Math.round(review)} ms\n`);
    return {
      diffMs: Math.round(diff.ms),
      diffChangedBlocks: CHANGED,
      diffEvaluated: evaluated ? Number(evaluated[1]) : NaN,
      cachedCheckMs: Math.round(cachedCheckMs),
      systemsAndHistoryMs: Math.round(review),
      systemsAndHistoryShare: Number((review / cachedCheckMs).toFixed(3)),
    };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
