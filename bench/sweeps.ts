import { evaluateBlock } from '../src/log/evaluate-block.ts';
import type { BlockResult } from '../src/log/result-types.ts';
import { parseRecord } from '../src/spec/parse-record.ts';

/**
 * Sweeps and sensitivities (the issue's numbers): `sweepOverCold` is the median CPU time of an 11-point sweep of a
 * one-parameter block over that of one cold evaluation of the same block (without its sensitivities, which sweep
 * points skip), target under 4; `sensitivityShare` is the sensitivities' time over the rest of the block's, target
 * under 0.2. CPU time, not wall-clock, so that a loaded machine shifts the ratios less.
 */
const RUNS = 9;
const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];
const WELL = 'id: tilt\nbox: [0, 1]\nconstants:\n  F: 1\npotential: F*x\ntrial: x*(1 - x)*exp(b*x)\nparameters:\n  b: { start: 0, min: -5, max: 5 }\n';
const DONOR = 'id: donor\nspace: radial\nmass: { value: 0.067, uncertainty: 0.002 }\nconstants:\n  epsr: { value: 12.9, uncertainty: 0.2 }\npotential: -1/(epsr*r)\ntrial: exp(-a*r)\nparameters:\n  a: { start: 0.01, min: 0.0001, max: 1 }\n';

interface Run {
  result: BlockResult;
  cpuMs: number;
}

function timed(body: string): Run[] {
  const text = ['---', 'title: bench', '---', '', '```variational', body.replace(/\n$/, ''), '```', ''].join('\n');
  const entry = parseRecord('bench.md', text).blocks[0];
  evaluateBlock('bench.md', entry);
  return Array.from({ length: RUNS }, () => {
    const before = process.cpuUsage();
    const result = evaluateBlock('bench.md', entry);
    const used = process.cpuUsage(before);
    return { result, cpuMs: (used.user + used.system) / 1000 };
  });
}

// The sensitivities' wall-clock share of the block's, applied to its CPU time.
const sensitivityFraction = (r: BlockResult) => (r.diagnostics?.sensitivityMs ?? 0) / r.timeMs;
const withoutSensitivities = (run: Run) => run.cpuMs * (1 - sensitivityFraction(run.result));
const share = (runs: Run[]) => median(runs.map((run) => sensitivityFraction(run.result) / (1 - sensitivityFraction(run.result))));

export function benchSweeps() {
  const cold = timed(WELL);
  const sweep = timed(`${WELL}sweep: { constant: F, from: 0, to: 2, points: 11 }\n`);
  const donor = timed(DONOR);
  const coldMs = median(cold.map(withoutSensitivities));
  const sweepMs = median(sweep.map((run) => run.cpuMs));
  return {
    sweep: {
      points: 11,
      coldMs,
      sweepMs,
      sweepOverCold: sweepMs / coldMs,
      coldEnergyEvaluations: cold[0].result.diagnostics?.energyEvaluations ?? null,
      sweepEnergyEvaluations: sweep[0].result.sweep!.points.reduce((sum, p) => sum + (p.result.diagnostics?.energyEvaluations ?? 0), 0),
    },
    sensitivityShare: { well: share(cold), donor: share(donor) },
  };
}

if (import.meta.url === `file://${process.argv[1]}`) process.stdout.write(JSON.stringify(benchSweeps(), null, 2) + '\n');
