import * as Plot from '@observablehq/plot';
import type { FieldDensity } from '../engine/field-plot-data.ts';
import type { BlockResult } from '../log/result-types.ts';
import { formatNumber } from './html.ts';
import { densityPlot, draw, HALO, INK, MARGIN, renderPlots, WIDTH, type PlotUnits } from './plots.ts';

/** Contour levels as fractions of the density's peak in the picture. */
const LEVELS = [0.05, 0.2, 0.4, 0.6, 0.8];
/** Band fills from below the lowest level up: a grey ramp that reads the same in black-and-white print. */
const GREYS = ['#ffffff', '#ececec', '#cfcfcf', '#a9a9a9', '#7f7f7f', '#565656'];
/** Plot height range for the picture; within it the two lengths share one scale. */
const PICTURE_HEIGHT = { min: 180, max: 430 };

/** Every plot of a block: those of one coordinate, then on spaces of several the density picture and its cuts. */
export function renderBlockPlots(result: BlockResult, units: PlotUnits): string[] {
  const field = result.plots?.field;
  return [...renderPlots(result, units), ...(field && result.energy !== null ? fieldPlots(field, result, units) : [])];
}

/** The density in a plane (grey bands, labelled contours, a legend in density units) and one cut along every axis. */
export function fieldPlots(field: FieldDensity, result: BlockResult, units: PlotUnits): string[] {
  return [picture(field, units), ...cuts(field, result, units)];
}

function picture(field: FieldDensity, units: PlotUnits): string {
  const { x, y, density } = field.picture;
  const [h, v] = field.plane.map((k) => field.coordinates[k]);
  const peak = Math.max(...density, Number.MIN_VALUE);
  const levels = LEVELS.map((f) => f * peak);
  // Sample points are pixel centres: the raster reaches half a step beyond the first and last sample.
  const dx = (x[x.length - 1] - x[0]) / (x.length - 1);
  const dy = (y[y.length - 1] - y[0]) / (y.length - 1);
  const bounds = { x1: x[0] - dx / 2, x2: x[x.length - 1] + dx / 2, y1: y[0] - dy / 2, y2: y[y.length - 1] + dy / 2 };
  const inner = WIDTH - MARGIN.left - MARGIN.right;
  const tall = (inner * (bounds.y2 - bounds.y1)) / (bounds.x2 - bounds.x1);
  const height = Math.round(Math.min(PICTURE_HEIGHT.max, Math.max(PICTURE_HEIGHT.min, tall + MARGIN.top + MARGIN.bottom)));
  const grid = { width: x.length, height: y.length, ...bounds };
  const through = { h: field.through[field.plane[0]], v: field.through[field.plane[1]] };
  const perUnit = `${units.length}⁻${superscript(field.dimension)}`;
  // Tick labels stay short in the narrow legend: very small or large densities carry a power of ten in the label.
  const power = Math.floor(Math.log10(peak));
  const legendUnit = power < -1 || power > 2 ? { factor: 10 ** power, label: `10${superscript(power)} ` } : { factor: 1, label: '' };
  const marks: Plot.Markish[] = [
    // Each level fills where the density reaches it; the darker bands stack on the lighter ones.
    ...levels.map((t, i) => Plot.contour(density, { ...grid, thresholds: [t], fill: GREYS[i + 1], stroke: INK, strokeWidth: 0.7 })),
    Plot.ruleX([through.h], { stroke: INK, strokeDasharray: '4,3', strokeWidth: 0.8 }),
    Plot.ruleY([through.v], { stroke: INK, strokeDasharray: '4,3', strokeWidth: 0.8 }),
    // Labels on the row sit centred on their contour; those up the column sit just right of it, clear of the dashed line.
    ...(['row', 'column'] as const).map((line) =>
      Plot.text(
        levelLabels(field, levels).filter((l) => l.line === line),
        { x: 'x', y: 'y', text: 'label', ...HALO, fontSize: 11, ...(line === 'column' ? { textAnchor: 'start', dx: 3 } : {}) },
      ),
    ),
  ];
  const at = coordinateFormat(field);
  const fixed = field.coordinates.length > 2 ? field.coordinates.flatMap((c, k) => (field.plane.includes(k) ? [] : [`${c} = ${at(k)} ${units.length}`])) : [];
  const axial = field.coordinates[0] === 'rho' && field.dimension === 3 && field.coordinates.length === 2;
  const where = fixed.length > 0 ? ` in the plane ${fixed.join(', ')} (through the ${field.throughKind})` : axial ? ' in a half-plane through the z axis (the same at every angle about it)' : '';
  const crossing = field.plane.map((k) => `${field.coordinates[k]} = ${at(k)}`).join(', ');
  return draw(
    {
      height,
      x: { label: `${h} (${units.length})`, domain: [bounds.x1, bounds.x2] },
      y: { label: `${v} (${units.length})`, domain: [bounds.y1, bounds.y2] },
      color: { type: 'threshold', domain: levels, range: GREYS, legend: true, label: `trial density |ψ|² (${legendUnit.label}${perUnit})`, tickFormat: (d: number) => formatNumber(d / legendUnit.factor, 2) },
      marks,
    },
    `Trial density |ψ|²${where}, its cuts crossing at the ${field.throughKind} (${crossing} ${units.length}).`,
    `Grey bands between contour lines at ${LEVELS.map((f) => `${Math.round(100 * f)}`).join(', ')} % of its peak (labelled on the lines), darker is denser; the legend gives the levels in ${perUnit}. Dashed lines: the cuts that follow.`,
  );
}

/**
 * Where each level's contour crosses the lines through the crossing point, walking outward from the line's densest
 * sample: alternate levels along the row (to the right) and along the column (upward), so neighbouring labels stay apart.
 */
function levelLabels(field: FieldDensity, levels: number[]): Array<{ x: number; y: number; label: string; line: 'row' | 'column' }> {
  const { x, y, density } = field.picture;
  const nearest = (v: number[], at: number) => v.reduce((best, w, k) => (Math.abs(w - at) < Math.abs(v[best] - at) ? k : best), 0);
  const i0 = nearest(x, field.through[field.plane[0]]);
  const j0 = nearest(y, field.through[field.plane[1]]);
  const row = x.map((_, i) => density[j0 * x.length + i]);
  const column = y.map((_, j) => density[j * x.length + i0]);
  const crossing = (line: number[], at: number[], t: number): number | null => {
    const top = line.indexOf(Math.max(...line));
    for (let i = top + 1; i < line.length; i++) {
      if (line[i] < t && line[i - 1] >= t) return at[i - 1] + ((at[i] - at[i - 1]) * (line[i - 1] - t)) / (line[i - 1] - line[i]);
    }
    return null;
  };
  return levels.flatMap((t, n): Array<{ x: number; y: number; label: string; line: 'row' | 'column' }> => {
    const label = `${Math.round(100 * LEVELS[n])}%`;
    const up = n % 2 === 1 ? crossing(column, y, t) : null;
    if (up !== null) return [{ x: x[i0], y: up, label, line: 'column' }];
    const right = crossing(row, x, t);
    return right === null ? [] : [{ x: right, y: y[j0], label, line: 'row' }];
  });
}

function cuts(field: FieldDensity, result: BlockResult, units: PlotUnits): string[] {
  const at = coordinateFormat(field);
  const perUnit = `${units.length}⁻${superscript(field.dimension)}`;
  return field.cuts.map((cut, k) => {
    const others = field.coordinates.flatMap((c, j) => (j === k ? [] : [`${c} = ${at(j)} ${units.length}`])).join(', ');
    const grid = cut.grid.length > 0 ? '; open circles: grid ground-state density at its nodes on this line; both' : ',';
    const reference = result.reference?.energy != null ? ' Dashed: reference ground energy.' : '';
    // With a grid the crossing point sits on the nearest grid line, so the grid's own nodes lie on the cut.
    const where = cut.grid.length > 0 ? `through the ${field.throughKind}, moved onto the nearest grid line (${others})` : `through the ${field.throughKind} (${others})`;
    const encodings = `Cut along ${cut.coordinate} ${where}. Thick grey: potential V. Shaded with line: trial density |ψ|² (per ${perUnit})${grid} scaled and drawn from the level E.${reference}`;
    return densityPlot(cut, result, units, encodings);
  });
}

/** A coordinate of the crossing point to 4 digits; a grid node a rounding error from 0 (or beside rho = 0) reads 0. */
function coordinateFormat(field: FieldDensity): (k: number) => string {
  return (k) => {
    const samples = field.cuts[k].samples;
    const span = Math.abs(samples[samples.length - 1].x - samples[0].x);
    const v = field.through[k];
    return formatNumber(Math.abs(v) < 1e-5 * span ? 0 : v, 4);
  };
}

function superscript(n: number): string {
  return String(n).replace(/\d/g, (d) => '⁰¹²³⁴⁵⁶⁷⁸⁹'[Number(d)]).replace('-', '⁻');
}
