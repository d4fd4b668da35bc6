import { basename } from 'node:path';
import { blockVerdict } from '../log/block-verdict.ts';
import type { BlockResult, LogResult } from '../log/result-types.ts';

const num = (value: number | null | undefined, digits = 10) => (value === null || value === undefined ? '-' : String(Number(value.toPrecision(digits))));
const signed = (value: number, digits: number) => `${value > 0 ? '+' : ''}${num(value, digits)}`;

/** The table fits a terminal of this many columns: the file and block names give way first. */
const WIDTH = 100;
const GAP = ' ';

interface Column {
  title: string;
  /** Numbers are right-aligned so their digits line up. */
  right: boolean;
  /** The narrowest a column that gives way may become. */
  shrinks?: number;
}

const COLUMNS: Column[] = [
  { title: '', right: false },
  { title: 'record', right: false, shrinks: 14 },
  { title: 'block', right: false, shrinks: 12 },
  { title: 'status', right: false },
  { title: 'E', right: true },
  { title: 'unit', right: false },
  { title: 'E - Eref', right: true },
  { title: 'checks', right: true },
  { title: 'time', right: true },
];

/** A row of the table: '!' marks a block that is not confirmed, so the table says it without colour. */
function row(file: string, b: BlockResult, cached: boolean): string[] {
  const v = blockVerdict(b);
  return [
    b.status === 'confirmed' ? ' ' : '!',
    basename(file, '.md'),
    b.id,
    b.status,
    num(b.energy?.value),
    b.energy?.unit ?? '-',
    // A gap below what the numerics resolve is zero, as on the pages.
    v.gap ? (v.gap.resolved ? signed(v.gap.absolute, 3) : '0') : '-',
    `${v.checks.passed}/${v.checks.total}`,
    cached ? 'cached' : `${Math.round(b.timeMs)} ms`,
  ];
}

/** A cell cut to `width` characters with an ellipsis in the middle: names differ at their ends (date, variant). */
function fit(text: string, width: number): string {
  if (text.length <= width) return text;
  const head = Math.ceil((width - 1) / 2);
  return `${text.slice(0, head)}…${text.slice(text.length - (width - 1 - head))}`;
}

/**
 * The plain-text summary: one row a block, then every problem with its place, then the counts by status and
 * of the records with problems of their own (a stray Markdown file, unreadable front matter), which fail a
 * check as surely as a block does. `fromCache` names the results that were not evaluated in this run.
 */
export function formatTable(log: LogResult, fromCache: ReadonlySet<BlockResult> = new Set()): string {
  const rows: string[][] = [];
  const notes: string[] = [];
  const statuses: string[] = [];
  for (const record of log.records) {
    for (const p of record.problems) notes.push(`${p.file}:${p.line} ${p.field ?? ''}: ${p.message}`);
    for (const b of record.blocks) {
      rows.push(row(record.file, b, fromCache.has(b)));
      statuses.push(b.status);
      // A confirmed basis block may still have had near-dependent functions dropped: the writer should know.
      if (b.basis?.warning) notes.push(`${record.file}:${b.line} [${b.id}] basis: ${b.basis.warning}`);
      if (b.status !== 'confirmed') {
        if (b.problems.length > 0) for (const p of b.problems) notes.push(`${p.file}:${p.line} [${p.block}] ${p.field ?? ''}: ${p.message}`);
        else notes.push(`${record.file}:${b.line} [${b.id}] ${b.status}: ${b.message}`);
      }
    }
  }
  const widths = COLUMNS.map((c, i) => Math.max(c.title.length, ...rows.map((r) => r[i].length)));
  // Give way in the name columns until the table fits.
  let over = widths.reduce((a, b) => a + b, 0) + GAP.length * (widths.length - 1) - WIDTH;
  for (const [i, c] of COLUMNS.entries()) {
    if (over <= 0 || c.shrinks === undefined) continue;
    const cut = Math.min(over, Math.max(0, widths[i] - c.shrinks));
    widths[i] -= cut;
    over -= cut;
  }
  const line = (cells: string[]) =>
    cells
      .map((cell, i) => (COLUMNS[i].right ? fit(cell, widths[i]).padStart(widths[i]) : fit(cell, widths[i]).padEnd(widths[i])))
      .join(GAP)
      .trimEnd();
  const counts = new Map<string, number>();
  for (const s of statuses) counts.set(s, (counts.get(s) ?? 0) + 1);
  const summary = [...counts].map(([status, n]) => `${n} ${status}`).join(', ') || 'no blocks';
  const troubled = log.records.filter((r) => r.problems.length > 0).length;
  const records = troubled > 0 ? `; ${troubled} ${troubled === 1 ? 'record has' : 'records have'} problems of ${troubled === 1 ? 'its' : 'their'} own (listed above)` : '';
  const legend = rows.some((r) => r[0] === '!') ? ' (! marks a block that is not confirmed)' : '';
  return [
    line(COLUMNS.map((c) => c.title)),
    ...rows.map(line),
    '',
    ...notes,
    ...(notes.length ? [''] : []),
    `${rows.length} ${rows.length === 1 ? 'block' : 'blocks'}: ${summary}${records}${legend}`,
  ].join('\n');
}
