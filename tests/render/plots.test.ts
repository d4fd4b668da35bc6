import { parseHTML } from 'linkedom';
import { describe, expect, it } from 'vitest';
import { renderPlots } from '../../src/render/plots.ts';
import { checkRecordText } from './record-fixture.ts';

// Harmonic oscillator x^2/2 with the Gaussian trial exp(-a x^2): the optimum a = 1/2 gives the exact level 1/2
// (any quantum mechanics textbook). The range puts the limit max = 0.5 on the optimum and the claim 0.6 misses.
const TEXT = ['---', 'title: t', 'author: test bench', 'date: 2026-12-02', 'tags: []', '---', '', '```variational', 'id: osc', 'potential: x^2/2', 'trial: exp(-a*x^2)', 'parameters:', '  a: { start: 0.3, min: 0.05, max: 0.5 }', 'claim:', '  energy: 0.6', '  tolerance: 0.01', '```', ''].join('\n');

describe('renderPlots', () => {
  const [block] = checkRecordText('content/records/osc.md', TEXT).blocks;
  const figures = renderPlots(block, { energy: 'hartree', length: 'bohr', parameters: { a: null } }).map((html) => parseHTML(`<html><body>${html}</body></html>`).document);

  it('names each SVG by its finding and leaves no aria-label on bare groups (WAI-ARIA 1.2 prohibits naming the generic role)', () => {
    expect(figures.length).toBe(2);
    for (const doc of figures) {
      const svg = doc.querySelector('svg')!;
      expect(svg.getAttribute('role')).toBe('img');
      const name = svg.getAttribute('aria-label')!;
      expect(name.length).toBeGreaterThan(20);
      expect(doc.querySelectorAll('g[aria-label]').length).toBe(0);
      // The caption opens with the same finding.
      expect(doc.querySelector('figcaption')!.textContent!.startsWith(name)).toBe(true);
      // Text of at least 12 px (common practice for legible chart text).
      expect(Number.parseFloat(svg.getAttribute('style')!.match(/font-size:\s*([\d.]+)px/)![1])).toBeGreaterThanOrEqual(12);
    }
  });

  it('says that the optimum is pressed on a limit and that the claim band misses it, and draws the band and the limit', () => {
    const scan = figures[0];
    const name = scan.querySelector('svg')!.getAttribute('aria-label')!;
    expect(name).toContain('pressed on a parameter limit');
    expect(name).toContain('the claim band misses the optimum');
    const texts = Array.from(scan.querySelectorAll('text')).map((t) => t.textContent);
    expect(texts.some((t) => t?.startsWith('claim 0.6 ± 0.01'))).toBe(true);
    // The limit is a solid rule: a vertical line at the limit's x across the frame.
    expect(Array.from(scan.querySelectorAll('line')).some((l) => l.getAttribute('x1') === l.getAttribute('x2') && l.parentElement?.getAttribute('stroke-width') === '2')).toBe(true);
  });
});
