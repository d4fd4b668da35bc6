import { performance } from 'node:perf_hooks';
import { g } from '../engine/format.ts';
import { STATUS_ORDER } from '../engine/status.ts';
import type { BlockEntry, BlockSpec } from '../spec/types.ts';
import { inputHash } from './input-hash.ts';
import type { BlockResult } from './result-types.ts';

/**
 * Evaluates a block at every value of its swept constant, in the order written, each point a full evaluation
 * warm-started from its neighbour's optimum (the optimum moves little between close values, so the search is short).
 * The block takes the worst point's status and result, its message naming the point; every point's result is kept.
 * Only the first point samples the scan and density plots (the panel draws them for the block's own point); when a
 * later point is the worst, it is evaluated once more with its plots.
 * Points carry sensitivities only when the block has uncertain inputs, whose propagation each point then states.
 * `evaluatePoint` returns results in the block's units; `known` holds points already computed (from the cache, by
 * sweepPointEntries), which are taken as they are, so adding a point to a sweep evaluates only that point.
 */
export function evaluateSweep(spec: BlockSpec, evaluatePoint: (point: BlockSpec, withSensitivities: boolean) => BlockResult, known: ReadonlyArray<BlockResult | null> = []): BlockResult {
  const started = performance.now();
  const sweep = spec.sweep!;
  const withSensitivities = Object.keys(spec.uncertainties).length > 0;
  const points: Array<{ value: number; result: BlockResult }> = [];
  let previous: BlockResult | null = null;
  const pointSpec = (value: number, varied: BlockSpec['varied'], plots: boolean): BlockSpec => ({
    ...spec,
    constants: { ...spec.constants, [sweep.constant]: value },
    varied,
    sweep: null,
    report: plots ? spec.report : { ...spec.report, plots: [] },
  });
  // Results are in the block's units; the search runs in atomic units.
  const atomic = (name: string, value: number) => value / (spec.quantity?.parameters[name]?.perAtomic ?? 1);
  const warm = (from: BlockResult) =>
    spec.varied.map((p) => ({ ...p, start: Math.min(p.max, Math.max(p.min, from.parameters[p.name] ? atomic(p.name, from.parameters[p.name].value) : p.start)) }));
  for (const [i, value] of sweep.values.entries()) {
    const result: BlockResult = known[i] ?? evaluatePoint(pointSpec(value, previous ? warm(previous) : spec.varied, points.length === 0), withSensitivities);
    points.push({ value, result });
    if (result.status !== 'invalid' && result.energy !== null) previous = result;
  }
  const rank = (r: BlockResult) => STATUS_ORDER.indexOf(r.status);
  const worst = points.reduce((w, p, i) => (rank(p.result) < rank(points[w].result) ? i : w), 0);
  const { value: worstValue, result: worstResult } = points[worst];
  const needsPlots = worstResult.energy !== null && spec.report.plots.length > 0 && worstResult.plots === null;
  const chosen = needsPlots ? { value: worstValue, result: evaluatePoint(pointSpec(worstValue, warm(worstResult), true), withSensitivities) } : points[worst];
  const unit = spec.quantity?.inputs[sweep.constant];
  const stated = (value: number) => value * (unit?.perAtomic ?? 1);
  const at = `at ${sweep.constant} = ${g(stated(chosen.value), 6)}${unit?.unit ? ` ${unit.unit}` : ''}`;
  return {
    ...chosen.result,
    id: spec.id,
    line: spec.line,
    caption: spec.caption,
    message: chosen.result.message === null ? null : `${at} (of ${points.length} points): ${chosen.result.message}`,
    problems: chosen.result.problems.map((p) => ({ ...p, message: `${at}: ${p.message}` })),
    // The plots are the block's (above); in the points they would only weigh down the JSON.
    sweep: { constant: sweep.constant, unit: unit?.unit ?? null, points: points.map((p) => ({ value: stated(p.value), result: { ...p.result, plots: null } })), worst },
    inputHash: inputHash(spec),
    timeMs: performance.now() - started,
  };
}

/**
 * The cache entries of a sweep's points: each the block at one value of the swept constant, keyed by that meaning
 * alone (not by the list of values, nor by the warm start), so that a point is found again when the sweep changes.
 */
export function sweepPointEntries(entry: Extract<BlockEntry, { kind: 'spec' }>): Array<Extract<BlockEntry, { kind: 'spec' }>> {
  const { spec } = entry;
  const sweep = spec.sweep!;
  return sweep.values.map((value) => ({
    kind: 'spec',
    source: '',
    spec: { ...spec, id: `${spec.id}@${sweep.constant}=${value}`, constants: { ...spec.constants, [sweep.constant]: value }, sweep: null, report: { ...spec.report, plots: [] } },
  }));
}
