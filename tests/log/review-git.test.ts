import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';
import { checkLog } from '../../src/log/check-log.ts';
import { loadLogConfig } from '../../src/log/log-config.ts';
import { diffLog } from '../../src/log/log-diff.ts';
import { recordHistories } from '../../src/log/record-history.ts';

// History and diff read a real git repository, made here in a temporary folder.

const record = (...blocks: string[]) => `---\ntitle: log\nauthor: test bench\ndate: 2026-12-01\ntags: []\n---\n\nProse.\n\n${blocks.map((b) => '```variational\n' + b + '\n```\n').join('\n')}`;
// Oscillator, exact level 1/2 with a Gaussian (any quantum mechanics textbook).
const oscillator = (id: string, claim: string) => `id: ${id}\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.05, max: 5 }\nclaim:\n  energy: ${claim}\n  tolerance: 0.001`;
// Hydrogen 1s with exp(-a r), exact level -1/2 hartree (any quantum mechanics textbook).
const HYDROGEN = 'id: h1s\nspace: radial\npotential: -1/r\ntrial: exp(-a*r)\nparameters:\n  a: { start: 0.6, min: 0.05, max: 5 }\nclaim:\n  energy: -0.5';

function repository(): { root: string; commit(message: string, files: Record<string, string>): void } {
  const root = mkdtempSync(join(tmpdir(), 'groundwork-git-'));
  const git = (...args: string[]) => execFileSync('git', ['-c', 'user.name=Test Bench', '-c', 'user.email=bench@example.invalid', '-c', 'commit.gpgsign=false', ...args], { cwd: root, stdio: 'pipe' });
  git('init', '-q');
  writeFileSync(join(root, 'groundwork.config.json'), JSON.stringify({ workers: 1 }));
  return {
    root,
    commit(message, files) {
      for (const [name, text] of Object.entries(files)) writeFileSync(join(root, name), text);
      git('add', '-A');
      git('commit', '-q', '-m', message);
    },
  };
}

async function run(args: string[]) {
  const out: string[] = [];
  const code = await main(args, (t) => out.push(t), () => {});
  return { code, out: out.join('\n') };
}

describe('record history through git', () => {
  const repo = repository();
  repo.commit('first', { 'r.md': record(oscillator('osc', '0.5'), HYDROGEN) });
  repo.commit('wrong claim', { 'r.md': record(oscillator('osc', '0.6'), HYDROGEN) });
  // Renamed in place: same line, nothing else new, so it keeps its history.
  repo.commit('rename', { 'r.md': record(oscillator('osc-renamed', '0.6'), HYDROGEN) });

  it('gives each block its status and energy at every commit, a block renamed in place included', async () => {
    const config = loadLogConfig(repo.root);
    const { log } = await checkLog([join(repo.root, 'r.md')], { root: repo.root, config });
    const histories = (await recordHistories(log.records, { root: repo.root, config, depth: config.historyDepth })).get('r.md')!;
    expect(histories.map((h) => h.id)).toEqual(['osc-renamed', 'h1s']);
    const [osc, h1s] = histories;
    expect(osc.points.map((p) => [p.commit?.subject, p.id, p.status])).toEqual([
      ['first', 'osc', 'confirmed'],
      ['wrong claim', 'osc', 'disputed'],
      ['rename', 'osc-renamed', 'disputed'],
    ]);
    for (const p of osc.points) expect(p.energy!.value).toBeCloseTo(0.5, 8);
    expect(h1s.points.map((p) => p.status)).toEqual(['confirmed', 'confirmed', 'confirmed']);
    // The depth limit keeps only the newest commits.
    const shallow = (await recordHistories(log.records, { root: repo.root, config, depth: 1 })).get('r.md')!;
    expect(shallow[0].points.map((p) => p.commit?.subject)).toEqual(['rename']);
  }, 120_000);
});

describe('groundwork diff', () => {
  const repo = repository();
  repo.commit('first', { 'r.md': record(oscillator('osc', '0.5'), HYDROGEN), 's.md': record(HYDROGEN.replace('h1s', 'other')) });
  repo.commit('wrong claim', { 'r.md': record(oscillator('osc', '0.6'), HYDROGEN) });
  const home = process.cwd();
  beforeAll(() => process.chdir(repo.root));
  afterAll(() => process.chdir(home));

  it('reports exactly the block whose claim changed, before and after, and that it got worse', async () => {
    const diff = await diffLog('HEAD~1', ['.'], { root: repo.root, config: loadLogConfig(repo.root) });
    expect(diff.changes.map((c) => [c.file, c.id, c.change, c.fields])).toEqual([['r.md', 'osc', 'changed', ['claim']]]);
    const [change] = diff.changes;
    expect([change.before!.status, change.after!.status]).toEqual(['confirmed', 'disputed']);
    expect(change.before!.energy!.value).toBeCloseTo(0.5, 8);
    expect(change.worse).toBe('status confirmed -> disputed');
    expect(diff.unchanged).toBe(2);
  }, 120_000);

  it('exits 1 when a block got worse, 0 when nothing did, 2 for a revision git does not know', async () => {
    const worse = await run(['diff', 'HEAD~1', '.', '--json']);
    expect(worse.code).toBe(1);
    expect(JSON.parse(worse.out).changes[0].id).toBe('osc');
    expect((await run(['diff', 'HEAD', '.'])).code).toBe(0);
    expect((await run(['diff', 'no-such-revision', '.'])).code).toBe(2);
  }, 120_000);

  it('counts a new block that is not confirmed as worse, and reports removed blocks', async () => {
    writeFileSync(join(repo.root, 's.md'), record(oscillator('fresh', '0.7')));
    const diff = await diffLog('HEAD', ['.'], { root: repo.root, config: loadLogConfig(repo.root) });
    expect(diff.changes.map((c) => [c.id, c.change, c.worse !== null])).toEqual([
      ['fresh', 'added', true],
      ['other', 'removed', false],
    ]);
  }, 120_000);
});
