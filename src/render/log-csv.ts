import type { BlockResult, RecordResult } from '../log/result-types.ts';

const COLUMNS = [
  'file', 'title', 'author', 'date', 'block', 'line', 'status', 'energy', 'unit', 'reference', 'reference_method',
  'rel_error_grid', 'rel_error_published', 'lower_bound', 'variance', 'parameters', 'input_hash', 'message',
  'sweep_constant', 'sweep_value', 'energy_uncertainty',
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
    // A sweep gives a row per point, each with its own status and numbers.
    const rowsOf = (b: BlockResult): Array<[BlockResult, number | null, BlockResult['sweep']]> => (b.sweep ? b.sweep.points.map((p) => [p.result, p.value, b.sweep]) : [[b, null, null]]);
    for (const [b, swept, sweep] of record.blocks.flatMap(rowsOf)) {
      const parameters = Object.entries(b.parameters).map(([name, p]) => `${name}=${p.value}${p.unit ? ` ${p.unit}` : ''}`).join('; ');
      rows.push(
        [
          record.file, record.title, fm.author, fm.date, b.id, b.line, b.status, b.energy?.value ?? null, b.energy?.unit ?? null,
          b.reference?.energy ?? null, b.reference?.method ?? null, b.errors.vsGrid, b.errors.vsPublished, b.bounds.lower, b.variance,
          parameters, b.inputHash, b.message, sweep?.constant ?? null, swept === null ? null : `${swept}${sweep?.unit ? ` ${sweep.unit}` : ''}`,
          b.uncertainty?.uncertainty ?? null,
        ].map(field).join(','),
      );
    }
  }
  return rows.join('\r\n') + '\r\n';
}
