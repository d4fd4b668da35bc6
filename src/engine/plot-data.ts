import type { GridLevels } from './grid-levels.ts';
import type { ParameterSpec, ProblemBase, TrialFamily } from './problem.ts';
import type { FieldDensity } from './field-plot-data.ts';
import type { CoordinateSpace } from './spaces/space.ts';

/** E along one varied parameter with the others held at the optimum; null where the trial is unusable. */
export interface EnergyScan {
  parameter: string;
  optimum: number;
  points: Array<{ value: number; energy: number | null }>;
}

/** Trial and grid densities (weight |psi|^2, the density in the coordinate: radial r^2 |R|^2) and the potential on a common window. */
export interface DensityProfile {
  coordinate: 'x' | 'r';
  /** On `plane` the density in r is r |R|^2 (volume element r dr), not the radial r^2 |R|^2. */
  plane?: boolean;
  samples: Array<{ x: number; trial: number; potential: number | null }>;
  /** The grid state the trial is compared with (the ground state by default) at its own nodes inside the window (no interpolation). */
  grid: Array<{ x: number; density: number }>;
}

export interface PlotData {
  scans: EnergyScan[];
  density: DensityProfile | null;
  /** Spaces of two or three coordinates: the density in a plane and cuts along each axis (absent on one coordinate). */
  field?: FieldDensity | null;
  evaluations: number;
}

const SCAN_POINTS = 25;
const DENSITY_SAMPLES = 161;
/** The scan reaches about this fraction of <T> above the optimum: enough to show the curvature, not so far that the trial breaks. */
const SCAN_RISE = 0.1;

export interface PlotInputs {
  /** The state whose density is drawn (a trial, or the lowest combination of a basis) and the parameters scanned. */
  problem: Pick<ProblemBase, 'parameters' | 'potential'> & { trial: Pick<TrialFamily, 'value' | 'setParameters'> };
  domain: CoordinateSpace;
  optimum: number[];
  energyAt: (parameters: number[]) => number;
  kinetic: number;
  curvature: number[][] | null;
  norm: number;
  center: number;
  scale: number;
  grid: GridLevels | null;
  /** Which grid level's density is drawn (default 0, the ground level). */
  gridLevel?: number;
}

/** What the energy scans need, on any space. */
export interface ScanInputs {
  problem: { parameters: ParameterSpec[]; trial: { setParameters(values: ArrayLike<number>): void } };
  optimum: number[];
  energyAt: (parameters: number[]) => number;
  kinetic: number;
  curvature: number[][] | null;
}

/** Samples the data behind the scan and density plots; the plots themselves are drawn by the render layer. */
export function plotData(inputs: PlotInputs, wanted: ReadonlyArray<'scan' | 'density'>): PlotData {
  const { scans, evaluations } = energyScans(inputs, wanted);
  const density = wanted.includes('density') ? densityProfile(inputs) : null;
  return { scans, density, evaluations: evaluations + (density ? DENSITY_SAMPLES : 0) };
}

/** E along each varied parameter through the optimum (when scans are wanted), and how many energies that took. */
export function energyScans(inputs: ScanInputs, wanted: ReadonlyArray<'scan' | 'density'>): { scans: EnergyScan[]; evaluations: number } {
  let evaluations = 0;
  const energy = (p: number[]) => {
    evaluations++;
    const e = inputs.energyAt(p);
    return Number.isFinite(e) ? e : null;
  };
  const scans = wanted.includes('scan') ? inputs.problem.parameters.map((_, i) => scanParameter(inputs, i, energy)) : [];
  return { scans, evaluations };
}

function scanParameter(inputs: ScanInputs, index: number, energy: (p: number[]) => number | null): EnergyScan {
  const spec = inputs.problem.parameters[index];
  const centre = inputs.optimum[index];
  const curvature = inputs.curvature?.[index]?.[index] ?? NaN;
  // Half-width where a parabola with the optimiser's curvature rises by SCAN_RISE <T>; half the value (or range) otherwise.
  let half = curvature > 0 ? Math.sqrt((2 * SCAN_RISE * Math.abs(inputs.kinetic)) / curvature) : NaN;
  if (!Number.isFinite(half) || half <= 0) half = centre !== 0 ? Math.abs(centre) / 2 : (spec.max - spec.min) / 4;
  const lo = Math.max(spec.min, centre - half);
  const hi = Math.min(spec.max, centre + half);
  const points = Array.from({ length: SCAN_POINTS }, (_, k) => {
    const value = lo + ((hi - lo) * k) / (SCAN_POINTS - 1);
    const p = inputs.optimum.slice();
    p[index] = value;
    return { value, energy: energy(p) };
  });
  inputs.problem.trial.setParameters(inputs.optimum);
  return { parameter: spec.name, optimum: centre, points };
}

function densityProfile(inputs: PlotInputs): DensityProfile {
  const { problem, domain } = inputs;
  const reach = 1.15 * inputs.scale;
  const lo = Math.max(domain.lo, Number.isFinite(domain.lo) && domain.lo >= inputs.center - reach ? domain.lo : inputs.center - reach);
  const hi = Math.min(domain.hi, inputs.center + reach);
  problem.trial.setParameters(inputs.optimum);
  const samples = Array.from({ length: DENSITY_SAMPLES }, (_, k) => {
    const x = lo + ((hi - lo) * k) / (DENSITY_SAMPLES - 1);
    const psi = problem.trial.value(x);
    const v = problem.potential(x);
    return { x, trial: (psi * psi * domain.weight(x)) / inputs.norm, potential: Number.isFinite(v) ? v : null };
  });
  const grid: DensityProfile['grid'] = [];
  const state = inputs.grid?.states[inputs.gridLevel ?? 0];
  if (inputs.grid && state) {
    const { nodes } = inputs.grid;
    // Grid vectors are normalised with the lumped weights, so state[i]^2 is the density at node i (radial: of chi = r R).
    for (let i = 0; i < nodes.length; i++) if (nodes[i] >= lo && nodes[i] <= hi) grid.push({ x: nodes[i], density: state[i] * state[i] });
  }
  return { coordinate: domain.coordinate, ...(domain.name === 'plane' ? { plane: true } : {}), samples, grid };
}
