import { describe, expect, it } from 'vitest';
import { WALL_VIRIAL_NOTE } from '../../src/engine/virial.ts';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import type { BlockResult } from '../../src/log/result-types.ts';
import { renderBlockPanel } from '../../src/render/block-panel.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';

// The virial theorem 2<T> = k<V> for V homogeneous of degree k follows from stationarity under the dilation
// psi(x) -> psi(s x), which a hard wall at a != 0 does not allow: there the exact relation carries the surface term
// (hbar^2/2m) [x |psi'|^2] over the walls (for a particle in [0, L] with V = 0, 2<T> = (hbar^2/2m) L |psi'(L)|^2;
// hypervirial theorem with a boundary term, Fernandez & Castro, Hypervirial Theorems, Springer 1987, from memory).

const FILE = 'content/records/virial.md';

function run(block: string): BlockResult {
  const text = ['---', 'title: Virial', 'author: test', 'date: 2026-01-01', 'tags: []', '---', '', '```variational', block, '```', ''].join('\n');
  return evaluateBlock(FILE, parseRecord(FILE, text).blocks[0]);
}

const context = { file: FILE, git: null, provenance: { tool: 'groundwork test', node: process.version, dependencies: {}, settings: {} } };

describe('the virial ratio only where the theorem holds', () => {
  it('a tilted box [0, 1] with V = 8x gets no ratio but the reason, in the result and on the panel', () => {
    const result = run('id: tilted\nbox: [0, 1]\npotential: 8*x\ntrial: x*(1 - x)*exp(-b*x)\nparameters:\n  b: { start: 0, min: -5, max: 5 }');
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(result.virial).toBeNull();
    expect(result.virialNote).toBe(WALL_VIRIAL_NOTE);
    const html = renderBlockPanel(result, context);
    expect(html).toContain(WALL_VIRIAL_NOTE);
    expect(html).not.toMatch(/virial ratio.*<td>\d/);
  }, 60_000);

  it('the half-line, whose only wall is at the origin, keeps its ratio: 1 for x exp(-a x) in V = x', () => {
    // The family is closed under dilation and the wall stays put, so at its optimum 2<T> = 1 <V> (Fock's argument; common practice).
    const result = run('id: wedge\nspace: half-line\npotential: x\ntrial: x*exp(-a*x)\nparameters:\n  a: { start: 1, min: 0.1, max: 10 }');
    expect(result.virialNote).toBeNull();
    expect(result.virial).toMatchObject({ exponent: 1 });
    expect(result.virial!.ratio).toBeCloseTo(1, 5);
  }, 60_000);

  it('the open line keeps its ratio: 1 for the Gaussian in x^2/2', () => {
    const result = run('id: osc\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 0.3, min: 0.01, max: 10 }');
    expect(result.virialNote).toBeNull();
    expect(result.virial!.ratio).toBeCloseTo(1, 5);
  }, 60_000);
});
