import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';

async function run(args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(args, (t) => out.push(t), (t) => err.push(t));
  return { code, out: out.join('\n'), err: err.join('\n') };
}

const record = (blocks: string) => `---\ntitle: test\nauthor: test bench\ndate: 2026-12-01\ntags: [test]\n---\n\n${blocks}`;
const oscillator = (claim: string) =>
  '```variational\nid: osc\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.05, max: 5 }\n' + claim + '```\n';

describe('groundwork check', () => {
  // The command reads groundwork.config.json and keeps its cache in the working folder: run it in a fresh one.
  const dir = mkdtempSync(join(tmpdir(), 'groundwork-cli-'));
  const home = process.cwd();
  beforeAll(() => process.chdir(dir));
  afterAll(() => process.chdir(home));
  const good = join(dir, 'good.md');
  const mixed = join(dir, 'mixed.md');
  // Exact oscillator level 1/2 (any quantum mechanics textbook).
  writeFileSync(good, record(oscillator('claim:\n  energy: 0.5\n')));
  writeFileSync(mixed, record(oscillator('claim:\n  energy: 0.6\n  tolerance: 0.01\n') + '\n' + '```variational\nid: broken\npotential: x^2\ntrial: exp(-b*x^2)\n```\n'));

  it('exits 0 when every block is confirmed, and says on stderr what it evaluated', async () => {
    const { code, out, err } = await run(['check', good]);
    expect(code).toBe(0);
    expect(out).toMatch(/osc\s+confirmed\s+0\.5\b/);
    expect(err).toMatch(/^groundwork: 1 block, 1 evaluated, 0 from cache \(\d+ workers?\)$/);
  }, 60_000);

  it('takes the result from the cache the next time, and evaluates again with --recompute', async () => {
    const cached = await run(['check', good]);
    expect(cached.code).toBe(0);
    expect(cached.err).toMatch(/^groundwork: 1 block, 0 evaluated, 1 from cache \(/);
    const again = await run(['check', good, '--recompute']);
    expect(again.err).toMatch(/^groundwork: 1 block, 1 evaluated, 0 from cache \(/);
    const untimed = (table: string) => table.replace(/\d+ ms/g, 'ms');
    expect(untimed(again.out)).toBe(untimed(cached.out));
  }, 60_000);

  it('keeps going past a bad block, prints both, and exits 1', async () => {
    const { code, out } = await run(['check', mixed]);
    expect(code).toBe(1);
    expect(out).toMatch(/osc\s+disputed/);
    expect(out).toMatch(/broken\s+invalid/);
    expect(out).toMatch(/mixed\.md:\d+ \[broken\] trial: unknown name b/);
  }, 60_000);

  it('prints the result contract with --json', async () => {
    const { code, out } = await run(['check', good, '--json']);
    expect(code).toBe(0);
    const log = JSON.parse(out);
    expect(log.tool.name).toBe('groundwork');
    const block = log.records[0].blocks[0];
    expect(block).toMatchObject({ id: 'osc', line: 8, status: 'confirmed', energy: { unit: 'hartree' }, reference: { method: 'grid' } });
    expect(block.inputHash).toMatch(/^sha256:[0-9a-f]{64}$/);
    expect(block.checks.every((c: { pass: boolean }) => c.pass)).toBe(true);
  }, 60_000);

  it('refuses unknown options and missing paths with a clear message', async () => {
    expect((await run(['check', '--fast'])).code).toBe(2);
    const missing = await run(['check', join(dir, 'nope.md')]);
    expect(missing.code).toBe(1);
    expect(missing.err).toContain('no such file or folder');
  });

  it('refuses a bad groundwork.config.json naming the file and the field', async () => {
    const sub = mkdtempSync(join(dir, 'configured-'));
    writeFileSync(join(sub, 'groundwork.config.json'), JSON.stringify({ memoryLimitMb: 'lots' }));
    process.chdir(sub);
    try {
      const { code, err } = await run(['check', good]);
      expect(code).toBe(2);
      expect(err).toMatch(/groundwork\.config\.json: memoryLimitMb: must be a number of megabytes/);
    } finally {
      process.chdir(dir);
    }
  });
});
