import { compileBlock } from '../src/expr/compile-block.ts';
import type { BlockResult } from '../src/log/result-types.ts';
import type { BlockSpec } from '../src/spec/types.ts';

const ROUNDS = 7;
const CALLS_PER_ROUND = 200_000;
const SAMPLES = 1024;

/**
 * Nanoseconds per trial evaluation of a single-trial block: one call each of the compiled trial,
 * its derivative and the potential, at the optimum's parameters and at points where the trial lives
 * (the density plot's window when there is one). The fastest of several rounds, so that it is the
 * floor the engine's figures are compared with, measured in the same process and so with the same
 * closure feedback as the engine's own calls.
 */
export function closureNanoseconds(spec: BlockSpec, result: BlockResult): number | null {
  // A trial of several coordinates is called at points, not at x: its floor would be a different measure.
  if (typeof spec.space === 'object' || spec.space === 'axial') return null;
  const compiled = compileBlock(spec);
  if (!compiled.ok || !compiled.block.trial) return null;
  const { trial, potential } = compiled.block;
  trial.setParameters(spec.varied.map((p) => result.parameters[p.name]?.value ?? p.start));
  const window = result.plots?.density?.samples.map((s) => s.x) ?? [];
  const lo = window.length > 0 ? window[0] : spec.space === 'line' ? -3 : 0;
  const hi = window.length > 0 ? window[window.length - 1] : 3;
  // Interior points only: a hard wall or r = 0 may be where the potential is singular.
  const xs = Float64Array.from({ length: SAMPLES }, (_, i) => lo + ((hi - lo) * (i + 0.5)) / SAMPLES);
  let best = Infinity;
  let sink = 0;
  for (let round = 0; round < ROUNDS; round++) {
    const started = performance.now();
    for (let i = 0; i < CALLS_PER_ROUND; i++) {
      const x = xs[i % SAMPLES];
      sink += trial.value(x) + trial.d1(x) + potential(x);
    }
    best = Math.min(best, ((performance.now() - started) * 1e6) / CALLS_PER_ROUND);
  }
  checksum = sink;
  return best;
}

/** Where the timed loop's sum goes, so that no compiler may drop the calls as unused. */
export let checksum = 0;
