import { describe, expect, it } from 'vitest';
import { splitFrontMatter } from '../../src/spec/front-matter.ts';
import { newestFirst } from '../../src/site/newest-first.ts';

// The index lists records newest first; ISO 8601 dates YYYY-MM-DD sort chronologically as text (ISO 8601's design).
const row = (id: string, dateLine: string) => {
  const date = splitFrontMatter(`${id}.md`, `---\ntitle: t\nauthor: a\n${dateLine}\ntags: []\n---\n`).frontMatter.date;
  return { id, meta: { date: date ?? '' } };
};

describe('newestFirst', () => {
  it('puts records with refused or missing dates after every dated record', () => {
    const rows = [row('old', 'date: 2025-01-02'), row('bad-month', 'date: 2027-13-45'), row('words', 'date: 5 March'), row('new', 'date: 2026-11-30'), row('none', '')];
    expect(rows.sort(newestFirst).map((r) => r.id)).toEqual(['new', 'old', 'bad-month', 'none', 'words']);
  });
});
