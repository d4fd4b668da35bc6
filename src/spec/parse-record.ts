import { findSpecBlocks } from './find-blocks.ts';
import { splitFrontMatter } from './front-matter.ts';
import { parseBlock } from './parse-block.ts';
import type { BlockEntry, RecordSpec } from './types.ts';

/** Reads a record's text into its front matter and its spec blocks; never throws on bad input. */
export function parseRecord(file: string, text: string): RecordSpec {
  const split = splitFrontMatter(file, text);
  const firstLineOf = new Map<string, number>();
  // A repeated id would share anchors and cache keys with the first block, so the repeat is refused.
  const blocks = findSpecBlocks(split.body).map((fenced, index): BlockEntry => {
    const entry = parseBlock(file, fenced, index);
    const id = entry.kind === 'spec' ? entry.spec.id : entry.id;
    const first = firstLineOf.get(id);
    if (first === undefined) {
      firstLineOf.set(id, fenced.line);
      return entry;
    }
    const caption = entry.kind === 'spec' ? entry.spec.caption : entry.caption;
    const message = `id ${id} is already used by the block on line ${first}; ids must be unique within a record`;
    return { kind: 'invalid', id, line: fenced.line, caption, source: entry.source, problems: [{ file, line: fenced.line + 1 + Math.max(0, fenced.text.split('\n').findIndex((l) => /^id\s*:/.test(l))), block: id, field: 'id', message }] };
  });
  return { file, frontMatter: split.frontMatter, problems: split.problems, blocks };
}
