import katex from 'katex';
import type { LastCommit } from '../log/git-audit.ts';
import type { Provenance } from '../log/provenance.ts';
import { eckartOverlapFloor } from '../engine/bounds.ts';
import { describeLevel } from '../engine/parity.ts';
import { symbolTex } from '../expr/symbol-tex.ts';
import { blockVerdict, numericFloor, type Verdict } from '../log/block-verdict.ts';
import type { BlockInputs, BlockResult } from '../log/result-types.ts';
import { escapeHtml, formatAt, formatNearOne, formatNumber, MINUS, texNumber, typesetMessage, typesetUnit } from './html.ts';
import { renderBlockPlots } from './field-plots.ts';
import { renderSystemLink, type SystemLink } from './review-html.ts';
import { renderResponse, renderSweep } from './sweep-panel.ts';

// A display equation too wide for a phone scrolls inside the panel; tabindex lets a keyboard reach that scroll.
const tex = (source: string, display = false) => {
  const html = katex.renderToString(source, { displayMode: display, throwOnError: false, output: 'htmlAndMathml' });
  return display ? html.replace('<span class="katex-display">', '<span class="katex-display" tabindex="0">') : html;
};

/** Each status has a word and a shape of its own, so it reads in print and without colour. */
export const STATUS_LOOK: Record<BlockResult['status'], { word: string; shape: string }> = {
  confirmed: { word: 'confirmed', shape: '●' },
  disputed: { word: 'disputed', shape: '▲' },
  'below-reference': { word: 'below reference', shape: '▼' },
  unsettled: { word: 'unsettled', shape: '◐' },
  invalid: { word: 'invalid', shape: '✕' },
};

/** A status badge: shape and word; the shape is decoration, the word is what is read out. */
export function statusBadge(status: BlockResult['status']): string {
  const look = STATUS_LOOK[status];
  return `<span class="gw-status gw-status-${status}"><span class="gw-shape" aria-hidden="true">${look.shape}</span> ${look.word}</span>`;
}

/** What a panel's audit trail says about where the block came from and what computed it. */
export interface PanelContext {
  file: string;
  git: LastCommit | null;
  provenance: Provenance;
  /** The system a block belongs to across the log, when it shares one with other blocks. */
  systemOf?: (blockId: string) => SystemLink | null;
}

/** The result panel that stands in a record's page where its spec block was written. */
export function renderBlockPanel(result: BlockResult, context: PanelContext): string {
  const id = escapeHtml(result.id);
  const verdict = blockVerdict(result);
  const parts = [
    `<section class="gw-panel gw-${result.status}" id="block-${id}" data-status="${result.status}" aria-labelledby="block-${id}-heading">`,
    `<header><h2 id="block-${id}-heading"><span class="gw-caption">${escapeHtml(result.caption ?? `Block ${result.id}`)}</span> <a class="gw-self" href="#block-${id}" title="link to this block"><code>${id}</code></a></h2></header>`,
    renderVerdict(result, verdict),
  ];
  const system = context.systemOf?.(result.id);
  if (system) parts.push(renderSystemLink(system));
  if (result.problems.length > 0) {
    parts.push('<ul class="gw-problems">');
    for (const p of result.problems) parts.push(`<li><code>${escapeHtml(p.file)}:${p.line}</code> ${p.field ? `<code>${escapeHtml(p.field)}</code>: ` : ''}${escapeHtml(p.message)}</li>`);
    parts.push('</ul>');
  }
  if (result.inputs) parts.push(renderInputs(result));
  if (result.energy) parts.push(renderResults(result, verdict));
  if (result.sweep) parts.push(renderSweep(result));
  if (result.sensitivities) parts.push(renderResponse(result));
  const plots = renderBlockPlots(result, {
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

/** An energy at the resolution that matters for this block, with its unit. */
function energyText(value: number | null | undefined, verdict: Verdict, unit: string): string {
  const text = verdict.resolution ? formatAt(value, verdict.resolution) : formatNumber(value);
  return `${text}${unit ? `\u00a0${escapeHtml(unit)}` : ''}`;
}

const signed = (text: string) => (text.startsWith(MINUS) || text === '0' ? text : `+${text}`);

/** The verdict line: status and reason, E, the gap to the reference, the bracket, the claim and the checks, in that order. */
function renderVerdict(result: BlockResult, verdict: Verdict): string {
  const unit = result.energy?.unit ?? '';
  const items = [`<li class="gw-v-status">${statusBadge(result.status)} <span class="gw-reason">${escapeHtml(typesetMessage(verdict.reason))}</span></li>`];
  if (result.energy) items.push(`<li><span class="gw-v-label">E</span> <span class="gw-num">${energyText(result.energy.value, verdict, unit)}</span></li>`);
  if (verdict.gap) {
    const relative = verdict.gap.relative === null ? '' : ` (${signed(formatNumber(100 * verdict.gap.relative, 2))}\u00a0%)`;
    // A gap below what the numerics can resolve is zero within that resolution, not a figure to read.
    const gap = !verdict.gap.resolved ? `0 within ${formatNumber(numericFloor(result), 1)}${unit ? `\u00a0${escapeHtml(unit)}` : ''}` : `${signed(energyText(verdict.gap.absolute, { ...verdict, resolution: Math.abs(verdict.gap.absolute) / 100 }, unit))}${relative}`;
    items.push(`<li><span class="gw-v-label">E ${MINUS} E<sub>ref</sub></span> <span class="gw-num">${gap}</span> <span class="gw-quiet">against the ${verdict.gap.method === 'correlated-basis' ? 'correlated-basis reference' : verdict.gap.method === 'grid' ? 'grid' : 'published value'}</span></li>`);
  } else if (result.energy) items.push(`<li class="gw-quiet">no reference to compare with</li>`);
  if (verdict.bracket) {
    const b = verdict.bracket;
    items.push(`<li><span class="gw-v-label">bracket</span> <span class="gw-num">[${formatNumber(b.lower, 6)}, ${formatNumber(b.upper, 6)}]</span>, width <span class="gw-num">${formatNumber(b.width, 2)}${unit ? `\u00a0${escapeHtml(unit)}` : ''}</span> <span class="gw-quiet">(lower end: ${b.lowerFrom})</span></li>`);
  }
  if (verdict.claim) {
    const c = verdict.claim;
    items.push(`<li><span class="gw-v-label">claim</span> <span class="gw-num">${formatNumber(c.energy)} ± ${formatNumber(c.tolerance, 3)}</span> ${c.agrees ? 'agrees' : '<strong>disagrees</strong>'}, off by <span class="gw-num">${formatNumber(Math.abs(c.difference), 3)}${unit ? `\u00a0${escapeHtml(unit)}` : ''}</span></li>`);
  } else if (result.claim && Object.keys(result.claim.parameters).length > 0) items.push(`<li>claim on parameters only (see the checks)</li>`);
  // A confirmed block's reason already says it made no claim.
  else if (result.energy && result.status !== 'confirmed') items.push(`<li class="gw-quiet">no claim made</li>`);
  if (verdict.checks.total > 0) items.push(`<li><span class="gw-num">${verdict.checks.passed}/${verdict.checks.total}</span> checks pass</li>`);
  return `<ul class="gw-verdict" aria-label="verdict">${items.join('')}</ul>`;
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
    `<div>${tex(`H = ${kinetic} ${/^\s*-/.test(inputs.potentialTex) ? '' : '+'} ${inputs.potentialTex}, \\quad ${where}, \\quad ${massTex}`, true)}</div>`,
    inputs.trialTex !== null
      ? `<div>${tex(`${stateTex(inputs)} = ${inputs.trialTex}`, true)}</div>`
      : `<div>Basis (linear variational method, ${result.states.length} level${result.states.length === 1 ? '' : 's'} reported):${tex(`${stateTex(inputs)} = \\sum_i c_i \\phi_i(${inputs.coordinates.map(coordinateTex).join(', ')})`, true)}<ul class="gw-basis">${(inputs.basisTex ?? []).map((b, i) => `<li>${tex(`\\phi_{${i}} = ${b}`)}</li>`).join('')}</ul></div>`,
  ];
  // Units stay outside the math: they are written as mathjs spells them (nm^-1), not as TeX.
  // From the block's units rather than the results, so an invalid block's ranges keep theirs too.
  const unitOf = (name: string) => (result.quantity?.parameters[name]?.unit ? `\u00a0${escapeHtml(typesetUnit(result.quantity.parameters[name].unit!))}` : '');
  const ranges = inputs.ranges.map((r) => `${tex(`${symbolTex(r.name)} \\in [${texNumber(r.min, 8)}, ${texNumber(r.max, 8)}]`)}${unitOf(r.name)}, start ${formatNumber(r.start, 8)}${unitOf(r.name)}`).join('; ');
  const constantUnit = (name: string) => (inputs.constantUnits?.[name] ? `\u00a0${escapeHtml(typesetUnit(inputs.constantUnits[name]!))}` : '');
  const constants = Object.entries(inputs.constants).map(([k, v]) => `${tex(`${symbolTex(k)} = ${texNumber(v, 10)}`)}${constantUnit(k)}`).join(', ');
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
  if (space === 'two-electron') return '-\\frac{\\hbar^2}{2m}\\left(\\nabla_1^2+\\nabla_2^2\\right)';
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
  if (inputs.box) return `${q} \\in [${texNumber(inputs.box[0], 10)}, ${texNumber(inputs.box[1], 10)}]${lengthUnit}`;
  if (space === 'axial') return '\\rho \\ge 0,\\ z \\in \\mathbb{R}';
  if (space === 'two-electron') return `|r_1 - r_2| \\le r_{12} \\le r_1 + r_2,\\ \\text{S state, ${inputs.exchange === 'antisymmetric' ? 'antisymmetric (triplet)' : 'symmetric (singlet)'} under } r_1 \\leftrightarrow r_2`;
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

function renderResults(result: BlockResult, verdict: Verdict): string {
  const unit = result.energy!.unit ?? '';
  const u = unit ? `\u00a0${escapeHtml(unit)}` : '';
  const E = result.energy!.value;
  const at = (v: number | null | undefined) => energyText(v, verdict, unit);
  const row = (label: string, value: string, quiet = false) => `<tr${quiet ? ' class="gw-quiet"' : ''}><th scope="row">${label}</th><td class="gw-num">${value}</td></tr>`;
  /** A row that does not apply to this block says why, in a quieter style. */
  const not = (label: string, why: string) => `<tr class="gw-quiet"><th scope="row">${label}</th><td>${escapeHtml(why)}</td></tr>`;
  const ref = result.reference;
  // The next level above E0 or, when there is none bound, the continuum threshold: a lower bound to it either way.
  const next = ref?.excited ?? ref?.threshold ?? null;
  const rows = [
    ...Object.entries(result.parameters).map(([name, p]) => row(`${tex(symbolTex(name))} ${p.varied ? 'at the optimum' : '(fixed)'}`, `${formatNumber(p.value, 8)}${p.unit ? `\u00a0${escapeHtml(typesetUnit(p.unit))}` : ''}`)),
    row(`kinetic energy ${tex('\\langle T\\rangle')}`, at(result.components?.kinetic)),
    row(`potential energy ${tex('\\langle V\\rangle')}`, at(result.components?.potential)),
    row(`${tex('E = \\langle H\\rangle')} (upper bound)`, `<strong>${at(E)}</strong>`),
  ];
  if (result.variance === null) rows.push(not('variance', `not available: ${result.varianceNote ?? 'not computed for this block'}`));
  else rows.push(row(`variance ${tex('\\sigma^2 = \\langle H^2\\rangle - E^2')}`, `${formatNumber(result.variance, 3)}${unit ? `\u00a0${escapeHtml(unit)}²` : ''}; ${tex('\\sigma')} = ${formatNumber(Math.sqrt(Math.max(result.variance, 0)), 3)}${u}`));
  // Temple's bound needs the variance and a next level above E; Weinstein's needs the variance.
  const temple = result.bounds.lower;
  if (temple !== null) {
    const weak = result.bounds.weinstein && temple < result.bounds.weinstein[0];
    rows.push(row("Temple's lower bound", `${at(temple)}${weak ? ' <span class="gw-quiet">(not informative: below the lower end of Weinstein\'s interval)</span>' : ''}`));
  } else rows.push(not("Temple's lower bound", result.variance === null ? 'not applicable: no variance' : next === null ? 'not applicable: no next level known' : `not applicable: E is above the next level E1 = ${formatNumber(next, 6)}`));
  if (result.bounds.weinstein) rows.push(row("Weinstein's interval", `[${at(result.bounds.weinstein[0])}, ${at(result.bounds.weinstein[1])}] <span class="gw-quiet">(holds at least one level)</span>`));
  else rows.push(not("Weinstein's interval", 'not applicable: no variance'));
  if (verdict.bracket) rows.push(row('best lower bound', `${at(verdict.bracket.lower)} <span class="gw-quiet">(${verdict.bracket.lowerFrom})</span>`));
  // Which level the reference stands for, when it is not the ground level (a declared or an odd trial's symmetry, a level index).
  const level = ref && (ref.level.symmetry !== null || ref.level.index > 0) ? describeLevel(ref.level) : null;
  if (ref) {
    const nextName = level && ref.level.symmetry ? `next ${ref.level.symmetry} level` : 'next level';
    rows.push(row(`reference (${ref.method}${level ? `, ${level}` : ''})`, `${at(ref.energy)}${ref.excited !== null ? `; ${nextName} ${at(ref.excited)}` : ''}`));
    if (result.binding) rows.push(row('binding threshold (one-electron ion)', `${at(result.binding.threshold)}: ${escapeHtml(result.binding.detail)}`));
    if (ref.published) rows.push(row('published', `${formatNumber(ref.published.energy)}${u} — ${escapeHtml(ref.published.source)}`));
  }
  if (result.states.length > 1) {
    result.states.forEach((state, k) => {
      const error = state.reference === null ? '' : `; grid ${formatNumber(state.reference)} (relative error ${formatNumber((state.energy - state.reference) / Math.abs(state.reference), 3)})`;
      rows.push(row(`level ${tex(`E_{${k}}`)} (upper bound)`, `${formatNumber(state.energy)}${u}${error}`));
    });
  }
  if (result.basis) rows.push(row('overlap matrix', `${result.basis.functions} functions, ${result.basis.kept} kept; ${escapeHtml(typesetMessage(result.basis.conditioning))}`));
  if (result.errors.vsGrid !== null) rows.push(row(`relative error against the grid${level ? ` (${level})` : ''}`, formatNumber(result.errors.vsGrid, 3)));
  if (result.errors.vsPublished !== null) rows.push(row('relative error against the published value', formatNumber(result.errors.vsPublished, 3)));
  if (result.overlap !== null) rows.push(row(`overlap with the grid ${level ? `state of the ${level}` : 'ground state'} ${tex('|\\langle\\psi|\\psi_0\\rangle|^2')}`, formatNearOne(result.overlap)));
  // Eckart's floor on that overlap, from the same E, E0 and E1 the checks use.
  const floor = ref?.energy !== null && ref?.energy !== undefined && (!level) ? eckartOverlapFloor(E, ref.energy, next) : null;
  if (floor !== null) rows.push(row("Eckart's overlap floor", floor <= 0 ? `${formatNumber(floor, 3)} <span class="gw-quiet">(not informative: E is too far above E0)</span>` : formatNearOne(floor)));
  else rows.push(not("Eckart's overlap floor", level ? `not applicable: only for the ground level` : 'not applicable: no next level known'));
  if (result.virial) rows.push(row(`virial ratio ${tex(`2\\langle T\\rangle / (${result.virial.exponent === 1 ? '' : result.virial.exponent === -1 ? '-' : result.virial.exponent}\\langle V\\rangle)`)}`, formatNearOne(result.virial.ratio)));
  else rows.push(not('virial ratio', `not applicable: ${result.virialNote ?? 'the potential is not a power law'}`));
  return `<table class="gw-results"><caption>Recomputed values (${escapeHtml(unit)}); model estimates, not a substitute for the group's validated procedures</caption><tbody>${rows.join('')}</tbody></table>`;
}

function renderChecks(result: BlockResult): string {
  const items = result.checks.map((c) => `<li class="${c.pass ? 'gw-pass' : 'gw-fail'}"><span class="gw-mark">${c.pass ? '✓ pass' : '✗ FAIL'}</span> <code>${escapeHtml(c.name)}</code> ${escapeHtml(typesetMessage(c.detail))}</li>`);
  const passed = result.checks.filter((c) => c.pass).length;
  return `<div class="gw-checks-box"><h3 class="gw-sub">Checks: ${passed} of ${result.checks.length} pass</h3><ul class="gw-checks">${items.join('')}</ul></div>`;
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
    const basis = d.grid?.correlated;
    if (basis) {
      items.push(
        `correlated-basis reference: H read as -${formatNumber(basis.charge, 8)}/r1 - ${formatNumber(basis.charge, 8)}/r2 + ${formatNumber(basis.coupling, 8)}/r12 (atomic units); ${d.grid!.size} functions r1^i r2^j r12^k exp(-alpha r1 - beta r2), symmetrised, ${basis.dropped} dropped as linearly dependent; exponent sets ${basis.sets.map((s) => `(alpha ${formatNumber(s.alpha, 4)}, beta ${formatNumber(s.beta, 4)}, i+j+k <= ${s.omega})`).join(', ')}; settled to ${formatNumber(basis.relTol, 2)} relative over the sizes ${basis.steps.map((s) => `${s.size}: ${formatNumber(s.levels[0], 12)}${s.levels[1] === null ? '' : ` / ${formatNumber(s.levels[1], 12)}`}`).join('; ')}`,
      );
    }
    else if (d.grid) items.push(`grid: ${d.grid.size} points, ${d.grid.elements} elements of order ${d.grid.elementOrder}, ${d.grid.refinements} refinements, domain [${formatNumber(d.grid.domain[0], 6)}, ${formatNumber(d.grid.domain[1], 6)}] ${escapeHtml(result.inputs?.lengthUnit ?? 'bohr')}, last change ${d.grid.errorEstimate.map((e) => formatNumber(e, 2)).join(', ')}`);
    if (d.energyError !== null) items.push(`quadrature error estimate of E ${formatNumber(d.energyError, 3)} ${escapeHtml(result.energy?.unit ?? 'hartree')}`);
    if (d.sensitivityMs) items.push(`sensitivities ${formatNumber(d.sensitivityMs, 3)} ms: Hellmann–Feynman at the optimum, each checked by a central difference of re-optimised energies (grid reference skipped there)`);
  }
  return `<details class="gw-audit"><summary>Audit trail</summary><ul>${items.map((i) => `<li>${i}</li>`).join('')}</ul></details>`;
}
