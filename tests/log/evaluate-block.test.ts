import { describe, expect, it } from 'vitest';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import type { BlockResult } from '../../src/log/result-types.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';

// Blocks are written as in /work/shared/RECORD-FORMAT.md and go through parseRecord first, as the
// build does. Statuses and their order are those of the contract's "Status of a block".

const FILE = 'content/records/check.md';

function record(block: string): string {
  return ['---', 'title: Checks', 'author: test', 'date: 2026-01-01', 'tags: []', '---', '', 'Prose.', '', '```variational', block, '```', ''].join('\n');
}

/** The 1-based file line of the first line of the record that starts with `prefix`. */
function lineOf(text: string, prefix: string): number {
  return text.split('\n').findIndex((l) => l.startsWith(prefix)) + 1;
}

function run(block: string): { result: BlockResult; text: string } {
  const text = record(block);
  const parsed = parseRecord(FILE, text);
  expect(parsed.blocks).toHaveLength(1);
  return { result: evaluateBlock(FILE, parsed.blocks[0]), text };
}

/** Bisection to full double precision on a bracket where f changes sign (common practice). */
function bisect(f: (z: number) => number, lo: number, hi: number): number {
  let flo = f(lo);
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (mid === lo || mid === hi) break;
    const fm = f(mid);
    if (Math.sign(fm) === Math.sign(flo)) {
      lo = mid;
      flo = fm;
    } else hi = mid;
  }
  return (lo + hi) / 2;
}

const HARMONIC = 'id: ho\nmass: 1\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.3, min: 0.01, max: 10 }';

describe('evaluateBlock: blocks that cannot be evaluated are invalid', () => {
  it('a trial that does not vanish at a hard wall (box [0, 1], exp(-a x^2)) is invalid, and says so', () => {
    const { result, text } = run('id: wall\nbox: [0, 1]\npotential: "0"\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.1, max: 10 }');
    expect(result.status).toBe('invalid');
    expect(result.message).toMatch(/wall/);
    expect(result.problems.length).toBeGreaterThan(0);
    expect(result.problems[0]).toMatchObject({ file: FILE, block: 'wall', field: 'trial', line: lineOf(text, 'trial:') });
    expect(result.energy).toBeNull();
  });

  it('a trial that is not square-integrable (exp(a x^2), a in [0.1, 1]) is invalid', () => {
    const { result } = run('id: grows\npotential: x^2/2\ntrial: exp(a*x^2)\nparameters:\n  a: { start: 0.5, min: 0.1, max: 1 }');
    expect(result.status).toBe('invalid');
    expect(result.problems[0].field).toBe('trial');
    expect(result.energy).toBeNull();
  });

  it('a trial decaying too slowly, (1 + a x^2)^(-1/4) (|psi|^2 ~ 1/|x|, the integral diverges), is invalid', () => {
    const { result } = run('id: slow\npotential: x^2/(1 + x^2)\ntrial: (1 + a*x^2)^(-1/4)\nparameters:\n  a: { start: 0.5, min: 0.1, max: 1 }');
    expect(result.status).toBe('invalid');
    expect(result.message).toMatch(/norm|integra/);
  });

  it('an undeclared name in the trial is invalid on field trial, naming the name', () => {
    const { result, text } = run('id: undeclared\npotential: x^2/2\ntrial: exp(-a*x^2) * (1 + q*x^2)\nparameters:\n  a: { start: 0.5, min: 0.1, max: 2 }');
    expect(result.status).toBe('invalid');
    expect(result.problems[0].field).toBe('trial');
    expect(result.problems[0].message).toContain('q');
    expect(result.problems[0].line).toBe(lineOf(text, 'trial:'));
    expect(result.problems[0].block).toBe('undeclared');
  });

  it('the radial coordinate written as x is invalid, with a hint that the coordinate is r', () => {
    const { result } = run('id: hydrogen-x\nspace: radial\npotential: -1/r\ntrial: exp(-a*x)\nparameters:\n  a: { start: 0.5, min: 0.1, max: 3 }');
    expect(result.status).toBe('invalid');
    expect(result.problems[0].field).toBe('trial');
    expect(result.problems[0].message).toMatch(/coordinate/);
    expect(result.problems[0].message).toMatch(/\br\b/);
  });

  it('a potential that depends on a varied parameter is invalid on field potential', () => {
    const { result } = run('id: pv\npotential: a*x^2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.5, min: 0.1, max: 2 }');
    expect(result.status).toBe('invalid');
    expect(result.problems[0].field).toBe('potential');
    expect(result.problems[0].message).toContain('a');
  });

  it('a block refused by the parser stays invalid with the parser problems', () => {
    const { result } = run('id: nomass\nmass: heavy\npotential: x^2/2\ntrial: exp(-x^2)');
    expect(result.status).toBe('invalid');
    expect(result.problems[0].field).toBe('mass');
    expect(result.message).toContain('mass');
  });

  it('a trial using pi evaluates: exp(-a pi x^2) reaches the oscillator level 1/2 at a = 1/(2 pi) (any QM textbook)', () => {
    const { result } = run('id: pi1\npotential: x^2/2\ntrial: exp(-a*pi*x^2)\nparameters:\n  a: { start: 0.5, min: 0.01, max: 2 }');
    expect(result.status).toBe('confirmed');
    expect(result.energy!.value).toBeCloseTo(0.5, 9);
    expect(result.parameters.a.value).toBeCloseTo(1 / (2 * Math.PI), 5);
  });

  it('an unquoted numeric potential (potential: 0) is accepted: box ground level pi^2/2 (any QM textbook)', () => {
    const { result } = run('id: flat\nbox: [0, 1]\npotential: 0\ntrial: x*(1-x)');
    expect(result.status).toBe('confirmed');
    // x(1-x) in a unit box gives exactly 5 (common practice), above pi^2/2.
    expect(result.energy!.value).toBeCloseTo(5, 10);
    expect(result.reference!.energy).toBeCloseTo(Math.PI ** 2 / 2, 9);
  });

  it('the message of a refused property access names the token', () => {
    const { result } = run('id: pa\npotential: x^2/2\ntrial: a.constructor\nparameters:\n  a: { start: 0.5, min: 0.1, max: 2 }');
    expect(result.status).toBe('invalid');
    expect(result.message).toContain('a.constructor');
  });
});

describe('evaluateBlock: statuses of blocks that evaluate', () => {
  // Harmonic oscillator, m = hbar = omega = 1: exact ground level 1/2, first excited 3/2 (any QM
  // textbook, e.g. Griffiths, Introduction to Quantum Mechanics, 2nd ed., eq. 2.61). The Gaussian is
  // the exact ground state, at a = 1/2 (Griffiths Example 7.1).
  it('a claim that agrees (0.5 +/- 0.001) is confirmed; energy 1/2 at a = 1/2; grid levels 1/2, 3/2', () => {
    const { result } = run(`${HARMONIC}\nclaim:\n  energy: 0.5\n  tolerance: 0.001`);
    expect(result.status).toBe('confirmed');
    expect(result.message).toBeNull();
    expect(Math.abs(result.energy!.value - 0.5)).toBeLessThan(1e-10);
    expect(result.energy!.unit).toBe('hartree');
    expect(Math.abs(result.parameters.a.value - 0.5)).toBeLessThan(1e-4);
    expect(result.parameters.a.varied).toBe(true);
    expect(result.reference?.method).toBe('grid');
    expect(Math.abs(result.reference!.energy! - 0.5)).toBeLessThan(1e-8);
    expect(Math.abs(result.reference!.excited! - 1.5)).toBeLessThan(1e-8);
    expect(result.problems).toEqual([]);
  });

  it('a claim that disagrees (0.55 +/- 0.001, exact 0.5) is disputed, and the message gives both numbers', () => {
    const { result } = run(`${HARMONIC}\nclaim:\n  energy: 0.55\n  tolerance: 0.001`);
    expect(result.status).toBe('disputed');
    expect(result.message).toContain('0.55');
    expect(Math.abs(result.energy!.value - 0.5)).toBeLessThan(1e-10);
    expect(result.claim).toMatchObject({ energy: 0.55, tolerance: 0.001 });
  });

  it('an optimum on a parameter limit (a max 0.3) is unsettled; E(0.3) = a/2 + 1/(8a) (Griffiths Example 7.1)', () => {
    const { result } = run('id: limit\nmass: 1\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.2, min: 0.01, max: 0.3 }');
    expect(result.status).toBe('unsettled');
    expect(result.message).toMatch(/limit/);
    expect(result.parameters.a.value).toBe(0.3);
    expect(Math.abs(result.energy!.value - (0.3 / 2 + 1 / (8 * 0.3)))).toBeLessThan(1e-10);
  });

  it('unsettled wins over disputed (contract order) when both apply', () => {
    const { result } = run('id: both\nmass: 1\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.2, min: 0.01, max: 0.3 }\nclaim:\n  energy: 0.9\n  tolerance: 0.001');
    expect(result.status).toBe('unsettled');
  });

  it('a published reference set wrong (0.60000, "deliberately wrong"; true level 0.5) gives below-reference', () => {
    // Written 0.60000 so its implied tolerance (a unit in the last digit, 1e-5) is far below the
    // 0.1 gap; written "0.6" the implied tolerance would be 0.1 and 0.5 would sit on its edge.
    const { result } = run(`${HARMONIC}\nreference:\n  energy: 0.60000\n  source: "deliberately wrong"`);
    expect(result.status).toBe('below-reference');
    expect(result.message).toContain('deliberately wrong');
    expect(result.reference?.published).toMatchObject({ energy: 0.6, source: 'deliberately wrong' });
  });

  it('a correct published reference (0.5, any QM textbook) with the grid switched off is confirmed', () => {
    const { result } = run(`${HARMONIC}\nreference:\n  solve: false\n  energy: 0.5000000\n  source: "any QM textbook"`);
    expect(result.status).toBe('confirmed');
    expect(result.reference?.method).toBe('published');
    expect(result.reference?.energy).toBe(0.5);
  });

  it('particle in a box [0, 1]: the grid reference is pi^2/2 and 2 pi^2 (Griffiths eq. 2.27); a vanishing trial is confirmed above it', () => {
    const { result } = run('id: box\nbox: [0, 1]\npotential: "0"\ntrial: x*(1 - x)*(1 + a*x*(1 - x))\nparameters:\n  a: { start: 0.1, min: -1, max: 10 }');
    expect(result.status).toBe('confirmed');
    const ground = Math.PI ** 2 / 2;
    expect(Math.abs(result.reference!.energy! - ground) / ground).toBeLessThan(1e-8);
    expect(Math.abs(result.reference!.excited! - 4 * ground) / (4 * ground)).toBeLessThan(1e-8);
    // Variational principle: an upper bound, here within 1e-4 relative (x(1-x) alone gives 5, 1.3% high;
    // the one-parameter correction closes most of the gap).
    expect(result.energy!.value).toBeGreaterThan(ground);
    expect((result.energy!.value - ground) / ground).toBeLessThan(1e-4);
  });

  it('finite square well (V = -5 for |x| < 1): confirmed; grid levels solve Griffiths §2.6 k tan k = kappa and -k cot k = kappa', () => {
    const { result } = run('id: well\npotential: "abs(x) < 1 ? -5 : 0"\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.5, min: 0.01, max: 20 }');
    expect(result.status).toBe('confirmed');
    // Griffiths, Introduction to Quantum Mechanics, 2nd ed., §2.6 (well of half-width a = 1, depth
    // V0 = 5, m = hbar = 1): z = k a, z0 = a sqrt(2 m V0) / hbar, even states tan z = sqrt((z0/z)^2 - 1),
    // odd states -cot z = sqrt((z0/z)^2 - 1); E = z^2 / 2 - V0.
    const z0 = Math.sqrt(10);
    const even = bisect((z) => z * Math.tan(z) - Math.sqrt(z0 * z0 - z * z), 1e-9, Math.PI / 2 - 1e-12);
    const odd = bisect((z) => -z / Math.tan(z) - Math.sqrt(z0 * z0 - z * z), Math.PI / 2 + 1e-12, z0);
    const e0 = (even * even) / 2 - 5;
    const e1 = (odd * odd) / 2 - 5;
    expect(e0).toBeGreaterThan(-5);
    expect(e0).toBeLessThan(e1);
    expect(Math.abs(result.reference!.energy! - e0) / Math.abs(e0)).toBeLessThan(1e-8);
    expect(Math.abs(result.reference!.excited! - e1) / Math.abs(e1)).toBeLessThan(1e-8);
    // A Gaussian is not the eigenfunction: strictly above the ground level, below the first excited.
    expect(result.energy!.value).toBeGreaterThan(e0);
    expect(result.energy!.value).toBeLessThan(e1);
  });

  it('the same well written with a chained comparison gives the same energy', () => {
    const a = run('id: w1\npotential: "abs(x) < 1 ? -5 : 0"\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.5, min: 0.01, max: 20 }').result;
    const b = run('id: w2\npotential: "-1 < x < 1 ? -5 : 0"\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.5, min: 0.01, max: 20 }').result;
    expect(b.status).toBe('confirmed');
    expect(Math.abs(a.energy!.value - b.energy!.value)).toBeLessThan(1e-12);
  });

  it('hydrogen, radial, l = 0: exp(-a r) reaches -1/2 hartree at a = 1 (any QM textbook; Griffiths eq. 4.70)', () => {
    const { result } = run('id: h\nspace: radial\npotential: -1/r\ntrial: exp(-a*r)\nparameters:\n  a: { start: 0.5, min: 0.1, max: 3 }\nclaim:\n  energy: -0.5\n  tolerance: 0.0001');
    expect(result.status).toBe('confirmed');
    expect(Math.abs(result.energy!.value + 0.5)).toBeLessThan(1e-8);
    expect(Math.abs(result.parameters.a.value - 1)).toBeLessThan(1e-4);
  });
});
