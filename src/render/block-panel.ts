import katex from 'katex';
import type { LastCommit } from '../log/git-audit.ts';
import type { Provenance } from '../log/provenance.ts';
import { describeLevel } from '../engine/parity.ts';
import type { BlockInputs, BlockResult } from '../log/result-types.ts';
import { escapeHtml, formatNumber } from './html.ts';
import { renderPlots } from './plots.ts';

const tex = (source: string, display = false) => katex.renderToString(source, { displayMode: display, throwOnError: false, output: 'htmlAndMathml' });

const STATUS_WORDS: Record<BlockResult['status'], string> = {
  confirmed: 'confirmed',
  disputed: 'disputed: the claim disagrees',
  'below-reference': 'below the reference',
  unsettled: 'unsettled',
  invalid: 'invalid',
};

/** What a panel's audit trail says about where the block came from and what computed it. */
export interface PanelContext {
  file: string;
  git: LastCommit | null;
  provenance: Provenance;
}

/** The result panel that stands in a record's page where its spec block was written. */
export function renderBlockPanel(result: BlockResult, context: PanelContext): string {
  const parts = [
    `<section class="gw-panel gw-${result.status}" id="block-${escapeHtml(result.id)}" data-status="${result.status}">`,
    `<header><span class="gw-status">${escapeHtml(STATUS_WORDS[result.status])}</span> <code>${escapeHtml(result.id)}</code>${result.caption ? ` <span class="gw-caption">${escapeHtml(result.caption)}</span>` : ''}</header>`,
  ];
  if (result.message) parts.push(`<p class="gw-message">${escapeHtml(result.message)}</p>`);
  if (result.problems.length > 0) {
    parts.push('<ul class="gw-problems">');
    for (const p of result.problems) parts.push(`<li><code>${escapeHtml(p.file)}:${p.line}</code> ${p.field ? `<code>${escapeHtml(p.field)}</code>: ` : ''}${escapeHtml(p.message)}</li>`);
    parts.push('</ul>');
  }
  if (result.inputs) parts.push(renderInputs(result));
  if (result.energy) parts.push(renderResults(result));
  const plots = renderPlots(result, {
    energy: result.energy?.unit ?? 'hartree',
    length: result.inputs?.lengthUnit ?? 'bohr',
    parameters: Object.fromEntries(Object.entries(result.parameters).map(([name, p]) => [name, p.unit])),
  });
  if (plots.length > 0) parts.push(`<div class="gw-plots">${plots.join('\n')}</div>`);
  if (result.checks.length > 0) {
    parts.push(renderChecks(result));
  }
  parts.push(renderAudit(result, context));
  parts.push('</section>');
  return parts.join('\n');
}

function renderInputs(result: BlockResult): string {
  const inputs = result.inputs!;
  const q = inputs.coordinate;
  const kinetic = inputs.massTex === null ? constantMassKinetic(inputs) : profileKinetic(inputs);
  // In quantity mode the walls are stated in the block's length unit and the mass in electron masses.
  const lengthUnit = result.quantity ? `\\ \\mathrm{${inputs.lengthUnit}}` : '';
  const where = whereTex(inputs, lengthUnit);
  const massTex = inputs.masses
    ? Object.entries(inputs.masses).map(([c, m]) => `m_{${coordinateTex(c)}} = ${m}`).join(', ')
    : inputs.massTex === null ? `m = ${result.quantity ? `${inputs.mass}\\,m_e` : `${inputs.mass}`}` : `m(${q}) = ${inputs.massTex}`;
  const rows = [
    `<div>${tex(`H = ${kinetic} + ${inputs.potentialTex}, \\quad ${where}, \\quad ${massTex}`, true)}</div>`,
    inputs.trialTex !== null
      ? `<div>${tex(`${stateTex(inputs)} = ${inputs.trialTex}`, true)}</div>`
      : `<div>Basis (linear variational method, ${result.states.length} level${result.states.length === 1 ? '' : 's'} reported):${tex(`${stateTex(inputs)} = \\sum_i c_i \\phi_i(${inputs.coordinates.map(coordinateTex).join(', ')})`, true)}<ol start="0" class="gw-basis">${(inputs.basisTex ?? []).map((b) => `<li>${tex(`\\phi = ${b}`)}</li>`).join('')}</ol></div>`,
  ];
  // Units stay outside the math: they are written as mathjs spells them (nm^-1), not as TeX.
  // From the block's units rather than the results, so an invalid block's ranges keep theirs too.
  const unitOf = (name: string) => (result.quantity?.parameters[name]?.unit ? ` ${escapeHtml(result.quantity.parameters[name].unit!)}` : '');
  const ranges = inputs.ranges.map((r) => `${tex(`${r.name} \\in [${formatNumber(r.min, 8)}, ${formatNumber(r.max, 8)}]`)}${unitOf(r.name)}, start ${formatNumber(r.start, 8)}${unitOf(r.name)}`).join('; ');
  const constantUnit = (name: string) => (inputs.constantUnits?.[name] ? ` ${escapeHtml(inputs.constantUnits[name]!)}` : '');
  const constants = Object.entries(inputs.constants).map(([k, v]) => `${tex(`${k} = ${formatNumber(v, 10)}`)}${constantUnit(k)}`).join(', ');
  if (ranges) rows.push(`<p>Varied: ${ranges}</p>`);
  if (constants) rows.push(`<p>Constants: ${constants}</p>`);
  return `<div class="gw-inputs">${rows.join('\n')}</div>`;
}

/** The kinetic-energy operator of the block's space (radial, plane and axial with their angular parts). */
function constantMassKinetic(inputs: BlockInputs): string {
  const l = inputs.angularMomentum;
  const space = inputs.space;
  if (space === 'radial') return `-\\frac{\\hbar^2}{2m}\\frac{1}{r^2}\\frac{d}{dr}r^2\\frac{d}{dr}${l ? `+\\frac{${l * (l + 1)}\\hbar^2}{2m r^2}` : ''}`;
  if (space === 'plane') return `-\\frac{\\hbar^2}{2m}\\frac{1}{r}\\frac{d}{dr}r\\frac{d}{dr}${l ? `+\\frac{${l * l}\\hbar^2}{2m r^2}` : ''}`;
  if (space === 'axial') return `-\\frac{\\hbar^2}{2m}\\left(\\frac{1}{\\rho}\\frac{\\partial}{\\partial\\rho}\\rho\\frac{\\partial}{\\partial\\rho}+\\frac{\\partial^2}{\\partial z^2}\\right)${l ? `+\\frac{${l * l}\\hbar^2}{2m\\rho^2}` : ''}`;
  if (typeof space === 'object') {
    return inputs.coordinates
      .map((c) => `-\\frac{\\hbar^2}{2m${inputs.masses ? `_{${coordinateTex(c)}}` : ''}}\\frac{\\partial^2}{\\partial ${coordinateTex(c)}^2}`)
      .join('');
  }
  return `-\\frac{\\hbar^2}{2m}\\frac{d^2}{d${inputs.coordinate}^2}`;
}

/** A coordinate name as TeX: rho as the Greek letter, x1 as x_1. */
function coordinateTex(name: string): string {
  if (name === 'rho') return '\\rho';
  const m = /^([A-Za-z]+)(\d+)$/.exec(name);
  return m ? `${m[1]}_{${m[2]}}` : name;
}

/** The state the trial stands for: the radial factor R on radial and plane, psi of every coordinate otherwise. */
function stateTex(inputs: BlockInputs): string {
  const f = inputs.space === 'radial' || inputs.space === 'plane' ? 'R' : '\\psi';
  return `${f}(${inputs.coordinates.map(coordinateTex).join(', ')})`;
}

/** Where the coordinates range. */
function whereTex(inputs: BlockInputs, lengthUnit: string): string {
  const space = inputs.space;
  const q = inputs.coordinate;
  if (inputs.box) return `${q} \\in [${formatNumber(inputs.box[0], 10)}, ${formatNumber(inputs.box[1], 10)}]${lengthUnit}`;
  if (space === 'axial') return '\\rho \\ge 0,\\ z \\in \\mathbb{R}';
  if (typeof space === 'object') {
    return Object.entries(space)
      .map(([c, range]) => `${coordinateTex(c)} ${Array.isArray(range) ? `\\in [${range[0]}, ${range[1]}]` : range === 'line' ? '\\in \\mathbb{R}' : '\\ge 0'}`)
      .join(',\\ ');
  }
  return space === 'line' ? `${q} \\in \\mathbb{R}` : `${q} \\ge 0`;
}

/** The BenDaniel–Duke kinetic operator of a position-dependent mass. */
function profileKinetic(inputs: BlockInputs): string {
  const l = inputs.angularMomentum;
  const q = inputs.coordinate;
  return inputs.space === 'radial'
    ? `-\\frac{\\hbar^2}{2}\\frac{1}{r^2}\\frac{d}{dr}\\frac{r^2}{m(r)}\\frac{d}{dr}${l ? `+\\frac{${l * (l + 1)}\\hbar^2}{2m(r) r^2}` : ''}`
    : `-\\frac{\\hbar^2}{2}\\frac{d}{d${q}}\\frac{1}{m(${q})}\\frac{d}{d${q}}`;
}

function renderResults(result: BlockResult): string {
  const unit = result.energy!.unit ?? '';
  const row = (label: string, value: string) => `<tr><th scope="row">${label}</th><td>${value}</td></tr>`;
  const rows = [
    ...Object.entries(result.parameters).map(([name, p]) => row(`${tex(name)} ${p.varied ? 'at the optimum' : '(fixed)'}`, `${formatNumber(p.value)}${p.unit ? ` ${escapeHtml(p.unit)}` : ''}`)),
    row(tex('\\langle T\\rangle'), formatNumber(result.components?.kinetic)),
    row(tex('\\langle V\\rangle'), formatNumber(result.components?.potential)),
    row(`${tex('E = \\langle H\\rangle')} (upper bound)`, `<strong>${formatNumber(result.energy!.value)}</strong> ${unit}`),
    row('variance', result.variance === null ? escapeHtml(result.varianceNote ?? '—') : formatNumber(result.variance, 4)),
    row("Temple's lower bound", formatNumber(result.bounds.lower)),
    row("Weinstein's interval", result.bounds.weinstein ? `[${formatNumber(result.bounds.weinstein[0])}, ${formatNumber(result.bounds.weinstein[1])}]` : '—'),
  ];
  // Which level the reference stands for, when it is not the ground level (a declared or an odd trial's symmetry, a level index).
  const level = result.reference && (result.reference.level.symmetry !== null || result.reference.level.index > 0) ? describeLevel(result.reference.level) : null;
  if (result.reference) {
    const next = level && result.reference.level.symmetry ? `next ${result.reference.level.symmetry} level` : 'next level';
    rows.push(row(`reference (${result.reference.method}${level ? `, ${level}` : ''})`, `${formatNumber(result.reference.energy)}${result.reference.excited !== null ? `; ${next} ${formatNumber(result.reference.excited)}` : ''}`));
    if (result.reference.published) rows.push(row('published', `${formatNumber(result.reference.published.energy)} — ${escapeHtml(result.reference.published.source)}`));
  }
  if (result.states.length > 1) {
    result.states.forEach((state, k) => {
      const error = state.reference === null ? '' : `; grid ${formatNumber(state.reference)} (relative error ${formatNumber((state.energy - state.reference) / Math.abs(state.reference), 3)})`;
      rows.push(row(`level ${tex(`E_{${k}}`)} (upper bound)`, `${formatNumber(state.energy)}${error}`));
    });
  }
  if (result.basis) rows.push(row('overlap matrix', `${result.basis.functions} functions, ${result.basis.kept} kept; ${escapeHtml(result.basis.conditioning)}`));
  if (result.errors.vsGrid !== null) rows.push(row(`relative error against the grid${level ? ` (${level})` : ''}`, formatNumber(result.errors.vsGrid, 3)));
  if (result.errors.vsPublished !== null) rows.push(row('relative error against the published value', formatNumber(result.errors.vsPublished, 3)));
  if (result.overlap !== null) rows.push(row(`overlap with the grid ${level ? `state of the ${level}` : 'ground state'}`, formatNumber(result.overlap, 8)));
  if (result.virial) rows.push(row(`virial ratio ${tex(`2\\langle T\\rangle / (${result.virial.exponent}\\langle V\\rangle)`)}`, formatNumber(result.virial.ratio, 8)));
  else if (result.virialNote) rows.push(row('virial ratio', escapeHtml(result.virialNote)));
  if (result.claim?.energy !== null && result.claim) rows.push(row('claimed energy', `${formatNumber(result.claim.energy)} ± ${formatNumber(result.claim.tolerance, 3)}`));
  return `<table class="gw-results"><caption>Recomputed values (${escapeHtml(unit)}); model estimates, not a substitute for the group's validated procedures</caption><tbody>${rows.join('')}</tbody></table>`;
}

function renderChecks(result: BlockResult): string {
  const items = result.checks.map((c) => `<li class="${c.pass ? 'gw-pass' : 'gw-fail'}"><span class="gw-mark">${c.pass ? 'pass' : 'FAIL'}</span> <code>${escapeHtml(c.name)}</code> ${escapeHtml(c.detail)}</li>`);
  return `<ul class="gw-checks">${items.join('')}</ul>`;
}

function renderAudit(result: BlockResult, context: PanelContext): string {
  const d = result.diagnostics;
  const { git, provenance } = context;
  const items = [
    `input hash <code>${escapeHtml(result.inputHash)}</code>`,
    `record <code>${escapeHtml(context.file)}</code>, line ${result.line}`,
    git
      ? `last commit <code>${escapeHtml(git.hash.slice(0, 12))}</code> by ${escapeHtml(git.author)}, ${escapeHtml(git.date)}${git.modified ? ' (the file has uncommitted changes since)' : ''}`
      : 'last commit: not in git, or not committed yet',
    `groundwork ${escapeHtml(provenance.tool)} on Node ${escapeHtml(provenance.node)}; ${Object.entries(provenance.dependencies).map(([name, version]) => `${escapeHtml(name)} ${escapeHtml(version)}`).join(', ')}`,
    `settings: ${Object.entries(provenance.settings).map(([name, value]) => `${escapeHtml(name)} ${formatNumber(value)}`).join(', ')}`,
    `time ${formatNumber(result.timeMs, 3)} ms${d ? ` (variational ${formatNumber(d.variationalMs, 3)} ms, grid reference ${formatNumber(d.referenceMs, 3)} ms)` : ''}`,
  ];
  if (result.quantity) {
    const q = result.quantity;
    items.push(`quantity mode: energies in ${escapeHtml(q.energy.unit)} (${escapeHtml(q.energy.definition)}), lengths in ${escapeHtml(q.length.unit)} (1 bohr = ${formatNumber(q.length.perBohr)} ${escapeHtml(q.length.unit)})`);
    items.push(`physical constants: ${q.constantsUsed.map((c) => `${escapeHtml(c.name)} = ${formatNumber(c.value)} ${escapeHtml(c.unit)}`).join(', ')} (${escapeHtml([...new Set(q.constantsUsed.map((c) => c.source))].join('; '))})`);
  }
  if (d) {
    items.push(`energy evaluations ${d.energyEvaluations}, trial evaluations ${d.trialEvaluations}, plot evaluations ${d.plotEvaluations}`);
    if (d.optimiser) items.push(`optimiser ${escapeHtml(d.optimiser.method)}: ${d.optimiser.iterations} iterations, ${d.optimiser.evaluations} evaluations, ${d.optimiser.starts} local search${d.optimiser.starts > 1 ? 'es' : ''}, converged ${d.optimiser.converged}`);
    if (d.grid) items.push(`grid: ${d.grid.size} points, ${d.grid.elements} elements of order ${d.grid.elementOrder}, ${d.grid.refinements} refinements, domain [${formatNumber(d.grid.domain[0], 6)}, ${formatNumber(d.grid.domain[1], 6)}] ${escapeHtml(result.inputs?.lengthUnit ?? 'bohr')}, last change ${d.grid.errorEstimate.map((e) => formatNumber(e, 2)).join(', ')}`);
    if (d.energyError !== null) items.push(`quadrature error estimate of E ${formatNumber(d.energyError, 3)} ${escapeHtml(result.energy?.unit ?? 'hartree')}`);
  }
  return `<details class="gw-audit"><summary>Audit trail</summary><ul>${items.map((i) => `<li>${i}</li>`).join('')}</ul></details>`;
}
