import fc from 'fast-check';
import { evaluate, type MathNode } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { checkExpression, type NameScope } from '../../src/expr/allow-list.ts';
import { compileBlock } from '../../src/expr/compile-block.ts';
import { compileTree } from '../../src/expr/compile.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';
import type { BlockSpec } from '../../src/spec/types.ts';

// Property-based tests of the expression path (allow-list, compiler, block compilation) on random
// expressions from a grammar that mixes the constructs RECORD-FORMAT.md allows with ones it refuses
// (the mathjs "Syntax" page lists them). The reference for values is mathjs's own evaluator, run here
// on clean expressions only. Seeds are fixed so that a failure reproduces in CI.

const SEED = 20261201;

interface Generated {
  text: string;
  /** Holds at least one construct the allow-list must refuse. */
  tainted: boolean;
}

const clean = (text: string): Generated => ({ text, tainted: false });
const join = (tainted: boolean, ...parts: Generated[]) => parts.some((p) => p.tainted) || tainted;

const CLEAN_NAMES = ['x', 'a', 'pi', 'e', 'mass', 'hbar', 'V0'];
const TAINTED_NAMES = ['y', 'constructor', '__proto__', 'toString', 'cm', 'import', 'true', 'null', '"s"', 'NaN', 'Infinity', '1e400', 'i'];
const FUNCTIONS: Array<[string, number]> = [['exp', 1], ['log', 1], ['sqrt', 1], ['abs', 1], ['sin', 1], ['cos', 1], ['tan', 1], ['sinh', 1], ['cosh', 1], ['tanh', 1], ['sech', 1], ['erf', 1], ['min', 2], ['max', 2]];
const TAINTED_FUNCTIONS = ['import', 'evaluate', 'parse', 'gamma', 'zeros', 'typeOf', 'config', 'createUnit', 'sign'];
const TAINTED_BINARY = ['&', '|', '<<', 'mod', '%', 'xor', 'to', ';', '='];

const number = fc.oneof(
  fc.integer({ min: 0, max: 20 }).map(String),
  fc.double({ min: 0, max: 10, noNaN: true }).map((v) => String(Math.round(v * 1000) / 1000)),
  fc.constantFrom('0.5', '1e-3', '2.5e2'),
);

/** Random expressions; about half of the trees hold a refused construct somewhere. */
const { expr } = fc.letrec<{ expr: Generated; condition: Generated }>((tie) => ({
  expr: fc.oneof(
    { depthSize: 'small', maxDepth: 5 },
    number.map(clean),
    fc.constantFrom(...CLEAN_NAMES).map(clean),
    fc.constantFrom(...TAINTED_NAMES).map((text) => ({ text, tainted: true })),
    fc.tuple(fc.constantFrom('-', '+'), tie('expr')).map(([op, u]) => ({ text: `${op}(${u.text})`, tainted: u.tainted })),
    fc.tuple(tie('expr'), fc.constantFrom('+', '-', '*', '/', '^'), tie('expr')).map(([u, op, v]) => ({ text: `(${u.text}) ${op} (${v.text})`, tainted: join(false, u, v) })),
    fc.tuple(tie('expr'), fc.constantFrom(...TAINTED_BINARY), tie('expr')).map(([u, op, v]) => ({ text: `(${u.text}) ${op} (${v.text})`, tainted: true })),
    fc.tuple(tie('expr'), fc.constantFrom('!', "'")).map(([u, op]) => ({ text: `(${u.text})${op}`, tainted: true })),
    fc.tuple(fc.constantFrom(...FUNCTIONS), tie('expr'), tie('expr')).map(([[name, arity], u, v]) => ({
      text: arity === 1 ? `${name}(${u.text})` : `${name}(${u.text}, ${v.text})`,
      tainted: arity === 1 ? u.tainted : join(false, u, v),
    })),
    fc.tuple(fc.constantFrom(...TAINTED_FUNCTIONS), tie('expr')).map(([name, u]) => ({ text: `${name}(${u.text})`, tainted: true })),
    fc.tuple(tie('condition'), tie('expr'), tie('expr')).map(([c, u, v]) => ({ text: `((${c.text}) ? (${u.text}) : (${v.text}))`, tainted: join(false, c, u, v) })),
    fc.tuple(tie('expr'), fc.constantFrom('.constructor', '["constructor"]', '[1]', '.re')).map(([u, access]) => ({ text: `(${u.text})${access}`, tainted: true })),
    fc.tuple(tie('expr'), tie('expr')).map(([u, v]) => ({ text: `[${u.text}, ${v.text}]`, tainted: true })),
    fc.tuple(tie('expr'), tie('expr')).map(([u, v]) => ({ text: `(${u.text}):(${v.text})`, tainted: true })),
    tie('expr').map((u) => ({ text: `{k: ${u.text}}`, tainted: true })),
    // A comparison is no value: it may only stand in the condition of c ? a : b.
    fc.tuple(tie('expr'), fc.constantFrom('<', '>=', '==', '!='), tie('expr')).map(([u, op, v]) => ({ text: `((${u.text}) ${op} (${v.text}))`, tainted: true })),
  ),
  condition: fc.oneof(
    { depthSize: 'small', maxDepth: 3 },
    fc.tuple(tie('expr'), fc.constantFrom('<', '>', '<=', '>='), tie('expr')).map(([u, op, v]) => ({ text: `(${u.text}) ${op} (${v.text})`, tainted: join(false, u, v) })),
    fc.tuple(tie('condition'), fc.constantFrom('and', 'or'), tie('condition')).map(([c, op, d]) => ({ text: `(${c.text}) ${op} (${d.text})`, tainted: join(false, c, d) })),
    // A bare value is no condition.
    fc.constantFrom(...CLEAN_NAMES, '1').map((text) => ({ text, tainted: true })),
  ),
}));

const cleanExpr = expr.filter((g) => !g.tainted);
const scope: NameScope = { variables: ['x', 'a'], constants: { pi: Math.PI, e: Math.E, mass: 1, hbar: 1, V0: 5 } };
const slotOf = { x: 0, a: 1 };

describe('checkExpression on random expressions (allowed and refused constructs mixed)', () => {
  it('never throws; refuses every expression that holds a refused construct, naming a token (5000 cases)', () => {
    const seen = { tainted: 0, accepted: 0 };
    fc.assert(
      fc.property(expr, (g) => {
        const result = checkExpression(g.text, scope);
        if (g.tainted) {
          seen.tainted++;
          expect(result.ok, g.text).toBe(false);
        }
        if (result.ok) seen.accepted++;
        else {
          expect(typeof result.token).toBe('string');
          expect(result.message.length).toBeGreaterThan(0);
        }
      }),
      { seed: SEED, numRuns: 5000 },
    );
    // Both kinds are well represented, so neither half of the property is vacuous.
    expect(seen.tainted).toBeGreaterThan(1000);
    expect(seen.accepted).toBeGreaterThan(500);
    console.info(`fuzz-compile: ${seen.tainted} expressions with a refused construct, ${seen.accepted} accepted, of 5000`);
  }, 120_000);

  it('never throws on arbitrary text, including control characters and unpaired surrogates (3000 cases)', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 200 }), (text) => {
        const result = checkExpression(text, scope);
        if (!result.ok) expect(result.message.length).toBeGreaterThan(0);
      }),
      { seed: SEED, numRuns: 3000 },
    );
  }, 120_000);
});

describe('compileTree agrees with mathjs on random clean expressions', () => {
  it('accepts every clean expression and computes the value mathjs computes wherever mathjs gives a finite real number (3000 cases)', () => {
    let compared = 0;
    fc.assert(
      fc.property(cleanExpr, fc.double({ min: -3, max: 3, noNaN: true }), fc.double({ min: 0.1, max: 3, noNaN: true }), (g, x, a) => {
        const result = checkExpression(g.text, scope);
        expect(result.ok, g.text).toBe(true);
        if (!result.ok) return;
        const ours = compileTree(result.tree as MathNode, slotOf, scope.constants)(Float64Array.of(x, a));
        expect(typeof ours).toBe('number');
        let reference: unknown;
        try {
          reference = evaluate(g.text, { x, a, mass: 1, hbar: 1, V0: 5 });
        } catch {
          return;
        }
        // mathjs goes complex for roots and logs of negative numbers, where we give NaN.
        if (typeof reference !== 'number' || !Number.isFinite(reference)) return;
        compared++;
        expect(Math.abs(ours - reference), `${g.text} at x = ${x}, a = ${a}`).toBeLessThanOrEqual(1e-9 * (1 + Math.abs(reference)));
      }),
      { seed: SEED, numRuns: 3000 },
    );
    // Most clean expressions are real-valued at these points, so the comparison is not vacuous.
    expect(compared).toBeGreaterThan(1500);
    console.info(`fuzz-compile: ${compared} of 3000 clean expressions compared with mathjs`);
  }, 120_000);
});

describe('compileBlock on random potentials and trials', () => {
  // The block reaches compileBlock as the build reads it: through parseRecord. Lines: the potential
  // is on line 11 of the record, the trial on 12, the range of a on 14.
  const specOf = (space: string, potential: string, trial: string): BlockSpec | null => {
    const body = [`id: fuzz`, `space: ${space}`, `potential: ${JSON.stringify(potential)}`, `trial: ${JSON.stringify(trial)}`, 'parameters:', '  a: { start: 0.5, min: 0.01, max: 10 }', 'constants: { V0: 5 }'];
    const text = ['---', 'title: Fuzz', 'author: invented lab', 'date: 2026-12-01', 'tags: []', '---', '', '```variational', ...body, '```', ''].join('\n');
    const entry = parseRecord('fuzz.md', text).blocks[0];
    return entry.kind === 'spec' ? entry.spec : null;
  };

  it('never throws; problems name potential, trial or the parameter, at their lines; compiled functions return numbers (1000 cases)', () => {
    let compiled = 0;
    fc.assert(
      // Half the cases are clean, and the trial always holds the parameter and the coordinate, so
      // that a fair share of blocks gets through to the derivatives and the compiled functions.
      fc.property(fc.oneof(expr, cleanExpr), fc.oneof(expr, cleanExpr), fc.constantFrom('line', 'half-line', 'radial'), (potential, trial, space) => {
        const coordinate = space === 'radial' ? 'r' : 'x';
        const inSpace = (text: string) => text.replace(/\bx\b/g, coordinate);
        const spec = specOf(space, inSpace(potential.text.replace(/\ba\b/g, 'V0')), inSpace(`exp(-a*x^2)*(${trial.text})`));
        // Only an empty text stops a block before the compiler; the grammar never writes one.
        expect(spec).not.toBeNull();
        const result = compileBlock(spec!);
        if (!result.ok) {
          expect(result.problems.length).toBeGreaterThan(0);
          for (const p of result.problems) {
            expect([['potential', 11], ['trial', 12], ['parameters.a', 14]]).toContainEqual([p.field, p.line]);
            expect(p.message.length).toBeGreaterThan(0);
          }
          if (potential.tainted) expect(result.problems.some((p) => p.field === 'potential')).toBe(true);
          return;
        }
        compiled++;
        const trialFunction = result.block.trial!;
        trialFunction.setParameters([0.7]);
        for (const f of [result.block.potential, trialFunction.value, trialFunction.d1, trialFunction.d2]) expect(typeof f(0.3)).toBe('number');
      }),
      { seed: SEED, numRuns: 1000 },
    );
    expect(compiled).toBeGreaterThan(100);
    console.info(`fuzz-compile: ${compiled} of 1000 random blocks compiled`);
  }, 120_000);
});
