import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Unit } from 'mathjs';
import { afterAll, describe, expect, it } from 'vitest';
import { checkExpression, type NameScope } from '../../src/expr/allow-list.ts';
import { compileBlock } from '../../src/expr/compile-block.ts';
import { checkRecord } from '../../src/log/check-record.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';

// Expressions in records are data (/work/shared/RECORD-FORMAT.md: "Anything else (assignment,
// property access, matrices, unknown names, `import`, `evaluate`, ...) is refused with a message
// that names the block, the field and the offending token"). The tricks below are the known ways
// to reach code through a mathjs expression: the mathjs documentation, "Security" page (the
// expression parser's access to `import`, `createUnit`, `evaluate`, `parse`, `compile`, `config`,
// property and method access, the Function constructor reached through `.constructor`), and its
// "Syntax" page for the operators (`!` factorial, `'` transpose, bitwise `& | ~ << >> >>>`,
// `to` unit conversion, `:` ranges, `[]` matrices and indexes, `{}` objects, `;` statements).

// [label, expression, a fragment of the offending token that the message must show]
const TRICKS: Array<[string, string, string]> = [
  ['property access', 'a.constructor', 'a.constructor'],
  ['property access by string index', 'x["constructor"]', 'x["constructor"]'],
  ['constructor chain to the Function constructor, called', 'cos.constructor("return process")()', 'process")()'],
  ['constructor chain to the Function constructor', 'cos.constructor("return process")', 'cos.constructor("return process")'],
  ['constructor of a constructor', 'exp.constructor.constructor("return this")', 'exp.constructor.constructor'],
  ['prototype through a built-in constant', 'e.constructor.prototype', 'e.constructor.prototype'],
  ['__proto__ as a property', 'x.__proto__', 'x.__proto__'],
  ['__proto__ as a name', '__proto__ * x', '__proto__'],
  ['an inherited Object name: constructor', 'constructor * x', 'constructor'],
  ['an inherited Object name: toString', 'toString + x', 'toString'],
  ['a method call on a number', 'pi.toString()', 'pi.toString()'],
  ['optional chaining', 'x?.y', 'x?.y'],
  ['import of a module name', 'import("fs")', 'import'],
  ['import with override', 'import({exp: 1}, {override: true})', 'import'],
  ['evaluate', 'evaluate("1")', 'evaluate'],
  ['createUnit', 'createUnit("flux")', 'createUnit'],
  ['parse', 'parse("x")', 'parse'],
  ['compile', 'compile("x")', 'compile'],
  ['simplify', 'simplify("x")', 'simplify'],
  ['derivative', 'derivative("x^2", "x")', 'derivative'],
  ['typeOf', 'typeOf(x)', 'typeOf'],
  ['config as a call', 'config({number: "BigNumber"})', 'config'],
  ['config as a name', 'config', 'config'],
  ['help', 'help(exp)', 'help'],
  ['chain', 'chain(x)', 'chain'],
  ['assignment', 'a = 1', 'a = 1'],
  ['assignment to a built-in', 'pi = 3', 'pi = 3'],
  ['function definition', 'f(x) = x', 'f(x) = x'],
  ['statements separated by a semicolon', 'x; 1', 'x;'],
  ['statements separated by a newline', 'x\n1', 'x\n1'],
  ['a huge matrix', 'zeros(10000, 10000)', 'zeros'],
  ['a matrix literal', '[1, 2, 3]', '[1, 2, 3]'],
  ['matrix()', 'matrix([1])', 'matrix'],
  ['a range of a billion', '1:1e9', '1:1e+9'],
  ['an object', '{a: 1}', '{"a": 1}'],
  ['a string literal', '"abc"', '"abc"'],
  ['a string in arithmetic', '"1" + x', '"1"'],
  ['a boolean literal', 'true + x', 'true'],
  ['index access', 'x[1]', 'x[1]'],
  ['index into a matrix', '[1, 2, 3][2]', '[1, 2, 3][2]'],
  ['index with a range', 'a[1:2]', 'a[1:2]'],
  ['factorial of a big number', '170!', '!'],
  ['factorial of a huge number', '1e6!', '!'],
  ['bitwise and', 'x & 1', '&'],
  ['bitwise or', 'x | 1', '|'],
  ['bitwise not', '~x', '~'],
  ['left shift', 'x << 1', '<<'],
  ['exclusive or', 'x xor 1', 'xor'],
  ['modulo', 'x mod 2', 'mod'],
  ['transpose', "x'", "'"],
  ['unit conversion', 'x to cm', 'to'],
  ['a unit literal in atomic mode', '5 cm', '5 cm'],
  ['a unit literal in a product', '2 kg * x^2', '2 kg'],
  ['accessor on a function result', 'sqrt(x).re', 'sqrt(x).re'],
  ['index on a function result', 'exp(x)[1]', 'exp(x)[1]'],
  ['Infinity', 'Infinity * x', 'Infinity'],
  ['NaN', 'NaN + x', 'NaN'],
  ['a literal beyond the double range', '1e400 * x', '1e400'],
  ['wrong arity', 'max(1, 2, 3)', 'max'],
  ['a condition that is not a comparison', 'x ? 1 : 0', 'x'],
  ['a comparison outside a condition', '(x < 1) * 2', '<'],
];

const scope: NameScope = { variables: ['x', 'a'], constants: { pi: Math.PI, e: Math.E, mass: 1, hbar: 1 } };

describe('expression injection: every trick is refused by the allow-list, with the token named', () => {
  it('the table holds at least 30 tricks', () => {
    expect(TRICKS.length).toBeGreaterThanOrEqual(30);
  });

  it.each(TRICKS)('%s: %s', (_label, text, token) => {
    const result = checkExpression(text, scope);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.token).toContain(token);
    expect(result.message).toContain(token);
  });

  it('nothing was executed: mathjs has no unit flux, and Object.prototype is clean', () => {
    // mathjs "Units": flux is not a built-in unit, so createUnit("flux") would be the only way to get one.
    for (const [, text] of TRICKS) checkExpression(text, scope);
    expect(Unit.isValuelessUnit('flux')).toBe(false);
    expect(Object.getOwnPropertyNames(Object.prototype)).not.toContain('exp');
  });
});

// Through whole records: every trick is once the potential and once the trial of its own block;
// a healthy block after them must still be evaluated (the contract: one invalid block never stops
// the rest of the log).
const folder = mkdtempSync(join(tmpdir(), 'groundwork-injection-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

const HEALTHY = 'id: healthy\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.3, min: 0.01, max: 10 }';

function recordWith(field: 'potential' | 'trial'): { file: string; lines: string[] } {
  const parts = ['---', 'title: Injection attempts', 'author: device-modelling team (invented lab)', 'date: 2026-12-01', 'tags: [corpus]', '---', ''];
  TRICKS.forEach(([, text], i) => {
    // A JSON string is a YAML double-quoted scalar, so every trick reaches the expression as written.
    const potential = field === 'potential' ? JSON.stringify(text) : 'x^2/2';
    const trial = field === 'trial' ? JSON.stringify(text) : 'exp(-a*x^2)';
    parts.push('```variational', `id: trick-${i + 1}`, `potential: ${potential}`, `trial: ${trial}`, 'parameters:', '  a: { start: 0.5, min: 0.01, max: 10 }', '```', '');
  });
  parts.push('```variational', HEALTHY, '```', '');
  const file = join(folder, `${field}.md`);
  writeFileSync(file, parts.join('\n'));
  return { file, lines: parts.join('\n').split('\n') };
}

describe.each(['potential', 'trial'] as const)('expression injection through whole records, in the %s', (field) => {
  const { file, lines } = recordWith(field);
  const result = checkRecord(file, { cwd: folder });

  it('refuses every trick as invalid, naming file, line, block, field and token', () => {
    expect(result.blocks).toHaveLength(TRICKS.length + 1);
    TRICKS.forEach(([label, , token], i) => {
      const block = result.blocks[i];
      const id = `trick-${i + 1}`;
      // The field's line, counted in the text: the potential follows the id, the trial follows the potential.
      const line = lines.indexOf(`id: ${id}`) + 1 + (field === 'potential' ? 1 : 2);
      expect(lines[line - 1].startsWith(`${field}: `)).toBe(true);
      expect(block.id, label).toBe(id);
      expect(block.status, label).toBe('invalid');
      expect(block.problems, label).toHaveLength(1);
      expect(block.problems[0], label).toMatchObject({ file: `${field}.md`, line, block: id, field });
      expect(block.problems[0].message, label).toContain(token);
      expect(block.message, label).toContain(`${field}: `);
    });
  });

  it('still evaluates the healthy block after them', () => {
    // Harmonic oscillator ground level 1/2 (any quantum mechanics textbook).
    const healthy = result.blocks[TRICKS.length];
    expect(healthy.status).toBe('confirmed');
    expect(healthy.energy?.value).toBeCloseTo(0.5, 9);
  });
});

describe('names that are also properties of every JavaScript object', () => {
  // ECMAScript: every plain object inherits constructor, toString, valueOf, ... from Object.prototype;
  // a record may still declare them, and then they mean what the record says.
  it('declared as constants, constructor and valueOf compile to their declared values', () => {
    const text = ['---', 'title: T', 'author: a', 'date: 2026-12-01', 'tags: []', '---', '', '```variational', 'id: own-names', 'constants: { constructor: 2, valueOf: 3 }', 'potential: constructor*x^2/2 + valueOf', 'trial: exp(-a*x^2)', 'parameters:', '  a: { start: 0.5, min: 0.01, max: 10 }', '```', ''].join('\n');
    const entry = parseRecord('own-names.md', text).blocks[0];
    if (entry.kind !== 'spec') throw new Error(JSON.stringify(entry));
    const compiled = compileBlock(entry.spec);
    if (!compiled.ok) throw new Error(JSON.stringify(compiled.problems));
    // 2 * 1.5^2 / 2 + 3 = 5.25 (arithmetic)
    expect(compiled.block.potential(1.5)).toBe(5.25);
  });
});
