import { describe, expect, it } from 'vitest';
import { checkExpression } from '../../src/expr/allow-list.ts';
import { compileTree } from '../../src/expr/compile.ts';
import { differentiate } from '../../src/expr/differentiate.ts';

// Derivatives are checked two independent ways: against closed forms from a table of derivatives
// (any calculus text; the erf rule is Abramowitz & Stegun 7.1.19) and against central finite
// differences f'(x) ~ (f(x+h) - f(x-h)) / 2h, whose error is O(h^2) (common practice).

const SLOT = { x: 0, a: 1, b: 2 } as const;
const CONSTANTS = { k: 3, pi: Math.PI, e: Math.E };

/** Parses through the allow-list, then returns f, f' and f'' in x as plain functions of (x, a, b). */
function derivatives(text: string) {
  const checked = checkExpression(text, { variables: ['x', 'a', 'b'], constants: CONSTANTS });
  if (!checked.ok) throw new Error(`${text}: ${checked.message}`);
  const d1 = differentiate(checked.tree, 'x');
  const d2 = differentiate(d1, 'x');
  const slots = new Float64Array(3);
  const at = (tree: typeof d1) => {
    const f = compileTree(tree, SLOT, CONSTANTS);
    return (x: number, a = 0.7, b = 1.3) => {
      slots[0] = x;
      slots[1] = a;
      slots[2] = b;
      return f(slots);
    };
  };
  return { f: at(checked.tree), d1: at(d1), d2: at(d2), tree: checked.tree };
}

const central = (f: (x: number) => number, x: number, h = 1e-5) => (f(x + h) - f(x - h)) / (2 * h);

function close(actual: number, expected: number, relative: number) {
  expect(Math.abs(actual - expected), `${actual} vs ${expected}`).toBeLessThanOrEqual(relative * Math.max(1, Math.abs(expected)));
}

const POINTS = [-2.3, -1.1, -0.4, 0.25, 0.9, 1.7, 2.6];
const POSITIVE = [0.2, 0.6, 1.1, 1.9, 3.4];
const sech = (x: number) => 1 / Math.cosh(x);
const A = 0.7; // the parameter value the helper uses

describe('differentiate: closed forms (table of derivatives)', () => {
  it('d/dx exp(-a x^2) = -2 a x exp(-a x^2); second derivative (4a^2x^2 - 2a) exp(-a x^2)', () => {
    const { d1, d2 } = derivatives('exp(-a*x^2)');
    for (const x of POINTS) {
      close(d1(x), -2 * A * x * Math.exp(-A * x * x), 1e-14);
      close(d2(x), (4 * A * A * x * x - 2 * A) * Math.exp(-A * x * x), 1e-14);
    }
  });

  it('d/dx sech(x) = -sech(x) tanh(x); second derivative sech(x)(tanh^2 x - sech^2 x)', () => {
    const { d1, d2 } = derivatives('sech(x)');
    for (const x of POINTS) {
      close(d1(x), -sech(x) * Math.tanh(x), 1e-14);
      close(d2(x), sech(x) * (Math.tanh(x) ** 2 - sech(x) ** 2), 1e-14);
    }
  });

  it('d/dx erf(x) = 2/sqrt(pi) exp(-x^2) (A&S 7.1.19); second derivative -4x/sqrt(pi) exp(-x^2)', () => {
    const { d1, d2 } = derivatives('erf(x)');
    for (const x of POINTS) {
      close(d1(x), (2 / Math.sqrt(Math.PI)) * Math.exp(-x * x), 1e-14);
      close(d2(x), ((-4 * x) / Math.sqrt(Math.PI)) * Math.exp(-x * x), 1e-14);
    }
  });

  it('chain rule through erf: d/dx erf(a x) = 2a/sqrt(pi) exp(-a^2 x^2)', () => {
    const { d1 } = derivatives('erf(a*x)');
    for (const x of POINTS) close(d1(x), ((2 * A) / Math.sqrt(Math.PI)) * Math.exp(-A * A * x * x), 1e-14);
  });

  it('trigonometric and hyperbolic functions', () => {
    const cases: Array<[string, (x: number) => number, (x: number) => number]> = [
      ['sin(x)', Math.cos, (x) => -Math.sin(x)],
      ['cos(x)', (x) => -Math.sin(x), (x) => -Math.cos(x)],
      ['tan(x)', (x) => 1 / Math.cos(x) ** 2, (x) => (2 * Math.tan(x)) / Math.cos(x) ** 2],
      ['sinh(x)', Math.cosh, Math.sinh],
      ['cosh(x)', Math.sinh, Math.cosh],
      ['tanh(x)', (x) => sech(x) ** 2, (x) => -2 * sech(x) ** 2 * Math.tanh(x)],
    ];
    for (const [text, first, second] of cases) {
      const { d1, d2 } = derivatives(text);
      for (const x of [-1.2, -0.3, 0.5, 1.1]) {
        close(d1(x), first(x), 1e-13);
        close(d2(x), second(x), 1e-13);
      }
    }
  });

  it('log and sqrt: d/dx log x = 1/x, d2 = -1/x^2; d/dx sqrt x = 1/(2 sqrt x), d2 = -1/(4 x^(3/2))', () => {
    const log = derivatives('log(x)');
    const sqrt = derivatives('sqrt(x)');
    for (const x of POSITIVE) {
      close(log.d1(x), 1 / x, 1e-14);
      close(log.d2(x), -1 / (x * x), 1e-14);
      close(sqrt.d1(x), 1 / (2 * Math.sqrt(x)), 1e-14);
      close(sqrt.d2(x), -1 / (4 * x ** 1.5), 1e-14);
    }
  });

  it('powers x^n: integer, negative, fractional, and a symbolic exponent a', () => {
    const cases: Array<[string, (x: number) => number, (x: number) => number]> = [
      ['x^5', (x) => 5 * x ** 4, (x) => 20 * x ** 3],
      ['x^(-3)', (x) => -3 * x ** -4, (x) => 12 * x ** -5],
      ['x^2.5', (x) => 2.5 * x ** 1.5, (x) => 3.75 * x ** 0.5],
      ['x^a', (x) => A * x ** (A - 1), (x) => A * (A - 1) * x ** (A - 2)],
      ['x^k', (x) => 3 * x ** 2, (x) => 6 * x],
    ];
    for (const [text, first, second] of cases) {
      const { d1, d2 } = derivatives(text);
      for (const x of POSITIVE) {
        close(d1(x), first(x), 1e-13);
        close(d2(x), second(x), 1e-13);
      }
    }
  });

  it('general u^v: d/dx x^x = x^x (log x + 1), d2 = x^x ((log x + 1)^2 + 1/x)', () => {
    const { d1, d2 } = derivatives('x^x');
    for (const x of POSITIVE) {
      close(d1(x), x ** x * (Math.log(x) + 1), 1e-13);
      close(d2(x), x ** x * ((Math.log(x) + 1) ** 2 + 1 / x), 1e-13);
    }
  });

  it('general u^v: d/dx 2^x = 2^x log 2 and d/dx e^(-x^2) = -2x e^(-x^2)', () => {
    const two = derivatives('2^x');
    const gauss = derivatives('e^(-x^2)');
    for (const x of POINTS) {
      close(two.d1(x), 2 ** x * Math.LN2, 1e-14);
      close(gauss.d1(x), -2 * x * Math.exp(-x * x), 1e-14);
    }
  });

  it('quotient rule: d/dx 1/(1 + x^2) = -2x/(1 + x^2)^2', () => {
    const { d1 } = derivatives('1/(1 + x^2)');
    for (const x of POINTS) close(d1(x), (-2 * x) / (1 + x * x) ** 2, 1e-14);
  });

  it('product rule: d/dx x^2 exp(-x) = (2x - x^2) exp(-x); d2 = (2 - 4x + x^2) exp(-x)', () => {
    const { d1, d2 } = derivatives('x^2*exp(-x)');
    for (const x of POINTS) {
      close(d1(x), (2 * x - x * x) * Math.exp(-x), 1e-14);
      close(d2(x), (2 - 4 * x + x * x) * Math.exp(-x), 1e-13);
    }
  });

  it('abs away from the kink: d/dx abs(x) exp(-x^2) = sign(x) (1 - 2x^2) exp(-x^2)', () => {
    const { d1 } = derivatives('abs(x)*exp(-x^2)');
    for (const x of POINTS) close(d1(x), Math.sign(x) * (1 - 2 * x * x) * Math.exp(-x * x), 1e-14);
  });

  it('exp(-a abs(x)) (a cusp at 0): d1 = -a sign(x) exp(-a|x|), d2 = a^2 exp(-a|x|) off the cusp', () => {
    const { d1, d2 } = derivatives('exp(-a*abs(x))');
    for (const x of POINTS) {
      close(d1(x), -A * Math.sign(x) * Math.exp(-A * Math.abs(x)), 1e-14);
      close(d2(x), A * A * Math.exp(-A * Math.abs(x)), 1e-14);
    }
  });

  it('a conditional is differentiated branch by branch away from the switch', () => {
    const { f, d1, d2 } = derivatives('x < 0 ? exp(x) : exp(-2*x)');
    for (const x of POINTS) {
      expect(f(x)).toBeCloseTo(x < 0 ? Math.exp(x) : Math.exp(-2 * x), 14);
      close(d1(x), x < 0 ? Math.exp(x) : -2 * Math.exp(-2 * x), 1e-14);
      close(d2(x), x < 0 ? Math.exp(x) : 4 * Math.exp(-2 * x), 1e-14);
    }
  });

  it('a chained-comparison conditional (finite well shape) has derivative 0 on each flat piece', () => {
    const { f, d1 } = derivatives('-1 < x < 1 ? -5 : 0');
    expect(f(0)).toBe(-5);
    expect(f(2)).toBe(0);
    expect(f(-1.5)).toBe(0);
    for (const x of POINTS) expect(Math.abs(d1(x))).toBe(0); // -0 and 0 are both zero
  });

  it('min and max: the derivative of the branch that wins', () => {
    const min = derivatives('min(x^2, 1)');
    const max = derivatives('max(x, x^3)');
    for (const x of POINTS) {
      close(min.d1(x), Math.abs(x) < 1 ? 2 * x : 0, 1e-14);
      close(max.d1(x), x > x ** 3 ? 1 : 3 * x * x, 1e-14);
    }
  });

  it('differentiates with respect to a parameter: d/da exp(-a x^2) = -x^2 exp(-a x^2)', () => {
    const checked = checkExpression('exp(-a*x^2)', { variables: ['x', 'a'], constants: {} });
    if (!checked.ok) throw new Error(checked.message);
    const da = compileTree(differentiate(checked.tree, 'a'), SLOT, {});
    for (const x of POINTS) close(da(Float64Array.of(x, A, 0)), -x * x * Math.exp(-A * x * x), 1e-14);
  });

  it('the derivative of an expression without x is zero', () => {
    const { d1, d2 } = derivatives('a^2 + k*b');
    expect(d1(0.3)).toBe(0);
    expect(d2(0.3)).toBe(0);
  });
});

describe('differentiate: against central finite differences', () => {
  const TRIALS = [
    'exp(-a*x^2) * (1 + b*x^2)',
    'sech(a*x)^2',
    'x*exp(-a*x^2) + erf(b*x)',
    '1/(1 + a*x^2)^2',
    'exp(-a*x^2 - b*x^4)',
    'cosh(b*x) * exp(-x^2/2)',
    'sqrt(1 + x^2) * tanh(x)',
    'max(exp(-x^2), exp(-a*abs(x)) / 2)',
    '(1 + x^2)^(sin(x)/3)',
  ];

  it.each(TRIALS)('%s: f\' and f\'\' agree with central differences of f and f\'', (text) => {
    const { f, d1, d2 } = derivatives(text);
    for (const x of POINTS) {
      // h = 1e-5: truncation ~ h^2 f''' ~ 1e-10, rounding ~ 1e-16/h ~ 1e-11 (common practice).
      close(d1(x), central((t) => f(t), x), 1e-8);
      close(d2(x), central((t) => d1(t), x), 1e-8);
    }
  });
});
