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

describe('a block in bohr and hartree is the same block as in atomic units', () => {
  // Same Hamiltonian, trial and range: V = x^2/2 with exp(-a x^2); the exact optimum is a = 1/2, E = 1/2 (any QM textbook).
  const atomic = run('id: au\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.3, min: 0.01, max: 5 }');
  const quantity = run(
    'id: qm\nunits: { length: bohr, energy: hartree }\npotential: 0.5 hartree * (x / (1 bohr))^2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.3 bohr^-2, min: 0.01 bohr^-2, max: 5 bohr^-2 }',
  );

  it('gives the same numbers, stated in hartree and bohr', () => {
    expect(quantity.status).toBe(atomic.status);
    expect(quantity.energy!.unit).toBe('hartree');
    expect(quantity.energy!.value).toBeCloseTo(0.5, 12);
    const same = (a: number | null | undefined, b: number | null | undefined) => expect(Math.abs(a! - b!)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(b!)));
    same(quantity.energy!.value, atomic.energy!.value);
    same(quantity.parameters.a.value, atomic.parameters.a.value);
    same(quantity.reference!.energy, atomic.reference!.energy);
    same(quantity.reference!.excited, atomic.reference!.excited);
    same(quantity.bounds.lower, atomic.bounds.lower);
    same(quantity.diagnostics!.grid!.domain[1], atomic.diagnostics!.grid!.domain[1]);
    expect(quantity.parameters.a.unit).toBe('bohr^-2');
  });
});

describe('claims in spectroscopic units', () => {
  // hbar omega / 2 with omega = 2 pi x 1 THz is h x 0.5 THz: 500000 MHz exactly, 0.5e12 / c = 16.6782048 cm^-1 and
  // h 0.5e12 / k_B = 23.9962154 K (h, c and k_B exact in the 2019 SI; NIST CODATA 2018).
  it.each([
    ['16.678 cm^-1', 'confirmed'],
    ['16.70 cm^-1', 'disputed'],
    ['23.996 K', 'confirmed'],
    ['23996.2 mK', 'confirmed'],
    ['24.05 K', 'disputed'],
    ['500000 MHz', 'confirmed'],
    ['500 GHz', 'confirmed'],
  ])('claim.energy %s is %s', (claim, status) => {
    const result = run(oscillator(`claim:\n  energy: ${claim}`));
    expect(result.status, result.checks.map((c) => c.detail).join('; ')).toBe(status);
  });

  it('report.energy-unit GHz states E = h f: 500 GHz', () => {
    const result = run(oscillator('report: { energy-unit: GHz }'));
    expect(result.energy!.unit).toBe('GHz');
    expect(result.energy!.value).toBeCloseTo(500, 6);
  });

  it('a refused energy unit is invalid, naming the field and its line', () => {
    const result = run('id: bad-unit\nunits: { length: nm, energy: furlong }\npotential: 0 meV\ntrial: exp(-a x^2)\nparameters:\n  a: { start: 0.05 nm^-2, min: 0.001 nm^-2, max: 1 nm^-2 }');
    expect(result.status).toBe('invalid');
    // Six lines of front matter, a blank line, the fence and the id: units is line 10 of the file.
    expect(result.problems.map((p) => [p.field, p.line])).toEqual([['units.energy', 10]]);
    expect(result.problems[0].message).toMatch(/^furlong is not a unit/);
  });
});
