import * as Plot from '@observablehq/plot';
import { parseHTML } from 'linkedom';
import type { DensityProfile, EnergyScan } from '../engine/plot-data.ts';
import type { BlockResult } from '../log/result-types.ts';
import { describeLevel } from '../engine/parity.ts';
import { formatNumber } from './html.ts';

/** Plot draws into a DOM; on the server a small standalone one is enough. */
const { document } = parseHTML('<!doctype html><html><body></body></html>');

const WIDTH = 430;
const HEIGHT = 270;
// Black and white print: marks differ by line style and symbol, never by colour alone.
const INK = '#111';
const STYLE = { fontSize: '11px', background: 'white', color: INK, overflow: 'visible' };

export interface PlotUnits {
  energy: string;
  length: string;
  parameters: Record<string, string | null>;
}

/** The scan and density plots of a block as inline SVG (empty when the block has no plot data). */
export function renderPlots(result: BlockResult, units: PlotUnits): string[] {
  if (!result.plots || result.energy === null) return [];
  const svgs = result.plots.scans.map((scan) => scanPlot(scan, result, units));
  if (result.plots.density) svgs.push(densityPlot(result.plots.density, result, units));
  if (result.states.length > 1) svgs.push(levelPlot(result, units));
  return svgs;
}

function scanPlot(scan: EnergyScan, result: BlockResult, units: PlotUnits): string {
  const points = scan.points.filter((p): p is { value: number; energy: number } => p.energy !== null);
  const optimum = result.energy!.value;
  const reference = result.reference?.energy ?? null;
  const unit = units.parameters[scan.parameter];
  const marks: Plot.Markish[] = [
    Plot.line(points, { x: 'value', y: 'energy', stroke: INK, strokeWidth: 1.6 }),
    Plot.dot([{ value: scan.optimum, energy: optimum }], { x: 'value', y: 'energy', fill: INK, r: 4, symbol: 'circle' }),
    Plot.text([{ value: scan.optimum, energy: optimum }], { x: 'value', y: 'energy', text: () => `optimum ${scan.parameter} = ${formatNumber(scan.optimum, 6)}`, dy: -12, fill: INK }),
  ];
  if (reference !== null) {
    marks.push(
      Plot.ruleY([reference], { stroke: INK, strokeDasharray: '6,4' }),
      Plot.text([reference], { y: (d: number) => d, frameAnchor: 'right', text: () => `reference ${formatNumber(reference, 8)}`, dy: 9, fill: INK, textAnchor: 'end' }),
    );
  }
  return draw(
    {
      // In quantity mode a parameter without a unit is a pure number; in atomic mode it is in atomic units.
      x: { label: `${scan.parameter}${unit ? ` (${unit})` : result.quantity ? '' : ' (atomic units)'}`, nice: true },
      y: { label: `E (${units.energy})`, nice: true, grid: true },
      marks,
    },
    `Energy against ${scan.parameter} through the optimum; dashed line: reference energy of the ${targetLevel(result)}`,
  );
}

function densityPlot(profile: DensityProfile, result: BlockResult, units: PlotUnits): string {
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
  const q = profile.coordinate;
  const marks: Plot.Markish[] = [
    Plot.line(
      profile.samples.filter((s) => s.potential !== null),
      { x: 'x', y: 'potential', stroke: '#666', strokeWidth: 3, clip: true },
    ),
    Plot.ruleY([energy], { stroke: INK, strokeWidth: 0.8 }),
    Plot.areaY(profile.samples, { x: 'x', y1: energy, y2: (s: DensityProfile['samples'][number]) => energy + lift * s.trial, fill: '#d9d9d9', clip: true }),
    Plot.line(profile.samples, { x: 'x', y: (s: DensityProfile['samples'][number]) => energy + lift * s.trial, stroke: INK, strokeWidth: 1.4, clip: true }),
    Plot.dot(profile.grid, { x: 'x', y: (g: DensityProfile['grid'][number]) => energy + lift * g.density, stroke: INK, fill: 'white', r: 2.5, symbol: 'circle', clip: true }),
    Plot.text([energy], { y: (d: number) => d, frameAnchor: 'left', text: () => `E = ${formatNumber(energy, 8)}`, dy: 8, dx: 4, fill: INK, textAnchor: 'start' }),
  ];
  if (reference !== null) marks.push(Plot.ruleY([reference], { stroke: INK, strokeDasharray: '6,4' }));
  return draw(
    {
      x: { label: `${q} (${units.length})` },
      y: { label: `energy (${units.energy})`, domain: [low - margin, high + margin], grid: true },
      marks,
    },
    `Thick grey: potential V(${q}). Shaded with line: trial density${q === 'r' ? ' r²|R|²' : ' |ψ|²'}; open circles: grid density of the ${targetLevel(result)} at its nodes; both scaled and drawn from the level E. Dashed: reference energy of that level.`,
  );
}

/** The basis levels beside the grid levels of the same index: each basis level must sit on or above its partner. */
function levelPlot(result: BlockResult, units: PlotUnits): string {
  const ticks = result.states.flatMap((state, k) => [
    { method: 'basis', energy: state.energy, label: `E${k}` },
    ...(state.reference === null ? [] : [{ method: 'grid', energy: state.reference, label: `E${k}` }]),
  ]);
  const pairs = result.states.flatMap((state) => (state.reference === null ? [] : [[{ method: 'basis', energy: state.energy }, { method: 'grid', energy: state.reference }]]));
  return draw(
    {
      x: { domain: ['basis', 'grid'], label: null, padding: 0.35 },
      y: { label: `energy (${units.energy})`, grid: true, nice: true },
      marks: [
        ...pairs.map((pair) => Plot.line(pair, { x: 'method', y: 'energy', stroke: INK, strokeDasharray: '2,3', strokeWidth: 0.8 })),
        Plot.tickY(ticks, { x: 'method', y: 'energy', stroke: INK, strokeWidth: 2.2 }),
        Plot.text(ticks, { x: 'method', y: 'energy', text: 'label', dy: -7, fill: INK }),
      ],
    },
    'Levels of the basis (left) against the grid levels of the same index (right); dotted lines join partners.',
  );
}

/** The grid level a block is compared with, in words ("ground level", "lowest odd level"). */
function targetLevel(result: BlockResult): string {
  return result.reference ? describeLevel(result.reference.level) : 'ground level';
}

function draw(options: Plot.PlotOptions, caption: string): string {
  const figure = Plot.plot({ document, width: WIDTH, height: HEIGHT, marginLeft: 58, marginRight: 16, style: STYLE, caption, ...options }) as unknown as { outerHTML: string };
  return figure.outerHTML;
}
