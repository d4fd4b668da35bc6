import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import { openResultCache, type SpecEntry } from '../../src/log/result-cache.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';
import { withoutTimings } from './without-timings.ts';

// The reference for every cached result is a fresh evaluation of the same record text.

const record = (prose: string, block: string) => `---\ntitle: cache\nauthor: test bench\ndate: 2026-12-01\ntags: []\n---\n\n${prose}\n\n\`\`\`variational\n${block}\n\`\`\`\n`;
// The oscillator with a Gaussian trial: confirmed at E = 1/2 (any quantum mechanics textbook).
const OSCILLATOR = 'id: osc\npotential: x^2/2\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.05, max: 5 }';
// exp(-a x^2) does not vanish at the walls of a box: invalid, with a problem on the trial line.
const WALL = 'id: wall\nbox: [0, 1]\npotential: "0"\ntrial: exp(-a*x^2)\nparameters:\n  a: { start: 1, min: 0.1, max: 10 }';

function specOf(file: string, text: string): SpecEntry {
  const entry = parseRecord(file, text).blocks[0];
  if (entry.kind !== 'spec') throw new Error(`the test block did not parse: ${JSON.stringify(entry.problems)}`);
  return entry;
}

const folder = () => join(mkdtempSync(join(tmpdir(), 'groundwork-cache-')), '.groundwork-cache');

describe('results cache', () => {
  it('gives back what was stored, one entry file per block and no temp file left', () => {
    const dir = folder();
    const entry = specOf('a.md', record('Prose.', OSCILLATOR));
    const result = evaluateBlock('a.md', entry);
    expect(result.status).toBe('confirmed');
    const cache = openResultCache(dir);
    expect(cache.get('a.md', entry)).toBeNull();
    const stored = cache.put(entry, result);
    expect(withoutTimings(stored)).toBe(withoutTimings(result));
    expect(readdirSync(dir)).toEqual([basename(cache.folder)]);
    expect(readdirSync(cache.folder)).toEqual([basename(cache.entryPath(entry))]);
    const reopened = openResultCache(dir);
    expect(reopened.get('a.md', entry)).toEqual(stored);
    expect(reopened.stats).toMatchObject({ hits: 1, misses: 0, corrupt: 0 });
  });

  it('serves a block moved by prose edits above it, at its new line, problems included', () => {
    const cache = openResultCache(folder());
    const before = specOf('a.md', record('Prose.', WALL));
    const first = evaluateBlock('a.md', before);
    expect(first.status).toBe('invalid');
    cache.put(before, first);
    const movedText = record('Prose.\n\nThree more lines\nof prose\nabove the block.', WALL);
    const moved = specOf('b.md', movedText);
    const hit = cache.get('b.md', moved);
    const fresh = evaluateBlock('b.md', moved);
    expect(hit).not.toBeNull();
    expect(hit!.line).toBe(first.line + 4);
    expect(hit!.problems[0]).toMatchObject({ file: 'b.md', line: movedText.split('\n').indexOf('trial: exp(-a*x^2)') + 1 });
    expect(withoutTimings(hit)).toBe(withoutTimings(fresh));
  });

  it('misses when the block changes, in meaning or in layout', () => {
    const cache = openResultCache(folder());
    const entry = specOf('a.md', record('Prose.', OSCILLATOR));
    cache.put(entry, evaluateBlock('a.md', entry));
    expect(cache.get('a.md', specOf('a.md', record('Prose.', OSCILLATOR.replace('x^2/2', 'x^2/3'))))).toBeNull();
    // Lines inside a result count from the fence, so a re-laid-out block is evaluated again.
    expect(cache.get('a.md', specOf('a.md', record('Prose.', OSCILLATOR.replace('\nparameters:', '\n\nparameters:'))))).toBeNull();
    expect(cache.get('a.md', entry)).not.toBeNull();
  });

  it('detects a truncated, an edited and a misplaced entry, removes each and counts it', () => {
    const dir = folder();
    const cache = openResultCache(dir);
    const osc = specOf('a.md', record('Prose.', OSCILLATOR));
    const wall = specOf('a.md', record('Prose.', WALL));
    const path = (entry: SpecEntry) => cache.entryPath(entry);

    cache.put(osc, evaluateBlock('a.md', osc));
    truncateSync(path(osc), Math.floor(statSync(path(osc)).size / 2));
    expect(cache.get('a.md', osc)).toBeNull();
    expect(readdirSync(cache.folder)).toEqual([]);

    const stored = cache.put(osc, evaluateBlock('a.md', osc));
    writeFileSync(path(osc), readFileSync(path(osc), 'utf8').replace(`"value":${stored.energy!.value}`, '"value":0.49'));
    expect(cache.get('a.md', osc)).toBeNull();

    cache.put(wall, evaluateBlock('a.md', wall));
    writeFileSync(path(osc), readFileSync(path(wall)));
    expect(cache.get('a.md', osc)).toBeNull();
    expect(cache.get('a.md', wall)).not.toBeNull();
    expect(cache.stats).toMatchObject({ corrupt: 3, hits: 1 });
  });

  it('removes temp files of writers that are gone and keeps those of running ones', () => {
    const cache = openResultCache(folder());
    const entry = specOf('a.md', record('Prose.', OSCILLATOR));
    cache.put(entry, evaluateBlock('a.md', entry));
    const dir = cache.folder;
    const gone = spawnSync(process.execPath, ['-e', '0']).pid!;
    const key = basename(cache.entryPath(entry), '.json');
    const abandoned = `.${key}.${gone}.00ff00ff.tmp`;
    const inFlight = `.${key}.${process.ppid}.00ff00ff.tmp`;
    writeFileSync(join(dir, abandoned), '{"format":1,"ke');
    writeFileSync(join(dir, inFlight), '{"format":1,"ke');
    openResultCache(dirname(dir));
    expect(readdirSync(dir).sort()).toEqual([inFlight, `${key}.json`].sort());
  });

  it('removes the entries of other evaluators and nothing else in the folder', () => {
    const dir = folder();
    const cache = openResultCache(dir);
    const entry = specOf('a.md', record('Prose.', OSCILLATOR));
    cache.put(entry, evaluateBlock('a.md', entry));
    const older = join(dir, '0123456789abcdef');
    mkdirSync(older);
    writeFileSync(join(older, 'old.json'), '{}');
    mkdirSync(join(dir, 'notes'));
    const reopened = openResultCache(dir);
    expect(readdirSync(dir).sort()).toEqual([basename(cache.folder), 'notes'].sort());
    expect(reopened.get('a.md', entry)).not.toBeNull();
  });

  it('goes on without storing when the cache folder cannot be written, and counts it', () => {
    const blocker = join(mkdtempSync(join(tmpdir(), 'groundwork-cache-')), 'a-file');
    writeFileSync(blocker, 'not a folder');
    const cache = openResultCache(join(blocker, '.groundwork-cache'));
    const entry = specOf('a.md', record('Prose.', OSCILLATOR));
    const result = evaluateBlock('a.md', entry);
    expect(withoutTimings(cache.put(entry, result))).toBe(withoutTimings(result));
    expect(cache.get('a.md', entry)).toBeNull();
    expect(cache.stats).toMatchObject({ writeErrors: 1, hits: 0 });
  });

  it('stores a block that did not parse, keyed so that a repeated id never takes the result of a lone one', () => {
    const cache = openResultCache(folder());
    // The unknown field makes the block invalid at parsing; the second copy in `twice` is a repeated id as well.
    const odd = 'id: odd\npotential: x^2\ntrial: exp(-a*x^2)\nmystery: 1';
    const alone = parseRecord('a.md', record('Prose.', odd)).blocks[0];
    const twice = parseRecord('b.md', record('Prose.', odd) + '\n```variational\n' + odd + '\n```\n').blocks;
    expect([alone.kind, twice[0].kind, twice[1].kind]).toEqual(['invalid', 'invalid', 'invalid']);
    const stored = cache.put(alone, evaluateBlock('a.md', alone));
    expect(stored.problems[0]).toMatchObject({ field: 'mystery' });
    expect(cache.get('a.md', alone)).toEqual(stored);
    expect(cache.get('b.md', twice[0])).toMatchObject({ id: 'odd', problems: [{ file: 'b.md', field: 'mystery' }] });
    expect(cache.get('b.md', twice[1])).toBeNull();
    expect(cache.stats).toMatchObject({ hits: 2, misses: 1 });
  });

  it('gives a record whose text is unchanged back whole from its index, and nothing for a changed one', () => {
    const cache = openResultCache(folder());
    const text = record('Prose.', WALL);
    const spec = parseRecord('w.md', text);
    const results = spec.blocks.map((entry) => cache.put(entry, evaluateBlock('w.md', entry)));
    expect(cache.getRecord('w.md', text)).toBeNull();
    cache.putRecord(text, spec);
    const whole = cache.getRecord('w.md', text);
    expect(whole).toEqual({ file: 'w.md', title: 'cache', frontMatter: spec.frontMatter, problems: spec.problems, blocks: results });
    expect(cache.getRecord('w.md', text.replace('Prose.', 'Prose edited.'))).toBeNull();
    expect(cache.getRecord('renamed.md', text)).toBeNull();
    expect(cache.stats.hits).toBe(1);
  });

  it('parses a record again when one of the results its index names is gone', () => {
    const cache = openResultCache(folder());
    const text = record('Prose.', OSCILLATOR);
    const spec = parseRecord('o.md', text);
    for (const entry of spec.blocks) cache.put(entry, evaluateBlock('o.md', entry));
    cache.putRecord(text, spec);
    rmSync(cache.entryPath(spec.blocks[0]));
    expect(cache.getRecord('o.md', text)).toBeNull();
    expect(cache.stats.hits).toBe(0);
  });
});
