import { describe, expect, it } from 'vitest';
import type { BlockHistory } from '../../src/log/record-history.ts';
import type { LogSystem, SystemMember } from '../../src/log/systems.ts';
import { renderHistory, renderSystem, systemLinks } from '../../src/render/review-html.ts';

const links = { record: (file: string, block?: string) => `/records/${file}/#block-${block}`, system: (slug: string) => `/systems/${slug}/` };
const member = (file: string, block: string, energy: number, lower: number | null): SystemMember => ({
  file, title: file, author: 'test bench', date: '2026-12-01', block, caption: null, method: { trialTex: 'e^{-a x^2}' }, status: 'confirmed', energy, upper: energy, lower, level: 'ground',
});
// Oscillator numbers (exact level 1/2, any textbook) and one result made wrong on purpose: 0.49 lies below 0.5's lower bound.
const system: LogSystem = {
  slug: 'osc',
  name: 'osc',
  members: [member('a.md', 'good', 0.5, 0.4999999), member('b.md', 'wrong', 0.49, null)],
  brackets: [{ level: 'ground', upper: { value: 0.49, member: 1 }, lower: { value: 0.4999999, member: 0 }, width: -0.0099999, reference: 0.5, published: [] }],
  conflicts: [{ level: 'ground', upperMember: 1, lowerMember: 0, upper: 0.49, lower: 0.4999999 }],
};

describe('review pages', () => {
  it('flags an incompatible pair on both panels, each naming the other', () => {
    const a = systemLinks([system], 'a.md', links).get('good')!;
    const b = systemLinks([system], 'b.md', links).get('wrong')!;
    expect(a.href).toBe('/systems/osc/');
    expect(a.conflicts).toEqual(['wrong (b.md)']);
    expect(b.conflicts).toEqual(['good (a.md)']);
  });

  it('shows the bracket with the blocks it comes from, and every member', () => {
    const html = renderSystem(system, links, '');
    expect(html).toMatch(/lowest upper bound<\/th><td>0\.49 hartree, from <a href="\/records\/b\.md\/#block-wrong">/);
    expect(html).toMatch(/highest lower bound<\/th><td>0\.4999999 hartree, from <a href="\/records\/a\.md\/#block-good">/);
    expect(html.match(/<tr><td class="gw-date">/g)).toHaveLength(2);
    expect(html).toContain('at least one of the two results is wrong');
  });

  it('lists a history newest first, with renamed versions marked', () => {
    const history: BlockHistory[] = [
      {
        id: 'new-name',
        points: [
          { commit: { hash: 'a'.repeat(40), author: 'A', date: '2026-11-01T10:00:00Z', subject: 'first' }, id: 'old-name', status: 'confirmed', energy: { value: 0.5, unit: 'hartree' }, inputHash: 'h1' },
          { commit: { hash: 'b'.repeat(40), author: 'B', date: '2026-11-02T10:00:00Z', subject: 'second' }, id: 'new-name', status: 'disputed', energy: { value: 0.5, unit: 'hartree' }, inputHash: 'h2' },
        ],
      },
    ];
    const html = renderHistory(history);
    expect(html.indexOf('<td>second</td>')).toBeLessThan(html.indexOf('<td>first</td>'));
    expect(html.indexOf('<td>first</td>')).toBeGreaterThan(0);
    expect(html).toContain('(as <code>old-name</code>)');
    expect(renderHistory([{ id: 'x', points: [] }])).toBe('');
  });
});
