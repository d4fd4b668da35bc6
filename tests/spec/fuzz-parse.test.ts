import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { STATUS_ORDER } from '../../src/engine/status.ts';
import { compileBlock } from '../../src/expr/compile-block.ts';
import { checkRecord } from '../../src/log/check-record.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';
import type { RecordSpec, SpecProblem } from '../../src/spec/types.ts';

// Property-based tests of the record parser on random Markdown with random spec blocks. The
// contract (/work/shared/RECORD-FORMAT.md) says bad input becomes an `invalid` block whose problems
// name file, line, block and field, never an exception, and that every block ends with one of five
// statuses. Seeds are fixed so that a failure reproduces in CI.

const SEED = 20261201;
const FILE = 'content/records/fuzz.md';

const KNOWN_KEYS = ['id', 'caption', 'units', 'space', 'box', 'angular-momentum', 'mass', 'constants', 'potential', 'trial', 'basis', 'states', 'parameters', 'reference', 'claim', 'report'];
const ODD_KEYS = ['trail', '__proto__', 'constructor', '<<', 'start', 'min', 'max', 'energy', 'source', 'a', '"quoted key"', '? complex'];
const EXPRESSIONS = ['x^2/2', 'exp(-a*x^2)', '-1/r', 'abs(x) < 1 ? -1 : 0', '"abs(x) < 1 ? -1 : 0"', 'a.constructor', '[1, 2]', 'f(x) = x', 'exp(exp(x))', '1e400*x', '5 cm', ''];
const SCALARS = [
  '0', '-1', '1e999', '.nan', '.inf', '-.inf', '~', 'null', 'true', 'line', 'radial', 'half-line', 'atomic', '[0, 1]', '[1, 0]', '[0]', '[]', '{}',
  '{ start: 1, min: 0, max: 2 }', '{ start: 5, min: 0, max: 2 }', '{ start: 1, min: 2, max: 2 }', '{ start: 1 }', '{ value: 1, tolerance: 0.1 }',
  '{ length: nm, energy: meV }', '&anchor 1', '*anchor', '*missing', '!!binary aGk=', '!!set { a }', '!custom x', '|', '>', '|-\n  x^2',
  '"unterminated', "'single", '[1, 2', '{ a: 1', 'a: b: c', '@reserved', '`tick', '%directive', '- item', '# comment',
];
const indent = fc.constantFrom('', '', '', '  ', '    ', '\t', ' \t');
const value = fc.oneof(fc.constantFrom(...SCALARS), fc.constantFrom(...EXPRESSIONS), fc.double({ noNaN: false }).map(String), fc.string({ maxLength: 20 }));
const yamlLine = fc.oneof(
  { weight: 6, arbitrary: fc.tuple(indent, fc.constantFrom(...KNOWN_KEYS, ...ODD_KEYS), fc.constantFrom(': ', ':', ':\t', ' : '), value).map(([i, k, c, v]) => `${i}${k}${c}${v}`) },
  { weight: 1, arbitrary: fc.constantFrom('---', '...', '', '- id: x', '  - 1', '\t', '```', '~~~') },
  { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 30 }) },
);
const blockBody = fc.array(yamlLine, { maxLength: 12 }).map((lines) => lines.join('\n'));
const prose = fc.oneof(fc.constantFrom('Prose with $E = mc^2$ and `code`.', '# Heading', '> quoted', '- a list item', '| a | table |', '***'), fc.string({ maxLength: 40 }));
const segment = fc.oneof(
  { weight: 3, arbitrary: prose },
  { weight: 5, arbitrary: blockBody.map((b) => `\`\`\`variational\n${b}\n\`\`\``) },
  { weight: 1, arbitrary: blockBody.map((b) => `~~~variational extra info\n${b}\n~~~`) },
  { weight: 1, arbitrary: blockBody.map((b) => `> \`\`\`variational\n${b.split('\n').map((l) => `> ${l}`).join('\n')}\n> \`\`\``) },
  { weight: 1, arbitrary: blockBody.map((b) => `- item\n\n  \`\`\`variational\n${b.split('\n').map((l) => `  ${l}`).join('\n')}\n  \`\`\``) },
  // Never closed: the block runs to the end of the file.
  { weight: 1, arbitrary: blockBody.map((b) => `\`\`\`variational\n${b}`) },
  { weight: 1, arbitrary: fc.constant('```js\nconst x = 1;\n```') },
);
const frontMatter = fc.oneof(
  fc.constant('---\ntitle: Fuzz\nauthor: invented lab\ndate: 2026-12-01\ntags: [fuzz]\n---\n'),
  fc.constant(''),
  fc.constant('\uFEFF---\ntitle: Fuzz\n---\n'),
  fc.constant('---\n---\n'),
  fc.constant('---\ntitle: "unclosed\n---\n'),
  fc.constant('---\ntitle: Fuzz\n'),
  fc.constant('---\na: &a [1, 1, 1, 1, 1, 1, 1, 1, 1, 1]\nb: &b [*a, *a, *a, *a, *a, *a, *a, *a, *a, *a]\nc: [*b, *b, *b, *b, *b, *b, *b, *b, *b, *b]\n---\n'),
  blockBody.map((b) => `---\n${b}\n---\n`),
);
const recordText = fc
  .tuple(frontMatter, fc.array(segment, { maxLength: 6 }), fc.constantFrom('\n', '\r\n'))
  .map(([head, parts, eol]) => (head + parts.join('\n\n') + '\n').replace(/\n/g, eol));

/** Every problem names this file, a line of it, and a block (or none, for the record) and a field (or none). */
function expectWellFormed(problem: SpecProblem, lineCount: number, block: string | null) {
  expect(problem.file).toBe(FILE);
  expect(Number.isInteger(problem.line)).toBe(true);
  expect(problem.line).toBeGreaterThanOrEqual(1);
  expect(problem.line).toBeLessThanOrEqual(lineCount);
  expect(problem.block).toBe(block);
  expect(problem.field === null || (typeof problem.field === 'string' && problem.field.length > 0)).toBe(true);
  expect(typeof problem.message).toBe('string');
  expect(problem.message.length).toBeGreaterThan(0);
}

function expectWellFormedRecord(record: RecordSpec, text: string) {
  const lineCount = text.split('\n').length;
  for (const p of record.problems) expectWellFormed(p, lineCount, null);
  for (const entry of record.blocks) {
    if (entry.kind === 'invalid') {
      expect(entry.problems.length).toBeGreaterThan(0);
      expect(entry.line).toBeLessThanOrEqual(lineCount);
      for (const p of entry.problems) expectWellFormed(p, lineCount, entry.id);
    } else {
      expect(entry.kind).toBe('spec');
      for (const line of [entry.spec.line, entry.spec.potential.line, ...entry.spec.varied.map((v) => v.line)]) {
        expect(line).toBeGreaterThanOrEqual(1);
        expect(line).toBeLessThanOrEqual(lineCount);
      }
    }
  }
}

describe('parseRecord on random Markdown with random YAML-ish spec blocks', () => {
  it('never throws; every block is a spec or invalid with problems naming file, line, block and field (1000 cases)', () => {
    const seen = { blocks: 0, invalid: 0 };
    fc.assert(
      fc.property(recordText, (text) => {
        const record = parseRecord(FILE, text);
        expectWellFormedRecord(record, text);
        seen.blocks += record.blocks.length;
        seen.invalid += record.blocks.filter((b) => b.kind === 'invalid').length;
      }),
      { seed: SEED, numRuns: 1000 },
    );
    expect(seen.blocks).toBeGreaterThan(1000);
    console.info(`fuzz-parse: ${seen.blocks} random blocks, ${seen.invalid} invalid`);
  }, 120_000);
});

// A valid skeleton whose fields take random values, mostly good ones: most records get past the
// YAML and into the schema, the meaning rules, the expression compiler and the evaluation.
const mostly = (good: string[], odd: string[]) => fc.oneof({ weight: 5, arbitrary: fc.constantFrom(...good) }, { weight: 1, arbitrary: fc.constantFrom(...odd) });
/** Present in one case of `every`. */
const sometimes = <T>(arbitrary: fc.Arbitrary<T>, every = 2) => fc.oneof({ weight: every - 1, arbitrary: fc.constant(undefined) }, { weight: 1, arbitrary });
const fieldValue = {
  space: mostly(['line', 'half-line', 'radial'], ['sphere', '3', '[line]']),
  box: mostly(['[0, 1]', '[-2, 2]'], ['[1, 0]', '[0]', '[0, .inf]', '"wide"']),
  angular: mostly(['0', '1', '2'], ['-1', '0.5', 'one']),
  mass: mostly(['1', '0.5', '2'], ['0', '-1', '1e-300', '1e300', '1e999', 'heavy']),
  potential: mostly(['x^2/2', '0.5*x^2 + 0.1*x^4', 'abs(x)', '-1/r', '"abs(x) < 1 ? -2 : 0"', '-5*exp(-x^2)', 'x'], ['sqrt(x)', 'omega*x^2', 'x.constructor', '[x]', '"5 cm * x"', '""', 'exp(x^4)']),
  trial: mostly(['exp(-a*x^2)', 'x*exp(-a*x)', 'exp(-a*abs(x))', 'x*(1-x)', 'exp(-a*x^2)*(1+c*x^2)', 'sech(a*x)'], ['exp(a*x^2)', 'exp(-a)', 'import("fs")', 'exp(exp(x))', '0*x']),
  range: fc.oneof(
    { weight: 4, arbitrary: fc.tuple(fc.constantFrom(0.3, 0.5, 1), fc.constantFrom(0.01, 0.1), fc.constantFrom(5, 10)).map(([s, lo, hi]) => `{ start: ${s}, min: ${lo}, max: ${hi} }`) },
    { weight: 1, arbitrary: fc.tuple(fc.constantFrom(-1, 0, 0.5, 10), fc.constantFrom(-1, 0, 0.5, 10), fc.constantFrom(-1, 0, 0.5, 10)).map(([s, lo, hi]) => `{ start: ${s}, min: ${lo}, max: ${hi} }`) },
  ),
  claim: mostly(['claim:\n  energy: 0.5', 'claim:\n  energy: 0.5\n  tolerance: 0.01'], ['claim:\n  energy: 0.5\n  tolerance: -1', 'claim:\n  tolerance: 0.1', 'claim:\n  parameters:\n    b: 1', 'claim: yes']),
  reference: mostly(['reference:\n  solve: false', 'reference:\n  energy: 0.5\n  source: "notebook"'], ['reference:\n  energy: 0.5', 'reference:\n  solve: maybe']),
};
const blockWithRandomFields = fc
  .record({
    space: sometimes(fieldValue.space),
    box: sometimes(fieldValue.box, 6),
    angular: sometimes(fieldValue.angular, 8),
    mass: sometimes(fieldValue.mass),
    potential: fieldValue.potential,
    trial: fieldValue.trial,
    a: fieldValue.range,
    c: sometimes(fc.oneof(fieldValue.range, fc.constantFrom('0.1', 'x')), 4),
    claim: sometimes(fieldValue.claim),
    reference: sometimes(fieldValue.reference),
  })
  .map((f) => {
    const coordinate = f.space === 'radial' ? 'r' : 'x';
    const lines = ['id: fuzz-block'];
    if (f.space) lines.push(`space: ${f.space}`);
    if (f.box) lines.push(`box: ${f.box}`);
    if (f.angular) lines.push(`angular-momentum: ${f.angular}`);
    if (f.mass) lines.push(`mass: ${f.mass}`);
    lines.push(`potential: ${f.potential.replace(/\bx\b/g, coordinate)}`, `trial: ${f.trial.replace(/\bx\b/g, coordinate)}`);
    if (f.a || f.c) lines.push('parameters:');
    if (f.a) lines.push(`  a: ${f.a}`);
    if (f.c) lines.push(`  c: ${f.c}`);
    if (f.claim) lines.push(f.claim);
    if (f.reference) lines.push(f.reference);
    return lines.join('\n');
  });
const recordOf = (body: string) => `---\ntitle: Fuzz\nauthor: invented lab\ndate: 2026-12-01\ntags: [fuzz]\n---\n\nProse.\n\n\`\`\`variational\n${body}\n\`\`\`\n`;

describe('parseRecord and compileBlock on blocks with random field values', () => {
  it('never throw; problems name file, line, block and field (1000 cases)', () => {
    const seen = { compiled: 0, refused: 0 };
    fc.assert(
      fc.property(blockWithRandomFields, (body) => {
        const text = recordOf(body);
        const record = parseRecord(FILE, text);
        expectWellFormedRecord(record, text);
        const entry = record.blocks[0];
        if (entry.kind !== 'spec') return;
        const compiled = compileBlock(entry.spec);
        if (compiled.ok) seen.compiled++;
        else {
          seen.refused++;
          for (const p of compiled.problems) {
            expect(p.line).toBeGreaterThan(entry.spec.line);
            expect(p.message.length).toBeGreaterThan(0);
          }
        }
      }),
      { seed: SEED, numRuns: 1000 },
    );
    expect(seen.compiled).toBeGreaterThan(100);
    console.info(`fuzz-parse: ${seen.compiled} random-field blocks compiled, ${seen.refused} refused by the compiler`);
  }, 120_000);
});

// Whole evaluations through checkRecord: far fewer cases, since each may run the optimiser and the
// grid reference. The generous vitest limits below only stop a hang; they assert no speed.
const folder = mkdtempSync(join(tmpdir(), 'groundwork-fuzz-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('checkRecord on records with random field values', () => {
  it('never throws, and every block ends with one of the five statuses, problems naming file, line, block and field (200 cases)', () => {
    const statuses: Record<string, number> = {};
    let run = 0;
    fc.assert(
      fc.property(blockWithRandomFields, fc.boolean(), (body, solve) => {
        // Half the cases skip the grid reference to keep the run short; the other half exercise it.
        const text = recordOf(solve || body.includes('reference:') ? body : `${body}\nreference:\n  solve: false`);
        const file = join(folder, `case-${run++}.md`);
        writeFileSync(file, text);
        const result = checkRecord(file, { cwd: folder });
        expect(result.blocks).toHaveLength(1);
        const block = result.blocks[0];
        expect(STATUS_ORDER).toContain(block.status);
        statuses[block.status] = (statuses[block.status] ?? 0) + 1;
        const lineCount = text.split('\n').length;
        if (block.status === 'invalid') {
          expect(block.problems.length).toBeGreaterThan(0);
          for (const p of block.problems) {
            expect(p.file).toBe(`case-${run - 1}.md`);
            expect(p.line).toBeGreaterThanOrEqual(1);
            expect(p.line).toBeLessThanOrEqual(lineCount);
            expect(p.block).toBe(block.id);
            expect(p.message.length).toBeGreaterThan(0);
          }
        } else {
          expect(block.energy === null || Number.isFinite(block.energy.value)).toBe(true);
        }
      }),
      { seed: SEED, numRuns: 200 },
    );
    // The random fields reach past parsing: some blocks are evaluated to a status other than invalid.
    expect(Object.keys(statuses).filter((s) => s !== 'invalid').length).toBeGreaterThan(0);
    console.info(`fuzz-parse: whole evaluations by status ${JSON.stringify(statuses)}`);
  }, 300_000);
});
