import * as Plot from '@observablehq/plot';
import type { EnergyScan } from '../engine/plot-data.ts';
import type { BlockResult } from '../log/result-types.ts';
import { describeLevel } from '../engine/parity.ts';
import { densityPlot } from './density-plot.ts';
import { fieldPlots } from './field-plots.ts';
import { formatNumber } from './html.ts';
import { draw, INK, type PlotUnits } from './plot-frame.ts';

export type { PlotUnits } from './plot-frame.ts';

/** The scan and density plots of a block as inline SVG (empty when the block has no plot data). */
export function renderPlots(result: BlockResult, units: PlotUnits): string[] {
  if (!result.plots || result.energy === null) return [];
  const svgs = result.plots.scans.map((scan) => scanPlot(scan, result, units));
  const { density, field } = result.plots;
  if (density) {
    const q = density.coordinate;
    const caption = `Thick grey: potential V(${q}). Shaded with line: trial density${q === 'r' ? (density.plane ? ' r|R|²' : ' r²|R|²') : ' |ψ|²'}; open circles: grid density of the ${targetLevel(result)} at its nodes; both scaled and drawn from the level E. Dashed: reference energy of that level.`;
    svgs.push(densityPlot(density, q, caption, result, units));
  }
  if (field) svgs.push(...fieldPlots(field, result, units));
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
