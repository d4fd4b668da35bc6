import { describe, expect, it } from 'vitest';
import { checkRecordText } from '../render/record-fixture.ts';

// A particle in the box [0, 1] with the trial x(1 - x): E = 5 exactly against the ground level pi^2/2 and the next
// level 2 pi^2 (Griffiths, Introduction to Quantum Mechanics, problem 7.2 and §2.2), so Temple's bound, Eckart's
// floor, the wall condition and the quadrature check all compare a number with a limit that scripts can read.
const TEXT = `---
title: Box with a parabola trial
author: test
date: 2026-12-02
---

\`\`\`variational
id: box
box: [0, 1]
potential: 0
trial: x*(1 - x)
\`\`\`
`;

describe('check measures: the number each check compared and its limit', () => {
  const [block] = checkRecordText('content/records/box.md', TEXT).blocks;

  it('gives value, limit and relation beside the words, consistent with pass', () => {
    expect(block.status).toBe('confirmed');
    expect(block.energy!.value).toBeCloseTo(5, 10);
    for (const name of ['hard-wall', 'integrals-converged', 'temple-below-grid', 'eckart-overlap']) {
      const check = block.checks.find((c) => c.name === name);
      expect(check?.measure, name).toBeDefined();
      const { value, limit, relation } = check!.measure!;
      expect(relation === '<=' ? value <= limit : value >= limit, name).toBe(check!.pass);
    }
    // Temple's bound E - var/(E1 - E): psi'' = -2 and <psi|psi> = 1/30, so <H^2> = (1/4) * 4 / (1/30) = 30 and
    // var = 30 - 5^2 = 5 (elementary integrals); E1 = 2 pi^2.
    const temple = block.checks.find((c) => c.name === 'temple-below-grid')!.measure!;
    expect(temple.value).toBeCloseTo(5 - 5 / (2 * Math.PI ** 2 - 5), 8);
  });
});
