import * as Plot from '@observablehq/plot';
import { parseHTML } from 'linkedom';
import type { DensityProfile, EnergyScan } from '../engine/plot-data.ts';
import { numericFloor } from '../log/block-verdict.ts';
import type { BlockResult } from '../log/result-types.ts';
import { describeLevel } from '../engine/parity.ts';
import { formatNumber, MINUS } from './html.ts';

/** Plot draws into a DOM; on the server a small standalone one is enough. */
const { document } = parseHTML('<!doctype html><html><body></body></html>');

// Drawn at about the width a phone gives a panel, so text keeps its size there; wider screens put two side by side.
export const WIDTH = 360;
const HEIGHT = 260;
// Black and white print: marks differ by line style and symbol, never by colour alone.
export const INK = '#111';
const QUIET = '#555';
/** Labels drawn over marks keep a white halo, so a curve running under them never makes them unreadable. */
export const HALO = { fill: INK, stroke: 'white', strokeWidth: 4, paintOrder: 'stroke' } as const;
// 13 px text stays at least 12 px when a phone narrows the plot to its panel.
const STYLE = { fontSize: '13px', background: 'white', color: INK, overflow: 'visible' };

export interface PlotUnits {
  energy: string;
  length: string;
  parameters: Record<string, string | null>;
}

/** The scan and density plots of a block as inline SVG (empty when the block has no plot data). */
export function renderPlots(result: BlockResult, units: PlotUnits): string[] {
  if (!result.plots || result.energy === null) return [];
  const yDomain = scanRange(result);
  const svgs = result.plots.scans.map((scan) => scanPlot(scan, result, units, yDomain));
  if (result.plots.density) svgs.push(densityPlot(result.plots.density, result, units));
  if (result.states.length > 1) svgs.push(levelPlot(result, units));
  return svgs;
}

/** One energy range for all of a block's scans, so their curvatures compare at a glance; the claim band and reference are inside it. */
function scanRange(result: BlockResult): [number, number] {
  const energies = result.plots!.scans.flatMap((scan) => scan.points.flatMap((p) => (p.energy === null ? [] : [p.energy])));
  const claim = result.claim?.energy ?? null;
  const tolerance = result.claim?.tolerance ?? 0;
  const extra = [result.energy!.value, result.reference?.energy ?? null, claim === null ? null : claim - tolerance, claim === null ? null : claim + tolerance].filter((v): v is number => v !== null);
  const all = [...energies, ...extra];
  const low = Math.min(...all);
  const high = Math.max(...all);
  const pad = 0.08 * (high - low || Math.abs(high) || 1);
  // More room below: the labels under the reference and the claim band sit there, clear of the tick labels.
  return [low - 2 * pad, high + pad];
}

function scanPlot(scan: EnergyScan, result: BlockResult, units: PlotUnits, yDomain: [number, number]): string {
  const points = scan.points.filter((p): p is { value: number; energy: number } => p.energy !== null);
  const optimum = result.energy!.value;
  const reference = result.reference?.energy ?? null;
  const unit = units.parameters[scan.parameter];
  const values = points.map((p) => p.value);
  let [x0, x1] = [Math.min(...values, scan.optimum), Math.max(...values, scan.optimum)];
  // A limit at or just beyond the scanned window is drawn: an optimum pressed on it must be visible.
  const range = result.inputs?.ranges.find((r) => r.name === scan.parameter);
  const reach = 0.1 * (x1 - x0 || 1);
  const limits = range ? [range.min, range.max].filter((v) => v >= x0 - reach && v <= x1 + reach) : [];
  for (const v of limits) [x0, x1] = [Math.min(x0, v), Math.max(x1, v)];
  const marks: Plot.Markish[] = [];
  const claim = result.claim?.energy ?? null;
  // The optimum's label goes on the side of the dot away from a claim band above it.
  const claimAbove = claim !== null && claim > optimum;
  if (claim !== null && result.claim?.tolerance !== null && result.claim?.tolerance !== undefined) {
    const tol = result.claim.tolerance;
    marks.push(
      Plot.rect([{}], { x1: x0, x2: x1, y1: claim - tol, y2: claim + tol, fill: INK, fillOpacity: 0.12 }),
      // A tolerance thinner than a few pixels still shows as a broad pale line at the claimed value.
      Plot.ruleY([claim], { stroke: INK, strokeOpacity: 0.3, strokeWidth: 5 }),
      // Labelled at the band's right end on the side away from the optimum, with a white halo over any curve.
      Plot.text([{}], { x: x1, y: claimAbove ? claim + tol : claim - tol, text: () => `claim ${formatNumber(claim)} ± ${formatNumber(tol, 2)}`, textAnchor: 'end', dy: claimAbove ? -9 : 12, dx: -2, ...HALO }),
    );
  }
  if (range) {
    // Outside the allowed range is shaded, with a solid rule at the limit.
    if (limits.includes(range.min)) marks.push(Plot.rect([{}], { x1: x0 - reach, x2: range.min, y1: yDomain[0], y2: yDomain[1], fill: QUIET, fillOpacity: 0.18 }), Plot.ruleX([range.min], { stroke: INK, strokeWidth: 2 }));
    if (limits.includes(range.max)) marks.push(Plot.rect([{}], { x1: range.max, x2: x1 + reach, y1: yDomain[0], y2: yDomain[1], fill: QUIET, fillOpacity: 0.18 }), Plot.ruleX([range.max], { stroke: INK, strokeWidth: 2 }));
  }
  marks.push(
    Plot.line(points, { x: 'value', y: 'energy', stroke: INK, strokeWidth: 1.8 }),
    Plot.dot([{ value: scan.optimum, energy: optimum }], { x: 'value', y: 'energy', fill: INK, r: 4, symbol: 'circle' }),
    Plot.text([{ value: scan.optimum, energy: optimum }], { x: 'value', y: 'energy', text: () => `optimum ${scan.parameter} = ${formatNumber(scan.optimum, 4)}`, dy: claimAbove ? 18 : -14, ...HALO }),
  );
  if (reference !== null) {
    marks.push(
      Plot.ruleY([reference], { stroke: INK, strokeDasharray: '6,4' }),
      // At the left end: the right end is the claim's.
      Plot.text([reference], { y: (d: number) => d, frameAnchor: 'left', text: () => 'reference', dy: 9, dx: 2, textAnchor: 'start', ...HALO }),
    );
  }
  // The gap E − E_ref stated on the plot: at this scale a small gap would otherwise be invisible.
  const gap = reference === null ? null : optimum - reference;
  const resolved = gap !== null && Math.abs(gap) > numericFloor(result);
  const gapText = gap === null ? '' : resolved ? `${gap >= 0 ? '+' : ''}${formatNumber(gap, 3)} ${units.energy}` : `0 within ${formatNumber(numericFloor(result), 1)} ${units.energy}`;
  if (gap !== null) marks.push(Plot.text([`E ${MINUS} reference = ${gapText}`], { frameAnchor: 'top-right', text: (d: string) => d, dy: 4, dx: -2, fill: INK, textAnchor: 'end' }));
  const onLimit = limits.some((v) => Math.abs(v - scan.optimum) <= 1e-6 * Math.max(1, Math.abs(v)));
  const finding = `${scan.parameter} = ${formatNumber(scan.optimum, 4)} minimises E at ${formatNumber(optimum, 6)} ${units.energy}${onLimit ? ', pressed on a parameter limit' : ''}${gap === null ? '' : resolved ? `, ${formatNumber(gap, 3)} ${units.energy} ${gap >= 0 ? 'above' : 'below'} the reference` : ', on the reference to within the numerics'}${claim !== null ? `; the claim band ${result.claim!.tolerance !== null && Math.abs(optimum - claim) <= result.claim!.tolerance ? 'holds' : 'misses'} the optimum` : ''}.`;
  return draw(
    {
      // In quantity mode a parameter without a unit is a pure number; in atomic mode it is in atomic units.
      x: { label: `${scan.parameter}${unit ? ` (${unit})` : result.quantity ? '' : ' (atomic units)'}`, domain: [x0 - (limits.length ? reach : 0), x1 + (limits.length ? reach : 0)], ticks: 5 },
      y: { label: `E (${units.energy})`, domain: yDomain, grid: true, ticks: 5 },
      marks,
    },
    finding,
    `Energy against ${scan.parameter} through the optimum (dot); dashed line: reference energy of the ${targetLevel(result)}${claim !== null ? '; grey band: the claim with its tolerance' : ''}${limits.length ? '; solid rule and shade: the parameter limit and the excluded side' : ''}.`,
  );
}

/** A density along one coordinate with the potential there: trial samples, grid nodes, V(q) (null where not finite). */
export type DensityLine = Pick<DensityProfile, 'samples' | 'grid'> & { coordinate: string; plane?: boolean };

/** The potential with the trial and grid densities drawn from the level E: one coordinate, or (with `encodings`) a cut through a space of several. */
export function densityPlot(profile: DensityLine, result: BlockResult, units: PlotUnits, encodings?: string): string {
  const energy = result.energy!.value;
  const kinetic = Math.abs(result.components?.kinetic ?? 1) || 1;
  const reference = result.reference?.energy ?? null;
  const potentials = profile.samples.flatMap((s) => (s.potential === null ? [] : [s.potential]));
  const deepest = Math.min(energy, reference ?? energy, ...potentials);
  // The whole well is shown when it is finite (a deep sech² well cut at the window looks like two dips); a
  // potential that dives without bound (Coulomb) is cut a few kinetic energies below E, and the caption says so.
  const bounded = deepest >= energy - 30 * kinetic;
  const low = bounded ? deepest : energy - 3 * kinetic;
  const high = energy + Math.max(3 * kinetic, 0.3 * (energy - low));
  const margin = 0.05 * (high - low);
  // Densities are drawn at the height of the variational energy and scaled to fill the space above it.
  const peak = Math.max(...profile.samples.map((s) => s.trial), ...profile.grid.map((g) => g.density), Number.MIN_VALUE);
  const lift = (0.6 * (high - energy)) / peak;
  const q = profile.coordinate;
  const xs = profile.samples.map((s) => s.x);
  const marks: Plot.Markish[] = [
    Plot.line(
      profile.samples.filter((s) => s.potential !== null),
      { x: 'x', y: 'potential', stroke: '#666', strokeWidth: 3, clip: true },
    ),
    Plot.ruleY([energy], { stroke: INK, strokeWidth: 0.8 }),
    Plot.areaY(profile.samples, { x: 'x', y1: energy, y2: (s: DensityLine['samples'][number]) => energy + lift * s.trial, fill: '#d9d9d9', clip: true }),
    Plot.line(profile.samples, { x: 'x', y: (s: DensityLine['samples'][number]) => energy + lift * s.trial, stroke: INK, strokeWidth: 1.4, clip: true }),
    Plot.dot(profile.grid, { x: 'x', y: (g: DensityLine['grid'][number]) => energy + lift * g.density, stroke: INK, fill: 'white', r: 2.5, symbol: 'circle', clip: true }),
    Plot.text([energy], { y: (d: number) => d, frameAnchor: 'left', text: () => `E = ${formatNumber(energy, 6)}`, dy: 9, dx: 4, textAnchor: 'start', ...HALO }),
  ];
  // Hard walls inside the window are drawn as thick rules: the trial must vanish there.
  const walls = (result.inputs?.box ?? []).filter((w) => w >= Math.min(...xs) - 1e-9 && w <= Math.max(...xs) + 1e-9);
  if (walls.length > 0) marks.push(Plot.ruleX(walls, { stroke: INK, strokeWidth: 4 }));
  if (reference !== null) marks.push(Plot.ruleY([reference], { stroke: INK, strokeDasharray: '6,4' }));
  const overlap = result.overlap;
  const finding = `The trial density ${overlap === null ? 'is drawn against' : overlap > 0.999 ? 'lies on' : overlap > 0.98 ? 'is close to' : 'differs visibly from'} the grid density of the ${targetLevel(result)}${overlap === null ? '' : ` (overlap ${formatNumber(overlap, 6)})`}, inside the potential${walls.length ? ' between hard walls' : ''}.`;
  return draw(
    {
      x: { label: `${q} (${units.length})`, ticks: 5 },
      y: { label: `energy (${units.energy})`, domain: [low - margin, high + margin], grid: true, ticks: 5 },
      marks,
    },
    finding,
    encodings ??
      `Thick grey: potential V(${q})${bounded ? '' : `, cut off below ${formatNumber(low, 3)} ${units.energy}`}${walls.length ? '; thick black rules: hard walls' : ''}. Shaded with line: trial density${q === 'r' ? (profile.plane ? ' r|R|²' : ' r²|R|²') : ' |ψ|²'}; open circles: grid density of the ${targetLevel(result)} at its nodes; both scaled and drawn from the level E. Dashed: reference energy of that level.`,
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
    `${result.states.length} basis levels, each ${result.states.every((st) => st.reference === null || st.energy >= st.reference - 1e-9 * Math.max(1, Math.abs(st.reference))) ? 'on or above' : 'not always above'} the grid level of the same index.`,
    'Levels of the basis (left) against the grid levels of the same index (right); dotted lines join partners.',
  );
}

/** The grid level a block is compared with, in words ("ground level", "lowest odd level"). */
function targetLevel(result: BlockResult): string {
  return result.reference ? describeLevel(result.reference.level) : 'ground level';
}

/**
 * A figure with its finding said twice: in the caption's first sentence and as the SVG's accessible name. Plot
 * names its mark groups with aria-label on bare g elements, which ARIA forbids; the name is kept on the svg alone.
 */
/** The plot margins every figure uses (a picture sizes its height from them). */
export const MARGIN = { left: 62, right: 14, top: 24, bottom: 42 };

export function draw(options: Plot.PlotOptions, finding: string, encodings: string): string {
  const figure = Plot.plot({ document, width: WIDTH, height: HEIGHT, marginLeft: MARGIN.left, marginRight: MARGIN.right, marginBottom: MARGIN.bottom, marginTop: MARGIN.top, style: STYLE, caption: `${finding} ${encodings}`, ...options }) as unknown as Element;
  for (const g of Array.from(figure.querySelectorAll('g[aria-label]'))) g.removeAttribute('aria-label');
  const svg = figure.querySelector('svg');
  if (svg) {
    svg.setAttribute('role', 'img');
    svg.setAttribute('aria-label', finding);
    svg.removeAttribute('aria-description');
  }
  return figure.outerHTML;
}
