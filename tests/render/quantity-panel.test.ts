import { describe, expect, it } from 'vitest';
import { provenance } from '../../src/log/provenance.ts';
import { recordHtml } from '../../src/render/record-html.ts';
import { checkRecordText } from './record-fixture.ts';

// A 10 nm GaAs-like well in quantity mode: everything a reader sees (messages, JSON, panel, audit trail) must be in
// nm and meV, never in bohr or hartree. In bohr, 10 nm is 188.9726125 and its half 94.48630623 (a0 = 0.0529177210903 nm,
// NIST CODATA 2018): those figures must not appear.
const WELL = `---
title: Well
author: test
date: 2026-01-01
tags: []
---

\`\`\`variational
id: open-trial
units: { length: nm, energy: meV }
box: [-5, 5]
mass: 0.067 electronMass
constants:
  L: 10 nm
potential: 0 meV
trial: exp(-a x^2)
parameters:
  a: { start: 0.05 nm^-2, min: 0.01 nm^-2, max: 1 nm^-2 }
\`\`\`

\`\`\`variational
id: closed-trial
units: { length: nm, energy: meV }
box: [-5, 5]
mass: 0.067 electronMass
constants:
  L: 10 nm
potential: 0 meV
trial: cos(pi x / L) * (1 + a * (x/L)^2)
parameters:
  a: { start: 0.1, min: -1, max: 1 }
\`\`\`
`;

const ATOMIC_FIGURES = /188\.97|94\.486|-?94\.49/;

describe('a quantity-mode well states every length and energy in its own units', () => {
  const record = checkRecordText('content/records/well.md', WELL);
  const [open, closed] = record.blocks;
  const html = recordHtml(record.file, WELL, record, { file: record.file, git: null, provenance: provenance() }).html;

  it('says where the trial fails to vanish in nm', () => {
    expect(open.status).toBe('invalid');
    expect(open.problems.map((p) => p.message)).toEqual([
      expect.stringMatching(/^trial at the wall -5 nm is /),
      expect.stringMatching(/^trial at the wall 5 nm is /),
    ]);
  });

  it('states the particle-in-a-box level in meV, the norm integral in nm and the constants as written', () => {
    expect(closed.status).toBe('confirmed');
    // E1 = pi^2 hbar^2 / (2 m L^2) (any QM textbook) with m = 0.067 m_e; hbar, m_e and e from NIST CODATA 2018.
    const expected = (Math.PI ** 2 * 1.054571817e-34 ** 2) / (2 * 0.067 * 9.1093837015e-31 * 1e-8 ** 2) / 1.602176634e-22;
    expect(Math.abs(closed.energy!.value - expected) / expected).toBeLessThan(1e-8);
    // The integral of cos^2(pi x / L) over the box is L / 2 = 5 nm.
    expect(closed.components!.norm).toBeCloseTo(5, 6);
    const norm = closed.checks.find((c) => c.name === 'normalisable')!.detail;
    expect(Number(/norm integral (\S+) nm/.exec(norm)![1])).toBeCloseTo(5, 6);
    expect(closed.inputs!.constants).toEqual({ L: 10 });
    expect(closed.inputs!.constantUnits).toEqual({ L: 'nm' });
    expect(closed.diagnostics!.grid!.domain).toEqual([expect.closeTo(-5, 9), expect.closeTo(5, 9)]);
  });

  it('quotes no atomic-unit figure in the JSON or on the page', () => {
    expect(JSON.stringify(record)).not.toMatch(ATOMIC_FIGURES);
    expect(html).not.toMatch(ATOMIC_FIGURES);
    expect(html).toContain('trial at the wall \u22125 nm');
    expect(html).toMatch(/domain \[\u2212 ?5, 5\] nm/);
    expect(html).toMatch(/Constants: .*<\/span>\u00a0nm<\/p>/);
  });
});
