import type { AxisPlacement } from './spaces/field-space.ts';
import type { FieldSpace } from './spaces/field-space.ts';
import { energyScans, type PlotData, type ScanInputs } from './plot-data.ts';
import type { PointFunction } from './problem.ts';

/** The density along one axis through the crossing point, the potential there, and the grid ground state at its nodes on that line. */
export interface FieldCut {
  coordinate: string;
  samples: Array<{ x: number; trial: number; potential: number | null }>;
  /** The grid ground state at its own nodes on the cut (the crossing point sits on a grid line, so no interpolation). */
  grid: Array<{ x: number; density: number }>;
}

/**
 * The trial density |psi|^2 / <psi|psi> (per unit volume of the whole space: axial per length^3) on a plane of the
 * space, and cuts along every axis through one point: the potential's minimum, or the trial's peak when the
 * potential has none in the window.
 */
export interface FieldDensity {
  coordinates: string[];
  /** The picture's horizontal and vertical coordinates, as indices into `coordinates`. */
  plane: [number, number];
  /** The crossing point of the cuts, one value per coordinate; with three coordinates it also fixes the picture's plane. */
  through: number[];
  throughKind: 'potential minimum' | 'trial peak';
  /** The density is per unit length to this power (axial: 3; a product: its number of coordinates). */
  dimension: number;
  /** Row-major with x fastest: density[j * x.length + i] is at (x[i], y[j]). */
  picture: { x: number[]; y: number[]; density: number[] };
  cuts: FieldCut[];
}

/** What the grid contributes: its axes' nodes and the ground state's values there (row-major, the last axis fastest). */
export interface ProductGridStates {
  axes: Array<{ nodes: Float64Array }>;
  states: Float64Array[];
}

export interface FieldPlotInputs extends ScanInputs {
  problem: ScanInputs['problem'] & { space: FieldSpace; potential: PointFunction; trial: ScanInputs['problem']['trial'] & { value: PointFunction } };
  norm: number;
  placement: { axes: AxisPlacement[] };
  grid: ProductGridStates | null;
}

const PICTURE_SAMPLES = 61;
const CUT_SAMPLES = 161;
/** The window reaches this many of the probe's length scales either side of the centre, as on one coordinate. */
const REACH = 1.15;
/** A potential minimum where the trial density is below this fraction of its peak says little about the state: cut through the peak instead. */
const MINIMUM_DENSITY_FRACTION = 0.01;
const SWEEPS = 2;
const COARSE_SAMPLES = 41;
/** The picture frames the samples above this fraction of the density's peak, with FRAME_MARGIN of that extent around them. */
const FRAME_FRACTION = 0.01;
const FRAME_MARGIN = 0.15;

/** Samples the scans and the density picture and cuts of a trial on a space of two or three coordinates. */
export function fieldPlotData(inputs: FieldPlotInputs, wanted: ReadonlyArray<'scan' | 'density'>): PlotData {
  let field: FieldDensity | null = null;
  let sampled = 0;
  if (wanted.includes('density')) {
    inputs.problem.trial.setParameters(inputs.optimum);
    ({ field, evaluations: sampled } = fieldDensity(inputs));
  }
  const { scans, evaluations } = energyScans(inputs, wanted);
  return { scans, density: null, field, evaluations: evaluations + sampled };
}

/** The picture and cuts of the trial at the parameters already set. */
export function fieldDensity(inputs: Omit<FieldPlotInputs, keyof ScanInputs> & { problem: FieldPlotInputs['problem'] }): { field: FieldDensity; evaluations: number } {
  const { space, potential, trial } = inputs.problem;
  const d = space.axes.length;
  let evaluations = 0;
  const density: PointFunction = (point) => {
    evaluations++;
    const psi = trial.value(point);
    return (psi * psi) / inputs.norm;
  };
  const windows = space.axes.map((axis, k) => {
    const { center, scale } = inputs.placement.axes[k];
    const reach = REACH * scale;
    const lo = Number.isFinite(axis.lo) && axis.lo >= center - reach ? axis.lo : Math.max(axis.lo, center - reach);
    return { lo, hi: Math.min(axis.hi, center + reach) };
  });
  const along = (k: number, count: number) => Array.from({ length: count }, (_, i) => windows[k].lo + ((windows[k].hi - windows[k].lo) * i) / (count - 1));
  const cutPoints = windows.map((_, k) => along(k, CUT_SAMPLES));

  const peak = sweep(inputs.placement.axes.map((a, k) => clamp(a.center, windows[k])), cutPoints, (p) => density(p), 'max');
  const lowest = sweep(peak.point, cutPoints, (p) => potential(p), 'min');
  // Edges of the window are only a minimum of V where the space itself ends without a wall (rho = 0); elsewhere V keeps falling outward.
  const interior = lowest.index.every((i, k) => (i > 0 && i < CUT_SAMPLES - 1) || (i === 0 && windows[k].lo === space.axes[k].lo && !space.axes[k].walls.includes(space.axes[k].lo)));
  // A potential that is not finite somewhere along the sweep is singular there (a nucleus): it has no minimum to cut through.
  const useMinimum = interior && !lowest.sawNonFinite && Number.isFinite(lowest.value) && density(lowest.point) >= MINIMUM_DENSITY_FRACTION * peak.value;
  const through = Array.from(useMinimum ? lowest.point : peak.point);
  const snapped = inputs.grid ? through.map((x, k) => nearestNode(inputs.grid!.axes[k].nodes, x)) : null;
  if (snapped) snapped.forEach((i, k) => (through[k] = inputs.grid!.axes[k].nodes[i]));

  const cuts = space.axes.map((_, k): FieldCut => {
    const point = Float64Array.from(through);
    const samples = cutPoints[k].map((x) => {
      point[k] = x;
      const v = potential(point);
      return { x, trial: density(point), potential: Number.isFinite(v) ? v : null };
    });
    return { coordinate: space.coordinates[k], samples, grid: inputs.grid && snapped ? gridCut(inputs.grid, snapped, k, windows[k]) : [] };
  });

  const plane: [number, number] = [0, 1];
  const inPlane = (xs: number[], ys: number[]) => {
    const point = Float64Array.from(through);
    const values: number[] = [];
    for (const yj of ys) {
      point[plane[1]] = yj;
      for (const xi of xs) {
        point[plane[0]] = xi;
        values.push(density(point));
      }
    }
    return values;
  };
  // A coarse look over the whole window first, so the picture frames where the density is rather than the far tails.
  const coarse = { x: along(plane[0], COARSE_SAMPLES), y: along(plane[1], COARSE_SAMPLES) };
  const frame = densityFrame(coarse.x, coarse.y, inPlane(coarse.x, coarse.y));
  const x = spread(frame.x, PICTURE_SAMPLES);
  const y = spread(frame.y, PICTURE_SAMPLES);
  const values = inPlane(x, y);
  return {
    field: {
      coordinates: space.coordinates.slice(),
      plane,
      through,
      throughKind: useMinimum ? 'potential minimum' : 'trial peak',
      dimension: space.name === 'axial' ? 3 : d,
      picture: { x, y, density: values },
      cuts,
    },
    evaluations,
  };
}

/** Coordinate sweeps over each axis's samples toward the extremum of f (non-finite values skipped): a point on the sample lattice and its indices. */
function sweep(start: ArrayLike<number>, samples: number[][], f: PointFunction, kind: 'min' | 'max'): { point: Float64Array; index: number[]; value: number; sawNonFinite: boolean } {
  let sawNonFinite = false;
  const point = Float64Array.from(start);
  const index = Array.from(start, () => -1);
  const better = (a: number, b: number) => Number.isFinite(a) && (!Number.isFinite(b) || (kind === 'min' ? a < b : a > b));
  let value = NaN;
  for (let s = 0; s < SWEEPS; s++) {
    samples.forEach((xs, k) => {
      // Always lands on a sample, so the indices say whether the extremum sits on the window's edge.
      let best = { i: -1, x: point[k], v: NaN };
      xs.forEach((x, i) => {
        point[k] = x;
        const v = f(point);
        if (!Number.isFinite(v)) sawNonFinite = true;
        if (better(v, best.v)) best = { i, x, v };
      });
      point[k] = best.x;
      index[k] = best.i;
      value = best.v;
    });
  }
  return { point, index, value, sawNonFinite };
}

/** The ranges in x and y holding every sample above FRAME_FRACTION of the peak, widened by FRAME_MARGIN and kept inside the window. */
function densityFrame(x: number[], y: number[], values: number[]): { x: [number, number]; y: [number, number] } {
  const peak = Math.max(...values);
  let [i0, i1, j0, j1] = [x.length - 1, 0, y.length - 1, 0];
  values.forEach((v, n) => {
    if (!(v >= FRAME_FRACTION * peak)) return;
    const i = n % x.length;
    const j = Math.floor(n / x.length);
    [i0, i1, j0, j1] = [Math.min(i0, i), Math.max(i1, i), Math.min(j0, j), Math.max(j1, j)];
  });
  // One sample step beyond the last sample above the fraction, where the density is known to be below it.
  const range = (v: number[], a: number, b: number): [number, number] => {
    if (a > b) return [v[0], v[v.length - 1]];
    const lo = v[Math.max(0, a - 1)];
    const hi = v[Math.min(v.length - 1, b + 1)];
    const pad = FRAME_MARGIN * (hi - lo);
    return [Math.max(v[0], lo - pad), Math.min(v[v.length - 1], hi + pad)];
  };
  return { x: range(x, i0, i1), y: range(y, j0, j1) };
}

function spread([lo, hi]: [number, number], count: number): number[] {
  return Array.from({ length: count }, (_, i) => lo + ((hi - lo) * i) / (count - 1));
}

/** The grid ground state's density at the nodes of axis k inside its window, the other axes at the node indices `at`. */
function gridCut(grid: ProductGridStates, at: number[], k: number, window: { lo: number; hi: number }): FieldCut['grid'] {
  const ground = grid.states[0];
  if (!ground) return [];
  const strides = grid.axes.map((_, j) => grid.axes.slice(j + 1).reduce((n, a) => n * a.nodes.length, 1));
  const base = at.reduce((sum, i, j) => (j === k ? sum : sum + i * strides[j]), 0);
  const out: FieldCut['grid'] = [];
  grid.axes[k].nodes.forEach((x, i) => {
    if (x < window.lo || x > window.hi) return;
    const psi = ground[base + i * strides[k]];
    out.push({ x, density: psi * psi });
  });
  return out;
}

function nearestNode(nodes: Float64Array, x: number): number {
  let best = 0;
  for (let i = 1; i < nodes.length; i++) if (Math.abs(nodes[i] - x) < Math.abs(nodes[best] - x)) best = i;
  return best;
}

function clamp(x: number, window: { lo: number; hi: number }): number {
  return Math.min(window.hi, Math.max(window.lo, x));
}
