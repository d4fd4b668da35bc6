import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { STATUS_ORDER } from '../../src/engine/status.ts';
import { checkRecord } from '../../src/log/check-record.ts';
import type { RecordResult } from '../../src/log/result-types.ts';

// A corpus of broken records (tests/fixtures/broken/, an invented device lab). Every expectation
// comes from the contract /work/shared/RECORD-FORMAT.md: its field table (what is required, which
// types, which combinations), its "Status of a block" table, and its rule that bad input gets a
// message naming file, line, block and field and never takes the rest of the log down. Lines are
// found here by searching the fixture's own text, independently of the parser.

const ROOT = join(import.meta.dirname, '..', '..');
const FOLDER = 'tests/fixtures/broken';

interface ExpectedProblem {
  field: string | null;
  /** Text on the problem's line: the first line containing it, searched from the block's fence. */
  at: string;
}

interface ExpectedBlock {
  id: string;
  status: (typeof STATUS_ORDER)[number];
  message: string;
  /** Invalid blocks: every problem, in order. */
  problems?: ExpectedProblem[];
}

interface Expected {
  record?: Array<ExpectedProblem & { message: string }>;
  blocks: ExpectedBlock[];
}

const invalid = (id: string, message: string, ...problems: ExpectedProblem[]): ExpectedBlock => ({ id, status: 'invalid', message, problems });
const on = (field: string | null, at: string): ExpectedProblem => ({ field, at });
/** A block of the fixtures' standard harmonic well, x^2/2 with exp(-a x^2), which must confirm. */
const healthy = (id: string): ExpectedBlock => ({ id, status: 'confirmed', message: '' });

// Failed checks of the evaluation itself are filed under the trial field, or under the potential when
// the fault is traced there (nan-potential, overflowing-potential).
const EXPECTED: Record<string, Expected> = {
  // YAML and structure
  'yaml-colon-unquoted': { blocks: [invalid('well-t1', "a value holds ': ' (quote an expression", on('potential', 'potential: abs(x)'))] },
  'yaml-tab-indent': { blocks: [invalid('tab-t2', 'indented with a tab', on('potential', '\tpotential'))] },
  'yaml-duplicate-field': { blocks: [invalid('twice-t3', 'the field potential is given twice', on('potential', 'potential: x^4'))] },
  'yaml-second-document': { blocks: [invalid('split-t4', 'starts a second document', on(null, '---'))] },
  'yaml-unclosed-flow-map': { blocks: [invalid('brace-t5', 'end with a }', on('parameters.a', '  a: { start'))] },
  'yaml-unclosed-quote': { blocks: [invalid('quote-t6', 'Missing closing "quote', on('trial', 'trial: "exp'))] },
  'yaml-alias-bomb': { blocks: [invalid('aliases-t7', 'aliases (*name) cannot be expanded', on(null, '```variational'))] },
  'yaml-list-not-map': { blocks: [invalid('block-1', 'must be a YAML map of fields', on(null, '```variational'))] },
  'empty-block': { blocks: [invalid('block-1', 'must be a YAML map of fields', on(null, '```variational'))] },
  'tabs-between-fields': { blocks: [invalid('tabs-t10', 'indented with a tab', on('parameters.a', '\ta: {'))] },
  // Missing fields, wrong types, unknown keys and names
  'missing-id': { blocks: [invalid('block-1', 'every block needs an id', on('id', '```variational'))] },
  'missing-potential': { blocks: [invalid('nopot-d2', 'is required', on('potential', '```variational'))] },
  'missing-trial': { blocks: [invalid('notrial-d3', 'needs a trial function', on('trial', '```variational'))] },
  'wrong-type-mass': { blocks: [invalid('mass-d4', 'must be a number', on('mass', 'mass: heavy'))] },
  'wrong-type-potential-list': { blocks: [invalid('potlist-d5', 'must be an expression written as text', on('potential', 'potential: ['))] },
  'wrong-type-box': { blocks: [invalid('box-d6', 'must be [a, b] with two numbers', on('box', 'box: [0]'))] },
  // Suggestions: the nearest valid name by edit distance (Damerau 1964); trail -> trial is one transposition.
  'unknown-field': { blocks: [invalid('typo-d7', 'unknown field trail: did you mean trial?', on('trail', 'trail:'))] },
  'field-misspelt-potential': { blocks: [invalid('typo-d15', 'unknown field potental: did you mean potential?', on('potential', '```variational'), on('potental', 'potental:'))] },
  'name-misspelt': { blocks: [invalid('omga-d16', 'unknown name omga: did you mean omega?', on('potential', 'potential: omga'))] },
  // `^` is the power operator of the mathjs syntax (mathjs docs, "Syntax"); `**` is Python's.
  'power-double-star': { blocks: [invalid('stars-d14', 'use ^ for powers', on('potential', 'potential: x**2'))] },
  // The record format lists { value, uncertainty } as a feature still to come.
  'uncertain-constant': { blocks: [invalid('uncertain-d17', 'uncertain inputs ({ value, uncertainty }) are not supported yet', on('constants.k', '  k: {'))] },
  'unknown-name': { blocks: [invalid('omega-d8', 'unknown name omega', on('potential', 'potential: omega'))] },
  'unknown-function': { blocks: [invalid('gamma-d9', 'function gamma is not allowed', on('trial', 'trial:'))] },
  'bad-id-slug': { blocks: [invalid('dot d10!', 'must be a slug', on('id', 'id: dot d10!'))] },
  'space-unknown': { blocks: [invalid('sphere-d11', 'must be one of line, half-line, radial, plane', on('space', 'space: sphere'))] },
  'mass-zero': { blocks: [invalid('massless-d12', 'must be positive', on('mass', 'mass: 0'))] },
  'huge-numbers': {
    blocks: [
      invalid('huge-mass-d13', 'must be a finite number', on('mass', 'mass: 1e999')),
      invalid('huge-literal-d13', 'the number 1e400 is too large for a double', on('trial', 'trial: exp(-a*x^2) * (1 + 1e400')),
    ],
  },
  // RECORD-FORMAT.md: "id ... unique within the record"; the first block still evaluates.
  'duplicate-id': { blocks: [healthy('bond-b1'), invalid('bond-b1', 'id bond-b1 is already used by the block on line', on('id', 'id: bond-b1'))] },
  // RECORD-FORMAT.md, "Quantity mode": the potential must be an energy and exponents dimensionless.
  'quantity-mode-dimensions': {
    blocks: [invalid('units-b2', 'the potential must be an energy', on('potential', 'potential:'), on('trial', 'trial:'))],
  },
  'unit-literal-atomic': { blocks: [invalid('unit-b3', '5 meV reads as a quantity in the unit meV', on('potential', 'potential: 5 meV'))] },
  'injection-constructor': { blocks: [invalid('inject-b4', 'not cos.constructor("return process")', on('potential', 'potential:'))] },
  // Trials and walls
  'non-normalisable': { blocks: [invalid('grows-w1', 'a trial that overflows is not square-integrable', on('trial', 'trial: exp(a*x^2)'))] },
  'zero-trial': { blocks: [invalid('zero-w2', 'the trial is zero everywhere', on('trial', 'trial: 0*x'))] },
  // RECORD-FORMAT.md: refuse a trial "that does not vanish at a hard wall"; exp(-x^2) is 1 at 0 and e^-1 at 1.
  'wall-not-vanishing-box': { blocks: [invalid('box-w3', 'trial at the wall 0 is 1', on('trial', 'trial:'), on('trial', 'trial:'))] },
  'wall-not-vanishing-half-line': { blocks: [invalid('half-w4', 'trial at the wall 0 is 1', on('trial', 'trial:'))] },
  // exp(exp(x)) passes the largest double (about 1.8e308, IEEE 754) once exp(x) > 709.78, at x > 6.565.
  'overflowing-trial': { blocks: [invalid('overflow-w5', 'the trial is Infinity at x = ', on('trial', 'trial: exp(exp(x))'))] },
  // sqrt of a negative number is NaN (IEEE 754; ECMAScript Math.sqrt).
  'nan-potential': { blocks: [invalid('sqrt-w6', 'the potential there is NaN', on('potential', 'potential:'))] },
  'overflowing-potential': { blocks: [invalid('steep-w7', 'the potential there is Infinity', on('potential', 'potential:'))] },
  // sech(x)^p holds the ground state of -0.5 sech^2 at p = (sqrt 5 - 1)/2 (Poschl-Teller; Landau & Lifshitz §23):
  // its slope's 0 * Infinity where sech underflows lies where the trial has decayed, and must not stop it.
  'sech-power-trial': { blocks: [healthy('sech-w12')] },
  'trial-without-coordinate': { blocks: [invalid('flat-w8', 'the trial does not depend on the coordinate x', on('trial', 'trial: exp(-a)'))] },
  'wrong-coordinate': { blocks: [invalid('radial-w9', 'the coordinate of space radial is r', on('trial', 'trial: exp(-a*x)'))] },
  'varied-parameter-unused': { blocks: [invalid('unused-w10', 'parameter b is varied but the trial does not use it', on('parameters.b', '  b: {'))] },
  // RECORD-FORMAT.md, "Position-dependent mass": positive where the state lives, fixed during the search, a mass.
  'mass-profile-faults': {
    blocks: [
      invalid('negative-j4', 'the mass is -0.092 electron masses', on('mass', 'mass: "x < 1 ? 0.067 : -0.092"')),
      invalid('varied-j4', 'the mass may not depend on the varied parameter a', on('mass', 'mass: "x < 0 ? 0.067 : a"')),
      invalid('length-j4', 'the mass must be a mass', on('mass', 'mass: "x < 0 nm')),
    ],
  },
  'potential-uses-varied-parameter': { blocks: [invalid('moving-w11', 'the potential may not depend on the varied parameter a', on('potential', 'potential: a*x^2'))] },
  // Parity under x -> -x (the project's `symmetry` field): it needs a potential even on the line, and the trial must have it.
  'symmetry-not-in-trial': { blocks: [invalid('parity-t9', 'symmetry: even, but the trial is not even', on('symmetry', 'symmetry: even'))] },
  'symmetry-uneven-potential': { blocks: [invalid('tilt-t10', 'the potential is not even', on('symmetry', 'symmetry: odd'))] },
  'symmetry-on-half-line': { blocks: [invalid('half-s3', 'symmetry (parity under x -> -x) applies to space line only, not half-line', on('symmetry', 'symmetry: odd'))] },
  // Ranges, spaces, boxes
  'range-min-above-max': { blocks: [invalid('flipped-s1', 'max (2) must be larger than min (5)', on('parameters.a.max', '  a: {'))] },
  'range-start-outside': { blocks: [invalid('outside-s2', 'start (20) must lie within [0.01, 10]', on('parameters.a.start', '  a: {'))] },
  'range-zero-width': { blocks: [invalid('pinned-s3', 'max (0.5) must be larger than min (0.5)', on('parameters.a.max', '  a: {'))] },
  'range-missing-max': { blocks: [invalid('nomax-s4', 'max: is required', on('parameters.a', '  a: {'))] },
  'reserved-parameter-name': { blocks: [invalid('reserved-s5', 'x is a reserved name', on('parameters.x', '  x: 2'))] },
  'box-on-radial': { blocks: [invalid('radbox-s6', 'box applies to space line only, not radial', on('box', 'box:'))] },
  'box-reversed': { blocks: [invalid('flipbox-s7', 'box [1, 0] must have its left wall below its right wall', on('box', 'box:'))] },
  'angular-momentum-on-line': { blocks: [invalid('lline-s8', 'angular-momentum applies to spaces radial, plane and axial only', on('angular-momentum', 'angular-momentum:'))] },
  'angular-momentum-fractional': { blocks: [invalid('lhalf-s9', 'must be an integer', on('angular-momentum', 'angular-momentum:'))] },
  'two-hundred-parameters': { blocks: [invalid('many-s10', '200 parameters are varied; at most 32', on('parameters', 'parameters:'))] },
  // References and claims
  'published-energy-without-source': { blocks: [invalid('nosource-c1', 'needs its source', on('reference.source', 'reference:'))] },
  'claim-malformed': { blocks: [invalid('words-c2', 'must be a number', on('claim.energy', 'energy: about'))] },
  'claim-unknown-parameter': { blocks: [invalid('claimb-c3', 'claim names parameter b, which the block does not declare', on('claim.parameters.b', '    b: 0.5'))] },
  'claim-tolerance-without-energy': { blocks: [invalid('tolonly-c4', 'tolerance applies to a claimed energy, and none is given', on('claim.tolerance', 'tolerance:'))] },
  'claim-negative-tolerance': { blocks: [invalid('negtol-c5', 'must be positive', on('claim.tolerance', 'tolerance:'))] },
  // The oscillator x^2/2 (mass 1) has ground level 1/2 exactly, and the Gaussian family contains
  // its ground state (any quantum mechanics textbook): a claim of 0.45 is disputed, a published
  // 0.55 lies above the variational 0.5, so the block is below that reference.
  'claim-disputed': { blocks: [{ id: 'wrong-c6', status: 'disputed', message: 'claimed 0.45 +/- 0.001, recomputed 0.5' }] },
  'published-reference-too-high': { blocks: [{ id: 'highref-c7', status: 'below-reference', message: 'E - E(published) = -0.05' }] },
  // The optimum a = 1/2 (same textbook ground state, exp(-x^2/2)) lies outside [0.01, 0.1].
  'range-too-narrow': { blocks: [{ id: 'narrow-c8', status: 'unsettled', message: 'a sits on its max 0.1; widen the range' }] },
  // Front matter: the record's problem is reported, and its block is still evaluated.
  'front-matter-broken': { record: [{ field: 'title', at: 'title:', message: 'front matter is not valid YAML: Missing closing "quote' }], blocks: [healthy('fm-f1')] },
  'front-matter-missing': { record: [{ field: 'front matter', at: 'Front matter F2', message: 'the record has no YAML front matter' }], blocks: [healthy('fm-f2')] },
  'front-matter-unclosed': { record: [{ field: 'front matter', at: '---', message: 'is never closed' }], blocks: [healthy('fm-f3')] },
  // ISO 8601 calendar dates have months 01 to 12.
  'front-matter-bad-date': { record: [{ field: 'date', at: 'date:', message: 'front matter date 2027-13-45 has month 13' }], blocks: [healthy('fm-f5')] },
  'front-matter-wrong-types': {
    record: [
      { field: 'tags', at: 'tags: corpus', message: 'front matter tags must be a list' },
      { field: 'title', at: 'title:', message: 'front matter title must be text' },
    ],
    blocks: [healthy('fm-f4')],
  },
};

/** 1-based line of the first line at or after `from` that contains `text`. */
function lineOf(lines: string[], text: string, from = 1): number {
  for (let i = from - 1; i < lines.length; i++) if (lines[i].includes(text)) return i + 1;
  throw new Error(`no line contains ${JSON.stringify(text)}`);
}

/** 1-based lines of the opening fences of the spec blocks, in order. */
function fenceLines(lines: string[]): number[] {
  return lines.flatMap((line, i) => (line.startsWith('```variational') ? [i + 1] : []));
}

const names = readdirSync(join(ROOT, FOLDER))
  .filter((name) => name.endsWith('.md'))
  .map((name) => name.slice(0, -3))
  .sort();
const results = new Map<string, RecordResult>();
function result(name: string): RecordResult {
  if (!results.has(name)) results.set(name, checkRecord(join(ROOT, FOLDER, `${name}.md`), { cwd: ROOT }));
  return results.get(name)!;
}

describe('the broken-record corpus', () => {
  it('has at least 40 records, and an expectation for each of them', () => {
    expect(names.length).toBeGreaterThanOrEqual(40);
    expect(names).toEqual(Object.keys(EXPECTED).sort());
  });

  describe.each(names)('%s', (name) => {
    const expected = EXPECTED[name];
    const file = `${FOLDER}/${name}.md`;
    const lines = readFileSync(join(ROOT, file), 'utf8').split('\n');

    it('gets the expected status and message for every block, at the line of its fence', () => {
      const got = result(name);
      expect(got.file).toBe(file);
      expect(got.blocks.map((b) => [b.id, b.status])).toEqual(expected.blocks.map((b) => [b.id, b.status]));
      const fences = fenceLines(lines);
      got.blocks.forEach((block, i) => {
        expect(block.line).toBe(fences[i]);
        if (expected.blocks[i].message) expect(block.message).toContain(expected.blocks[i].message);
        else expect(block.message).toBeNull();
      });
    });

    it('names file, line, block and field of every problem', () => {
      const got = result(name);
      const fences = fenceLines(lines);
      got.blocks.forEach((block, i) => {
        const want = expected.blocks[i];
        const problems = block.problems.map((p) => ({ file: p.file, line: p.line, block: p.block, field: p.field }));
        const wanted = (want.problems ?? []).map((p) => ({ file, line: lineOf(lines, p.at, fences[i]), block: want.id, field: p.field }));
        expect(problems).toEqual(wanted);
        // The block's message carries every problem's text.
        for (const p of block.problems) expect(block.message).toContain(p.message);
      });
      const record = got.problems.map((p) => ({ file: p.file, line: p.line, block: p.block, field: p.field }));
      expect(record).toEqual((expected.record ?? []).map((p) => ({ file, line: lineOf(lines, p.at), block: null, field: p.field })));
      (expected.record ?? []).forEach((p, k) => expect(got.problems[k].message).toContain(p.message));
    });
  });

  it('every block of the corpus ends with one of the five statuses, and the healthy blocks beside broken ones confirm', () => {
    const statuses = names.flatMap((name) => result(name).blocks.map((b) => b.status));
    for (const status of statuses) expect(STATUS_ORDER).toContain(status);
    const count = (s: string) => statuses.filter((t) => t === s).length;
    // 74 blocks: 64 invalid, 7 healthy (confirmed), one each of disputed, below-reference, unsettled.
    expect({ invalid: count('invalid'), 'below-reference': count('below-reference'), unsettled: count('unsettled'), disputed: count('disputed'), confirmed: count('confirmed') }).toEqual({
      invalid: 64,
      'below-reference': 1,
      unsettled: 1,
      disputed: 1,
      confirmed: 7,
    });
  });
});
