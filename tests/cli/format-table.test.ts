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

describe('the check table', () => {
  // Harmonic oscillator x^2/2 with a Gaussian trial: exact level 1/2 (any quantum mechanics textbook).
  const oscillator = (claim: string) => ['---', 'title: t', 'author: test bench', 'date: 2026-12-02', 'tags: []', '---', '', '```variational', 'id: osc', 'potential: x^2/2', 'trial: exp(-a*x^2)', 'parameters:', '  a: { start: 1, min: 0.05, max: 5 }', claim, '```', ''].join('\n');
  const log = (text: string) => ({ tool: { name: 'groundwork' as const, version: 'test' }, records: [checkRecordText('content/records/a-rather-long-record-name-for-the-width-test.md', text)] });

  it('names the file, right-aligns E, gives gap and checks, says "1 block", and marks a disputed row without colour', () => {
    const confirmed = log(oscillator(''));
    const table = formatTable(confirmed).split('\n');
    expect(table[0]).toMatch(/^\s+record\s+block\s+status\s+E unit\s+E - Eref checks\s+time$/);
    expect(table[1]).toMatch(/^  a-rather-long-record-name-for-the-width-test osc\s+confirmed\s+0\.5 hartree\s+[+-]?\d/);
    expect(table[1]).not.toContain('content/records');
    // E's last digit stands under the header's E: numbers are right-aligned.
    expect(table[1].indexOf('0.5') + 3).toBe(table[0].indexOf('E ') + 1);
    expect(table.at(-1)).toBe('1 block: 1 confirmed');
    const disputed = formatTable(log(oscillator('claim:\n  energy: 0.6\n  tolerance: 0.01'))).split('\n');
    expect(disputed[1].startsWith('! ')).toBe(true);
    expect(disputed.at(-1)).toContain('! marks a block that is not confirmed');
    expect(disputed[1]).toMatch(/ 8\/9 /);
  });

  it('says which rows came from the cache and keeps to 100 columns by shortening names', () => {
    const wide = log(oscillator(''));
    wide.records[0].file = `content/records/${'x'.repeat(120)}.md`;
    const block = wide.records[0].blocks[0];
    const table = formatTable(wide, new Set([block])).split('\n');
    expect(table[1]).toMatch(/ cached$/);
    expect(table[1]).toContain('…');
    for (const line of table.slice(0, 2)) expect(line.length).toBeLessThanOrEqual(100);
  });
});
