import * as Plot from '@observablehq/plot';
import type { FieldDensity } from '../engine/field-plot-data.ts';
import type { BlockResult } from '../log/result-types.ts';
import { densityPlot } from './density-plot.ts';
import { formatNumber } from './html.ts';
import { draw, INK, MARGIN, WIDTH, type PlotUnits } from './plot-frame.ts';

/** Contour levels as fractions of the density's peak in the picture. */
const LEVELS = [0.05, 0.2, 0.4, 0.6, 0.8];
/** Band fills from below the lowest level up: a grey ramp that reads the same in black-and-white print. */
const GREYS = ['#ffffff', '#ececec', '#cfcfcf', '#a9a9a9', '#7f7f7f', '#565656'];
/** Plot height range for the picture; within it the two lengths share one scale. */
const PICTURE_HEIGHT = { min: 180, max: 430 };

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
  const marks: Plot.Markish[] = [
    // Each level fills where the density reaches it; the darker bands stack on the lighter ones.
    ...levels.map((t, i) => Plot.contour(density, { ...grid, thresholds: [t], fill: GREYS[i + 1], stroke: INK, strokeWidth: 0.7 })),
    Plot.ruleX([through.h], { stroke: INK, strokeDasharray: '4,3', strokeWidth: 0.8 }),
    Plot.ruleY([through.v], { stroke: INK, strokeDasharray: '4,3', strokeWidth: 0.8 }),
    // Alternate above and below the row so neighbouring labels do not overlap.
    ...[-8, 9].map((dy, parity) =>
      Plot.text(
        levelLabels(field, levels).filter((_, n) => n % 2 === parity),
        { x: 'x', y: 'y', text: 'label', fill: INK, stroke: 'white', strokeWidth: 3, paintOrder: 'stroke', dy, fontSize: 10 },
      ),
    ),
  ];
  const fixed = field.coordinates.length > 2 ? field.coordinates.flatMap((c, k) => (field.plane.includes(k) ? [] : [`${c} = ${formatNumber(field.through[k], 4)} ${units.length}`])) : [];
  const axial = field.coordinates[0] === 'rho' && field.dimension === 3 && field.coordinates.length === 2;
  const where = fixed.length > 0 ? ` in the plane ${fixed.join(', ')} (through the ${field.throughKind})` : axial ? ' in a half-plane through the z axis (the same at every angle about it)' : '';
  const crossing = field.plane.map((k) => `${field.coordinates[k]} = ${formatNumber(field.through[k], 4)}`).join(', ');
  return draw(
    {
      height,
      x: { label: `${h} (${units.length})`, domain: [bounds.x1, bounds.x2] },
      y: { label: `${v} (${units.length})`, domain: [bounds.y1, bounds.y2] },
      color: { type: 'threshold', domain: levels, range: GREYS, legend: true, label: `trial density |ψ|² (${perUnit})`, tickFormat: (d: number) => formatNumber(d, 3) },
      marks,
    },
    `Trial density |ψ|²${where}: grey bands between contour lines at ${LEVELS.map((f) => `${Math.round(100 * f)}`).join(', ')} % of its peak (labelled on the lines), darker is denser; the legend gives the levels in ${perUnit}. Dashed lines: the cuts that follow, crossing at the ${field.throughKind} (${crossing} ${units.length}).`,
  );
}

/** Where each level's contour crosses the row through the crossing point, walking outward from the row's densest sample. */
function levelLabels(field: FieldDensity, levels: number[]): Array<{ x: number; y: number; label: string }> {
  const { x, y, density } = field.picture;
  const yv = field.through[field.plane[1]];
  let j = 0;
  for (let k = 1; k < y.length; k++) if (Math.abs(y[k] - yv) < Math.abs(y[j] - yv)) j = k;
  const row = density.slice(j * x.length, (j + 1) * x.length);
  const top = row.indexOf(Math.max(...row));
  return levels.flatMap((t, n) => {
    for (let i = top + 1; i < row.length; i++) {
      if (row[i] < t && row[i - 1] >= t) {
        const at = x[i - 1] + ((x[i] - x[i - 1]) * (row[i - 1] - t)) / (row[i - 1] - row[i]);
        return [{ x: at, y: y[j], label: `${Math.round(100 * LEVELS[n])}%` }];
      }
    }
    return [];
  });
}

function cuts(field: FieldDensity, result: BlockResult, units: PlotUnits): string[] {
  const perUnit = `${units.length}⁻${superscript(field.dimension)}`;
  return field.cuts.map((cut, k) => {
    const others = field.coordinates.flatMap((c, j) => (j === k ? [] : [`${c} = ${formatNumber(field.through[j], 4)} ${units.length}`])).join(', ');
    const caption = `Cut along ${cut.coordinate} through the ${field.throughKind} (${others}). Thick grey: potential V. Shaded with line: trial density |ψ|² (per ${perUnit}); open circles: grid ground-state density at its nodes on this line; both scaled and drawn from the level E. Dashed: reference ground energy.`;
    return densityPlot(cut, cut.coordinate, caption, result, units);
  });
}

function superscript(n: number): string {
  return String(n).replace(/\d/g, (d) => '⁰¹²³⁴⁵⁶⁷⁸⁹'[Number(d)]);
}
