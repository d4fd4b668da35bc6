import { describe, expect, it } from 'vitest';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';

// The harmonic oscillator's ground level is exactly 1/2 hartree (any quantum mechanics textbook), used here as the
// published value; what is checked is which tolerance the checks say they used, and why.
const block = (reference: string) =>
  `---\ntitle: t\nauthor: test bench\ndate: 2026-12-01\ntags: []\n---\n\n\`\`\`variational\nid: osc\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.05, max: 5 }\nreference:\n${reference}\n\`\`\`\n`;
const details = (reference: string) => {
  const [entry] = parseRecord('t.md', block(reference)).blocks;
  const result = evaluateBlock('t.md', entry);
  return Object.fromEntries(result.checks.map((c) => [c.name, c.detail]));
};

describe('the tolerance of a published value', () => {
  it('is one unit in the last written digit when not given, and the check says so', () => {
    const d = details('  energy: 0.5\n  source: textbook harmonic oscillator');
    expect(d['above-published-reference']).toMatch(/published value taken to \+\/- 0\.1, one unit in its last written digit/);
    expect(d['grid-matches-published']).toMatch(/\+\/- 0\.1, one unit in its last written digit/);
  }, 30_000);

  it('is reference.tolerance when the author gives it, and the check says so', () => {
    const d = details('  energy: 0.5\n  tolerance: 1e-6\n  source: textbook harmonic oscillator');
    expect(d['above-published-reference']).toMatch(/published value taken to \+\/- (0\.000001|1e-0?6), as reference\.tolerance gives it$/);
  }, 30_000);
});
