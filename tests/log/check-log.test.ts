import { mkdtempSync, readdirSync, statSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkLog, unfinishedBlock } from '../../src/log/check-log.ts';
import { checkRecord } from '../../src/log/check-record.ts';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import { CONFIG_FILE, loadLogConfig } from '../../src/log/log-config.ts';
import type { SpecEntry } from '../../src/log/result-cache.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';
import { withoutTimings } from './without-timings.ts';

// The parallel, cached path is checked against the plain in-thread evaluation of the same records.

const record = (...blocks: string[]) => `---\ntitle: log\nauthor: test bench\ndate: 2026-12-01\ntags: []\n---\n\nProse.\n\n${blocks.map((b) => '```variational\n' + b + '\n```\n').join('\n')}`;
// Oscillator, exact level 1/2 with a Gaussian (any quantum mechanics textbook).
const OSCILLATOR = 'id: osc\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.05, max: 5 }\nclaim:\n  energy: 0.5';
// Hydrogen 1s with exp(-a r), exact level -1/2 hartree (any quantum mechanics textbook).
const HYDROGEN = 'id: h1s\nspace: radial\npotential: -1/r\ntrial: exp(-a*r)\nparameters:\n  a: { start: 0.6, min: 0.05, max: 5 }\nclaim:\n  energy: -0.5';
// Does not vanish at the walls: evaluated, then invalid (and still worth storing).
const WALL = 'id: wall\nbox: [0, 1]\npotential: "0"\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.1, max: 10 }';
// Does not parse (unknown field mystery): refused before any numerics, and stored like any result.
const BROKEN = 'id: broken\npotential: x^2\ntrial: exp(-b*x^2)\nmystery: 1';

/**
 * A valid but genuinely expensive block: the oscillator with 850 small Gaussian bumps and a
 * four-parameter trial. Each of the potential's many thousand evaluations costs 850 exponentials and
 * the optimiser needs over a thousand energies: tens of seconds, far over the 4 s limit below, which
 * the plain oscillator beside it meets many times over.
 */
function expensiveBlock(): string {
  const bumps = Array.from({ length: 850 }, (_, k) => `exp(-(x-${((k / 850) * 6 - 3).toFixed(3)})^2)`);
  const balanced = (terms: string[]): string => (terms.length === 1 ? terms[0] : `(${balanced(terms.slice(0, terms.length >> 1))} + ${balanced(terms.slice(terms.length >> 1))})`);
  const parameters = ['a: { start: 1, min: 0.05, max: 5 }', ...['c', 'd', 'f'].map((p) => `${p}: { start: 0, min: -1, max: 1 }`)];
  return `id: bumpy\npotential: x^2/2 + 0.001*${balanced(bumps)}\ntrial: exp(-a*x^2)*(1 + c*x^2 + d*x^4 + f*x^6)\nparameters:\n${parameters.map((p) => `  ${p}`).join('\n')}`;
}

function logFolder(records: Record<string, string>, config?: object): { root: string; files: string[] } {
  const root = mkdtempSync(join(tmpdir(), 'groundwork-log-'));
  if (config) writeFileSync(join(root, CONFIG_FILE), JSON.stringify(config));
  const files = Object.entries(records).map(([name, text]) => {
    writeFileSync(join(root, name), text);
    return join(root, name);
  });
  return { root, files };
}

/** The entry files under a cache folder, as paths relative to it. */
const entriesIn = (folder: string) => readdirSync(folder, { recursive: true, encoding: 'utf8' }).filter((name) => name.endsWith('.json'));
const cacheEntries = (root: string) => entriesIn(join(root, '.groundwork-cache'));

describe('checkLog: parallel and cached', () => {
  const { root, files } = logFolder({ 'a.md': record(OSCILLATOR, WALL), 'b.md': record(BROKEN, HYDROGEN), 'c.md': record(HYDROGEN.replace('h1s', 'h1s-again')) });
  const config = { ...loadLogConfig(root), workers: 2 };

  it('gives the records of the in-thread evaluation, in file and block order', async () => {
    const { log, stats } = await checkLog(files, { root, config });
    const inThread = files.map((file) => checkRecord(file, { cwd: root }));
    expect(withoutTimings(log.records)).toBe(withoutTimings(inThread));
    expect(log.records.map((r) => [r.file, r.blocks.map((b) => `${b.id}:${b.status}`)])).toEqual([
      ['a.md', ['osc:confirmed', 'wall:invalid']],
      ['b.md', ['broken:invalid', 'h1s:confirmed']],
      ['c.md', ['h1s-again:confirmed']],
    ]);
    const { fromCache, ...counts } = stats;
    // Two workers are allowed, but five blocks do not pay for a second worker's start-up (BLOCKS_PER_WORKER = 8).
    expect(counts).toEqual({ blocks: 5, evaluated: 5, cached: 0, corrupt: 0, timedOut: 0, overMemory: 0, writeErrors: 0, workers: 1 });
    expect(fromCache.size).toBe(0);
    expect(cacheEntries(root)).toHaveLength(5);
  }, 120_000);

  it('takes every block, the unparsed one included, from the cache on the next run, with the same JSON apart from timings', async () => {
    const cold = await checkLog(files, { root, config, recompute: true });
    const cached = await checkLog(files, { root, config });
    expect(cold.stats).toMatchObject({ evaluated: 5, cached: 0 });
    expect(cached.stats).toMatchObject({ evaluated: 0, cached: 5, corrupt: 0 });
    // The table marks exactly the blocks that came from the cache.
    expect(cached.stats.fromCache.size).toBe(5);
    for (const record of cached.log.records) for (const block of record.blocks) expect(cached.stats.fromCache.has(block)).toBe(true);
    expect(withoutTimings(cached.log)).toBe(withoutTimings(cold.log));
  }, 120_000);

  it('detects a truncated entry, recomputes that block and gives the same JSON', async () => {
    const before = await checkLog(files, { root, config });
    const victim = join(root, '.groundwork-cache', cacheEntries(root)[0]);
    truncateSync(victim, Math.floor(statSync(victim).size / 3));
    const after = await checkLog(files, { root, config });
    expect(after.stats).toMatchObject({ evaluated: 1, cached: 4, corrupt: 1 });
    expect(withoutTimings(after.log)).toBe(withoutTimings(before.log));
    expect(cacheEntries(root)).toHaveLength(5);
  }, 120_000);

  it('names an unreadable record and checks the others', async () => {
    const { log } = await checkLog([join(root, 'gone.md'), files[2]], { root, config });
    expect(log.records[0]).toMatchObject({ file: 'gone.md', blocks: [], problems: [{ file: 'gone.md', line: 1, message: expect.stringMatching(/cannot read the record/) }] });
    expect(log.records[1].blocks[0].status).toBe('confirmed');
  }, 120_000);
});

describe('checkLog: limits', () => {
  it('stops a block over the time limit as unsettled, stores nothing for it and builds the rest', async () => {
    const { root, files } = logFolder({ 'slow.md': record(expensiveBlock(), OSCILLATOR) }, { timeLimitSeconds: 4, workers: 2 });
    const { log, stats } = await checkLog(files, { root });
    const [slow, fast] = log.records[0].blocks;
    expect(slow).toMatchObject({ id: 'bumpy', status: 'unsettled', energy: null, problems: [] });
    expect(slow.message).toMatch(/time limit of 4 s \(timeLimitSeconds in groundwork\.config\.json\)/);
    expect(fast).toMatchObject({ id: 'osc', status: 'confirmed' });
    // One worker for two blocks: the stopped worker is replaced and the oscillator still gets done.
    expect(stats).toMatchObject({ evaluated: 2, timedOut: 1, workers: 1 });
    expect(cacheEntries(root)).toHaveLength(1);
  }, 120_000);

  it('makes a block over the memory cap invalid, with the block and its line named', () => {
    const text = record(OSCILLATOR);
    const entry = parseRecord('m.md', text).blocks[0] as SpecEntry;
    const result = unfinishedBlock('m.md', entry, { kind: 'out-of-memory', limitMb: 128 });
    expect(result).toMatchObject({ id: 'osc', status: 'invalid', line: entry.spec.line, inputHash: evaluateBlock('m.md', entry).inputHash });
    expect(result.problems).toEqual([{ file: 'm.md', line: entry.spec.line, block: 'osc', field: null, message: expect.stringMatching(/memory cap of 128 MB \(memoryLimitMb/) }]);
  });

  it('reads groundwork.config.json at the log root: workers and the cache folder', async () => {
    const { root, files } = logFolder({ 'a.md': record(OSCILLATOR) }, { workers: 1, cacheFolder: 'results' });
    const { stats } = await checkLog(files, { root });
    expect(stats.workers).toBe(1);
    expect(entriesIn(join(root, 'results'))).toHaveLength(1);
  }, 120_000);
});
