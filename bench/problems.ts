import { existsSync, readFileSync } from 'node:fs';
import os from 'node:os';
import { collectRecordFiles } from '../src/log/check-log.ts';
import { evaluateBlock } from '../src/log/evaluate-block.ts';
import { parseRecord } from '../src/spec/parse-record.ts';
import { closureNanoseconds } from './closure-floor.ts';
import { benchSyntheticLog } from './log200.ts';
import { benchReview } from './review.ts';
import { benchSweeps } from './sweeps.ts';
import { benchStartup } from './startup.ts';
import { benchTwoElectron } from './two-electron.ts';

/**
 * Evaluates every benchmark record repeatedly (and the records of two and three coordinates in bench/fields), then checks a synthetic 200-block log through the CLI
 * cold and cached, reviews it in git (bench/review.ts: `diff HEAD~1` with 5 changed blocks, systems and histories
 * against a cached check), times the command line's start-up (`startupMs`, `cachedOneFileMs`: see startup.ts),
 * and prints one comparable JSON document (progress on stderr).
 * Usage: tsx bench/problems.ts [folder] [--problems-only]; the flag leaves out the synthetic log. `twoElectron` times the
 * two-electron space (bench/two-electron.ts).
 *
 * Per single-trial problem, `floorMs` is the trial evaluations times the time of one evaluation of
 * the compiled trial, derivative and potential (`closureNs`): the least the variational part could
 * take with these closures. `overFloor` is variationalMs / floorMs.
 */
const WARM_UP = 2;
const RUNS = 7;
const FIELD_WARM_UP = 0;
const FIELD_RUNS = 3;
const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];

// The project's shared set when it sits beside the repository, else the copy the tests use.
const shared = new URL('../../shared/problems', import.meta.url).pathname;
const args = process.argv.slice(2);
const problemsOnly = args.includes('--problems-only');
const folder = args.find((a) => !a.startsWith('--')) ?? (existsSync(shared) ? shared : new URL('../tests/fixtures/problems', import.meta.url).pathname);
const problems: Record<string, unknown> = {};
const records = collectRecordFiles([folder]).files;
benchRecords(records, WARM_UP, RUNS);
// Problems of two and three coordinates (axial, Cartesian products): each run takes seconds, so fewer of them.
benchRecords(collectRecordFiles([new URL('./fields', import.meta.url).pathname]).files, FIELD_WARM_UP, FIELD_RUNS);

function benchRecords(files: string[], warmUp: number, runCount: number): void {
  for (const file of files) {
    const record = parseRecord(file, readFileSync(file, 'utf8'));
    for (const entry of record.blocks) {
      const runs = Array.from({ length: warmUp + runCount }, () => evaluateBlock(file, entry)).slice(warmUp);
      const last = runs[runs.length - 1];
      const published = last.reference?.published?.energy ?? null;
      const key = last.id;
      const variationalMs = median(runs.map((r) => r.diagnostics?.variationalMs ?? NaN));
      const evaluations = last.diagnostics?.trialEvaluations ?? null;
      const closureNs = entry.kind === 'spec' && last.energy ? closureNanoseconds(entry.spec, last) : null;
      const floorMs = closureNs !== null && evaluations !== null ? (evaluations * closureNs) / 1e6 : null;
      problems[key] = {
        status: last.status,
        variationalMs,
        referenceMs: median(runs.map((r) => r.diagnostics?.referenceMs ?? NaN)),
        energyEvaluations: last.diagnostics?.energyEvaluations ?? null,
        evaluations,
        closureNs,
        floorMs,
        overFloor: floorMs !== null ? variationalMs / floorMs : null,
        gridSize: last.diagnostics?.grid?.size ?? null,
        energy: last.energy?.value ?? null,
        relError: published !== null && last.energy ? (last.energy.value - published) / Math.abs(published) : null,
        referenceRelError: published !== null && last.reference?.method === 'grid' ? (last.reference.energy! - published) / Math.abs(published) : null,
      };
      process.stderr.write(`${key}: ${last.status}\n`);
    }
  }
}
const { startupMs, cachedOneFileMs } = await benchStartup(records[0]);
const sweeps = benchSweeps();
const log200 = problemsOnly ? null : await benchSyntheticLog(200);
const twoElectron = benchTwoElectron();
const review200 = problemsOnly ? null : await benchReview(200);
process.stdout.write(JSON.stringify({ node: process.version, cores: os.availableParallelism(), startupMs, cachedOneFileMs, problems, sweeps, twoElectron, log200, review200 }, null, 2) + '\n');
