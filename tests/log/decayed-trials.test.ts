import { describe, expect, it } from 'vitest';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import type { BlockResult } from '../../src/log/result-types.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';

// Trials whose derivatives are formed of factors that under- and overflow where the trial itself has
// long decayed: sech(x)^p with p < 1 holds sech^(p-1) in its slope, which is Infinity where sech
// underflows (IEEE 754: cosh overflows above x = 710.48), and exp(-p log(cosh x)) holds sinh/cosh,
// which is Infinity/Infinity there. Such points lie where the trial's density is 0 to every digit.

const FILE = 'content/records/decayed.md';

function run(block: string): BlockResult {
  const text = ['---', 'title: Decayed trials', 'author: test', 'date: 2026-01-01', 'tags: []', '---', '', '```variational', block, '```', ''].join('\n');
  return evaluateBlock(FILE, parseRecord(FILE, text).blocks[0]);
}

const relative = (value: number, expected: number) => Math.abs(value - expected) / Math.abs(expected);

// Poschl-Teller well V = -(hbar^2/2m) lambda(lambda+1) sech^2(x) (hbar = m = 1): ground state sech(x)^lambda,
// E = -lambda^2/2 (Landau & Lifshitz, Quantum Mechanics, §23, problem 4; Flugge, Practical Quantum
// Mechanics, problem 39). For V = -0.5 sech^2, lambda(lambda+1) = 1, so lambda = (sqrt 5 - 1)/2.
const LAMBDA = (Math.sqrt(5) - 1) / 2;
const EXACT = -(LAMBDA * LAMBDA) / 2;

describe('a trial evaluated only where it has not decayed', () => {
  it.each([
    ['sech(x)^p', 'sech-power'],
    ['exp(-p*log(cosh(x)))', 'sech-log'],
  ])('%s, p varied in [0.1, 5], reaches the Poschl-Teller ground state and is confirmed', (trial, id) => {
    const result = run(`id: ${id}\npotential: -0.5*sech(x)^2\ntrial: ${trial}\nparameters:\n  p: { start: 1, min: 0.1, max: 5 }`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(relative(result.energy!.value, EXACT)).toBeLessThan(1e-8);
    expect(relative(result.parameters.p.value, LAMBDA)).toBeLessThan(1e-6);
    // The family holds the exact state: its variance is at rounding level.
    expect(result.variance!).toBeLessThan(1e-12);
    expect(relative(result.reference!.energy!, EXACT)).toBeLessThan(1e-8);
  }, 60_000);

  it('sech(x)^p held at p = 0.618034 is evaluated, not refused for its derivative far out', () => {
    const result = run(`id: sech-fixed\npotential: -0.5*sech(x)^2\ntrial: sech(x)^p\nparameters:\n  p: 0.618034`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    // p is 1e-7 off lambda, so E is above the exact level by a second-order amount only.
    expect(result.energy!.value).toBeGreaterThanOrEqual(EXACT);
    expect(relative(result.energy!.value, EXACT)).toBeLessThan(1e-8);
  }, 60_000);

  it.each([
    ['sech(x / w)^p', 'graded-sech'],
    ['exp(-p * log(cosh(x / w)))', 'graded-log'],
  ])('a shallow graded well in meV and nm with the trial %s gives the closed-form level', (trial, id) => {
    const result = run(`id: ${id}
units: { length: nm, energy: meV }
mass: 0.067 electronMass
constants:
  V0: 5 meV
  w: 10 nm
potential: -V0 * sech(x / w)^2
trial: ${trial}
parameters:
  p: { start: 1, min: 0.1, max: 5 }`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    // Same Poschl-Teller well scaled: eps = hbar^2/(2 m w^2), lambda(lambda+1) = V0/eps, E = -eps lambda^2, with
    // NIST CODATA 2018 hbar = 1.054571817e-34 J s, electron mass 9.1093837015e-31 kg, e = 1.602176634e-19 C.
    const eps = 1.054571817e-34 ** 2 / (2 * 0.067 * 9.1093837015e-31 * 1e-16) / 1.602176634e-22;
    const lambda = (Math.sqrt(1 + (4 * 5) / eps) - 1) / 2;
    expect(lambda).toBeLessThan(1);
    expect(relative(result.energy!.value, -eps * lambda * lambda)).toBeLessThan(1e-8);
    expect(relative(result.parameters.p.value, lambda)).toBeLessThan(1e-6);
    // And against the block's own grid reference, which knows nothing of the trial.
    expect(relative(result.energy!.value, result.reference!.energy!)).toBeLessThan(1e-9);
  }, 60_000);
});
