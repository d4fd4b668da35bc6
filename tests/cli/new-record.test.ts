import { mkdirSync, mkdtempSync, readFileSync } from 'node:fs';
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

// The skeletons carry problems with closed-form levels: the oscillator's 1/2 (hbar omega / 2 in quantity mode) and the
// hydrogen-like -m*/(2 epsr^2) hartree (any quantum mechanics textbook). Each must check confirmed as written.
describe('groundwork new', () => {
  const dir = mkdtempSync(join(tmpdir(), 'groundwork-new-'));
  const home = process.cwd();
  beforeAll(() => {
    process.chdir(dir);
    mkdirSync(join(dir, 'content', 'records'), { recursive: true });
  });
  afterAll(() => process.chdir(home));

  it.each([
    [['plain']],
    [['coulomb', '--space', 'radial']],
    [['trap', '--units', 'nm,meV']],
    [['donor', '--space', 'radial', '--units', 'nm,meV']],
  ])('writes %j into content/records, and it checks confirmed', async (args) => {
    const made = await run(['new', ...args]);
    expect(made.code).toBe(0);
    const file = join('content', 'records', `${args[0]}.md`);
    expect(readFileSync(file, 'utf8')).toMatch(/^---\ntitle: /);
    const checked = await run(['check', file, '--json']);
    expect(checked.code).toBe(0);
    const [block] = JSON.parse(checked.out).records[0].blocks;
    expect(block.status).toBe('confirmed');
    expect(block.claim.energy).not.toBeNull();
  }, 60_000);

  it('refuses to overwrite a record, and a space or unit it cannot write', async () => {
    expect((await run(['new', 'plain'])).code).toBe(2);
    expect((await run(['new', 'x', '--space', 'plane'])).err).toMatch(/--space must be line or radial/);
    expect((await run(['new', 'y', '--units', 'nm'])).code).toBe(2);
  });
});
