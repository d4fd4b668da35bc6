import { describe, expect, it } from 'vitest';
import { provenance } from '../../src/log/provenance.ts';
import { logCsv } from '../../src/render/log-csv.ts';
import { recordHtml } from '../../src/render/record-html.ts';
import { checkRecordText } from './record-fixture.ts';

// The oscillator in a field, V = x^2/2 + F x: every level shifts by exactly -F^2/2 (completing the square), and
// dE/dF = <x> = -F (Hellmann–Feynman); the panel and the CSV must carry those numbers for every point.
const TEXT = `---
title: An oscillator in a field, swept
author: device-modelling team (invented lab)
date: 2026-12-02
tags: [sweep]
---

\`\`\`variational
id: shifted
constants:
  F: 0
potential: x^2/2 + F*x
trial: exp(-a*(x - s)^2)
parameters:
  a: { start: 1, min: 0.05, max: 5 }
  s: { start: 0, min: -3, max: 3 }
sweep: { constant: F, values: [0, 0.5, 1] }
\`\`\`

\`\`\`variational
id: uncertain-field
constants:
  F: { value: 0.5, uncertainty: 0.1 }
potential: x^2/2 + F*x
trial: exp(-a*(x - s)^2)
parameters:
  a: { start: 1, min: 0.05, max: 5 }
  s: { start: 0, min: -3, max: 3 }
\`\`\`
`;

describe('the panel and CSV of a sweep and of uncertain inputs', () => {
  const record = checkRecordText('content/records/shifted.md', TEXT);
  const { html } = recordHtml(record.file, TEXT, record, { file: record.file, git: null, provenance: provenance() });

  it('tabulates every point and plots E against the constant with the reference and the bracket', () => {
    const table = html.slice(html.indexOf('<table class="gw-sweep"'), html.indexOf('</table>', html.indexOf('<table class="gw-sweep"')));
    for (const F of [0, 0.5, 1]) expect(table).toContain(`<td>${F}</td>`);
    // E(1) = 1/2 - 1/2 = 0, E(0.5) = 0.375.
    expect(table).toContain('0.375');
    expect(html).toContain('the grid reference (dashed), and the bracket');
    expect(html).toContain('The optimal s against the swept constant.');
    expect(html).toContain("not a substitute for the group's validated procedures");
  });

  it('shows each sensitivity beside its finite-difference check, and E +- dE', () => {
    expect(html).toContain('<table class="gw-sensitivities"');
    // dE/dF = -F = -0.5; u(E) = |dE/dF| * 0.1 = 0.05.
    expect(html).toMatch(/F = 0\.5 ± 0\.1<\/th><td>−0\.5/);
    expect(html).toMatch(/E = 0\.375 ± 0\.05 hartree/);
    expect(html).toContain('sensitivities');
  });

  it('gives the CSV a row per sweep point', () => {
    const rows = logCsv([record]).trim().split('\r\n');
    const swept = rows.filter((r) => r.includes(',shifted,'));
    expect(swept).toHaveLength(3);
    expect(swept.map((r) => r.split(',').at(-2))).toEqual(['0', '0.5', '1']);
    expect(rows.find((r) => r.includes(',uncertain-field,'))!.split(',').at(-1)).toMatch(/^0\.0(49999|5)/);
  });
});
