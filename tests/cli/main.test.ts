import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';

function run(args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const code = main(args, (t) => out.push(t), (t) => err.push(t));
  return { code, out: out.join('\n'), err: err.join('\n') };
}

const record = (blocks: string) => `---\ntitle: test\nauthor: test bench\ndate: 2026-12-01\ntags: [test]\n---\n\n${blocks}`;
const oscillator = (claim: string) =>
  '```variational\nid: osc\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.05, max: 5 }\n' + claim + '```\n';

describe('groundwork check', () => {
  const dir = mkdtempSync(join(tmpdir(), 'groundwork-cli-'));
  const good = join(dir, 'good.md');
  const mixed = join(dir, 'mixed.md');
  // Exact oscillator level 1/2 (any quantum mechanics textbook).
  writeFileSync(good, record(oscillator('claim:\n  energy: 0.5\n')));
  writeFileSync(mixed, record(oscillator('claim:\n  energy: 0.6\n  tolerance: 0.01\n') + '\n' + '```variational\nid: broken\npotential: x^2\ntrial: exp(-b*x^2)\n```\n'));

  it('exits 0 when every block is confirmed', () => {
    const { code, out } = run(['check', good]);
    expect(code).toBe(0);
    expect(out).toMatch(/osc\s+confirmed\s+0\.5\b/);
  });

  it('keeps going past a bad block, prints both, and exits 1', () => {
    const { code, out } = run(['check', mixed]);
    expect(code).toBe(1);
    expect(out).toMatch(/osc\s+disputed/);
    expect(out).toMatch(/broken\s+invalid/);
    expect(out).toMatch(/mixed\.md:\d+ \[broken\] trial: unknown name b/);
  });

  it('prints the result contract with --json', () => {
    const { code, out } = run(['check', good, '--json']);
    expect(code).toBe(0);
    const log = JSON.parse(out);
    expect(log.tool.name).toBe('groundwork');
    const block = log.records[0].blocks[0];
    expect(block).toMatchObject({ id: 'osc', line: 8, status: 'confirmed', energy: { unit: 'hartree' }, reference: { method: 'grid' } });
    expect(block.inputHash).toMatch(/^sha256:[0-9a-f]{64}$/);
    expect(block.checks.every((c: { pass: boolean }) => c.pass)).toBe(true);
  });

  it('refuses unknown options and missing paths with a clear message', () => {
    expect(run(['check', '--fast']).code).toBe(2);
    const missing = run(['check', join(dir, 'nope.md')]);
    expect(missing.code).toBe(1);
    expect(missing.err).toContain('no such file or folder');
  });
});
