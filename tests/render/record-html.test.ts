import { describe, expect, it } from 'vitest';
import { provenance } from '../../src/log/provenance.ts';
import type { RecordResult } from '../../src/log/result-types.ts';
import { checkRecordText, HOSTILE } from './record-fixture.ts';
import { recordHtml } from '../../src/render/record-html.ts';

// What record prose may do once rendered follows the sanitiser's allow-list (rehype-sanitize's GitHub-style default
// schema); the attacks below are the common cross-site-scripting vectors (OWASP XSS filter evasion cheat sheet).


function render(text: string): { html: string; record: RecordResult } {
  const record = checkRecordText('content/records/hostile.md', text);
  return { html: recordHtml(record.file, text, record, { file: record.file, git: null, provenance: provenance() }).html, record };
}

describe('a record page body', () => {
  const { html, record } = render(HOSTILE);

  it('keeps the result panel, evaluated, in place of the spec block', () => {
    expect(record.blocks[0].status).toBe('confirmed');
    expect(html).toContain('id="block-t9-ground"');
    expect(html).toContain('class="gw-plots"');
  });

  it('typesets prose math with KaTeX', () => {
    expect(html).toContain('class="katex"');
  });

  it('drops scripts, event handlers, javascript: links, frames and forms from the prose', () => {
    expect(html).not.toMatch(/<script/i);
    // No element keeps an event-handler attribute (text that merely reads onmouseover= is escaped, not markup).
    expect(html).not.toMatch(/<[^>]*\son[a-z]+=/i);
    expect(html).not.toMatch(/javascript:/i);
    expect(html).not.toMatch(/<iframe|<form|<input/i);
    expect(html).not.toMatch(/style="position/);
    // A harmless link survives.
    expect(html).toContain('href="https://example.org"');
  });

  it('escapes what the block itself echoes (its caption)', () => {
    expect(html).toContain('<span class="gw-caption">&lt;b onmouseover=alert(1)&gt;caption&lt;/b&gt;</span>');
  });
});
