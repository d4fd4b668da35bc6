import { describe, expect, it } from 'vitest';
import { parseRecord } from '../../src/spec/parse-record.ts';
import type { BlockEntry, BlockSpec, SpecProblem } from '../../src/spec/types.ts';

/** `sweep` and `{ value, uncertainty }` as the spec layer reads them (docs/record-format.md, "Sweeps", "Uncertain inputs"). */

const FILE = 'content/records/field.md';
function one(body: string): BlockEntry {
  const text = ['---', 'title: t', '---', '', '```variational', body.replace(/\n$/, ''), '```', ''].join('\n');
  return parseRecord(FILE, text).blocks[0];
}
function spec(entry: BlockEntry): BlockSpec {
  if (entry.kind !== 'spec') throw new Error(`expected a valid block, got ${JSON.stringify(entry.problems)}`);
  return entry.spec;
}
function problems(entry: BlockEntry): SpecProblem[] {
  if (entry.kind !== 'invalid') throw new Error('expected an invalid block');
  return entry.problems;
}
const block = (extra: string) => `id: w1\nbox: [0, 1]\nconstants:\n  F: 0.5\npotential: F*x\ntrial: x*(1-x)*exp(b*x)\nparameters:\n  b: { start: 0, min: -5, max: 5 }\n${extra}`;

describe('sweep', () => {
  it('reads values as listed', () => {
    expect(spec(one(block('sweep: { constant: F, values: [0, 0.1, 0.3] }\n'))).sweep).toMatchObject({ constant: 'F', values: [0, 0.1, 0.3] });
  });

  it('spaces from/to/points evenly, both ends included', () => {
    const values = spec(one(block('sweep: { constant: F, from: 0, to: 1, points: 5 }\n'))).sweep!.values;
    expect(values).toEqual([0, 0.25, 0.5, 0.75, 1]);
  });

  it('reads swept quantities in atomic units, a bare number in the unit the constant was written in', () => {
    const body = 'id: q1\nunits: { length: nm, energy: meV }\nbox: [0 nm, 10 nm]\nconstants:\n  F: 10 kV/cm\npotential: elementaryCharge*F*x\ntrial: x*(10 nm - x)*exp(b*x/(1 nm))\nparameters:\n  b: { start: 0, min: -1, max: 1 }\nsweep: { constant: F, values: [0, 20, 1 MV/m] }\n';
    const s = spec(one(body));
    // The atomic unit of electric field is 5.14220674763e11 V/m (CODATA 2018, "atomic unit of electric field").
    const au = 5.14220674763e11;
    const values = s.sweep!.values;
    expect(values[0]).toBe(0);
    expect(values[1] / (20e5 / au)).toBeCloseTo(1, 10);
    expect(values[2] / (1e6 / au)).toBeCloseTo(1, 10);
    expect(s.quantity!.inputs.F.perAtomic / (au / 1e5)).toBeCloseTo(1, 10);
  });

  it('refuses a sweep over an undeclared name, suggesting the declared one', () => {
    expect(problems(one(block('sweep: { constant: G, values: [0, 1] }\n')))).toEqual([
      expect.objectContaining({ field: 'sweep.constant', message: expect.stringContaining('sweep names G, which the block does not declare under constants') }),
    ]);
  });

  it('refuses a sweep over a varied parameter', () => {
    expect(problems(one(block('sweep: { constant: b, values: [0, 1] }\n')))[0].message).toContain('a sweep runs over a declared constant');
  });

  it('refuses both forms at once, and a range without points', () => {
    expect(problems(one(block('sweep: { constant: F, values: [0], from: 0, to: 1, points: 3 }\n')))[0].message).toContain('not both');
    expect(problems(one(block('sweep: { constant: F, from: 0, to: 1 }\n')))[0].message).toContain('from, to and points together');
  });
});

describe('uncertain inputs', () => {
  it('reads { value, uncertainty } on a constant, a fixed parameter and the mass', () => {
    const s = spec(
      one('id: u1\nspace: radial\nmass: { value: 0.067, uncertainty: 0.001 }\nconstants:\n  epsr: { value: 12.9, uncertainty: 0.1 }\npotential: -q/(epsr*r)\ntrial: exp(-a*r)\nparameters:\n  a: { start: 0.01, min: 0.0001, max: 1 }\n  q: { value: 1, uncertainty: 0 }\n'),
    );
    expect(s.mass).toBe(0.067);
    expect(s.constants.epsr).toBe(12.9);
    expect(s.fixed.q).toBe(1);
    expect(s.uncertainties).toEqual({ mass: 0.001, epsr: 0.1, q: 0 });
  });

  it('refuses an uncertainty on a varied parameter', () => {
    expect(problems(one(block('').replace('max: 5 }', 'max: 5, uncertainty: 0.1 }')))).toEqual([
      expect.objectContaining({ field: 'parameters.b.uncertainty', message: expect.stringContaining('parameter b is varied (the search sets it), so it cannot carry an uncertainty') }),
    ]);
  });

  it('refuses a negative uncertainty, in atomic units and in quantity mode', () => {
    expect(problems(one(block('').replace('F: 0.5', 'F: { value: 0.5, uncertainty: -0.1 }')))[0]).toMatchObject({ field: 'constants.F.uncertainty', message: expect.stringContaining('must not be negative') });
    const body = 'id: q2\nunits: { length: nm, energy: meV }\nspace: radial\nmass: { value: 0.067, uncertainty: -0.001 }\nconstants:\n  epsr: 12.9\npotential: -elementaryCharge^2/(4 pi electricConstant epsr r)\ntrial: exp(-r/b)\nparameters:\n  b: { start: 10 nm, min: 1 nm, max: 100 nm }\n';
    expect(problems(one(body))[0]).toMatchObject({ field: 'mass.uncertainty', message: expect.stringContaining('must not be negative') });
  });

  it('reads an uncertainty in quantity mode in the unit of its value', () => {
    const body = 'id: q3\nunits: { length: nm, energy: meV }\nbox: [0 nm, 10 nm]\nconstants:\n  F: { value: 10 kV/cm, uncertainty: 1 }\npotential: elementaryCharge*F*x\ntrial: x*(10 nm - x)*exp(b*x/(1 nm))\nparameters:\n  b: { start: 0, min: -1, max: 1 }\n';
    const s = spec(one(body));
    expect(s.uncertainties.F / s.constants.F).toBeCloseTo(0.1, 12);
  });

  it('refuses an uncertainty on the swept constant', () => {
    const body = block('sweep: { constant: F, values: [0, 1] }\n').replace('F: 0.5', 'F: { value: 0.5, uncertainty: 0.1 }');
    expect(problems(one(body))[0].message).toContain('cannot also carry an uncertainty');
  });
});
