import { describe, expect, it } from 'vitest';
import { provenance } from '../../src/log/provenance.ts';
import { recordHtml } from '../../src/render/record-html.ts';
import { checkRecordText } from './record-fixture.ts';

// A basis holding the same function twice has a singular overlap matrix (linear algebra: two equal columns);
// the panel says so in words and gives the kept directions' finite condition number, 17 + 12 sqrt 2 = 33.97 for
// {x(1-x), x^2(1-x)} on [0, 1] (closed form from Beta integrals, see tests/log/evaluate-basis-block.test.ts).
const TEXT = `---
title: A basis with a repeated function
author: device-modelling team (invented lab)
date: 2026-12-02
tags: [basis]
---

\`\`\`variational
id: twice
box: [0, 1]
potential: 0
basis:
  - x*(1 - x)
  - x*(1 - x)
  - x^2*(1 - x)
states: 2
\`\`\`
`;

describe('the result panel of a basis block with dependent functions', () => {
  const record = checkRecordText('content/records/twice.md', TEXT);
  const { html } = recordHtml(record.file, TEXT, record, { file: record.file, git: null, provenance: provenance() });

  it('reports the overlap matrix as numerically singular with the finite condition number of the kept directions', () => {
    expect(html).toContain('numerically singular: 1 of 3 directions dropped as near-dependent; condition number 34.0 over the 2 kept');
    expect(html).not.toMatch(/condition number (Infinity|null|—)/);
  });
});
