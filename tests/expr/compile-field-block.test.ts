import { describe, expect, it } from 'vitest';
import { compileFieldBlock } from '../../src/expr/compile-field-block.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';
import type { BlockSpec, SpecProblem } from '../../src/spec/types.ts';

const FILE = 'content/records/fields.md';

function parse(block: string): { spec: BlockSpec | null; problems: SpecProblem[] } {
  const text = ['---', 'title: Fields', 'author: test', 'date: 2026-01-01', 'tags: []', '---', '', '```variational', block, '```', ''].join('\n');
  const entry = parseRecord(FILE, text).blocks[0];
  return entry.kind === 'spec' ? { spec: entry.spec, problems: [] } : { spec: null, problems: entry.problems };
}

function compiled(block: string) {
  const { spec, problems } = parse(block);
  if (!spec) throw new Error(problems.map((p) => p.message).join('; '));
  return compileFieldBlock(spec);
}

const close = (a: number, b: number) => Math.abs(a - b) <= 1e-12 * Math.max(1, Math.abs(b));

describe('compileFieldBlock', () => {
  it('gives the gradient and the cylindrical Laplacian of exp(-a r), r = sqrt(rho^2 + z^2): (a^2 - 2a/r) psi (elementary: f\'\' + 2 f\'/r for a radial f)', () => {
    const result = compiled(`id: h\nspace: axial\npotential: -1/sqrt(rho^2 + z^2)\ntrial: exp(-a*sqrt(rho^2 + z^2))\nparameters:\n  a: { start: 1, min: 0.1, max: 3 }`);
    if (!result.ok) throw new Error(result.problems[0].message);
    const { trial, potential } = result.block;
    const a = 0.8;
    trial.setParameters([a]);
    for (const [rho, z] of [[0.3, 0.4], [1.2, -0.7], [2, 3]]) {
      const p = Float64Array.of(rho, z);
      const r = Math.hypot(rho, z);
      const psi = Math.exp(-a * r);
      expect(close(trial.value(p), psi)).toBe(true);
      expect(close(trial.gradient[0](p), (-a * rho * psi) / r)).toBe(true);
      expect(close(trial.gradient[1](p), (-a * z * psi) / r)).toBe(true);
      expect(close(trial.laplacian(p), (a * a - (2 * a) / r) * psi)).toBe(true);
      expect(close(potential(p), -1 / r)).toBe(true);
    }
  });

  it('folds the masses into the Laplacian of a product space: sum_k d2_k psi / m_k for a Gaussian (elementary)', () => {
    const result = compiled(`id: g\nspace: { x: line, y: half-line }\nmass: { x: 2, y: 0.5 }\npotential: x^2 + y^2\ntrial: y*exp(-a*x^2 - b*y^2)\nparameters:\n  a: { start: 1, min: 0.1, max: 3 }\n  b: { start: 1, min: 0.1, max: 3 }`);
    if (!result.ok) throw new Error(result.problems[0].message);
    const { trial } = result.block;
    const [a, b] = [0.7, 1.3];
    trial.setParameters([a, b]);
    for (const [x, y] of [[0.3, 0.4], [-1.1, 2]]) {
      const p = Float64Array.of(x, y);
      const g = Math.exp(-a * x * x - b * y * y);
      const dxx = (4 * a * a * x * x - 2 * a) * y * g;
      // d2/dy2 of y exp(-b y^2) = (4 b^2 y^3 - 6 b y) exp(-b y^2)
      const dyy = (4 * b * b * y ** 3 - 6 * b * y) * g;
      expect(close(trial.laplacian(p), dxx / 2 + dyy / 0.5)).toBe(true);
      expect(close(trial.gradient[1](p), (1 - 2 * b * y * y) * g)).toBe(true);
    }
  });

  it('gives switch functions of one coordinate as element edges along that axis', () => {
    const result = compiled(`id: s\nspace: { x: line, y: line }\npotential: abs(x - 1) + y^2\ntrial: exp(-x^2 - y^2)`);
    if (!result.ok) throw new Error(result.problems[0].message);
    expect(result.block.potentialSwitches).toHaveLength(1);
    expect(result.block.potentialSwitches[0].axis).toBe(0);
    expect(result.block.potentialSwitches[0].at(1)).toBe(0);
  });

  it('refuses a coordinate the space does not have, naming it and the space\'s coordinates', () => {
    const result = compiled(`id: u\nspace: { x: line, z: line }\npotential: x^2 + z^2\ntrial: exp(-x^2 - y^2)`);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems[0].field).toBe('trial');
    expect(result.problems[0].line).toBe(12);
    expect(result.problems[0].message).toMatch(/unknown name y/);
  });

  it('refuses a potential of rho in a Cartesian space, saying rho belongs to axial', () => {
    const result = compiled(`id: rho\nspace: { x: line, y: line }\npotential: -1/sqrt(rho^2 + 1)\ntrial: exp(-x^2 - y^2)`);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems[0].field).toBe('potential');
    expect(result.problems[0].message).toMatch(/unknown name rho \(a coordinate of space axial\).*x, y/);
  });

  it('refuses mass in an expression where the mass is given per coordinate', () => {
    const result = compiled(`id: m\nspace: { x: line, y: line }\nmass: { x: 1, y: 2 }\npotential: mass*x^2 + y^2\ntrial: exp(-x^2 - y^2)`);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems[0].message).toMatch(/mass is given per coordinate/);
  });
});

describe('spec of the spaces with several coordinates', () => {
  it('refuses a non-integer m on axial, naming file, line, block and field', () => {
    const { problems } = parse(`id: m-half\nspace: axial\nangular-momentum: 1.5\npotential: rho^2 + z^2\ntrial: exp(-rho^2 - z^2)`);
    expect(problems[0]).toMatchObject({ file: FILE, line: 11, block: 'm-half', field: 'angular-momentum' });
    expect(problems[0].message).toMatch(/integer/);
  });

  it('refuses a coordinate named like a constant, and a product of one or four coordinates', () => {
    expect(parse(`id: c\nspace: { x: line, w: line }\nconstants: { w: 2 }\npotential: x^2 + w^2\ntrial: exp(-x^2)`).problems[0]).toMatchObject({ field: 'constants.w' });
    expect(parse(`id: one\nspace: { x: line }\npotential: x^2\ntrial: exp(-x^2)`).problems[0].message).toMatch(/2 or 3 coordinates/);
    expect(parse(`id: four\nspace: { a1: line, a2: line, a3: line, a4: line }\npotential: a1^2\ntrial: exp(-a1^2)`).problems[0].message).toMatch(/2 or 3 coordinates/);
  });

  it('refuses a mass map that misses a coordinate, and a mass map outside a product space', () => {
    expect(parse(`id: mm\nspace: { x: line, y: line }\nmass: { x: 1 }\npotential: x^2 + y^2\ntrial: exp(-x^2 - y^2)`).problems[0].message).toMatch(/no mass for coordinate y/);
    expect(parse(`id: ml\nmass: { x: 1 }\npotential: x^2\ntrial: exp(-x^2)`).problems[0].message).toMatch(/product space/);
  });

  it('refuses a level target on axial, where the block is compared with the ground level', () => {
    expect(parse(`id: lv\nspace: axial\nlevel: 1\npotential: rho^2 + z^2\ntrial: z*exp(-rho^2 - z^2)`).problems[0]).toMatchObject({ field: 'level' });
  });

  it('reads an interval coordinate and a wrong-way interval is refused', () => {
    const { spec } = parse(`id: box2\nspace: { x: [0, 2], y: line }\npotential: y^2\ntrial: x*(2 - x)*exp(-y^2)`);
    expect(spec!.space).toEqual({ x: [0, 2], y: 'line' });
    expect(parse(`id: bad\nspace: { x: [2, 0], y: line }\npotential: y^2\ntrial: exp(-y^2)`).problems[0].field).toBe('space.x');
  });
});
