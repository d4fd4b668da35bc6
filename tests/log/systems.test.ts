import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkRecord } from '../../src/log/check-record.ts';
import type { RecordResult } from '../../src/log/result-types.ts';
import { findSystems, systemIndex, memberKey } from '../../src/log/systems.ts';

const record = (date: string, ...blocks: string[]) => `---\ntitle: log ${date}\nauthor: test bench\ndate: ${date}\ntags: []\n---\n\n${blocks.map((b) => '```variational\n' + b + '\n```\n').join('\n')}`;

// The harmonic oscillator written three ways: its ground level is exactly 1/2 hartree (any quantum mechanics textbook).
const HALF_X_SQUARED = 'id: osc\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.05, max: 5 }';
const HALF_X_X = 'id: osc-poly\npotential: 0.5*x*x\ntrial: exp(-a*x^2)*(1 + c*x^2)\nparameters:\n  a: { start: 1, min: 0.05, max: 5 }\n  c: { start: 0.1, min: -0.4, max: 1 }';
// The same operator in quantity mode: hartreeEnergy and bohrRadius are the atomic scale (CODATA 2018), so V is x^2/2 in atomic units.
const IN_DEVICE_UNITS =
  'id: osc-mev\nunits: { length: nm, energy: meV }\nmass: 1 electronMass\npotential: hartreeEnergy * (x / bohrRadius)^2 / 2\ntrial: exp(-(x/b)^2)\nparameters:\n  b: { start: 0.1 nm, min: 0.01 nm, max: 1 nm }';
// A different system: the quartic oscillator.
const QUARTIC = 'id: quartic\npotential: x^4\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.05, max: 5 }';
// Two depths of one square well, joined only by the name the author gives them.
const sweep = (id: string, depth: number) => `id: ${id}\nsystem: well-sweep\nbox: [-1, 1]\npotential: "${depth}"\ntrial: cos(pi*x/2)`;

function evaluate(records: Record<string, string>): RecordResult[] {
  const root = mkdtempSync(join(tmpdir(), 'groundwork-systems-'));
  return Object.entries(records).map(([name, text]) => {
    writeFileSync(join(root, name), text);
    return checkRecord(join(root, name), { cwd: root });
  });
}

describe('findSystems', () => {
  const records = evaluate({
    'a.md': record('2026-10-01', HALF_X_SQUARED, QUARTIC),
    'b.md': record('2026-11-01', HALF_X_X, sweep('deep', -2)),
    'c.md': record('2026-12-01', IN_DEVICE_UNITS, sweep('shallow', -1)),
  });
  const systems = findSystems(records);

  it('gathers one operator written differently and in other units, and leaves a different one out', () => {
    const oscillator = systems.find((s) => s.members.some((m) => m.block === 'osc'))!;
    expect(oscillator.members.map((m) => `${m.file}:${m.block}`)).toEqual(['a.md:osc', 'b.md:osc-poly', 'c.md:osc-mev']);
    expect(systems.some((s) => s.members.some((m) => m.block === 'quartic'))).toBe(false);
    const [bracket] = oscillator.brackets;
    expect(bracket.level).toBe('ground');
    // Energies are compared in hartree whatever the block's unit: all three reach 1/2 (textbook, see above).
    for (const m of oscillator.members) expect(m.energy!).toBeCloseTo(0.5, 7);
    expect(bracket.upper!.value).toBeGreaterThanOrEqual(0.5 - 1e-9);
    expect(bracket.lower!.value).toBeLessThanOrEqual(0.5 + 1e-9);
    expect(bracket.width!).toBeLessThan(1e-6);
    expect(oscillator.conflicts).toEqual([]);
  }, 60_000);

  it('joins blocks the author names as one system, and indexes every member', () => {
    const named = systems.find((s) => s.name === 'well-sweep')!;
    expect(named.slug).toBe('well-sweep');
    expect(named.members.map((m) => m.block).sort()).toEqual(['deep', 'shallow']);
    expect(systemIndex(systems).get(memberKey('c.md', 'shallow'))).toBe(named);
  });

  it('flags two blocks whose results cannot both hold, on both', () => {
    // A result whose upper bound lies below another's lower bound: made by lowering one block's numbers, as a wrong engine would.
    const wrong = structuredClone(records);
    const block = wrong[1].blocks[0];
    block.bounds.upper = 0.49;
    block.energy = { value: 0.49, unit: 'hartree' };
    const oscillator = findSystems(wrong).find((s) => s.members.some((m) => m.block === 'osc'))!;
    const flagged = oscillator.conflicts.map((c) => [oscillator.members[c.upperMember].block, oscillator.members[c.lowerMember].block]);
    expect(flagged).toContainEqual(['osc-poly', 'osc']);
    expect(flagged).toContainEqual(['osc-poly', 'osc-mev']);
    expect(oscillator.brackets[0].upper!.value).toBe(0.49);
  });
});
