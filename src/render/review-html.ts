import type { BlockHistory } from '../log/record-history.ts';
import type { LogSystem, SystemMember } from '../log/systems.ts';
import type { BlockChange, BlockSnapshot, LogDiff } from '../log/log-diff.ts';
import katex from 'katex';
import { escapeHtml, formatNumber } from './html.ts';

/** The links a review page needs, supplied by the site (it knows the base URL and the record page names). */
export interface ReviewLinks {
  record(file: string, block?: string): string;
  system(slug: string): string;
}

/** What a block's panel says about the system it belongs to. */
export interface SystemLink {
  href: string;
  label: string;
  /** The other blocks of the system whose results cannot hold together with this one's. */
  conflicts: string[];
}

const status = (s: string) => `<span class="gw-status gw-status-${escapeHtml(s)}">${escapeHtml(s)}</span>`;
const day = (iso: string | null) => escapeHtml((iso ?? '').slice(0, 10));

/** The line a panel gets: which system, how many blocks, and any incompatible result. */
export function renderSystemLink(link: SystemLink): string {
  const conflict = link.conflicts.length > 0 ? ` <strong class="gw-conflict">Cannot hold together with ${link.conflicts.map(escapeHtml).join(', ')}: one upper bound lies below another's lower bound.</strong>` : '';
  return `<p class="gw-system-link">System: <a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a>${conflict}</p>`;
}

/** For each block of a record, its panel's system line, from the systems of the whole log. */
export function systemLinks(systems: LogSystem[], file: string, links: ReviewLinks): Map<string, SystemLink> {
  const found = new Map<string, SystemLink>();
  for (const system of systems) {
    system.members.forEach((m, i) => {
      if (m.file !== file) return;
      const others = system.conflicts.flatMap((c) => (c.upperMember === i ? [c.lowerMember] : c.lowerMember === i ? [c.upperMember] : [])).map((j) => `${system.members[j].block} (${system.members[j].file})`);
      found.set(m.block, { href: links.system(system.slug), label: `${systemTitle(system)}, ${system.members.length} blocks`, conflicts: [...new Set(others)] });
    });
  }
  return found;
}

/** A system's name, or for an unnamed one its first block and how many more share its Hamiltonian. */
export function systemTitle(system: LogSystem): string {
  const others = system.members.length - 1;
  return system.name ?? `${system.members[0].block} and ${others} other block${others === 1 ? '' : 's'}`;
}

/** The history section of a record page: per block, its status and energy at each commit that changed the record. */
export function renderHistory(histories: BlockHistory[]): string {
  const shown = histories.filter((h) => h.points.length > 0);
  if (shown.length === 0) return '';
  const tables = shown.map((h) => {
    const rows = [...h.points].reverse().map((p) => {
      const where = p.commit ? `<code>${escapeHtml(p.commit.hash.slice(0, 10))}</code>` : 'working tree';
      const when = p.commit ? day(p.commit.date) : '';
      const who = p.commit ? escapeHtml(p.commit.author) : '';
      const what = p.commit ? escapeHtml(p.commit.subject) : 'uncommitted changes';
      const renamed = p.id !== h.id ? ` (as <code>${escapeHtml(p.id)}</code>)` : '';
      const energy = p.energy ? `${formatNumber(p.energy.value)} ${escapeHtml(p.energy.unit ?? '')}` : '—';
      return `<tr><td class="gw-date">${when}</td><td>${status(p.status)}</td><td class="gw-num">${energy}</td><td>${where}${renamed}</td><td class="gw-wide-only">${who}</td><td>${what}</td></tr>`;
    });
    return `<table class="gw-history"><caption><code>${escapeHtml(h.id)}</code>: ${h.points.length} version${h.points.length === 1 ? '' : 's'}, newest first</caption><thead><tr><th>date</th><th>status</th><th>E</th><th>commit</th><th class="gw-wide-only">author</th><th>message</th></tr></thead><tbody>${rows.join('')}</tbody></table>`;
  });
  return `<section class="gw-history-section" id="history"><h2>History</h2><p class="gw-note">Each block recomputed as its record stood at every commit that changed it (the newest, up to historyDepth in groundwork.config.json), by today's evaluator.</p><div class="gw-scroll">${tables.join('\n')}</div></section>`;
}

function methodOf(m: SystemMember): string {
  if (!m.method) return '—';
  return 'trialTex' in m.method ? katex.renderToString(m.method.trialTex, { throwOnError: false }) : `basis of ${m.method.basisSize} functions`;
}

/** The body of a system's page: its bracket per level, every block on it across the log, and any incompatible pair. */
export function renderSystem(system: LogSystem, links: ReviewLinks, plot: string): string {
  const blockLink = (i: number) => {
    const m = system.members[i];
    return `<a href="${escapeHtml(links.record(m.file, m.block))}"><code>${escapeHtml(m.block)}</code></a>`;
  };
  const memberLink = (i: number) => `${blockLink(i)} (${escapeHtml(system.members[i].title ?? system.members[i].file)})`;
  const brackets = system.brackets.map((b) => {
    const rows = [
      ['lowest upper bound', b.upper ? `${formatNumber(b.upper.value)} hartree, from ${memberLink(b.upper.member)}` : '—'],
      ['highest lower bound', b.lower ? `${formatNumber(b.lower.value)} hartree, from ${memberLink(b.lower.member)}` : '— (no block gives a valid lower bound)'],
      ['bracket width', b.width === null ? '—' : `${formatNumber(b.width, 4)} hartree`],
      ['grid reference', b.reference === null ? '—' : `${formatNumber(b.reference)} hartree`],
      ...b.published.map((p) => ['published', `${formatNumber(p.energy)} hartree (${escapeHtml(p.source)})`]),
    ];
    return `<table class="gw-results gw-bracket"><caption>${escapeHtml(b.level)} level</caption><tbody>${rows.map(([k, v]) => `<tr><th>${k}</th><td>${v}</td></tr>`).join('')}</tbody></table>`;
  });
  const conflicts = system.conflicts.map((c) => `<li>${memberLink(c.upperMember)} has upper bound ${formatNumber(c.upper)} hartree, below the lower bound ${formatNumber(c.lower)} hartree of ${memberLink(c.lowerMember)}: at least one of the two results is wrong.</li>`);
  const rows = system.members.map(
    (m, i) =>
      `<tr><td class="gw-date">${escapeHtml(m.date ?? '')}</td><td>${blockLink(i)}</td><td>${status(m.status)}</td><td class="gw-num">${formatNumber(m.energy)}</td><td class="gw-num">${formatNumber(m.lower)}</td><td>${escapeHtml(m.level)}</td><td>${methodOf(m)}</td><td>${escapeHtml(m.title ?? m.file)}${m.author ? `<br><span class="gw-note">${escapeHtml(m.author)}</span>` : ''}</td></tr>`,
  );
  return [
    `<div class="gw-brackets">${brackets.join('\n')}</div>`,
    conflicts.length > 0 ? `<ul class="gw-problems gw-conflicts">${conflicts.join('')}</ul>` : '',
    plot,
    `<div class="gw-scroll"><table class="gw-table gw-members"><caption>Every block on this system (energies in hartree, whatever unit the block states them in)</caption><thead><tr><th>date</th><th>block</th><th>status</th><th>E</th><th>lower bound</th><th>level</th><th>trial or basis</th><th>record and author</th></tr></thead><tbody>${rows.join('')}</tbody></table></div>`,
  ].join('\n');
}

const snap = (s: BlockSnapshot | null) =>
  s === null ? '—' : `${status(s.status)} E = ${s.energy ? `${formatNumber(s.energy.value)} ${escapeHtml(s.energy.unit ?? '')}` : '—'}${s.lower !== null ? `; lower bound ${formatNumber(s.lower)}` : ''}`;

/** The changes page: each block added, removed or changed since the revision, before and after. */
export function renderChanges(diff: LogDiff, links: ReviewLinks): string {
  const row = (c: BlockChange) =>
    `<tr${c.worse ? ' class="gw-worse"' : ''}><td>${escapeHtml(c.change)}</td><td>${c.after ? `<a href="${escapeHtml(links.record(c.file, c.id))}"><code>${escapeHtml(c.id)}</code></a>` : `<code>${escapeHtml(c.id)}</code>`}<br><span class="gw-note">${escapeHtml(c.file)}</span></td><td>${c.fields.map((f) => `<code>${escapeHtml(f)}</code>`).join(', ') || '—'}</td><td>${snap(c.before)}</td><td>${snap(c.after)}</td><td>${c.worse ? `<strong>worse:</strong> ${escapeHtml(c.worse)}` : ''}</td></tr>`;
  const worse = diff.changes.filter((c) => c.worse).length;
  return `<p>${diff.changes.length} block${diff.changes.length === 1 ? '' : 's'} changed since <code>${escapeHtml(diff.revision)}</code> (<code>${escapeHtml(diff.commit.slice(0, 12))}</code>), ${diff.unchanged} unchanged; ${worse === 0 ? 'none got worse' : `<strong>${worse} got worse</strong>`}.</p>
<div class="gw-scroll"><table class="gw-table gw-changes"><thead><tr><th>change</th><th>block</th><th>fields</th><th>before</th><th>after</th><th></th></tr></thead><tbody>${diff.changes.map(row).join('')}</tbody></table></div>`;
}
