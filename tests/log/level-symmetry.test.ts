import { describe, expect, it } from 'vitest';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import type { BlockResult } from '../../src/log/result-types.ts';
import { renderBlockPanel } from '../../src/render/block-panel.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';

// A trial for an excited level is compared with the grid level of its parity and index (spec fields `symmetry`,
// `level`; an odd trial on an even problem is recognised without them). Closed forms: the oscillator x^2/2 (m = 1)
// has levels n + 1/2 with parity (-1)^n and eigenfunctions H_n(x) exp(-x^2/2) (Griffiths, Introduction to Quantum
// Mechanics, §2.3); the box [-L/2, L/2] has levels n^2 pi^2 / (2 L^2), n = 1, 2, ..., even for odd n (Griffiths §2.2).

const FILE = 'content/records/levels.md';

function run(block: string): BlockResult {
  const text = ['---', 'title: Levels', 'author: test', 'date: 2026-01-01', 'tags: []', '---', '', '```variational', block, '```', ''].join('\n');
  return evaluateBlock(FILE, parseRecord(FILE, text).blocks[0]);
}

const relative = (value: number, expected: number) => Math.abs(value - expected) / Math.abs(expected);
const ODD_TRIAL = 'potential: x^2/2\ntrial: x*exp(-a*x^2)\nparameters:\n  a: { start: 0.3, min: 0.05, max: 5 }';
const context = { file: FILE, git: null, provenance: { tool: 'groundwork test', node: process.version, dependencies: {}, settings: {} } };

describe('the level a trial is compared with', () => {
  it.each([
    ['recognised from the trial', ''],
    ['declared', 'symmetry: odd\n'],
  ])('x exp(-a x^2) on x^2/2, %s, is compared with the lowest odd level 3/2, with E1 = 7/2', (_how, declared) => {
    const result = run(`id: odd-osc\n${declared}${ODD_TRIAL}`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    // Exact at a = omega/2 = 1/2: x exp(-x^2/2) is the n = 1 eigenfunction, E = 3/2.
    expect(relative(result.energy!.value, 1.5)).toBeLessThan(1e-9);
    expect(result.parameters.a.value).toBeCloseTo(0.5, 6);
    expect(result.reference!.level).toEqual({ index: 0, symmetry: 'odd' });
    expect(relative(result.reference!.energy!, 1.5)).toBeLessThan(1e-9);
    // Temple's E1 is the next odd level, n = 3: 7/2.
    expect(relative(result.reference!.excited!, 3.5)).toBeLessThan(1e-9);
    expect(Math.abs(result.errors.vsGrid!)).toBeLessThan(1e-9);
    expect(result.bounds.lower!).toBeLessThanOrEqual(1.5 + 1e-9);
    expect(result.bounds.lower!).toBeGreaterThan(1.5 - 1e-6);
    // The trial is the exact odd state, so its overlap with the targeted grid state is 1.
    expect(result.overlap!).toBeGreaterThan(1 - 1e-8);
    expect(result.checks.find((c) => c.name === 'eckart-overlap')!.detail).toContain('lowest odd level');
    const html = renderBlockPanel(result, context);
    expect(html).toContain('reference (grid, lowest odd level)');
    expect(html).toContain('next odd level');
    expect(html).toContain('overlap with the grid state of the lowest odd level');
  }, 60_000);

  it('a Gaussian declared even keeps the ground level 1/2 and takes E1 from the next even level, 5/2', () => {
    const result = run('id: even-osc\nsymmetry: even\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.3, min: 0.05, max: 5 }');
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(result.reference!.level).toEqual({ index: 0, symmetry: 'even' });
    expect(relative(result.reference!.energy!, 0.5)).toBeLessThan(1e-9);
    expect(relative(result.reference!.excited!, 2.5)).toBeLessThan(1e-9);
    expect(result.checks.find((c) => c.name === 'symmetry')).toMatchObject({ pass: true });
  }, 60_000);

  it('level: 1 of the even levels is compared with n = 2, 5/2, and E1 = 9/2; Eckart says nothing above the lowest level', () => {
    // (x^2 - 1/2) exp(-x^2/2) is proportional to H_2(x) exp(-x^2/2): E = 5/2 exactly.
    const result = run('id: second-even\nsymmetry: even\nlevel: 1\npotential: x^2/2\ntrial: (x^2 - 0.5)*exp(-x^2/2)');
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(relative(result.energy!.value, 2.5)).toBeLessThan(1e-10);
    expect(result.reference!.level).toEqual({ index: 1, symmetry: 'even' });
    expect(relative(result.reference!.energy!, 2.5)).toBeLessThan(1e-9);
    expect(relative(result.reference!.excited!, 4.5)).toBeLessThan(1e-9);
    expect(result.checks.map((c) => c.name)).not.toContain('eckart-overlap');
    expect(result.overlap!).toBeGreaterThan(1 - 1e-8);
  }, 60_000);

  it('an odd trial in the box [-1, 1] is compared with the lowest odd box level pi^2/2, not the ground level', () => {
    // psi = x (1 - x^2): <T> = (1/2) int (1 - 3x^2)^2 / int x^2 (1 - x^2)^2 = (1/2)(8/5)/(16/105) = 21/4 (closed form).
    const result = run('id: odd-box\nbox: [-1, 1]\npotential: 0\ntrial: x*(1 - x^2)');
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(relative(result.energy!.value, 21 / 4)).toBeLessThan(1e-10);
    expect(result.reference!.level).toEqual({ index: 0, symmetry: 'odd' });
    expect(relative(result.reference!.energy!, Math.PI ** 2 / 2)).toBeLessThan(1e-9);
    expect(relative(result.reference!.excited!, 2 * Math.PI ** 2)).toBeLessThan(1e-9);
  }, 60_000);

  it('a trial that is neither even nor odd is compared with the ground level, as before', () => {
    const result = run('id: shifted\npotential: x^2/2\ntrial: exp(-a*(x - 0.1)^2)\nparameters:\n  a: { start: 0.3, min: 0.05, max: 5 }');
    expect(result.reference!.level).toEqual({ index: 0, symmetry: null });
    expect(relative(result.reference!.energy!, 0.5)).toBeLessThan(1e-9);
    expect(relative(result.reference!.excited!, 1.5)).toBeLessThan(1e-9);
  }, 60_000);

  it('a declared symmetry the trial lacks is invalid, naming the symmetry field and its line', () => {
    const result = run(`id: wrong-parity\nsymmetry: even\n${ODD_TRIAL}`);
    expect(result.status).toBe('invalid');
    expect(result.message).toContain('symmetry: even, but the trial is not even at the start values');
    expect(result.problems).toEqual([expect.objectContaining({ field: 'symmetry', line: 10, block: 'wrong-parity' })]);
  }, 60_000);

  it('a declared symmetry on a potential that is not even is invalid, naming the field', () => {
    const result = run('id: tilted\nsymmetry: odd\npotential: x^2/2 + 0.1*x\ntrial: x*exp(-a*x^2)\nparameters:\n  a: { start: 0.3, min: 0.05, max: 5 }');
    expect(result.status).toBe('invalid');
    expect(result.message).toContain('symmetry: odd needs a potential even under x -> -x');
    expect(result.message).toContain('the potential is not even');
    expect(result.problems[0]).toMatchObject({ field: 'symmetry', line: 10 });
  }, 60_000);
});
