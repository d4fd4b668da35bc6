import * as Plot from '@observablehq/plot';
import type { LogSystem } from '../log/systems.ts';
import { draw } from './plots.ts';

const INK = '#111';

/**
 * A system's estimates against the dates of their records: filled dots for each block's energy (an upper bound),
 * open triangles for its lower bound, dashed lines for the bracket's lowest upper and highest lower bound.
 * One level per plot (the ground level, else the first one the blocks report).
 */
export function systemPlot(system: LogSystem): string {
  const bracket = system.brackets.find((b) => b.level === 'ground') ?? system.brackets[0];
  const dated = system.members.filter((m) => m.level === bracket.level && m.date && m.energy !== null && m.status !== 'invalid');
  if (dated.length === 0) return '';
  const when = (date: string) => new Date(`${date}T00:00:00Z`);
  const estimates = dated.map((m) => ({ date: when(m.date!), energy: m.energy!, block: m.block }));
  const lowers = dated.filter((m) => m.lower !== null).map((m) => ({ date: when(m.date!), energy: m.lower! }));
  // Bounds first, then the estimates: a block whose bound meets its energy shows its dot inside the triangle.
  const marks: Plot.Markish[] = [];
  if (bracket.upper) marks.push(Plot.ruleY([bracket.upper.value], { stroke: INK, strokeDasharray: '6,4' }));
  if (bracket.lower) marks.push(Plot.ruleY([bracket.lower.value], { stroke: INK, strokeDasharray: '2,3' }));
  marks.push(
    Plot.dot(lowers, { x: 'date', y: 'energy', stroke: INK, fill: 'white', r: 7, symbol: 'triangle' }),
    Plot.dot(estimates, { x: 'date', y: 'energy', fill: INK, r: 3, symbol: 'circle' }),
    Plot.text(estimates, { x: 'date', y: 'energy', text: 'block', dy: -12, fill: INK }),
  );
  return `<div class="gw-plots">${draw(
    { x: { label: 'record date', type: 'utc', nice: true, insetLeft: 36, insetRight: 48 }, y: { label: 'energy (hartree)', grid: true, nice: true }, marks },
    `Estimates of the ${bracket.level} level against their records' dates.`,
    `Filled dots: each block's energy (an upper bound); open triangles: its lower bound; dashed: the lowest upper bound; dotted: the highest lower bound.`,
  )}</div>`;
}
