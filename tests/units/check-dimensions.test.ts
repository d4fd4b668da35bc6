import { describe, expect, it } from 'vitest';
import { ACTION, ANY, DIMENSIONLESS, ENERGY, LENGTH, MASS, describeDimension, type DimensionOrAny } from '../../src/units/dimension.ts';
import type { DimensionScope } from '../../src/units/check-dimensions.ts';
import { analyseExpression } from '../../src/units/quantity-expression.ts';

// The rules are those of dimensional analysis (e.g. Bridgman, "Dimensional Analysis", 1922):
// sums and comparisons need equal dimensions, arguments of exp, log and the trigonometric and
// hyperbolic functions must be dimensionless, sqrt halves the exponents. The coordinate x is a length
// (RECORD-FORMAT.md, "Quantity mode"). Atomic-unit values in the scope are placeholders: only
// exponents are evaluated here.

const INVERSE_AREA: DimensionOrAny = [0, -2, 0, 0, 0];
const scope: DimensionScope = {
  variables: { x: LENGTH, a: INVERSE_AREA, b: DIMENSIONLESS },
  constants: {
    pi: { dimension: DIMENSIONLESS, atomic: Math.PI },
    e: { dimension: DIMENSIONLESS, atomic: Math.E },
    hbar: { dimension: ACTION, atomic: 1 },
    mass: { dimension: MASS, atomic: 0.067 },
    V0: { dimension: ENERGY, atomic: 0.01 },
    n: { dimension: DIMENSIONLESS, atomic: 4 },
    k: { dimension: [1, 0, -2, 0, 0], atomic: 1 },
    zero: { dimension: ANY, atomic: 0 },
  },
};

function dimensionOf(text: string) {
  const result = analyseExpression(text, scope);
  if (!result.ok) throw new Error(`${text}: ${result.message}`);
  return result.dimension;
}

function refusal(text: string) {
  const result = analyseExpression(text, scope);
  if (result.ok) throw new Error(`expected ${text} to be refused`);
  return result;
}

describe('dimensions of accepted expressions', () => {
  it.each([
    ['a harmonic trap', 'k x^2 / 2', ENERGY],
    ['a Gaussian trial with a in nm^-2', 'exp(-a x^2) * (1 + b)', DIMENSIONLESS],
    ['a unit after a number', '0.5 meV/nm^2 * x^2', ENERGY],
    ['a number-led product before a unit', '2 pi THz', [0, 0, -1, 0, 0]],
    ['a parenthesised quantity', 'x / (1 nm)', DIMENSIONLESS],
    ['sqrt halves: the oscillator quantum', 'hbar sqrt(k / mass)', ENERGY],
    ['a dimensioned base to a fixed exponent from a constant', 'V0 * (x / (1 nm))^n + 1 meV nm^-4 * x^n', ENERGY],
    ['a physical constant anywhere', '-(elementaryCharge^2)/(4 pi electricConstant x)', ENERGY],
    ['zero beside an energy, compared with a length', 'abs(x) < 0.5 nm ? -V0 : 0', ENERGY],
    ['zero compared with a length', 'x < 0 ? V0 : 2 V0', ENERGY],
    ['min and max of lengths', 'min(x, 1 nm) + max(x, 2 angstrom)', LENGTH],
    ['a dimensionless base to a varying power', '(x / (1 nm))^b', DIMENSIONLESS],
  ])('%s: %s', (_label, text, expected) => {
    expect(describeDimension(dimensionOf(text))).toBe(describeDimension(expected as DimensionOrAny));
  });

  it('collects the mathjs units and constants an expression names, sized in atomic units', () => {
    const result = analyseExpression('-(elementaryCharge^2)/(4 pi electricConstant x) + 2 meV', scope);
    if (!result.ok) throw new Error(result.message);
    expect([...result.physical.keys()].sort()).toEqual(['electricConstant', 'elementaryCharge', 'meV']);
    // 4 pi eps0 = 1 in Hartree atomic units (CODATA 2018, "atomic units").
    expect(result.physical.get('electricConstant')!.atomic).toBeCloseTo(1 / (4 * Math.PI), 12);
  });
});

describe('refusals name the offending term', () => {
  it.each([
    ['exp of a length', 'exp(-x)', ['exp(-x)', '-x is a length', 'dimensionless argument']],
    ['a sum of a length and an energy', 'x + V0', ['x + V0', 'x is a length', 'V0 is an energy']],
    ['a comparison of a length with a number', 'x < 1 ? V0 : 0', ['x < 1', 'x is a length', '1 is dimensionless']],
    ['branches of different dimension', 'x < 0 nm ? V0 : x', ['V0 is an energy', 'x is a length', 'branches']],
    ['a dimensioned exponent', '2^x', ['exponent x', 'a length']],
    ['a varying exponent on a dimensioned base', 'x^b', ['x ^ b', 'fixed number', 'b is varied']],
    ['a unit not after a number', 'V0 exp(-x/nm)', ['nm is a unit of length', 'only follow a number', 'in parentheses']],
    ['an undeclared name that spells a unit', 'V0 * x / m', ['m is a unit of length', 'declare it']],
    ['a temperature scale with an offset', '1 degC', ['offset']],
    ['an unknown name', 'V1 x', ['unknown name V1']],
    ['a function outside the allow-list', 'gamma(x)', ['function gamma is not allowed']],
  ])('%s: %s', (_label, text, fragments) => {
    const { message } = refusal(text);
    for (const fragment of fragments) expect(message).toContain(fragment);
  });

  it('declared names win over units of the same spelling', () => {
    const withM: DimensionScope = { ...scope, constants: { ...scope.constants, m: { dimension: ENERGY, atomic: 1 } } };
    const result = analyseExpression('m * exp(-a x^2)', withM);
    expect(result.ok && describeDimension(result.dimension)).toBe('an energy');
  });
});
