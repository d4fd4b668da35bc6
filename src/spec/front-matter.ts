import { LineCounter, parseDocument } from 'yaml';
import type { FrontMatter, SpecProblem } from './types.ts';
import { locateYamlError } from './yaml-errors.ts';

export interface SplitRecord {
  frontMatter: FrontMatter;
  problems: SpecProblem[];
  /** The Markdown body with the front matter blanked out, so line numbers stay those of the file. */
  body: string;
}

// The YAML between the fences may be empty; an editor's byte-order mark may precede the first fence.
const FENCE = /^\uFEFF?---\r?\n(?:([\s\S]*?)\r?\n)??---\r?\n?/;
const OPENING = /^\uFEFF?---\r?\n/;

/** Splits YAML front matter from a record; keeps the body's line numbers equal to the file's. */
export function splitFrontMatter(file: string, text: string): SplitRecord {
  const empty: FrontMatter = { title: null, author: null, date: null, tags: [] };
  const match = FENCE.exec(text);
  if (!match) {
    const message = OPENING.test(text)
      ? 'the front matter opened by --- on line 1 is never closed by a line ---'
      : 'the record has no YAML front matter (a --- block with title, author, date, tags)';
    return { frontMatter: empty, problems: [{ file, line: 1, block: null, field: 'front matter', message }], body: text };
  }
  const blankLines = match[0].split('\n').length - 1;
  const body = '\n'.repeat(blankLines) + text.slice(match[0].length);
  const lineCounter = new LineCounter();
  const doc = parseDocument(match[1] ?? '', { lineCounter, prettyErrors: false, logLevel: 'error' });
  const problems: SpecProblem[] = [];
  const at = (offset: number) => lineCounter.linePos(offset).line + 1;
  const lines = (match[1] ?? '').split('\n');
  for (const error of doc.errors) {
    // The front matter's YAML starts on the file's line 2.
    const { index, field, reason } = locateYamlError(lines, error, at(error.pos[0]) - 1);
    problems.push({ file, line: index + 2, block: null, field: field ?? 'front matter', message: `front matter is not valid YAML: ${reason}` });
  }
  if (doc.errors.length > 0) return { frontMatter: empty, problems, body };
  let data: unknown;
  try {
    // An empty front matter is a map without fields, each then reported missing.
    data = doc.toJS() ?? {};
  } catch (error) {
    // Aliases that expand without bound, or that name no anchor, fail only when the YAML is expanded.
    const reason = error instanceof Error ? error.message : String(error);
    return { frontMatter: empty, problems: [{ file, line: 2, block: null, field: 'front matter', message: `front matter aliases (*name) cannot be expanded: ${reason}` }], body };
  }
  if (typeof data !== 'object' || Array.isArray(data)) {
    problems.push({ file, line: 2, block: null, field: 'front matter', message: 'front matter must be a YAML map' });
    return { frontMatter: empty, problems, body };
  }
  const fields = data as Record<string, unknown>;
  const lineOf = (name: string) => fieldLine(doc, name, at);
  const text_ = (name: string): string | null => {
    const value = fields[name];
    if (value === undefined) {
      // An absent field has no line of its own; the front matter opens on line 1.
      problems.push({ file, line: 1, block: null, field: name, message: `front matter has no ${name}` });
      return null;
    }
    if (value === null || value === '') {
      problems.push({ file, line: lineOf(name), block: null, field: name, message: `front matter ${name} is empty` });
      return null;
    }
    if (value instanceof Date) return value.toISOString().slice(0, 10);
    if (typeof value === 'string' || typeof value === 'number') return String(value);
    problems.push({ file, line: lineOf(name), block: null, field: name, message: `front matter ${name} must be text` });
    return null;
  };
  const tags = fields.tags ?? [];
  const tagList = Array.isArray(tags) ? tags.map(String) : [];
  if (!Array.isArray(tags)) {
    problems.push({ file, line: lineOf('tags'), block: null, field: 'tags', message: 'front matter tags must be a list, e.g. [trap, anharmonic]' });
  }
  const title = text_('title');
  const author = text_('author');
  const written = text_('date');
  // A refused date is dropped rather than kept as text, so the index (newest first) sorts it with the undated.
  const why = written === null ? null : calendarDateProblem(written);
  if (why) problems.push({ file, line: lineOf('date'), block: null, field: 'date', message: `front matter date ${why}` });
  return { frontMatter: { title, author, date: why ? null : written, tags: tagList }, problems, body };
}

/** Why a written date is not an ISO 8601 calendar date YYYY-MM-DD that exists (Gregorian calendar), or null. */
export function calendarDateProblem(text: string): string | null {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!match) return `"${text}" must be written YYYY-MM-DD, e.g. 2026-11-30`;
  const [year, month, day] = match.slice(1).map(Number);
  if (month < 1 || month > 12) return `${text} has month ${month}; months run 01 to 12`;
  // Date.UTC rolls an impossible day over into the next month, which the round trip detects.
  const roundTrip = new Date(Date.UTC(year, month - 1, day)).toISOString().slice(0, 10);
  if (day < 1 || roundTrip !== text) return `${text} is not a day of the calendar`;
  return null;
}

/** The line of a field's key, so an empty value is reported where it is written. */
function fieldLine(doc: ReturnType<typeof parseDocument>, name: string, at: (offset: number) => number): number {
  const items = (doc.contents as { items?: Array<{ key?: { value?: unknown; range?: [number, number, number] } }> } | null)?.items ?? [];
  const pair = items.find((item) => item.key?.value === name);
  return pair?.key?.range ? at(pair.key.range[0]) : 2;
}
