import type { Code, Root } from 'mdast';
import type { VFile } from 'vfile';
import { visit } from 'unist-util-visit';
import type { RecordResult } from '../log/result-types.ts';
import { renderBlockPanel, type PanelContext } from '../render/block-panel.ts';
import { SPEC_LANG } from '../spec/find-blocks.ts';

export interface Options {
  /** The record's evaluated result (what `groundwork check --json` prints); its blocks match the spec blocks in order. */
  record: RecordResult;
  /** Where the record came from and what computed it, for the panels' audit trails. */
  context: PanelContext;
}

/** Attribute of the placeholder element that marks where panel `n` goes once the prose has been sanitised. */
export const PANEL_ATTRIBUTE = 'dataGroundworkPanel';

declare module 'vfile' {
  interface DataMap {
    /** The result panels' HTML, in the order of their placeholders. */
    panels: string[];
  }
}

/**
 * Replaces every `variational` block by a placeholder for its result panel and keeps the panel's HTML in
 * `file.data.panels`: the panels are trusted output and go in after the record's own prose is sanitised.
 */
export default function remarkVariational(options: Readonly<Options>) {
  return (tree: Root, file: VFile) => {
    const panels: string[] = [];
    visit(tree, 'code', (node: Code, position, parent) => {
      if (node.lang !== SPEC_LANG || !parent || position === undefined) return;
      const result = options.record.blocks[panels.length];
      if (!result) return;
      if (result.status === 'invalid') file.message(`block ${result.id} is invalid: ${result.message}`, { place: node.position, ruleId: 'invalid-block', source: 'groundwork' });
      parent.children[position] = { type: 'paragraph', children: [], data: { hName: 'div', hProperties: { [PANEL_ATTRIBUTE]: String(panels.length) } } };
      panels.push(renderBlockPanel(result, options.context));
    });
    file.data.panels = panels;
  };
}
