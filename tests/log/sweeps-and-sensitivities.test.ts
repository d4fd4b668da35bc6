import { describe, expect, it } from 'vitest';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import type { BlockResult } from '../../src/log/result-types.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';

/** Sweeps, Hellmann–Feynman sensitivities and propagated uncertainties against closed forms. */

const FILE = 'content/records/sweep.md';
function evaluate(body: string): BlockResult {
  const text = ['---', 'title: t', '---', '', '```variational', body.replace(/\n$/, ''), '```', ''].join('\n');
  return evaluateBlock(FILE, parseRecord(FILE, text).blocks[0]);
}
const sensitivity = (r: BlockResult, name: string) => r.sensitivities!.find((s) => s.name === name)!;

// The hydrogenic donor: H = -(1/2m*) laplacian - 1/(epsr r) has E = -m*/(2 epsr^2) hartree (the hydrogen ground level,
// -1/2 hartree, scaled by the effective Rydberg m*/epsr^2; any text on shallow donors, e.g. Yu & Cardona,
// "Fundamentals of Semiconductors", section 4.2), so dE/dm* = E/m* and dE/depsr = -2E/epsr exactly.
describe('a donor with uncertain m* and epsr', () => {
  const m = 0.067;
  const epsr = 12.9;
  const [um, ueps] = [0.002, 0.2];
  const E = -m / (2 * epsr ** 2);
  const dEdm = E / m;
  const dEdeps = (-2 * E) / epsr;
  const block = (claim: string) =>
    `id: donor\nspace: radial\nmass: { value: ${m}, uncertainty: ${um} }\nconstants:\n  epsr: { value: ${epsr}, uncertainty: ${ueps} }\npotential: -1/(epsr*r)\ntrial: exp(-a*r)\nparameters:\n  a: { start: 0.01, min: 0.0001, max: 1 }\n${claim}`;
  const result = evaluate(block(''));

  it('recomputes E and each sensitivity by Hellmann–Feynman and by finite difference', () => {
    expect(result.status).toBe('confirmed');
    expect(result.energy!.value / E).toBeCloseTo(1, 10);
    expect(sensitivity(result, 'mass').hellmannFeynman! / dEdm).toBeCloseTo(1, 8);
    expect(sensitivity(result, 'epsr').hellmannFeynman! / dEdeps).toBeCloseTo(1, 8);
    expect(sensitivity(result, 'mass').finiteDifference! / dEdm).toBeCloseTo(1, 5);
    expect(sensitivity(result, 'epsr').finiteDifference! / dEdeps).toBeCloseTo(1, 5);
    expect(result.sensitivities!.every((s) => s.agrees)).toBe(true);
  });

  it('propagates the uncertainties to first order, inputs uncorrelated, and confirms it by re-evaluation', () => {
    // Uncorrelated inputs: u(E)^2 = sum (dE/dc u_c)^2 (GUM, JCGM 100:2008, eq. (10)).
    const uE = Math.hypot(dEdm * um, dEdeps * ueps);
    expect(result.uncertainty!.uncertainty / uE).toBeCloseTo(1, 8);
    // E is linear in m* (exact), and epsr^-2 bends by only (ueps/epsr)^2 over +-u: the re-evaluation agrees.
    expect(result.uncertainty!.reevaluated! / uE).toBeCloseTo(1, 3);
    expect(result.uncertainty!.linear).toBe(true);
  });

  it('checks a claim within its tolerance plus the propagated uncertainty', () => {
    const uE = Math.hypot(dEdm * um, dEdeps * ueps);
    // Off by more than its own tolerance, less than the tolerance plus u(E).
    const claimed = evaluate(block(`claim:\n  energy: ${E + 0.5 * uE}\n  tolerance: ${0.1 * uE}\n`));
    expect(claimed.status).toBe('confirmed');
    expect(claimed.checks.find((c) => c.name === 'claim-energy')!.detail).toContain('propagated uncertainty');
    const far = evaluate(block(`claim:\n  energy: ${E + 3 * uE}\n  tolerance: ${0.1 * uE}\n`));
    expect(far.status).toBe('disputed');
  });

  it('says when the response is not linear over +-u', () => {
    // epsr 12.9 +- 6: E ~ epsr^-2 changes its slope by far more than 10% over the interval.
    const wide = evaluate(block('').replace(`uncertainty: ${ueps}`, 'uncertainty: 6'));
    expect(sensitivity(wide, 'epsr').linear).toBe(false);
    expect(wide.uncertainty!.note).toContain('not linear');
  });
});

// The oscillator in a field, V = m w^2 x^2/2 + F x, is the oscillator displaced by -F/(m w^2): every level shifts by
// exactly -F^2/(2 m w^2) (completing the square), and dE/dF = <x> = -F/(m w^2).
describe('the oscillator in a field, swept', () => {
  const [m, w] = [2, 1.5];
  const values = [0, 0.25, 0.5, 1, 2];
  const result = evaluate(
    `id: shifted\nmass: ${m}\nconstants:\n  w: ${w}\n  F: 0\npotential: mass*w^2*x^2/2 + F*x\ntrial: exp(-a*(x - s)^2)\nparameters:\n  a: { start: 1, min: 0.01, max: 20 }\n  s: { start: 0, min: -5, max: 5 }\nsweep: { constant: F, values: [${values.join(', ')}] }\n`,
  );

  it('carries one entry per point, each the exact shifted level, with its grid reference and bracket', () => {
    expect(result.status).toBe('confirmed');
    expect(result.sweep!.points.map((p) => p.value)).toEqual(values);
    for (const { value: F, result: point } of result.sweep!.points) {
      const exact = w / 2 - F ** 2 / (2 * m * w ** 2);
      expect(point.status).toBe('confirmed');
      expect(point.energy!.value).toBeCloseTo(exact, 9);
      expect(point.reference!.energy!).toBeCloseTo(exact, 8);
      expect(point.bounds.lower!).toBeLessThanOrEqual(point.energy!.value + 1e-9);
      expect(point.parameters.s.value).toBeCloseTo(-F / (m * w ** 2), 6);
    }
  });

  it('warm-starts each point from its neighbour: a point needs fewer energy evaluations than the same point cold', () => {
    const well = (extra: string) => `id: tilt\nbox: [0, 1]\nconstants:\n  F: ${extra === '' ? 2 : 0}\npotential: F*x\ntrial: x*(1 - x)*exp(b*x)\nparameters:\n  b: { start: 0, min: -5, max: 5 }\n${extra}`;
    const swept = evaluate(well('sweep: { constant: F, values: [0, 0.5, 1, 1.5, 2] }\n'));
    const cold = evaluate(well(''));
    const last = swept.sweep!.points[4].result;
    expect(last.energy!.value).toBeCloseTo(cold.energy!.value, 10);
    expect(last.diagnostics!.energyEvaluations).toBeLessThan(cold.diagnostics!.energyEvaluations);
  });

  it('finds dE/dF = <x> = -F/(m w^2) and dE/dm = -<T>/m + <dV/dm> by Hellmann–Feynman at a single field', () => {
    const F = 0.5;
    const single = evaluate(
      `id: one\nmass: ${m}\nconstants:\n  w: ${w}\n  F: ${F}\npotential: mass*w^2*x^2/2 + F*x\ntrial: exp(-a*(x - s)^2)\nparameters:\n  a: { start: 1, min: 0.01, max: 20 }\n  s: { start: 0, min: -5, max: 5 }\n`,
    );
    expect(sensitivity(single, 'F').hellmannFeynman!).toBeCloseTo(-F / (m * w ** 2), 6);
    // E = w/2 - F^2/(2 m w^2): dE/dm = F^2/(2 m^2 w^2), dE/dw = 1/2 + F^2/(m w^3).
    expect(sensitivity(single, 'mass').hellmannFeynman!).toBeCloseTo(F ** 2 / (2 * m ** 2 * w ** 2), 6);
    expect(sensitivity(single, 'w').hellmannFeynman!).toBeCloseTo(0.5 + F ** 2 / (m * w ** 3), 6);
  });
});

// The infinite well of width L in a field F, V = F (x - L/2): second-order perturbation theory gives the ground-level
// shift -(15 - pi^2) m F^2 L^4 / (24 pi^4 hbar^2) (e = 1). Derivation (Dalgarno–Lewis): with psi0 = sqrt(2/L) sin(pi x/L),
// the first-order correction psi1 = f psi0 solves (f' psi0^2)' = 2m (V - <V>) psi0^2; here <V> = 0 and
// f' psi0^2 = 2mF int_0^x (y - L/2) psi0^2 dy, which gives E2 = <psi0|V f|psi0> = -(15 - pi^2) m F^2 L^4/(24 pi^4)
// (as quoted e.g. in Bastard, "Wave Mechanics Applied to Semiconductor Heterostructures", ch. VII, for the
// quantum-confined Stark effect; from memory).
describe('the quadratic Stark shift of a well, from a sweep at small F', () => {
  const L = 1;
  const m = 1;
  const c2 = -((15 - Math.PI ** 2) * m * L ** 4) / (24 * Math.PI ** 4);
  const F = 1;
  const result = evaluate(
    `id: stark\nbox: [0, ${L}]\nconstants:\n  F: 0\npotential: F*(x - ${L / 2})\ntrial: sin(pi*x/${L})*exp(b*(x - ${L / 2}) + c*(x - ${L / 2})^3)\nparameters:\n  b: { start: 0, min: -5, max: 5 }\n  c: { start: 0, min: -5, max: 5 }\nsweep: { constant: F, values: [${-2 * F}, ${-F}, 0, ${F}, ${2 * F}] }\n`,
  );

  it('matches the closed form in the grid reference curve, and in the variational curve to its trial', () => {
    expect(result.status).toBe('confirmed');
    const [down2, down, zero, up, up2] = result.sweep!.points.map((p) => p.result);
    // The even second difference s(F) = (E(F) + E(-F) - 2 E(0)) / (2 F^2) = c2 + c4 F^2 + ...; Richardson's
    // (4 s(F) - s(2F)) / 3 removes the F^4 term, leaving c2 + O(F^4), small enough next to the fields of 1 and 2
    // that keep the grid's 1e-9 errors far below the shift.
    const c2From = (e: (r: BlockResult) => number) => {
      const s = (a: BlockResult, b: BlockResult, f: number) => (e(a) + e(b) - 2 * e(zero)) / (2 * f ** 2);
      return (4 * s(up, down, F) - s(up2, down2, 2 * F)) / 3;
    };
    expect(c2From((r) => r.reference!.energy!) / c2).toBeCloseTo(1, 3);
    // The trial sin(pi x/L) exp(b u + c u^3), u = x - L/2, carries the odd first-order correction nearly exactly.
    expect(c2From((r) => r.energy!.value) / c2).toBeCloseTo(1, 3);
  });
});

// Hydrogen in a field F along z: E(F) = -1/2 - alpha F^2/2 + O(F^4) with the static dipole polarisability alpha = 9/2
// bohr^3 (exact: Dalgarno & Lewis, Proc. R. Soc. A 233, 70 (1955), whose first-order state is
// psi1 = -F z (1 + r/2) psi0). The trial psi0 (1 + b z (1 + r/2)) contains it, so by the 2n + 1 rule its optimum gets the
// F^2 term exactly; the F^4 term (hyperpolarisability) is removed by Richardson's combination of two fields.
describe('the hydrogen static polarisability from a field sweep on the axial space', () => {
  it('is 9/2', { timeout: 240_000 }, () => {
    const result = evaluate(
      'id: h-field\nspace: axial\nconstants:\n  F: 0\npotential: -1/sqrt(rho^2 + z^2) + F*z\ntrial: exp(-sqrt(rho^2 + z^2))*(1 + b*z*(1 + sqrt(rho^2 + z^2)/2))\nparameters:\n  b: { start: 0, min: -1, max: 1 }\nreference: { solve: false }\nsweep: { constant: F, values: [0, 0.01, 0.02] }\n',
    );
    expect(result.status, result.message ?? '').toBe('confirmed');
    const [e0, e1, e2] = result.sweep!.points.map((p) => p.result.energy!.value);
    expect(e0).toBeCloseTo(-0.5, 9);
    // E(F) is even in F: s(F) = (E(F) - E(0)) / F^2 = -alpha/2 + c4 F^2.
    const s = (e: number, F: number) => (e - e0) / F ** 2;
    const alpha = -2 * ((4 * s(e1, 0.01) - s(e2, 0.02)) / 3);
    expect(alpha).toBeCloseTo(4.5, 4);
    // The optimum follows the first-order state: b = -F.
    expect(result.sweep!.points[1].result.parameters.b.value).toBeCloseTo(-0.01, 4);
  });

  it('gives dE/dF = <z> = -alpha F by Hellmann–Feynman with the product cubature, as the re-optimised difference does for an uncertain F', { timeout: 240_000 }, () => {
    const F = 0.01;
    const result = evaluate(
      `id: h-slope\nspace: axial\nconstants:\n  F: { value: ${F}, uncertainty: 0.001 }\npotential: -1/sqrt(rho^2 + z^2) + F*z\ntrial: exp(-sqrt(rho^2 + z^2))*(1 + b*z*(1 + sqrt(rho^2 + z^2)/2))\nparameters:\n  b: { start: 0, min: -1, max: 1 }\nreference: { solve: false }\n`,
    );
    const slope = sensitivity(result, 'F');
    // -alpha F - (gamma/6) F^3 with gamma = 1333 (the F^3 part is 5e-3 of the first here).
    expect(slope.hellmannFeynman! / (-4.5 * F)).toBeCloseTo(1, 2);
    expect(slope.agrees).toBe(true);
  });
});
