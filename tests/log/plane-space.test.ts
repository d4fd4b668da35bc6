import { describe, expect, it } from 'vitest';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import type { BlockResult } from '../../src/log/result-types.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';

// Blocks on space plane as a record states them (RECORD-FORMAT.md "More dimensions"), through parseRecord and evaluateBlock.

const FILE = 'content/records/plane.md';

function run(block: string): BlockResult {
  const text = ['---', 'title: Plane', 'author: test', 'date: 2026-01-01', 'tags: []', '---', '', '```variational', block, '```', ''].join('\n');
  return evaluateBlock(FILE, parseRecord(FILE, text).blocks[0]);
}

describe('space plane end to end', () => {
  // 2-D hydrogen with m = 1: R = r exp(-2 r/3) is the exact lowest level, E = -1/(2 (3/2)^2) = -2/9
  // (Yang et al., Phys. Rev. A 43, 1186 (1991)).
  it('confirms the exact 2-D hydrogen trial with m = -1 at -2/9, with the grid and Temple bound agreeing', () => {
    const result = run(`id: h2d-m1
space: plane
angular-momentum: -1
potential: -1/r
trial: r * exp(-a*r)
parameters:
  a: { start: 1, min: 0.05, max: 5 }
claim: { energy: -0.2222222222, tolerance: 1e-9 }`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(Math.abs(result.energy!.value + 2 / 9)).toBeLessThan(1e-9);
    expect(Math.abs(result.parameters.a.value - 2 / 3)).toBeLessThan(1e-5);
    expect(Math.abs(result.bounds.lower! + 2 / 9)).toBeLessThan(1e-8);
    expect(Math.abs(result.reference!.energy! + 2 / 9)).toBeLessThan(1e-9);
    // The next level of the same m: n = 3, E = -1/(2 (5/2)^2) = -0.08 (Yang et al. 1991).
    expect(Math.abs(result.reference!.excited! + 0.08)).toBeLessThan(1e-9);
  });

  // 2-D oscillator V = r^2/2 with a Gaussian: E(a) = a + 1/(4a) for m = 0 (elementary: <T> = a, <V> = 1/(4a)),
  // least at a = 1/2 with the exact hbar omega = 1 (textbook, 2 n_r + |m| + 1).
  it('finds the 2-D oscillator ground level with a Gaussian, and the overlap with the grid state is 1', () => {
    const result = run(`id: osc2d
space: plane
potential: r^2/2
trial: exp(-a*r^2)
parameters:
  a: { start: 0.3, min: 0.01, max: 5 }`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(Math.abs(result.energy!.value - 1)).toBeLessThan(1e-9);
    expect(Math.abs(result.overlap! - 1)).toBeLessThan(1e-8);
    expect(result.variance!).toBeLessThan(1e-12);
  });

  it('refuses a non-integer m, naming the field', () => {
    const result = run(`id: bad-m
space: plane
angular-momentum: 0.5
potential: r^2/2
trial: exp(-a*r^2)
parameters:
  a: { start: 0.3, min: 0.01, max: 5 }`);
    expect(result.status).toBe('invalid');
    expect(result.problems[0].field).toBe('angular-momentum');
    expect(result.problems[0].line).toBe(11);
    expect(result.problems[0].message).toMatch(/integer/);
  });

  it('refuses a negative l on the radial space, and angular-momentum on the line', () => {
    const radial = run(`id: bad-l\nspace: radial\nangular-momentum: -1\npotential: -1/r\ntrial: exp(-r)`);
    expect(radial.status).toBe('invalid');
    expect(radial.problems[0].field).toBe('angular-momentum');
    const line = run(`id: bad-line\nangular-momentum: 1\npotential: x^2\ntrial: exp(-x^2)`);
    expect(line.problems[0].message).toMatch(/radial, plane and axial only/);
  });
});
