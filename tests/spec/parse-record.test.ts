import { describe, expect, it } from 'vitest';
import { parseRecord } from '../../src/spec/parse-record.ts';
import type { BlockEntry, BlockSpec, SpecProblem } from '../../src/spec/types.ts';

// Records follow /work/shared/RECORD-FORMAT.md (the project's contract); every expectation below
// that is not a line number or a number's precision is taken from that contract.

const FILE = 'content/records/trap.md';

/** A record with front matter, a prose paragraph, and the given block bodies as fenced `variational` blocks. */
function record(...blocks: string[]): string {
  const head = ['---', 'title: Ground level of the trap', 'author: device-modelling team', 'date: 2026-11-30', 'tags: [trap, anharmonic]', '---', '', 'We bracket the lowest level.', ''];
  const parts = [...head];
  for (const block of blocks) parts.push('```variational', block.replace(/\n$/, ''), '```', '', 'More prose.', '');
  return parts.join('\n');
}

/** The 1-based line of the first line of `text` that satisfies `test` (counted by hand, independently of the parser). */
function lineWhere(text: string, test: (line: string) => boolean, after = 0): number {
  const lines = text.split('\n');
  for (let i = after; i < lines.length; i++) if (test(lines[i])) return i + 1;
  throw new Error('no such line');
}

const GOOD = `id: gauss-2p
mass: 1
potential: x^2/2 + 0.1*x^4
trial: exp(-a*x^2) * (1 + c*x^2)
parameters:
  a: { start: 0.5, min: 0.01, max: 10 }
  c: { start: 0, min: -1, max: 1 }
claim:
  energy: 0.5591
  tolerance: 0.0005
`;

function spec(entry: BlockEntry | undefined): BlockSpec {
  if (!entry || entry.kind !== 'spec') throw new Error(`expected a valid block, got ${JSON.stringify(entry)}`);
  return entry.spec;
}

function problems(entry: BlockEntry | undefined): SpecProblem[] {
  if (!entry || entry.kind !== 'invalid') throw new Error(`expected an invalid block, got ${JSON.stringify(entry)}`);
  return entry.problems;
}

/** Parses one block (its body) inside a standard record and returns the block's entry. */
function one(body: string): BlockEntry {
  const parsed = parseRecord(FILE, record(body));
  expect(parsed.blocks).toHaveLength(1);
  return parsed.blocks[0];
}

/** A minimal valid block with extra lines appended. */
const minimal = (extra = '') => `id: b1\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.5, min: 0.01, max: 10 }\n${extra}`;

describe('parseRecord: a good record (RECORD-FORMAT.md example)', () => {
  const text = record(GOOD);
  const parsed = parseRecord(FILE, text);

  it('reads the front matter', () => {
    expect(parsed.file).toBe(FILE);
    expect(parsed.problems).toEqual([]);
    expect(parsed.frontMatter).toEqual({ title: 'Ground level of the trap', author: 'device-modelling team', date: '2026-11-30', tags: ['trap', 'anharmonic'] });
  });

  it('reads every field of the block as written', () => {
    const s = spec(parsed.blocks[0]);
    expect(s.id).toBe('gauss-2p');
    expect(s.caption).toBeNull();
    expect(s.potential.text).toBe('x^2/2 + 0.1*x^4');
    expect(s.trial?.text).toBe('exp(-a*x^2) * (1 + c*x^2)');
    expect(s.varied.map(({ name, start, min, max }) => ({ name, start, min, max }))).toEqual([
      { name: 'a', start: 0.5, min: 0.01, max: 10 },
      { name: 'c', start: 0, min: -1, max: 1 },
    ]);
    expect(s.fixed).toEqual({});
    // An explicit tolerance is taken as written.
    expect(s.claim?.energy).toEqual({ value: 0.5591, tolerance: 0.0005 });
  });

  it('fills in the contract defaults: space line, mass 1, units atomic, plots [scan, density], solve true', () => {
    const s = spec(one('id: d\npotential: x^2/2\ntrial: exp(-x^2)\n'));
    expect(s.space).toBe('line');
    expect(s.mass).toBe(1);
    expect(s.units).toBe('atomic');
    expect(s.box).toBeNull();
    expect(s.angularMomentum).toBe(0);
    expect(s.report.plots).toEqual(['scan', 'density']);
    expect(s.reference.solve).toBe(true);
    expect(s.reference.energy).toBeNull();
    expect(s.claim).toBeNull();
    expect(s.varied).toEqual([]);
  });

  it('places the block on the line of its opening fence and each field on its own line of the file', () => {
    const s = spec(parsed.blocks[0]);
    const fence = lineWhere(text, (l) => l === '```variational');
    expect(s.line).toBe(fence);
    expect(s.potential.line).toBe(lineWhere(text, (l) => l.startsWith('potential:')));
    expect(s.trial?.line).toBe(lineWhere(text, (l) => l.startsWith('trial:')));
    expect(s.varied[0].line).toBe(lineWhere(text, (l) => l.startsWith('  a:')));
    expect(s.varied[1].line).toBe(lineWhere(text, (l) => l.startsWith('  c:')));
  });

  it('keeps file line numbers for the second of two blocks', () => {
    const two = record(GOOD, GOOD.replace('gauss-2p', 'gauss-2q'));
    const blocks = parseRecord(FILE, two).blocks;
    const secondFence = lineWhere(two, (l) => l === '```variational', lineWhere(two, (l) => l === '```variational'));
    expect(spec(blocks[1]).line).toBe(secondFence);
    expect(spec(blocks[1]).trial?.line).toBe(lineWhere(two, (l) => l.startsWith('trial:'), secondFence));
  });

  it('reads a fixed parameter, constants and a published reference', () => {
    const s = spec(one(minimal('  w: 2\nconstants:\n  k: 3\nreference:\n  solve: false\n  energy: 0.5\n  source: "any QM textbook"\n')));
    expect(s.fixed).toEqual({ w: 2 });
    expect(s.constants).toEqual({ k: 3 });
    expect(s.reference.solve).toBe(false);
    expect(s.reference.source).toBe('any QM textbook');
    expect(s.reference.energy?.value).toBe(0.5);
  });

  it('reports a record without front matter but still reads its blocks', () => {
    const parsed2 = parseRecord(FILE, '```variational\n' + minimal() + '```\n');
    expect(parsed2.problems).toHaveLength(1);
    expect(parsed2.problems[0]).toMatchObject({ file: FILE, line: 1, field: 'front matter' });
    expect(spec(parsed2.blocks[0]).line).toBe(1);
  });
});

describe('parseRecord: blocks that are refused', () => {
  it('bad YAML: invalid, names the file and a line inside the block', () => {
    const text = record('id: y1\npotential: [x^2\ntrial: exp(-x^2)\n');
    const entry = parseRecord(FILE, text).blocks[0];
    const p = problems(entry);
    expect(p.length).toBeGreaterThan(0);
    expect(p[0].file).toBe(FILE);
    expect(p[0].message).toMatch(/not valid YAML/);
    const fence = lineWhere(text, (l) => l === '```variational');
    expect(p[0].line).toBeGreaterThan(fence);
    expect(p[0].line).toBeLessThan(fence + 5);
  });

  it('an unknown field (typo potental) is named with its line', () => {
    const text = record('id: t1\npotental: x^2/2\npotential: x^2/2\ntrial: exp(-x^2)\n');
    const p = problems(parseRecord(FILE, text).blocks[0]);
    const hit = p.find((q) => q.message.includes('potental'));
    expect(hit).toBeDefined();
    expect(hit!.message).toMatch(/unknown field/);
    expect(hit!.block).toBe('t1');
    expect(hit!.file).toBe(FILE);
  });

  it('an unknown field is located on the line of the misspelt key, with field naming it', () => {
    const text = record('id: t1\npotental: x^2/2\npotential: x^2/2\ntrial: exp(-x^2)\n');
    const p = problems(parseRecord(FILE, text).blocks[0]);
    const hit = p.find((q) => q.field === 'potental');
    expect(hit).toBeDefined();
    expect(hit!.line).toBe(text.split('\n').indexOf('potental: x^2/2') + 1);
  });

  it('a missing potential is reported on field potential', () => {
    const p = problems(one('id: m1\ntrial: exp(-x^2)\n'));
    expect(p.map((q) => q.field)).toContain('potential');
    expect(p.find((q) => q.field === 'potential')!.message).toMatch(/required/);
  });

  it('a missing trial (and no basis) is reported on field trial', () => {
    const p = problems(one('id: m2\npotential: x^2/2\n'));
    expect(p).toHaveLength(1);
    expect(p[0]).toMatchObject({ field: 'trial', block: 'm2', file: FILE });
    expect(p[0].message).toMatch(/trial/);
  });

  it('mass: "heavy" is refused as not a number, on the mass line', () => {
    const text = record('id: w1\nmass: heavy\npotential: x^2/2\ntrial: exp(-x^2)\n');
    const p = problems(parseRecord(FILE, text).blocks[0]);
    expect(p).toHaveLength(1);
    expect(p[0].field).toBe('mass');
    expect(p[0].message).toMatch(/number/);
    expect(p[0].line).toBe(lineWhere(text, (l) => l.startsWith('mass:')));
  });

  it('a mass that names the coordinate is kept as an expression with its line; other text stays refused', () => {
    const text = record('id: w1\nmass: "x < 0 ? 0.067 : 0.092"\npotential: x^2/2\ntrial: exp(-x^2)\n');
    expect(spec(parseRecord(FILE, text).blocks[0]).mass).toEqual({ text: 'x < 0 ? 0.067 : 0.092', line: lineWhere(text, (l) => l.startsWith('mass:')) });
    // exp names no coordinate of its own: a word that merely contains x is not an expression of x.
    const p = problems(one(minimal('mass: "exp(1)"\n')));
    expect(p[0].message).toMatch(/must be a number in atomic units \(or an expression of the coordinate x/);
    // On the radial space the coordinate is r.
    expect(problems(one(minimal('space: radial\nmass: "x < 1 ? 1 : 2"\n')))[0].field).toBe('mass');
  });

  it('a negative mass is refused as not positive', () => {
    const p = problems(one('id: w2\nmass: -1\npotential: x^2/2\ntrial: exp(-x^2)\n'));
    expect(p).toHaveLength(1);
    expect(p[0].field).toBe('mass');
    expect(p[0].message).toMatch(/positive/);
  });

  it('a parameter range with min >= max is refused on parameters.a.max', () => {
    const text = record('id: r1\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 2, max: 2 }\n');
    const p = problems(parseRecord(FILE, text).blocks[0]);
    expect(p).toHaveLength(1);
    expect(p[0].field).toBe('parameters.a.max');
    expect(p[0].message).toMatch(/max/);
    expect(p[0].line).toBe(lineWhere(text, (l) => l.startsWith('  a:')));
  });

  it('a start outside its range is refused on parameters.a.start', () => {
    const p = problems(one('id: r2\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 20, min: 0.01, max: 10 }\n'));
    expect(p).toHaveLength(1);
    expect(p[0].field).toBe('parameters.a.start');
    expect(p[0].message).toMatch(/start/);
  });

  it('box on space radial is refused', () => {
    const p = problems(one('id: b2\nspace: radial\nbox: [0, 1]\npotential: -1/r\ntrial: exp(-a*r)\nparameters:\n  a: { start: 1, min: 0.1, max: 5 }\n'));
    expect(p).toHaveLength(1);
    expect(p[0].field).toBe('box');
    expect(p[0].message).toMatch(/line only/);
  });

  it('a box with its walls in the wrong order is refused', () => {
    const p = problems(one(minimal('box: [1, 0]\n')));
    expect(p.map((q) => q.field)).toEqual(['box']);
  });

  it('angular-momentum on space line is refused', () => {
    const p = problems(one(minimal('angular-momentum: 1\n')));
    expect(p).toHaveLength(1);
    expect(p[0].field).toBe('angular-momentum');
    expect(p[0].message).toMatch(/radial/);
  });

  it('a published reference energy without a source is refused on reference.source', () => {
    const p = problems(one(minimal('reference:\n  energy: 0.5\n')));
    expect(p).toHaveLength(1);
    expect(p[0].field).toBe('reference.source');
    expect(p[0].message).toMatch(/source/);
  });

  it('a claim naming an undeclared parameter is refused and names it', () => {
    const p = problems(one(minimal('claim:\n  energy: 0.5\n  parameters:\n    b: 0.5\n')));
    expect(p).toHaveLength(1);
    expect(p[0].field).toBe('claim.parameters.b');
    expect(p[0].message).toMatch(/\bb\b/);
  });

  it('a duplicate id: the first block stands, the second is invalid and names the first line', () => {
    const text = record(minimal(), minimal());
    const blocks = parseRecord(FILE, text).blocks;
    expect(blocks).toHaveLength(2);
    expect(blocks[0].kind).toBe('spec');
    const first = lineWhere(text, (l) => l === '```variational');
    const second = lineWhere(text, (l) => l === '```variational', first);
    const p = problems(blocks[1]);
    expect(p).toHaveLength(1);
    expect(p[0].field).toBe('id');
    expect(p[0].block).toBe('b1');
    expect(p[0].message).toContain(`line ${first}`);
    expect(p[0].line).toBe(lineWhere(text, (l) => l.startsWith('id:'), second));
    expect(blocks[1].kind === 'invalid' && blocks[1].line).toBe(second);
  });

  it('a number with a unit in an atomic-unit block is refused, pointing to quantity mode', () => {
    const p = problems(one(minimal('mass: 0.067 electronMass\n')));
    expect(p).toHaveLength(1);
    expect(p[0].field).toBe('mass');
    expect(p[0].message).toMatch(/must be a number in atomic units.*quantity mode/);
  });

  it('a quantity-mode block is converted to atomic units, keeping how to state results in its units', () => {
    // 1 nm = 18.897261246 bohr (NIST CODATA 2018 Bohr radius 5.29177210903e-11 m).
    const s = spec(one('id: q\nunits: { length: nm, energy: meV }\npotential: 0\nbox: [0, 2]\ntrial: x*(2 nm - x)\n'));
    expect(s.box![1]).toBeCloseTo(2 / 0.0529177210903, 6);
    expect(s.quantity?.energy.unit).toBe('meV');
    expect(s.quantity?.length.unit).toBe('nm');
  });

  it('a basis block keeps each function with its own line, and states', () => {
    const text = 'id: lb\npotential: x^2/2\nbasis:\n  - exp(-x^2)\n  - x^2*exp(-x^2)\nstates: 2\n';
    const s = spec(one(text));
    expect(s.trial).toBeNull();
    expect(s.basis?.map((b) => b.text)).toEqual(['exp(-x^2)', 'x^2*exp(-x^2)']);
    expect(s.basis?.[1].line).toBe(s.basis![0].line + 1);
    expect(s.states).toBe(2);
  });

  it('a block with both a trial and a basis, or states without a basis, is refused naming the field', () => {
    expect(problems(one('id: lb\npotential: x^2/2\ntrial: exp(-x^2)\nbasis: [exp(-x^2)]\n')).map((q) => q.field)).toContain('basis');
    expect(problems(one('id: lb\npotential: x^2/2\ntrial: exp(-x^2)\nstates: 2\n')).map((q) => q.field)).toContain('states');
    expect(problems(one('id: lb\npotential: x^2/2\nbasis: []\n')).map((q) => q.field)).toContain('basis');
  });
});

describe('parseRecord: the tolerance a written number implies', () => {
  it('a claimed energy 0.5591 without tolerance gets half a unit in the last digit, 0.00005 (common practice)', () => {
    const s = spec(one(minimal('claim:\n  energy: 0.5591\n')));
    expect(s.claim?.energy?.value).toBe(0.5591);
    expect(s.claim?.energy?.tolerance).toBeCloseTo(0.00005, 15);
  });

  it('trailing zeros count as written digits: 0.50 -> 0.005 (common practice)', () => {
    const s = spec(one(minimal('claim:\n  energy: 0.50\n')));
    expect(s.claim?.energy?.tolerance).toBeCloseTo(0.005, 15);
  });

  it('a claimed parameter written 0.5 gets 0.05 (common practice)', () => {
    const s = spec(one(minimal('claim:\n  parameters:\n    a: 0.5\n')));
    expect(s.claim?.parameters.a.value).toBe(0.5);
    expect(s.claim?.parameters.a.tolerance).toBeCloseTo(0.05, 15);
  });

  it('a published reference energy gets a whole unit in the last digit: 1.0603620904 -> 1e-10 (tables are often truncated; common practice)', () => {
    const s = spec(one(minimal('reference:\n  energy: 1.0603620904\n  source: "quartic oscillator ground level, from memory"\n')));
    expect(s.reference.energy?.value).toBe(1.0603620904);
    expect(s.reference.energy!.tolerance).toBeGreaterThan(0.99e-10);
    expect(s.reference.energy!.tolerance).toBeLessThan(1.01e-10);
  });
});

// Suggestions come from the nearest valid name by edit distance (src/spec/nearest-name.ts, Damerau 1964);
// the valid names are the record format's field table (docs/record-format.md).
describe('parseRecord: misspelt fields get the nearest valid one', () => {
  it.each([
    ['a top-level field', 'id: t1\npotental: x^2/2\ntrial: exp(-x^2)\n', 'potental', 'unknown field potental: did you mean potential?'],
    ['a field of reference', minimal('reference:\n  sorce: "a textbook"\n  energy: 0.5\n'), 'reference.sorce', 'unknown field sorce: did you mean source?'],
    ['a field of claim', minimal('claim:\n  energy: 0.5\n  tolerence: 0.01\n'), 'claim.tolerence', 'unknown field tolerence: did you mean tolerance?'],
    ['a field of a varied parameter', 'id: t1\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { strat: 0.5, min: 0.01, max: 10 }\n', 'parameters.a.strat', 'unknown field strat: did you mean start?'],
  ])('%s', (_what, body, field, message) => {
    const p = problems(one(body));
    expect(p).toContainEqual(expect.objectContaining({ field, message }));
  });

  it('offers nothing when no field is close', () => {
    const p = problems(one(minimal('colour: blue\n')));
    expect(p).toContainEqual(expect.objectContaining({ field: 'colour', message: 'unknown field colour' }));
  });
});

describe('parseRecord: a misspelt physical constant in quantity mode gets the mathjs name', () => {
  it('elementaryCharg -> elementaryCharge', () => {
    const body = 'id: q1\nunits: { length: nm, energy: meV }\nspace: radial\npotential: -elementaryCharg^2 / (4 pi electricConstant 12.9 r)\ntrial: exp(-r / b)\nparameters:\n  b: { start: 5 nm, min: 0.5 nm, max: 50 nm }\n';
    const p = problems(one(body));
    expect(p).toEqual([expect.objectContaining({ field: 'potential', message: expect.stringMatching(/^unknown name elementaryCharg: did you mean elementaryCharge\?/) })]);
  });
});
