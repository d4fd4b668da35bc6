import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

// A property test must not depend on the speed of the machine: its work is fixed by a case count and it
// has a timeout of its own, far above what it needs, instead of vitest's 5 s default (common practice).
const TESTS = new URL('.', import.meta.url).pathname;
const LEAST_TIMEOUT_MS = 30_000;

/** Every `it(...)` block of a test file: its title line, its text, and the timeout written after it, if any. */
function testBlocks(text: string): Array<{ title: string; body: string; timeoutMs: number | null }> {
  const lines = text.split('\n');
  const blocks = [];
  for (let start = 0; start < lines.length; start++) {
    const opening = /^(\s*)it\(/.exec(lines[start]);
    if (!opening) continue;
    const closing = new RegExp(`^${opening[1]}\\}(?:, ([\\d_]+))?\\);$`);
    let end = start + 1;
    while (end < lines.length && !closing.test(lines[end])) end++;
    const timeout = closing.exec(lines[end] ?? '')?.[1];
    blocks.push({ title: lines[start].trim(), body: lines.slice(start, end + 1).join('\n'), timeoutMs: timeout ? Number(timeout.replace(/_/g, '')) : null });
  }
  return blocks;
}

describe('test budgets', () => {
  it('gives every fast-check property test a case count and a generous timeout of its own', () => {
    const files = readdirSync(TESTS, { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.test.ts') && !f.includes('fixtures'));
    const properties = files.flatMap((file) => testBlocks(readFileSync(join(TESTS, file), 'utf8')).filter((b) => /fc\.(assert|check)\(/.test(b.body)).map((b) => ({ file, ...b })));
    expect(properties.length).toBeGreaterThan(0);
    for (const p of properties) {
      expect(p.body, `${p.file}: ${p.title}`).toMatch(/numRuns: [\d_]+/);
      expect(p.timeoutMs, `${p.file}: ${p.title}`).toBeGreaterThanOrEqual(LEAST_TIMEOUT_MS);
    }
  });
});
