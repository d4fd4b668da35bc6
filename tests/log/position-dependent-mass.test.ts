import { describe, expect, it } from 'vitest';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import type { BlockResult } from '../../src/log/result-types.ts';
import { provenance } from '../../src/log/provenance.ts';
import { renderBlockPanel } from '../../src/render/block-panel.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';
import { steppedWellLevel } from '../engine/bdd-square-well.ts';

// Blocks with a position-dependent mass (RECORD-FORMAT.md "Position-dependent mass") through parseRecord and
// evaluateBlock, against the BenDaniel–Duke square-well levels of tests/engine/bdd-square-well.ts.

const FILE = 'content/records/heterostructure.md';

function run(block: string): BlockResult {
  const text = ['---', 'title: Junctions', 'author: test', 'date: 2026-01-01', 'tags: []', '---', '', '```variational', block, '```', ''].join('\n');
  return evaluateBlock(FILE, parseRecord(FILE, text).blocks[0]);
}

const relative = (value: number, exact: number) => Math.abs(value - exact) / Math.abs(exact);

describe('position-dependent mass in atomic units', () => {
  const well = { halfWidth: 1.2, depth: 4, massIn: 0.6, massOut: 1.7 };
  const [e0, e1] = [steppedWellLevel(well, 0), steppedWellLevel(well, 1)];
  const header = `mass: "abs(x) < 1.2 ? 0.6 : 1.7"\npotential: "abs(x) < 1.2 ? 0 : 4"`;

  it('a Gaussian trial is an upper bound above the exact level and is confirmed; the grid has the lowest two levels to 1e-8', () => {
    const result = run(`id: step-gauss\n${header}\ntrial: exp(-b*x^2)\nparameters:\n  b: { start: 0.5, min: 0.01, max: 10 }`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(result.energy!.value).toBeGreaterThan(e0);
    expect(relative(result.reference!.energy!, e0)).toBeLessThan(1e-8);
    expect(relative(result.reference!.excited!, e1)).toBeLessThan(1e-8);
    // The Gaussian's slope is continuous where the mass steps, so psi'/m is not: H psi holds a delta function.
    expect(result.variance).toBeNull();
    expect(result.varianceNote).toMatch(/the mass steps from 1\.7 to 0\.6 and the trial's psi'\/m is not continuous/);
    expect(result.virial).toBeNull();
    expect(result.inputs!.mass).toBeNull();
    expect(result.inputs!.massTex).toContain('1.7');
    // The panel typesets m(x) and the BenDaniel–Duke kinetic operator (KaTeX keeps the TeX source as an annotation).
    const html = renderBlockPanel(result, { file: FILE, git: null, provenance: provenance() });
    expect(html).toContain('m(x) = ');
    expect(html).toContain('\\frac{1}{m(x)}');
  });

  it('a trial that meets the BenDaniel–Duke conditions reaches the exact level with a vanishing variance', () => {
    // psi = cos(q x) inside, matched in value and in psi'/m at |x| = 1.2 by the decay p = (1.7/0.6) q tan(1.2 q).
    const trial = 'abs(x) < 1.2 ? cos(q*x) : cos(1.2*q) * exp(-(1.7/0.6)*q*tan(1.2*q)*(abs(x) - 1.2))';
    const result = run(`id: step-matched\n${header}\ntrial: "${trial}"\nparameters:\n  q: { start: 0.6, min: 0.1, max: 1.3 }`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(relative(result.energy!.value, e0)).toBeLessThan(1e-9);
    expect(result.variance).not.toBeNull();
    expect(result.variance!).toBeLessThan(1e-6 * e0 * e0);
  });

  it('a basis block (linear method) uses 1/m(x) too: its lowest level lies above the exact one, below the single Gaussian', () => {
    const gaussian = run(`id: step-gauss\n${header}\ntrial: exp(-b*x^2)\nparameters:\n  b: { start: 0.5, min: 0.01, max: 10 }`);
    const basis = ['exp(-b*x^2)', 'x^2*exp(-b*x^2)', 'x^4*exp(-b*x^2)', 'x^6*exp(-b*x^2)'];
    const result = run(`id: step-basis\n${header}\nbasis:\n${basis.map((f) => `  - "${f}"`).join('\n')}\nparameters:\n  b: { start: 0.5, min: 0.01, max: 10 }`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(result.energy!.value).toBeGreaterThan(e0);
    // The span holds the Gaussian at every b, so the lowest level is at or below the single trial's optimum.
    expect(result.energy!.value).toBeLessThanOrEqual(gaussian.energy!.value * (1 + 1e-9));
    expect(relative(result.energy!.value, e0)).toBeLessThan(0.1);
  });

  it('refuses a mass with a name it does not know, on the mass line, pointing to quantity mode for units', () => {
    const result = run(`id: step-unit\nmass: "abs(x) < 1.2 ? 0.6 : 1.7 electronMass"\npotential: "abs(x) < 1.2 ? 0 : 4"\ntrial: exp(-b*x^2)\nparameters:\n  b: { start: 0.5, min: 0.01, max: 10 }`);
    expect(result.status).toBe('invalid');
    expect(result.problems[0]).toMatchObject({ field: 'mass', line: 10 });
    expect(result.problems[0].message).toMatch(/unknown name electronMass.*quantity mode/);
  });

  it('refuses the name mass in the potential when the mass depends on the coordinate', () => {
    const result = run(`id: step-name\nmass: "abs(x) < 1.2 ? 0.6 : 1.7"\npotential: mass*x^2\ntrial: exp(-b*x^2)\nparameters:\n  b: { start: 0.5, min: 0.01, max: 10 }`);
    expect(result.status).toBe('invalid');
    expect(result.problems[0]).toMatchObject({ field: 'potential' });
    expect(result.problems[0].message).toMatch(/the name mass has no single value/);
  });
});

describe('position-dependent mass in quantity mode', () => {
  // NIST CODATA 2018: hbar = 1.054571817e-34 J s, m_e = 9.1093837015e-31 kg, e = 1.602176634e-19 C (exact).
  const hbarSquaredOverMass = (1.054571817e-34 ** 2 / 9.1093837015e-31 / 1.602176634e-22) * 1e18; // meV nm^2
  // A GaAs well between AlGaAs barriers: effective masses 0.067 and 0.092 m_e and a 224 meV offset, from memory.
  const well = { halfWidth: 5, depth: 224, massIn: 0.067 / hbarSquaredOverMass, massOut: 0.092 / hbarSquaredOverMass };
  const block = (mass: string) => `id: gaas-well
units: { length: nm, energy: meV }
mass: "${mass}"
potential: "abs(x) < 5 nm ? 0 meV : 224 meV"
trial: exp(-b*x^2)
parameters:
  b: { start: 0.02 nm^-2, min: 0.0001 nm^-2, max: 1 nm^-2 }`;

  it('a 10 nm GaAs/AlGaAs well: grid levels in meV against the BenDaniel–Duke condition, the Gaussian above them', () => {
    const result = run(block('abs(x) < 5 nm ? 0.067 electronMass : 0.092 electronMass'));
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(result.energy!.unit).toBe('meV');
    const [e0, e1] = [steppedWellLevel(well, 0), steppedWellLevel(well, 1)];
    expect(relative(result.reference!.energy!, e0)).toBeLessThan(1e-8);
    expect(relative(result.reference!.excited!, e1)).toBeLessThan(1e-8);
    expect(result.energy!.value).toBeGreaterThan(e0);
  });

  it('bare numbers count electron masses, as for a constant mass', () => {
    const withUnits = run(block('abs(x) < 5 nm ? 0.067 electronMass : 0.092 electronMass'));
    const bare = run(block('abs(x) < 5 nm ? 0.067 : 0.092'));
    expect(bare.status, bare.message ?? '').toBe('confirmed');
    expect(relative(bare.reference!.energy!, withUnits.reference!.energy!)).toBeLessThan(1e-12);
  });

  it('refuses a mass expression that is not a mass, naming the field', () => {
    const result = run(block('abs(x) < 5 nm ? 0.067 meV : 0.092 meV'));
    expect(result.status).toBe('invalid');
    expect(result.problems[0]).toMatchObject({ field: 'mass', line: 11 });
    expect(result.problems[0].message).toMatch(/the mass must be a mass/);
  });
});

describe('position-dependent mass on the radial space', () => {
  // The spherical well of tests/engine/mass-profile.test.ts (radius 1.5, depth 6, masses 0.5 inside and 1.3 outside):
  // R = sin(k r)/r inside and sin(1.5 k) e^{-kappa (r - 1.5)}/r outside, with kappa from continuity of R'/m,
  // (k cot(1.5 k) - 1/1.5)/0.5 = -(kappa + 1/1.5)/1.3 (BenDaniel & Duke). At the optimum over k the trial is exact.
  const kappa = '(1.3/0.5)*(1/1.5 - k*cos(1.5*k)/sin(1.5*k)) - 1/1.5';
  const trial = `r < 1.5 ? sin(k*r)/r : sin(1.5*k)*exp(-(${kappa})*(r - 1.5))/r`;
  const block = `id: sphere-matched\nspace: radial\nmass: "r < 1.5 ? 0.5 : 1.3"\npotential: "r < 1.5 ? 0 : 6"\ntrial: "${trial}"\nparameters:\n  k: { start: 1.5, min: 1.1, max: 2 }`;

  it('the matched trial meets the grid level (u = rR with the step term) and the variance vanishes', () => {
    const result = run(block);
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(relative(result.energy!.value, result.reference!.energy!)).toBeLessThan(1e-8);
    expect(result.variance!).toBeLessThan(1e-6 * result.energy!.value ** 2);
  });
});
