import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { blockKey, readBuildResults, writeBuildResults } from '../../src/log/build-results.ts';
import { checkRecord } from '../../src/log/check-record.ts';
import { openResultCache } from '../../src/log/result-cache.ts';
import type { LogResult } from '../../src/log/result-types.ts';

const RECORD = ['---', 'title: Stopped', 'author: test', 'date: 2026-01-01', 'tags: []', '---', '', '```variational', 'id: slow', 'potential: x^2/2', 'trial: exp(-a*x^2)', 'parameters:', '  a: { start: 0.3, min: 0.01, max: 5 }', '```', ''].join('\n');

describe('checkRecord with the results of a parallel run', () => {
  it('shows a block the run stopped at its time limit instead of evaluating it again without a limit', () => {
    const root = mkdtempSync(join(tmpdir(), 'groundwork-known-'));
    writeFileSync(join(root, 'slow.md'), RECORD);
    const cacheRoot = join(root, '.groundwork-cache');
    // A first pass gives the block's real result and hash; the parallel run is then said to have stopped it.
    const fresh = checkRecord(join(root, 'slow.md'), { cwd: root });
    const stopped = { ...fresh.blocks[0], status: 'unsettled' as const, message: 'the evaluation took longer than the time limit of 60 s' };
    const log: LogResult = { tool: { name: 'groundwork', version: 'test' }, records: [{ ...fresh, blocks: [stopped] }] };
    writeBuildResults(cacheRoot, log);
    const known = readBuildResults(cacheRoot);
    expect(known.has(blockKey('slow.md', stopped.line, stopped.inputHash))).toBe(true);

    const cache = openResultCache(cacheRoot);
    const page = checkRecord(join(root, 'slow.md'), { cwd: root, cache, known });
    expect(page.blocks[0].status).toBe('unsettled');
    expect(page.blocks[0].message).toMatch(/time limit/);
    // Nothing was looked up or evaluated: the stopped result came from the run.
    expect(cache.stats.hits + cache.stats.misses).toBe(0);

    // An edited block no longer matches the run and is evaluated afresh (the exact oscillator level 1/2, any textbook).
    writeFileSync(join(root, 'slow.md'), RECORD.replace('x^2/2', 'x^2/2 + 0'));
    const edited = checkRecord(join(root, 'slow.md'), { cwd: root, cache, known });
    expect(edited.blocks[0].status).toBe('confirmed');
    expect(edited.blocks[0].energy!.value).toBeCloseTo(0.5, 9);
  });
});
