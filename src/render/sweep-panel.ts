import * as Plot from '@observablehq/plot';
import type { BlockResult, Sensitivity } from '../log/result-types.ts';
import { escapeHtml, formatNumber, typesetUnit } from './html.ts';
import { draw, INK } from './plots.ts';

/** A panel's sweep part: the points as a table, E against the constant with the reference and the bracket, and the optimum. */
export function renderSweep(result: BlockResult): string {
  const sweep = result.sweep!;
  const energyUnit = escapeHtml(result.energy?.unit ?? 'hartree');
  const constant = `${escapeHtml(sweep.constant)}${sweep.unit ? ` (${escapeHtml(typesetUnit(sweep.unit))})` : ''}`;
  const varied = Object.entries(sweep.points.find((p) => p.result.energy)?.result.parameters ?? {}).filter(([, p]) => p.varied);
  const head = ['mark', constant, 'status', `E (${energyUnit})`, 'reference', 'lower bound', ...varied.map(([name, p]) => `${escapeHtml(name)}${p.unit ? ` (${escapeHtml(p.unit)})` : ''}`)];
  const mixed = new Set(sweep.points.map((p) => p.result.status)).size > 1;
  const rows = sweep.points.map(({ value, result: r }, i) =>
    [
      // Among points of one status the first stands for the block; marking it would suggest a fault that is not there.
      i === sweep.worst && mixed ? 'worst' : '',
      formatNumber(value, 6),
      escapeHtml(r.status),
      formatNumber(r.energy?.value ?? null),
      formatNumber(r.reference?.energy ?? null),
      formatNumber(r.bounds.lower),
      ...varied.map(([name]) => formatNumber(r.parameters[name]?.value ?? null, 8)),
    ].map((cell) => `<td>${cell}</td>`).join(''),
  );
  // Wide tables scroll inside the panel on a phone instead of widening the page; tabindex lets a keyboard scroll them.
  const table = `<div class="gw-scroll" tabindex="0"><table class="gw-sweep"><caption>Sweep over ${constant}: every point a full evaluation; the block takes the worst point's status. Model estimates, not a substitute for the group's validated procedures.</caption><thead><tr>${head.map((h) => `<th scope="col">${h}</th>`).join('')}</tr></thead><tbody>${rows.map((r) => `<tr>${r}</tr>`).join('')}</tbody></table></div>`;
  return [table, `<div class="gw-plots">${[energyCurve(result, constant), ...varied.map(([name, p]) => parameterCurve(result, name, p.unit, constant))].join('\n')}</div>`].join('\n');
}

function energyCurve(result: BlockResult, constant: string): string {
  const points = result.sweep!.points.filter((p) => p.result.energy !== null);
  const curve = points.map((p) => ({ c: p.value, energy: p.result.energy!.value, reference: p.result.reference?.energy ?? null, lower: p.result.bounds.lower }));
  const bracket = curve.filter((p) => p.lower !== null);
  const referenced = curve.filter((p) => p.reference !== null);
  return draw(
    {
      x: { label: constant, nice: true },
      y: { label: `energy (${result.energy?.unit ?? 'hartree'})`, grid: true, nice: true },
      marks: [
        Plot.areaY(bracket, { x: 'c', y1: 'lower', y2: 'energy', fill: '#d9d9d9' }),
        Plot.line(referenced, { x: 'c', y: 'reference', stroke: INK, strokeDasharray: '6,4' }),
        Plot.line(curve, { x: 'c', y: 'energy', stroke: INK, strokeWidth: 1.6 }),
        Plot.dot(curve, { x: 'c', y: 'energy', fill: INK, r: 3, symbol: 'circle' }),
      ],
    },
    sweepFinding(result, constant, curve.map((p) => ({ c: p.c, value: p.energy })), `E (${result.energy?.unit ?? 'hartree'})`),
    'E against the swept constant (solid, dots), the grid reference (dashed), and the bracket from Temple’s lower bound to E (grey band).',
  );
}

/** The plot's finding in one sentence: where the curve starts and ends over the swept range. */
function sweepFinding(result: BlockResult, constant: string, curve: Array<{ c: number; value: number }>, what: string): string {
  if (curve.length === 0) return `No point of the sweep over ${constant} gave a value.`;
  const first = curve[0];
  const last = curve[curve.length - 1];
  return `Over ${constant} from ${formatNumber(first.c, 4)} to ${formatNumber(last.c, 4)}, ${what} goes from ${formatNumber(first.value, 6)} to ${formatNumber(last.value, 6)}.`;
}

function parameterCurve(result: BlockResult, name: string, unit: string | null, constant: string): string {
  const curve = result.sweep!.points.filter((p) => p.result.parameters[name]).map((p) => ({ c: p.value, value: p.result.parameters[name].value }));
  return draw(
    {
      x: { label: constant, nice: true },
      y: { label: `${name}${unit ? ` (${unit})` : ''} at the optimum`, grid: true, nice: true },
      marks: [Plot.line(curve, { x: 'c', y: 'value', stroke: INK, strokeWidth: 1.4 }), Plot.dot(curve, { x: 'c', y: 'value', stroke: INK, fill: 'white', r: 3, symbol: 'square' })],
    },
    sweepFinding(result, constant, curve, `the optimal ${name}${unit ? ` (${unit})` : ''}`),
    `The optimal ${name} against the swept constant.`,
  );
}

/** dE/dc for every input by Hellmann–Feynman beside its finite-difference check, and E +- dE for uncertain inputs. */
export function renderResponse(result: BlockResult): string {
  const list = result.sensitivities ?? [];
  if (list.length === 0) return '';
  const energyUnit = escapeHtml(result.energy?.unit ?? 'hartree');
  const rows = list.map((s) => {
    const input = `${escapeHtml(s.name)} = ${formatNumber(s.value, 8)}${s.uncertainty !== null ? ` ± ${formatNumber(s.uncertainty, 3)}` : ''}${s.unit ? ` ${escapeHtml(s.unit)}` : ''}`;
    return `<tr><th scope="row">${input}</th><td>${formatNumber(s.hellmannFeynman, 8)}</td><td>${formatNumber(s.finiteDifference, 8)}</td><td>${agreement(s)}</td><td>${formatNumber(s.contribution, 3)}</td><td>${escapeHtml(s.note ?? '')}</td></tr>`;
  });
  const per = escapeHtml(list.find((s) => s.perUnit)?.perUnit ?? energyUnit);
  const u = result.uncertainty;
  const summary = u
    ? `<p class="gw-uncertainty">E = ${formatNumber(u.energy)} ± ${formatNumber(u.uncertainty, 3)} ${energyUnit} (first-order propagation, inputs uncorrelated; re-evaluation at c ± u gives ± ${formatNumber(u.reevaluated, 3)})${u.note ? `: ${escapeHtml(u.note)}` : ''}. The claim, if any, is checked within its tolerance plus this uncertainty.</p>`
    : '';
  return `<div class="gw-scroll" tabindex="0"><table class="gw-sensitivities"><caption>Sensitivities dE/dc at the optimum (${per} per input unit): Hellmann–Feynman ⟨∂H/∂c⟩, checked by a central difference of re-optimised energies</caption><thead><tr><th scope="col">input</th><th scope="col">Hellmann–Feynman</th><th scope="col">finite difference</th><th scope="col">agree</th><th scope="col">|dE/dc| u (${energyUnit})</th><th scope="col">note</th></tr></thead><tbody>${rows.join('')}</tbody></table></div>${summary}`;
}

function agreement(s: Sensitivity): string {
  return s.agrees === null ? '—' : s.agrees ? 'yes' : 'NO';
}
