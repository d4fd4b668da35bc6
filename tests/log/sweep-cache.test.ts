import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkLog } from '../../src/log/check-log.ts';
import { loadLogConfig } from '../../src/log/log-config.ts';

// The oscillator in a field, V = x^2/2 + F x: E(F) = 1/2 - F^2/2 exactly (completing the square).
const block = (values: number[]) =>
  `---\ntitle: sweep\n---\n\n\`\`\`variational\nid: shifted\nconstants:\n  F: 0\npotential: x^2/2 + F*x\ntrial: exp(-a*(x - s)^2)\nparameters:\n  a: { start: 1, min: 0.05, max: 5 }\n  s: { start: 0, min: -3, max: 3 }\nsweep: { constant: F, values: [${values.join(', ')}] }\n\`\`\`\n`;

describe('the results cache keys each sweep point', () => {
  it('evaluates only the point added to a sweep, taking the others from the cache', async () => {
    const root = mkdtempSync(join(tmpdir(), 'groundwork-sweep-'));
    const file = join(root, 'sweep.md');
    const config = { ...loadLogConfig(root), workers: 1 };
    writeFileSync(file, block([0, 0.5]));
    const first = (await checkLog([file], { root, config })).log.records[0].blocks[0];
    writeFileSync(file, block([0, 0.5, 1]));
    const second = (await checkLog([file], { root, config })).log.records[0].blocks[0];
    const [a, b, c] = second.sweep!.points;
    expect(c.result.energy!.value).toBeCloseTo(0, 9);
    // Measured durations repeat only when a stored result is reused: the first two points were not evaluated again.
    expect([a.result.timeMs, b.result.timeMs]).toEqual(first.sweep!.points.map((p) => p.result.timeMs));
    expect(c.result.timeMs).not.toBe(b.result.timeMs);
    expect(b.result.energy!.value).toBeCloseTo(0.5 - 0.5 ** 2 / 2, 9);
  }, 120_000);
});
