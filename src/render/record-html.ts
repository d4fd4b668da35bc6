import type { Element, Root as HastRoot } from 'hast';
import rehypeKatex from 'rehype-katex';
import rehypeRaw from 'rehype-raw';
import rehypeSanitize, { defaultSchema, type Options as SanitizeSchema } from 'rehype-sanitize';
import rehypeStringify from 'rehype-stringify';
import remarkMath from 'remark-math';
import remarkParse from 'remark-parse';
import remarkRehype from 'remark-rehype';
import { unified } from 'unified';
import { visit } from 'unist-util-visit';
import { VFile } from 'vfile';
import type { RecordResult } from '../log/result-types.ts';
import remarkVariational, { PANEL_ATTRIBUTE } from '../remark/remark-variational.ts';
import { splitFrontMatter } from '../spec/front-matter.ts';
import type { PanelContext } from './block-panel.ts';

/**
 * What record prose may contain once rendered: GitHub-style safe HTML (no scripts, no event handlers,
 * no javascript: links), plus the classes remark-math gives math and the panel placeholders.
 */
const SCHEMA: SanitizeSchema = {
  ...defaultSchema,
  // Task-list checkboxes are the only inputs the default keeps; a log has no use for them.
  tagNames: (defaultSchema.tagNames ?? []).filter((name) => name !== 'input'),
  attributes: {
    ...defaultSchema.attributes,
    code: [...(defaultSchema.attributes?.code ?? []), ['className', 'language-math', 'math-inline', 'math-display']],
    div: [...(defaultSchema.attributes?.div ?? []), PANEL_ATTRIBUTE],
  },
  // Heading anchors keep the ids the author wrote instead of a user-content- prefix.
  clobberPrefix: '',
  clobber: [],
};

/** Puts each result panel where its placeholder survived sanitising. */
function rehypePanels() {
  return (tree: HastRoot, file: VFile) => {
    const panels = file.data.panels ?? [];
    visit(tree, 'element', (node: Element, index, parent) => {
      const n = node.properties?.[PANEL_ATTRIBUTE];
      if (n === undefined || !parent || index === undefined) return;
      parent.children[index] = { type: 'raw', value: panels[Number(n)] ?? '' } as unknown as Element;
    });
  };
}

export interface RecordHtml {
  html: string;
  /** Warnings from the pipeline (invalid blocks), with their places in the record. */
  warnings: string[];
}

/** A record's Markdown as page HTML: sanitised prose, KaTeX math, and a result panel for each spec block. */
export function recordHtml(file: string, text: string, record: RecordResult, context: PanelContext): RecordHtml {
  const { body } = splitFrontMatter(file, text);
  const vfile = new VFile({ path: file, value: body });
  const html = unified()
    .use(remarkParse)
    .use(remarkMath)
    .use(remarkVariational, { record, context })
    .use(remarkRehype, { allowDangerousHtml: true })
    .use(rehypeRaw)
    .use(rehypeSanitize, SCHEMA)
    .use(rehypeKatex)
    .use(rehypePanels)
    .use(rehypeStringify, { allowDangerousHtml: true })
    .processSync(vfile);
  return { html: String(html), warnings: vfile.messages.map((m) => m.toString()) };
}
