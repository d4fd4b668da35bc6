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
  const text_ = (name: string): string | null => {
    const value = fields[name];
    if (value === undefined || value === null) {
      problems.push({ file, line: 2, block: null, field: name, message: `front matter has no ${name}` });
      return null;
    }
    if (value instanceof Date) return value.toISOString().slice(0, 10);
    if (typeof value === 'string' || typeof value === 'number') return String(value);
    problems.push({ file, line: fieldLine(doc, name, at), block: null, field: name, message: `front matter ${name} must be text` });
    return null;
  };
  const tags = fields.tags ?? [];
  const tagList = Array.isArray(tags) ? tags.map(String) : [];
  if (!Array.isArray(tags)) {
    problems.push({ file, line: fieldLine(doc, 'tags', at), block: null, field: 'tags', message: 'front matter tags must be a list, e.g. [trap, anharmonic]' });
  }
  return { frontMatter: { title: text_('title'), author: text_('author'), date: text_('date'), tags: tagList }, problems, body };
}

function fieldLine(doc: ReturnType<typeof parseDocument>, name: string, at: (offset: number) => number): number {
  const node = doc.get(name, true) as { range?: [number, number, number] } | undefined;
  return node?.range ? at(node.range[0]) : 2;
}
