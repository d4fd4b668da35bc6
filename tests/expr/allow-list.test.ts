import { describe, expect, it } from 'vitest';
import { checkExpression, type NameScope } from '../../src/expr/allow-list.ts';

// The allow-list is the one of /work/shared/RECORD-FORMAT.md ("Expressions use the mathjs expression
// syntax with an allow-list ..."); the syntax (implicit multiplication, chained comparisons, `'` for
// transpose, `!` for factorial) is that of the mathjs expression parser documentation, "Syntax".

const scope: NameScope = { variables: ['x', 'a', 'c'], constants: { pi: Math.PI, e: Math.E, mass: 1, hbar: 1, V0: 5 } };

function refusal(text: string) {
  const result = checkExpression(text, scope);
  if (result.ok) throw new Error(`expected ${JSON.stringify(text)} to be refused`);
  return result;
}

describe('checkExpression: accepted expressions (RECORD-FORMAT.md allow-list)', () => {
  it.each([
    ['arithmetic', 'x^2/2 + 0.1*x^4 - (x - 1)/3'],
    ['unary minus and plus', '-x + +a'],
    ['the example trial', 'exp(-a*x^2) * (1 + c*x^2)'],
    ['every allowed one-argument function', 'exp(x)+log(x)+sqrt(x)+abs(x)+sin(x)+cos(x)+tan(x)+sinh(x)+cosh(x)+tanh(x)+sech(x)+erf(x)'],
    ['min and max of two arguments', 'min(x, a) + max(x, 1)'],
    ['built-in names pi, e, mass, hbar and a constant', 'hbar^2/(2*mass) * pi * e * V0'],
    ['a conditional with a comparison', 'abs(x) < 1 ? -V0 : 0'],
    ['a chained comparison (mathjs syntax)', '-1 < x < 1 ? 1 : 0'],
    ['every comparison operator', 'x <= 1 ? (x >= 0 ? (x > 0.5 ? 1 : 2) : 3) : (x == 2 ? 4 : (x != 3 ? 5 : 6))'],
    ['and / or / not in a condition', 'x > 0 and not (x > 1) or x < -5 ? 1 : 0'],
    ['implicit multiplication 2x', '2x'],
    ['implicit multiplication 2 pi x', '2 pi x'],
    ['scientific notation', '1.5e-3 * x'],
  ])('%s: %s', (_label, text) => {
    const result = checkExpression(text, scope);
    expect(result.ok, JSON.stringify(result.ok ? null : result)).toBe(true);
    if (result.ok) expect(result.tree.type).toBeTypeOf('string');
  });

  it('a name is accepted only when it is declared: the same text fails in a narrower scope', () => {
    expect(checkExpression('exp(-a*x^2)', scope).ok).toBe(true);
    const narrow = checkExpression('exp(-a*x^2)', { variables: ['x'], constants: {} });
    expect(narrow.ok).toBe(false);
    if (!narrow.ok) expect(narrow.token).toBe('a');
  });
});

describe('checkExpression: refused expressions name the offending token', () => {
  // [label, text, a string the token must contain]
  it.each([
    ['property access', 'a.constructor', 'constructor'],
    ['index access with a string', 'x["constructor"]', 'constructor'],
    ['index access', 'x[1]', '['],
    ['method call', 'a.b(1)', 'a.b'],
    ['function definition', 'f(x) = x', 'f(x)'],
    ['assignment', 'a = 1', '='],
    ['a matrix', '[1,2]', '['],
    ['a range', '1:3', ':'],
    ['an object', '{a: 1}', '{'],
    ['a sequence of statements', 'x; 1', ';'],
  ])('%s: %s', (_label, text, fragment) => {
    const r = refusal(text);
    expect(r.token).toContain(fragment);
    expect(r.message).toMatch(/not allowed|only the allowed functions/);
  });

  // RECORD-FORMAT.md: the message names the offending token, not only its kind.
  it.each([
    ['a.constructor', 'a.constructor'],
    ['a = 1', 'a = 1'],
    ['[1, 2]', '[1, 2]'],
    ['f(x) = x', 'f(x) = x'],
  ])('the message of %s names the token', (text, fragment) => {
    expect(refusal(text).message).toContain(fragment);
  });

  it.each([
    ['import', 'import("fs")', 'import'],
    ['import of an object', 'import({})', 'import'],
    ['evaluate', 'evaluate("1")', 'evaluate'],
    ['createUnit', 'createUnit("foo")', 'createUnit'],
    ['an unknown function', 'gamma(x)', 'gamma'],
  ])('a function off the allow-list, %s, is named in token and message', (_label, text, name) => {
    const r = refusal(text);
    expect(r.token).toBe(name);
    expect(r.message).toContain(`function ${name} is not allowed`);
  });

  it('a string literal is refused and quoted in the message', () => {
    const r = refusal('"abc"');
    expect(r.token).toContain('abc');
    expect(r.message).toContain('abc');
  });

  it('a boolean literal is refused', () => {
    expect(refusal('true').token).toBe('true');
  });

  it('an unknown name is refused and named', () => {
    const r = refusal('y + 1');
    expect(r.token).toBe('y');
    expect(r.message).toContain('unknown name y');
  });

  it('a function name used as a value gets a hint to call it', () => {
    const r = refusal('sin * x');
    expect(r.token).toBe('sin');
    expect(r.message).toContain('sin(...)');
  });

  it('a unit name (quantity mode is not on) is an unknown name', () => {
    expect(refusal('x cm').token).toBe('cm');
  });

  it('wrong arity: min(x) and exp(x, 1)', () => {
    const r = refusal('min(x)');
    expect(r.token).toBe('min');
    expect(r.message).toMatch(/2 arguments, not 1/);
    const s = refusal('exp(x, 1)');
    expect(s.token).toBe('exp');
    expect(s.message).toMatch(/1 argument, not 2/);
  });

  it.each([
    ['transpose', "x'", "'"],
    ['factorial', 'x!', '!'],
    ['modulo %', 'x % 2', '%'],
    ['modulo mod', '5 mod 2', 'mod'],
    ['bitwise and', 'x & 1', '&'],
  ])('operator %s (%s) is refused and named', (_label, text, op) => {
    const r = refusal(text);
    expect(r.token).toBe(op);
    expect(r.message).toContain(`operator ${op} is not allowed`);
  });

  it('a comparison outside the condition of c ? a : b is refused', () => {
    for (const text of ['x < 1', '(x < 1) * 2', 'x < 1 ? (x < 2) : 0']) {
      const r = refusal(text);
      expect(r.token).toBe('<');
      expect(r.message).toMatch(/only stand in the condition/);
    }
  });

  it('a chained comparison outside a condition is refused', () => {
    expect(refusal('-1 < x < 1').message).toMatch(/condition/);
  });

  it('a condition that is not a comparison is refused', () => {
    const r = refusal('x ? 1 : 0');
    expect(r.token).toBe('x');
    expect(r.message).toMatch(/must be a comparison/);
  });

  it('a number too large for a double is refused', () => {
    expect(refusal('1e400 * x').message).toMatch(/too large/);
  });

  it('text mathjs cannot parse is refused, quoting the parser', () => {
    expect(refusal('x +').message).toMatch(/cannot read the expression/);
    expect(refusal('exp(x').message).toMatch(/cannot read the expression/);
  });

  it('a 30000-character expression is refused before parsing, with its length in the message', () => {
    const long = '1+'.repeat(14_999) + '1+x';
    expect(long.length).toBe(30_001);
    const r = refusal(long);
    expect(r.message).toContain('30001');
    expect(r.token.startsWith('1+1+')).toBe(true);
  });

  it('the first refused node is reported even when it sits deep in an otherwise good expression', () => {
    const r = refusal('exp(-a*x^2) * (1 + c*x^2) + sin(x.constructor)');
    expect(r.token).toContain('constructor');
  });
});

// Messages that point at the fix. `**` is a power in Python and Fortran, `^` in the mathjs syntax (mathjs docs, "Syntax",
// operators table); suggestions come from the nearest declared name by edit distance (src/spec/nearest-name.ts).
describe('checkExpression: refusals that say what to write instead', () => {
  it('x**2 is told to use ^', () => {
    const r = refusal('x**2');
    expect(r.message).toBe('use ^ for powers: write x^2, not x**2');
    expect(r.token).toBe('**');
  });
  it('a misspelt declared name gets the nearest one', () => {
    const withOmega: NameScope = { variables: ['x'], constants: { ...scope.constants, omega: 2 } };
    const r = checkExpression('omga^2 * x^2 / 2', withOmega);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toBe('unknown name omga: did you mean omega? (or declare omga under parameters or constants)');
  });
  it('names that are only suggestable (quantity mode constants) are offered but not accepted', () => {
    const r = checkExpression('elementaryCharg * x', { ...scope, suggestable: ['elementaryCharge', 'electronMass'] });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/^unknown name elementaryCharg: did you mean elementaryCharge\?/);
  });
  it('a name close to nothing declared only asks for a declaration', () => {
    expect(refusal('x * lambda').message).toBe('unknown name lambda: declare it under parameters or constants');
  });
  it('a misspelt function gets the nearest allowed one', () => {
    expect(refusal('exp(-a*x^2) * cosh2(x)').message).toMatch(/^function cosh2 is not allowed \(did you mean cosh\?\); allowed: exp/);
  });
});
