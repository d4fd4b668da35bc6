import { describe, expect, it } from 'vitest';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import type { BlockResult } from '../../src/log/result-types.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';

// Basis blocks (RECORD-FORMAT.md `basis`, `states`) go through parseRecord and evaluateBlock as the build does.

const FILE = 'content/records/basis.md';

function run(block: string): BlockResult {
  const text = ['---', 'title: Basis', 'author: test', 'date: 2026-01-01', 'tags: []', '---', '', '```variational', block, '```', ''].join('\n');
  const parsed = parseRecord(FILE, text);
  return evaluateBlock(FILE, parsed.blocks[0]);
}

/** x^k (1 - x) for k = 1..n: polynomials that vanish at both walls of [0, 1]. */
const boxBasis = (n: number) => Array.from({ length: n }, (_, k) => `  - x^${k + 1}*(1 - x)`).join('\n');

describe('the linear variational method through the whole evaluation', () => {
  it('a polynomial basis in a box gives upper bounds to n^2 pi^2 / 2 that tighten as it grows', () => {
    // Particle in a box of width 1, mass 1: E_n = n^2 pi^2 / 2 (Griffiths, Introduction to Quantum Mechanics, section 2.2).
    const exact = [1, 2, 3].map((n) => (n * n * Math.PI * Math.PI) / 2);
    let previous = [Infinity, Infinity, Infinity];
    for (const size of [4, 6, 8]) {
      const result = run(`id: box-${size}\nspace: line\nbox: [0, 1]\nmass: 1\npotential: 0\nbasis:\n${boxBasis(size)}\nstates: 3`);
      expect(result.status).toBe('confirmed');
      expect(result.states).toHaveLength(3);
      result.states.forEach((state, k) => {
        // Hylleraas–Undheim–MacDonald (MacDonald, Phys. Rev. 43, 830 (1933)): each level bounds its exact partner from above
        // and does not rise when the basis grows.
        expect(state.energy).toBeGreaterThanOrEqual(exact[k] - 1e-9);
        expect(state.energy).toBeLessThanOrEqual(previous[k] + 1e-9);
        // The grid reference reproduces the exact level of the same index.
        expect(Math.abs(state.reference! - exact[k]) / exact[k]).toBeLessThan(1e-9);
      });
      previous = result.states.map((s) => s.energy);
    }
    // With x..x^8 times (1 - x) the ground level is within 1e-8 of pi^2/2 (the basis spans degree-9 polynomials).
    expect(Math.abs(previous[0] - exact[0]) / exact[0]).toBeLessThan(1e-8);
  });

  it('an oscillator basis with a varied width converges to the Morse levels of P7', () => {
    // Morse, Phys. Rev. 34, 57 (1929): E_n = w(n + 1/2) - w^2 (n + 1/2)^2 / (4 D), w = alpha sqrt(2 D / m); D = 10, alpha = 0.5, m = 1.
    const w = 0.5 * Math.sqrt(20);
    const morse = (n: number) => w * (n + 0.5) - (w * w * (n + 0.5) ** 2) / 40;
    const errors: number[] = [];
    for (const size of [4, 10]) {
      const basis = Array.from({ length: size }, (_, k) => `  - (x - 1)^${k}*exp(-a*(x - 1)^2)`).join('\n');
      const result = run(`id: morse-${size}\nmass: 1\nconstants:\n  D: 10\n  alpha: 0.5\npotential: D*(1 - exp(-alpha*x))^2\nbasis:\n${basis}\nparameters:\n  a: { start: 0.5, min: 0.05, max: 5 }\nstates: 2`);
      expect(result.status).toBe('confirmed');
      expect(result.states[0].energy).toBeGreaterThanOrEqual(morse(0) - 1e-9);
      expect(result.states[1].energy).toBeGreaterThanOrEqual(morse(1) - 1e-9);
      expect(Math.abs(result.states[0].reference! - morse(0)) / morse(0)).toBeLessThan(1e-9);
      expect(Math.abs(result.states[1].reference! - morse(1)) / morse(1)).toBeLessThan(1e-9);
      errors.push((result.states[0].energy - morse(0)) / morse(0));
    }
    expect(errors[1]).toBeLessThan(errors[0] / 10);
    expect(errors[1]).toBeLessThan(2e-5);
  });

  it('a basis that spans fewer combinations than the levels asked is unsettled, saying so', () => {
    const result = run('id: short\npotential: x^2/2\nbasis:\n  - exp(-x^2/2)\n  - x^2*exp(-x^2/2)\nstates: 3');
    expect(result.status).toBe('unsettled');
    expect(result.checks.find((c) => c.name === 'states-available')?.detail).toMatch(/spans only 2/);
  });

  it('a basis function that breaks a wall makes the block invalid, naming the basis', () => {
    const result = run('id: wall\nbox: [0, 1]\npotential: 0\nbasis:\n  - x*(1 - x)\n  - x\nstates: 1');
    expect(result.status).toBe('invalid');
    expect(result.problems[0].field).toBe('basis');
    expect(result.message).toMatch(/basis\[1\]|wall/);
  });
});

describe('a basis with dependent functions', () => {
  // f = x(1-x), g = x^2(1-x) on [0, 1]; overlaps are Beta integrals B(a+1, b+1) = a! b!/(a+b+1)!:
  // <f|f> = 1/30, <f|g> = 1/60, <g|g> = 1/105 (Abramowitz & Stegun 6.2.1-6.2.2).
  const ff = 1 / 30;
  const fg = 1 / 60;
  const gg = 1 / 105;

  it('two identical functions: numerically singular, one direction dropped, the kept conditioning finite', () => {
    const result = run(`id: twice\nbox: [0, 1]\npotential: 0\nbasis:\n  - x*(1 - x)\n  - x*(1 - x)\n  - x^2*(1 - x)\nstates: 2`);
    expect(result.status).toBe('confirmed');
    expect(result.basis).toMatchObject({ functions: 3, kept: 2, dropped: 1, conditionNumber: null });
    // Kept pair {f, g}: unit-diagonal overlap eigenvalues (3 +/- 2 sqrt 2)/2 with rho^2 = fg^2/(ff gg) = 7/8.
    expect(fg ** 2 / (ff * gg)).toBeCloseTo(7 / 8, 14);
    expect(Math.abs(result.basis!.keptConditionNumber - (17 + 12 * Math.SQRT2)) / 34).toBeLessThan(1e-8);
    expect(result.basis!.conditioning).toBe('numerically singular: 1 of 3 directions dropped as near-dependent; condition number 34.0 over the 2 kept');
    expect(JSON.stringify(result)).not.toMatch(/Infinity/);
    // The box ground level pi^2/2 (Griffiths 2.2) is still bounded from above by the kept span.
    expect(result.energy!.value).toBeGreaterThanOrEqual((Math.PI * Math.PI) / 2);
  });

  it('two nearly dependent functions: the finite condition number of the 2 x 2 overlap matrix', () => {
    // f and f + d g: unit-diagonal off-diagonal c = <f|f+dg>/sqrt(<f|f><f+dg|f+dg>); eigenvalues 1 +/- c.
    const d = 1e-3;
    const c = (ff + d * fg) / Math.sqrt(ff * (ff + 2 * d * fg + d * d * gg));
    const exact = (1 + c) / (1 - c);
    const result = run(`id: close\nbox: [0, 1]\npotential: 0\nbasis:\n  - x*(1 - x)\n  - x*(1 - x) + ${d}*x^2*(1 - x)\nstates: 1`);
    expect(result.basis!.dropped).toBe(0);
    // 1 - c is about 1e-7: rounding of S (1e-16) moves it by about 1e-9 relative.
    expect(Math.abs(result.basis!.conditionNumber! - exact) / exact).toBeLessThan(1e-6);
    expect(result.basis!.conditioning).toBe(`condition number ${exact.toPrecision(3)}`);
  });
});
