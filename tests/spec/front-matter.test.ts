import { describe, expect, it } from 'vitest';
import { splitFrontMatter } from '../../src/spec/front-matter.ts';

// The front matter carries title, author, date and tags (the project's record format, docs/record-format.md).
// A date is a calendar date written YYYY-MM-DD (ISO 8601 calendar date, extended format); month 13 or day 45
// exists in no calendar, and 2027-02-29 does not exist because 2027 is not a leap year (Gregorian rule:
// divisible by 4, not by 100 unless by 400).

const FILE = 'content/records/dates.md';
const head = (...fields: string[]) => ['---', ...fields, '---', '', 'Prose.', ''].join('\n');
const base = ['title: A dated record', 'author: device-modelling team', 'tags: [trap]'];

describe('front matter dates', () => {
  it('reads a valid calendar date, including 29 February of a leap year', () => {
    for (const date of ['2026-11-30', '2024-02-29', '2000-02-29']) {
      const split = splitFrontMatter(FILE, head(...base, `date: ${date}`));
      expect(split.problems).toEqual([]);
      expect(split.frontMatter.date).toBe(date);
    }
  });

  it.each([
    ['2027-13-45', 'month 13'],
    ['5 March', 'YYYY-MM-DD'],
    ['2027-02-29', '2027-02-29 is not a day of the calendar'],
    ['1900-02-29', '1900-02-29 is not a day of the calendar'],
    ['2026-4-1', 'YYYY-MM-DD'],
    ['20261130', 'YYYY-MM-DD'],
  ])('refuses %s on its own line, and keeps no date that could sort as newest', (date, why) => {
    const text = head(...base, `date: ${date}`);
    const split = splitFrontMatter(FILE, text);
    // title on line 2, author 3, tags 4, date 5.
    expect(split.problems).toEqual([{ file: FILE, line: 5, block: null, field: 'date', message: expect.stringContaining(why) }]);
    expect(split.frontMatter.date).toBeNull();
    // The rest of the front matter still reads.
    expect(split.frontMatter.title).toBe('A dated record');
  });
});

describe('front matter: an empty field is reported on its own line', () => {
  it('an empty author: on the line of author, not the title', () => {
    const split = splitFrontMatter(FILE, head('title: A record', 'date: 2026-11-30', 'author:', 'tags: []'));
    expect(split.problems).toEqual([{ file: FILE, line: 4, block: null, field: 'author', message: 'front matter author is empty' }]);
  });

  it('a missing author: on the opening line of the front matter', () => {
    const split = splitFrontMatter(FILE, head('title: A record', 'date: 2026-11-30', 'tags: []'));
    expect(split.problems).toEqual([{ file: FILE, line: 1, block: null, field: 'author', message: 'front matter has no author' }]);
  });
});
