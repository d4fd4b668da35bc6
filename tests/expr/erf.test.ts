import { erf as referenceErf } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { erf } from '../../src/expr/erf.ts';

// Tabulated values: Abramowitz & Stegun, Handbook of Mathematical Functions, Table 7.1 (10 decimals;
// the digits below are from memory). The sweep compares with mathjs's erf, a general-purpose
// reference library (W. J. Cody's rational Chebyshev approximations, per the mathjs documentation).
const TABLE_7_1: Array<[number, number]> = [
  [0.1, 0.1124629160],
  [0.5, 0.5204998778],
  [1, 0.8427007929],
  [1.5, 0.9661051465],
  [2, 0.9953222650],
  [3, 0.9999779095],
];

describe('erf', () => {
  it.each(TABLE_7_1)('erf(%s) matches A&S Table 7.1 to its 10 decimals (from memory)', (x, value) => {
    expect(Math.abs(erf(x) - value)).toBeLessThan(6e-11);
  });

  it('is odd: erf(-x) = -erf(x) (A&S 7.1.9)', () => {
    for (const [x, value] of TABLE_7_1) expect(Math.abs(erf(-x) + value)).toBeLessThan(6e-11);
    for (let x = 0.05; x < 7; x += 0.37) expect(erf(-x)).toBe(-erf(x));
  });

  it('erf(0) = 0, erf -> +-1 for large |x|, erf(NaN) = NaN (A&S 7.1.1 and its limits)', () => {
    expect(erf(0)).toBe(0);
    for (const x of [6, 27, 1e5, 1e200, 1.7e308]) {
      expect(erf(x)).toBe(1);
      expect(erf(-x)).toBe(-1);
    }
    expect(erf(NaN)).toBeNaN();
  });

  // Found while writing these tests: erf(Infinity) and erf(-Infinity) return NaN (the continued
  // fraction computes Infinity * 1e-300 * ...); the limits are +-1 (see the report).
  it('erf(+-Infinity) = +-1 (A&S 7.1.16: erf tends to 1)', () => {
    expect(erf(Infinity)).toBe(1);
    expect(erf(-Infinity)).toBe(-1);
  });

  it('near 0 follows the Maclaurin series erf(x) ~ 2/sqrt(pi) (x - x^3/3) (A&S 7.1.5)', () => {
    for (const x of [1e-300, 1e-10, 1e-4]) {
      const series = (2 / Math.sqrt(Math.PI)) * (x - x ** 3 / 3);
      expect(Math.abs(erf(x) - series) / series).toBeLessThan(1e-14);
    }
  });

  it('erfc for large x follows the asymptotic series exp(-x^2)/(x sqrt(pi)) (1 - 1/(2x^2) + 3/(4x^4)) (A&S 7.1.23)', () => {
    // erf(x) rounds to 1 there, so compare 1 - erf(x) only where it is still resolvable.
    const x = 5;
    const asymptotic = (Math.exp(-x * x) / (x * Math.sqrt(Math.PI))) * (1 - 1 / (2 * x * x) + 3 / (4 * x ** 4) - 15 / (8 * x ** 6));
    expect(Math.abs(1 - erf(x) - asymptotic)).toBeLessThan(2e-16);
  });

  it('agrees with mathjs erf to 1e-14 absolute on a sweep from -6 to 6', () => {
    let worst = 0;
    let at = 0;
    for (let i = 0; i <= 12_000; i++) {
      const x = -6 + i * 0.001;
      const diff = Math.abs(erf(x) - referenceErf(x));
      if (diff > worst) {
        worst = diff;
        at = x;
      }
    }
    expect(worst, `worst difference at x = ${at}`).toBeLessThan(1e-14);
  });

  it('is continuous and increasing across x = 3, where the method changes (d erf/dx = 2/sqrt(pi) exp(-x^2), A&S 7.1.19)', () => {
    const h = 1e-6;
    const slope = (2 / Math.sqrt(Math.PI)) * Math.exp(-9);
    const jump = erf(3 + h) - erf(3 - h);
    expect(jump).toBeGreaterThan(0);
    expect(Math.abs(jump - 2 * h * slope)).toBeLessThan(1e-15);
  });

  it('is monotone non-decreasing on a fine grid from -6 to 6', () => {
    let previous = erf(-6);
    for (let i = 1; i <= 12_000; i++) {
      const value = erf(-6 + i * 0.001);
      expect(value).toBeGreaterThanOrEqual(previous);
      previous = value;
    }
  });
});
