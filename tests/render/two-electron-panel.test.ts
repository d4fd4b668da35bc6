import { describe, expect, it } from 'vitest';
import { provenance } from '../../src/log/provenance.ts';
import { recordHtml } from '../../src/render/record-html.ts';
import { checkRecordText } from './record-fixture.ts';

// H- with the screened-charge trial: E = -(1 - 5/16)^2 = -0.47265625 hartree lies above the hydrogen atom's -1/2
// (Griffiths, Introduction to Quantum Mechanics, 2nd ed., §7.2, problem on H-; from memory), so the page must say the
// bound is confirmed but shows no binding, and show the threshold and the correlated basis behind the reference.
const H_MINUS = `---
title: H minus
author: test
date: 2026-01-01
tags: []
---

\`\`\`variational
id: h-minus-screened
space: two-electron
constants: { Z: 1 }
potential: -Z/r1 - Z/r2 + 1/r12
trial: exp(-zeta*(r1 + r2))
parameters:
  zeta: { start: 0.8, min: 0.2, max: 2 }
\`\`\`
`;

describe('two-electron panel', () => {
  it('shows the threshold, the binding verdict, the region and exchange, and the correlated basis in the audit trail', () => {
    const record = checkRecordText('content/records/h-minus.md', H_MINUS);
    const block = record.blocks[0];
    expect(block.status).toBe('confirmed');
    expect(block.binding).toMatchObject({ below: false });
    expect(block.binding!.threshold).toBeCloseTo(-0.5, 12);
    const html = recordHtml(record.file, H_MINUS, record, { file: record.file, git: null, provenance: provenance() }).html;
    expect(html).toContain('binding threshold (one-electron ion)');
    expect(html).toContain('confirmed, but binding not shown by this trial');
    expect(html).toContain('correlated-basis reference: H read as');
    expect(html).toMatch(/exponent sets \(alpha/);
    expect(html).toContain('reference (correlated-basis)');
    // The typeset region and symmetry (KaTeX keeps the source in its annotation).
    expect(html).toContain('symmetric (singlet)');
  }, 120_000);
});
