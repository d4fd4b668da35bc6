import { findBreakpoints } from './breakpoints.ts';
import type { AxisSwitch, PointFunction } from './problem.ts';
import type { AxisPlacement, FieldSpace } from './spaces/field-space.ts';
import { probePoints, probeTrial } from './trial-probe.ts';

/** Where a trial of several coordinates lives: per axis its centre, scale and split points, and its peak. */
export interface FieldPlacement {
  axes: AxisPlacement[];
  /** Largest |psi| seen, the yardstick for the walls. */
  peakAmplitude: number;
  /** A point where the trial was not a finite number, if any. */
  nonFiniteAt: Float64Array | null;
  evaluations: number;
}

/** Sweeps over the axes: each moves the probing line to the largest |psi| found along it. */
const SWEEPS = 2;

/**
 * Probes the trial along lines through the point of largest |psi|, one axis at a time (coordinate sweeps), with the
 * one-coordinate probe of each axis's space (its volume element included), then finds the kinks of the potential and
 * trial and the space's singular points along each axis about where the trial lives.
 */
export function probeField(value: PointFunction, potential: PointFunction, space: FieldSpace, switches: AxisSwitch[]): FieldPlacement {
  const d = space.axes.length;
  const at = Float64Array.from(space.axes, (axis) => (Number.isFinite(axis.lo) && Number.isFinite(axis.hi) ? 0.5 * (axis.lo + axis.hi) : 0));
  let evaluations = 0;
  const along = (k: number) => (x: number) => {
    const saved = at[k];
    at[k] = x;
    const v = value(at);
    at[k] = saved;
    return v;
  };
  for (let sweep = 0; sweep < SWEEPS; sweep++) {
    for (let k = 0; k < d; k++) {
      const f = along(k);
      let best = at[k];
      let largest = Math.abs(f(best));
      for (const x of probePoints(space.axes[k])) {
        const v = Math.abs(f(x));
        if (v > largest) [best, largest] = [x, v];
      }
      evaluations += probePoints(space.axes[k]).length + 1;
      at[k] = best;
    }
  }
  let peakAmplitude = 0;
  let nonFiniteAt: Float64Array | null = null;
  const placements: AxisPlacement[] = [];
  for (let k = 0; k < d; k++) {
    const probe = probeTrial(along(k), space.axes[k]);
    evaluations += probe.evaluations;
    peakAmplitude = Math.max(peakAmplitude, probe.peakAmplitude);
    if (probe.nonFiniteAt !== null && nonFiniteAt === null) {
      nonFiniteAt = at.slice();
      nonFiniteAt[k] = probe.nonFiniteAt;
    }
    const axis = space.axes[k];
    const own = switches.filter((s) => s.axis === k).map((s) => s.at);
    const breaks = findBreakpoints(own, axis.lo, axis.hi, probe.center, probe.scale);
    evaluations += breaks.evaluations;
    placements.push({ center: probe.center, scale: probe.scale, breakpoints: breaks.points });
  }
  for (const { axis, points } of space.singularities(potential, placements)) {
    placements[axis].breakpoints = [...new Set([...placements[axis].breakpoints, ...points])].sort((a, b) => a - b);
  }
  return { axes: placements, peakAmplitude, nonFiniteAt, evaluations };
}
