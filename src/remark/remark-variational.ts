import type { Code, Root } from 'mdast';
import { relative } from 'node:path';
import type { VFile } from 'vfile';
import { visit } from 'unist-util-visit';
import { checkRecord } from '../log/check-log.ts';
import type { RecordResult } from '../log/result-types.ts';
import { renderBlockPanel } from '../render/block-panel.ts';
import { SPEC_LANG } from '../spec/find-blocks.ts';

export interface Options {
  /** Folder that record paths in panels and results are given relative to (default: the working folder). */
  root?: string;
}

const emptyOptions: Options = {};

/**
 * Replaces every `variational` block of a record by its result panel. The record is evaluated
 * through the same path as `groundwork check`, so the page shows the object the CLI prints.
 */
export default function remarkVariational(options?: Readonly<Options> | null) {
  const settings = options || emptyOptions;
  return (tree: Root, file: VFile) => {
    if (!file.path) return;
    const record: RecordResult = checkRecord(file.path, settings.root ?? process.cwd());
    const name = relative(settings.root ?? process.cwd(), file.path);
    let index = 0;
    visit(tree, 'code', (node: Code, position, parent) => {
      if (node.lang !== SPEC_LANG || !parent || position === undefined) return;
      const result = record.blocks[index++];
      if (!result) return;
      if (result.status === 'invalid') file.message(`block ${result.id} is invalid: ${result.message}`, { place: node.position, ruleId: 'invalid-block', source: 'groundwork' });
      parent.children[position] = { type: 'html', value: renderBlockPanel(result, name) };
    });
    const data = file.data as { astro?: { frontmatter?: Record<string, unknown> } };
    data.astro ??= {};
    data.astro.frontmatter ??= {};
    data.astro.frontmatter.groundwork = record;
  };
}
