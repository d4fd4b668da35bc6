import type { LogResult } from '../log/result-types.ts';

const num = (value: number | null | undefined, digits = 10) => (value === null || value === undefined ? '-' : String(Number(value.toPrecision(digits))));

/**
 * The plain-text summary: one row a block, then every problem with its place, then the counts by status and
 * of the records with problems of their own (a stray Markdown file, unreadable front matter), which fail a
 * check as surely as a block does.
 */
export function formatTable(log: LogResult): string {
  const header = ['record', 'block', 'status', 'energy', 'lower', 'reference', 'unit', 'time'];
  const rows: string[][] = [];
  const notes: string[] = [];
  for (const record of log.records) {
    for (const p of record.problems) notes.push(`${p.file}:${p.line} ${p.field ?? ''}: ${p.message}`);
    for (const b of record.blocks) {
      rows.push([record.file, b.id, b.status, num(b.energy?.value), num(b.bounds.lower), num(b.reference?.energy), b.energy?.unit ?? '-', `${Math.round(b.timeMs)} ms`]);
      // A confirmed basis block may still have had near-dependent functions dropped: the writer should know.
      if (b.basis?.warning) notes.push(`${record.file}:${b.line} [${b.id}] basis: ${b.basis.warning}`);
      if (b.status !== 'confirmed') {
        if (b.problems.length > 0) for (const p of b.problems) notes.push(`${p.file}:${p.line} [${p.block}] ${p.field ?? ''}: ${p.message}`);
        else notes.push(`${record.file}:${b.line} [${b.id}] ${b.status}: ${b.message}`);
      }
    }
  }
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i])).join('  ').trimEnd();
  const counts = new Map<string, number>();
  for (const r of rows) counts.set(r[2], (counts.get(r[2]) ?? 0) + 1);
  const summary = [...counts].map(([status, n]) => `${n} ${status}`).join(', ') || 'no blocks';
  const troubled = log.records.filter((r) => r.problems.length > 0).length;
  const records = troubled > 0 ? `; ${troubled} ${troubled === 1 ? 'record has' : 'records have'} problems of ${troubled === 1 ? 'its' : 'their'} own (listed above)` : '';
  return [line(header), ...rows.map(line), '', ...notes, ...(notes.length ? [''] : []), `${rows.length} ${rows.length === 1 ? 'block' : 'blocks'}: ${summary}${records}`].join('\n');
}
