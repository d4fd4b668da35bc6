import { describe, expect, it } from 'vitest';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import type { BlockResult } from '../../src/log/result-types.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';

// Quantity-mode blocks as a record states them (RECORD-FORMAT.md "Quantity mode"), through parseRecord and evaluateBlock.

const FILE = 'content/records/units.md';

function run(block: string): BlockResult {
  const text = ['---', 'title: Units', 'author: test', 'date: 2026-01-01', 'tags: []', '---', '', '```variational', block, '```', ''].join('\n');
  return evaluateBlock(FILE, parseRecord(FILE, text).blocks[0]);
}

// NIST CODATA 2018: hbar = 1.054571817e-34 J s, k_B = 1.380649e-23 J/K (exact), e = 1.602176634e-19 C (exact).
const HBAR = 1.054571817e-34;
const KB = 1.380649e-23;
const EV = 1.602176634e-19;

const oscillator = (report: string) => `id: thz-trap
units: { length: nm, energy: meV }
mass: 1 electronMass
constants:
  omega: 2 pi THz
potential: mass omega^2 x^2 / 2
trial: exp(-a x^2)
parameters:
  a: { start: 0.05 nm^-2, min: 0.001 nm^-2, max: 1 nm^-2 }
${report}`;

describe('quantity mode end to end', () => {
  it('an oscillator with omega = 2 pi THz has hbar omega / 2 in meV, its width parameter in nm^-2', () => {
    const result = run(oscillator(''));
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(result.energy!.unit).toBe('meV');
    const expected = (HBAR * 2 * Math.PI * 1e12) / 2 / (EV * 1e-3);
    expect(Math.abs(result.energy!.value - expected) / expected).toBeLessThan(1e-9);
    expect(result.parameters.a.unit).toBe('nm^-2');
    // The exact Gaussian has a = m omega / (2 hbar) with the CODATA 2018 electron mass 9.1093837015e-31 kg.
    const a = (9.1093837015e-31 * 2 * Math.PI * 1e12) / (2 * HBAR) / 1e18;
    expect(Math.abs(result.parameters.a.value - a) / a).toBeLessThan(1e-5);
    // Reference levels and bounds come back in the same unit.
    expect(Math.abs(result.reference!.energy! - expected) / expected).toBeLessThan(1e-8);
    expect(result.reference!.excited! / result.reference!.energy!).toBeCloseTo(3, 8);
  });

  it('report.energy-unit asks for kelvin: E / k_B', () => {
    const result = run(oscillator('report: { energy-unit: K }'));
    expect(result.energy!.unit).toBe('K');
    const expected = (HBAR * 2 * Math.PI * 1e12) / 2 / KB;
    expect(Math.abs(result.energy!.value - expected) / expected).toBeLessThan(1e-9);
  });

  it('a potential that is not an energy is invalid, naming the term and the field', () => {
    const result = run(`id: bad\nunits: { length: nm, energy: meV }\npotential: x^2\ntrial: exp(-a x^2)\nparameters:\n  a: { start: 0.05 nm^-2, min: 0.001 nm^-2, max: 1 nm^-2 }`);
    expect(result.status).toBe('invalid');
    expect(result.problems[0].field).toBe('potential');
    expect(result.problems[0].message).toMatch(/must be an energy.*x \^ 2/);
  });

  it('a number with a unit in an atomic-unit block is invalid, pointing to quantity mode', () => {
    const result = run('id: atomic\nmass: 0.067 electronMass\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.5, min: 0.1, max: 2 }');
    expect(result.status).toBe('invalid');
    expect(result.problems[0].field).toBe('mass');
    expect(result.problems[0].message).toMatch(/quantity mode/);
  });
});
