import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { checkExpression } from '../../src/expr/allow-list.ts';
import { compileTree } from '../../src/expr/compile.ts';
import { differentiate } from '../../src/expr/differentiate.ts';

// The compiler's shortcuts (whole powers by multiplication, numbers folded at compile time,
// closures shared between a tree and its derivatives with a one-value memo) checked against
// mathjs's own evaluator, a general-purpose reference library, and against closed forms.

const SLOT = { x: 0, a: 1 } as const;
const CONSTANTS = { k: 3, pi: Math.PI };
const tree = (text: string) => {
  const checked = checkExpression(text, { variables: ['x', 'a'], constants: CONSTANTS });
  if (!checked.ok) throw new Error(`${text}: ${checked.message}`);
  return checked.tree;
};
const relativeError = (value: number, exact: number) => Math.abs(value - exact) / Math.abs(exact);

describe('compileTree shortcuts', () => {
  it('multiplies out whole powers to within a few ulp of mathjs, for bases of either sign', () => {
    for (const n of [2, 3, 4, 5, 7, 8, 13, 31, 64, 65]) {
      const f = compileTree(tree(`x^${n}`), SLOT, CONSTANTS);
      for (const x of [-2.5, -0.7, 0.3, 1.0000001, 1.9]) {
        const reference = evaluate(`x^${n}`, { x }) as number;
        // The binary method rounds about log2(n) + popcount(n) times (Knuth, TAOCP vol. 2, 4.6.3).
        expect(relativeError(f(Float64Array.of(x, 0)), reference), `x^${n} at ${x}`).toBeLessThan(16 * Number.EPSILON);
      }
    }
  });

  it('keeps the IEEE values of powers at 0, infinity and NaN', () => {
    // x^n for whole n >= 2 at these points (IEEE 754 and ECMAScript Math.pow agree on them)
    const cube = compileTree(tree('x^3'), SLOT, CONSTANTS);
    expect(cube(Float64Array.of(-0, 0))).toBe(-0);
    expect(cube(Float64Array.of(-Infinity, 0))).toBe(-Infinity);
    expect(cube(Float64Array.of(NaN, 0))).toBeNaN();
    expect(compileTree(tree('x^4'), SLOT, CONSTANTS)(Float64Array.of(1e80, 0))).toBe(Infinity);
  });

  it('computes subtrees without variables once, to the value mathjs gives at run time', () => {
    const f = compileTree(tree('(k^2 + sqrt(pi)) * x - exp(k/2)'), SLOT, CONSTANTS);
    const reference = evaluate('(k^2 + sqrt(pi)) * x - exp(k/2)', { ...CONSTANTS, x: 1.25 }) as number;
    expect(relativeError(f(Float64Array.of(1.25, 0)), reference)).toBeLessThan(4 * Number.EPSILON);
  });

  it('gives the trial and its derivative fresh values at every point and parameter, though they share exp(-a x^2)', () => {
    // d/dx exp(-a x^2) = -2 a x exp(-a x^2) (table of derivatives)
    const trial = tree('exp(-a*x^2)');
    const value = compileTree(trial, SLOT, CONSTANTS);
    const slope = compileTree(differentiate(trial, 'x'), SLOT, CONSTANTS);
    const slots = new Float64Array(2);
    // Repeated x with a changed a, repeated a with a changed x, and a*x^2 repeated with both changed.
    for (const [x, a] of [[0.5, 1], [0.5, 2], [1.5, 2], [1, 4.5], [1.5, 2], [-0.5, 2]]) {
      slots[0] = x;
      slots[1] = a;
      const exact = Math.exp(-a * x * x);
      expect(value(slots)).toBe(exact);
      expect(relativeError(slope(slots), -2 * a * x * exact)).toBeLessThan(4 * Number.EPSILON);
      expect(value(slots)).toBe(exact);
    }
  });

  it('tells the two zeros apart where a function does not remember its last value', () => {
    // sqrt(-0) = -0 but sqrt(+0) = +0 (IEEE 754), so 1/sqrt(u) is -Infinity, then +Infinity
    const f = compileTree(tree('1/sqrt(x)'), SLOT, CONSTANTS);
    expect(f(Float64Array.of(-0, 0))).toBe(-Infinity);
    expect(f(Float64Array.of(0, 0))).toBe(Infinity);
  });
});
