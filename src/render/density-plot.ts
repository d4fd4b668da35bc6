import * as Plot from '@observablehq/plot';
import type { BlockResult } from '../log/result-types.ts';
import { formatNumber } from './html.ts';
import { draw, INK, type PlotUnits } from './plot-frame.ts';

/** A density along one coordinate with the potential there: trial samples, grid nodes, V(q) (null where not finite). */
export interface DensityLine {
  samples: Array<{ x: number; trial: number; potential: number | null }>;
  grid: Array<{ x: number; density: number }>;
}

/** The potential with the trial and grid densities drawn from the level E (one coordinate, or a cut through a plane). */
export function densityPlot(profile: DensityLine, coordinate: string, caption: string, result: BlockResult, units: PlotUnits): string {
  const energy = result.energy!.value;
  const kinetic = Math.abs(result.components?.kinetic ?? 1) || 1;
  const reference = result.reference?.energy ?? null;
  const potentials = profile.samples.flatMap((s) => (s.potential === null ? [] : [s.potential]));
  const low = Math.max(Math.min(energy, reference ?? energy, ...potentials), energy - 3 * kinetic);
  const high = energy + 3 * kinetic;
  const margin = 0.05 * (high - low);
  // Densities are drawn at the height of the variational energy and scaled to fill the space above it.
  const peak = Math.max(...profile.samples.map((s) => s.trial), ...profile.grid.map((g) => g.density), Number.MIN_VALUE);
  const lift = (0.6 * (high - energy)) / peak;
  type Sample = DensityLine['samples'][number];
  const marks: Plot.Markish[] = [
    Plot.line(
      profile.samples.filter((s) => s.potential !== null),
      { x: 'x', y: 'potential', stroke: '#666', strokeWidth: 3, clip: true },
    ),
    Plot.ruleY([energy], { stroke: INK, strokeWidth: 0.8 }),
    Plot.areaY(profile.samples, { x: 'x', y1: energy, y2: (s: Sample) => energy + lift * s.trial, fill: '#d9d9d9', clip: true }),
    Plot.line(profile.samples, { x: 'x', y: (s: Sample) => energy + lift * s.trial, stroke: INK, strokeWidth: 1.4, clip: true }),
    Plot.dot(profile.grid, { x: 'x', y: (g: DensityLine['grid'][number]) => energy + lift * g.density, stroke: INK, fill: 'white', r: 2.5, symbol: 'circle', clip: true }),
    Plot.text([energy], { y: (d: number) => d, frameAnchor: 'left', text: () => `E = ${formatNumber(energy, 8)}`, dy: 8, dx: 4, fill: INK, textAnchor: 'start' }),
  ];
  if (reference !== null) marks.push(Plot.ruleY([reference], { stroke: INK, strokeDasharray: '6,4' }));
  return draw(
    {
      x: { label: `${coordinate} (${units.length})` },
      y: { label: `energy (${units.energy})`, domain: [low - margin, high + margin], grid: true },
      marks,
    },
    caption,
  );
}
