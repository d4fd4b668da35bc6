import { describe, expect, it } from 'vitest';
import { blockVerdict, withVerdicts } from '../../src/log/block-verdict.ts';
import { checkRecordText } from '../render/record-fixture.ts';

const record = (block: string) => ['---', 'title: verdicts', 'author: test bench', 'date: 2026-12-02', 'tags: []', '---', '', '```variational', block, '```', ''].join('\n');

describe('blockVerdict', () => {
  it('states the gap of the box trial x(1 - x) to the exact level and the claim it agrees with', () => {
    // Particle in a box [0, 1] with m = hbar = 1: the trial x(1 - x) gives <H> = 5 exactly, the ground level is
    // pi^2/2 (any quantum mechanics textbook, e.g. Griffiths, Introduction to Quantum Mechanics, problem 7.2).
    const [block] = checkRecordText('content/records/box.md', record('id: box\nbox: [0, 1]\npotential: 0\ntrial: x*(1 - x)\nclaim:\n  energy: 5\n  tolerance: 0.001')).blocks;
    expect(block.status).toBe('confirmed');
    const v = blockVerdict(block);
    expect(v.gap!.method).toBe('grid');
    expect(v.gap!.absolute).toBeCloseTo(5 - Math.PI ** 2 / 2, 6);
    expect(v.gap!.relative).toBeCloseTo((5 - Math.PI ** 2 / 2) / (Math.PI ** 2 / 2), 6);
    expect(v.claim).toEqual({ energy: 5, tolerance: 0.001, difference: expect.closeTo(0, 9), agrees: true });
    expect(v.checks.passed).toBe(v.checks.total);
    expect(v.reason).toContain('the claim agrees');
    // The bracket's lower end is a lower bound of the exact level and its upper end is E.
    expect(v.bracket!.upper).toBeCloseTo(5, 9);
    expect(v.bracket!.lower).toBeLessThanOrEqual(Math.PI ** 2 / 2);
    expect(v.bracket!.width).toBeCloseTo(v.bracket!.upper - v.bracket!.lower, 12);
  });

  it('says there is no claim, and gives the difference of a claim that disagrees', () => {
    // Harmonic oscillator x^2/2: the Gaussian trial holds the exact level 1/2 (any quantum mechanics textbook).
    const trial = 'id: osc\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.05, max: 5 }';
    const none = blockVerdict(checkRecordText('content/records/osc.md', record(trial)).blocks[0]);
    expect(none.claim).toBeNull();
    expect(none.reason).toContain('no claim made');
    const [wrong] = checkRecordText('content/records/osc.md', record(`${trial}\nclaim:\n  energy: 0.6\n  tolerance: 0.01`)).blocks;
    const v = blockVerdict(wrong);
    expect(v.status).toBe('disputed');
    expect(v.claim!.agrees).toBe(false);
    expect(v.claim!.difference).toBeCloseTo(-0.1, 6);
    expect(v.checks.passed).toBe(v.checks.total - 1);
    expect(v.reason).toContain('claimed 0.6');
    // Each compared check carries its number and limit beside its words.
    const claimCheck = wrong.checks.find((c) => c.name === 'claim-energy')!;
    expect(claimCheck.measure).toEqual({ value: expect.closeTo(0.1, 6), limit: 0.01, relation: '<=', quantity: 'energy' });
    const above = wrong.checks.find((c) => c.name === 'above-grid-reference')!;
    expect(above.measure!.relation).toBe('>=');
    expect(above.measure!.value).toBeCloseTo(0, 6);
  });

  it('adds the verdict to JSON output and leaves the plot samples out unless asked for', () => {
    const r = checkRecordText('content/records/box.md', record('id: box\nbox: [0, 1]\npotential: 0\ntrial: x*(1 - x)'));
    expect(r.blocks[0].plots).not.toBeNull();
    const log = { tool: { name: 'groundwork' as const, version: 'test' }, records: [r] };
    const lean = withVerdicts(log, { plots: false }).records[0].blocks[0];
    expect(lean.plots).toBeNull();
    expect(lean.verdict!.status).toBe('confirmed');
    expect(withVerdicts(log, { plots: true }).records[0].blocks[0].plots).toEqual(r.blocks[0].plots);
  });
});
