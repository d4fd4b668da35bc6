import type { RecordResult } from '../log/result-types.ts';

const COLUMNS = [
  'file', 'title', 'author', 'date', 'block', 'line', 'status', 'energy', 'unit', 'reference', 'reference_method',
  'rel_error_grid', 'rel_error_published', 'lower_bound', 'variance', 'parameters', 'input_hash', 'message',
] as const;

/** One field as RFC 4180 wants it: quoted when it holds a comma, a quote or a line break. */
function field(value: string | number | null): string {
  const text = value === null ? '' : String(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The whole log as one CSV table, a row per block, for spreadsheets and scripts. */
export function logCsv(records: RecordResult[]): string {
  const rows = [COLUMNS.join(',')];
  for (const record of records) {
    const fm = record.frontMatter;
    for (const b of record.blocks) {
      const parameters = Object.entries(b.parameters).map(([name, p]) => `${name}=${p.value}${p.unit ? ` ${p.unit}` : ''}`).join('; ');
      rows.push(
        [
          record.file, record.title, fm.author, fm.date, b.id, b.line, b.status, b.energy?.value ?? null, b.energy?.unit ?? null,
          b.reference?.energy ?? null, b.reference?.method ?? null, b.errors.vsGrid, b.errors.vsPublished, b.bounds.lower, b.variance,
          parameters, b.inputHash, b.message,
        ].map(field).join(','),
      );
    }
  }
  return rows.join('\r\n') + '\r\n';
}
