import { existsSync, mkdirSync, mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
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
    const untimed = (table: string) => table.replace(/ *(\d+ ms|cached)$/gm, ' time');
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
    // The verdict says the same as the fields, so scripts need not parse details; plot samples only with --plots.
    expect(block.verdict).toMatchObject({ status: 'confirmed', claim: { energy: 0.5, agrees: true }, checks: { passed: block.checks.length, total: block.checks.length } });
    expect(block.plots).toBeNull();
    const withPlots = JSON.parse((await run(['check', good, '--json', '--plots'])).out);
    expect(withPlots.records[0].blocks[0].plots.scans.length).toBeGreaterThan(0);
  }, 60_000);

  it('refuses unknown options and missing paths with a clear message and exit code 2', async () => {
    expect((await run(['check', '--fast'])).code).toBe(2);
    const missing = await run(['check', join(dir, 'nope.md'), good]);
    expect(missing.code).toBe(2);
    expect(missing.err).toContain('nope.md: no such file or folder');
  });

  it('with --json, puts what stopped the run in the document, not only on stderr', async () => {
    const missing = await run(['check', join(dir, 'nope.md'), '--json']);
    expect(missing.code).toBe(2);
    expect(JSON.parse(missing.out)).toMatchObject({ tool: { name: 'groundwork' }, records: [], errors: [{ path: join(dir, 'nope.md'), message: 'no such file or folder' }] });
    const option = await run(['check', good, '--json', '--fast']);
    expect(option.code).toBe(2);
    expect(JSON.parse(option.out).errors).toEqual([{ path: null, message: 'unknown option --fast' }]);
    const fine = await run(['check', good, '--json']);
    expect(JSON.parse(fine.out).errors).toEqual([]);
  }, 60_000);

  it('exits 2, not 0, when there is nothing to check: an empty folder, or Markdown without any block', async () => {
    const empty = mkdtempSync(join(dir, 'empty-'));
    const none = await run(['check', empty]);
    expect(none.code).toBe(2);
    expect(none.err).toMatch(/no records \(Markdown files\) found, so nothing was checked/);
    const prose = mkdtempSync(join(dir, 'prose-'));
    writeFileSync(join(prose, 'notes.md'), record('Only prose here.\n'));
    const blockless = await run(['check', prose, '--json']);
    expect(blockless.code).toBe(2);
    expect(JSON.parse(blockless.out).errors[0].message).toBe('no variational blocks found in 1 Markdown file, so nothing was checked');
  });

  it('says in the summary why a folder with a stray Markdown file fails', async () => {
    const folder = mkdtempSync(join(dir, 'stray-'));
    writeFileSync(join(folder, 'good.md'), record(oscillator('claim:\n  energy: 0.5\n')));
    writeFileSync(join(folder, 'NOTES.md'), '# Notes\n\nNot a record: no front matter.\n');
    const { code, out } = await run(['check', folder]);
    expect(code).toBe(1);
    expect(out).toMatch(/NOTES\.md:1 /);
    expect(out.split('\n').at(-1)).toBe('1 block: 1 confirmed; 1 record has problems of its own (listed above)');
  }, 60_000);

  it('accepts --help after the command and checks nothing then', async () => {
    const { code, out, err } = await run(['check', '--help']);
    expect(code).toBe(0);
    expect(out).toMatch(/^usage: groundwork check/m);
    expect(err).toBe('');
  });

  it('documents its exit codes in --help', async () => {
    const { code, out } = await run(['--help']);
    expect(code).toBe(0);
    expect(out).toMatch(/^ {2}1 {2}some block is not confirmed/m);
    expect(out).toMatch(/^ {2}2 {2}the command could not run: a path that does not exist, no records or no blocks found/m);
  });

  it('takes a block refused before any numerics from the cache on the next run too, so nothing unchanged is evaluated', async () => {
    const unparsed = join(dir, 'unparsed.md');
    writeFileSync(unparsed, record(oscillator('claim:\n  energy: 0.5\n') + '\n```variational\nid: odd\npotential: x^2\ntrial: exp(-a*x^2)\nmystery: 1\n```\n'));
    const first = await run(['check', unparsed]);
    expect(first.out).toMatch(/odd\s+invalid/);
    const again = await run(['check', unparsed]);
    expect(again.code).toBe(1);
    expect(again.err).toMatch(/^groundwork: 2 blocks, 0 evaluated, 2 from cache \(/);
    expect(again.out).toMatch(/unparsed\.md:\d+ \[odd\] mystery: /);
  }, 60_000);

  it('reads the configuration and keeps the cache of a log checked from another folder', async () => {
    const log = mkdtempSync(join(dir, 'elsewhere-'));
    mkdirSync(join(log, 'records'));
    writeFileSync(join(log, 'groundwork.config.json'), JSON.stringify({ cacheFolder: 'results', workers: 1 }));
    writeFileSync(join(log, 'records', 'good.md'), record(oscillator('claim:\n  energy: 0.5\n')));
    const elsewhere = mkdtempSync(join(tmpdir(), 'groundwork-cwd-'));
    process.chdir(elsewhere);
    try {
      const { code, err } = await run(['check', join(log, 'records')]);
      expect(code).toBe(0);
      expect(err).toMatch(/\(1 worker\)$/);
      expect(readdirSync(join(log, 'results'))).toHaveLength(1);
      expect(existsSync(join(elsewhere, '.groundwork-cache'))).toBe(false);
    } finally {
      process.chdir(dir);
    }
  }, 60_000);

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
