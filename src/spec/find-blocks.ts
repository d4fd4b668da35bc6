import remarkParse from 'remark-parse';
import { unified } from 'unified';
import { visit } from 'unist-util-visit';
import type { Code } from 'mdast';

/** The info string that marks a spec block. */
export const SPEC_LANG = 'variational';

export interface FencedBlock {
  /** Line of the opening fence in the file. */
  line: number;
  /** The block's YAML text. */
  text: string;
}

/** Finds the fenced spec blocks of a Markdown body with the same parser the site uses. */
export function findSpecBlocks(body: string): FencedBlock[] {
  const tree = unified().use(remarkParse).parse(body);
  const found: FencedBlock[] = [];
  visit(tree, 'code', (node: Code) => {
    if (node.lang === SPEC_LANG && node.position) {
      found.push({ line: node.position.start.line, text: node.value });
    }
  });
  return found;
}
