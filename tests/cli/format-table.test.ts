import { describe, expect, it } from 'vitest';
import { formatTable } from '../../src/cli/format-table.ts';
import { checkRecordText } from '../render/record-fixture.ts';

// A basis holding the same function twice has a singular overlap matrix (two equal columns); the block still
// confirms on the kept directions, and the table says what was dropped so the writer can fix the basis.
const TEXT = ['---', 'title: repeated', 'author: test bench', 'date: 2026-12-02', 'tags: []', '---', '', '```variational', 'id: twice', 'box: [0, 1]', 'potential: 0', 'basis:', '  - x*(1 - x)', '  - x*(1 - x)', '  - x^2*(1 - x)', 'states: 2', '```', ''].join('\n');

describe('formatTable', () => {
  it('prints the basis warning of a confirmed block with its file, line and block', () => {
    const record = checkRecordText('content/records/twice.md', TEXT);
    expect(record.blocks[0].status).toBe('confirmed');
    const table = formatTable({ tool: { name: 'groundwork', version: 'test' }, records: [record] });
    // The fence is on line 8 of the record.
    expect(table).toMatch(/^content\/records\/twice\.md:8 \[twice\] basis: the overlap matrix is numerically singular .*1 of 3 overlap eigenvectors dropped/m);
    expect(table).not.toContain('Infinity');
  });
});
