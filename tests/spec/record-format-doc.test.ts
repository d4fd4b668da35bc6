import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { STATUS_ORDER } from '../../src/engine/status.ts';
import { DEFAULTS } from '../../src/log/log-config.ts';
import { knownFields } from '../../src/spec/block-schema.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';
import { ENERGY_UNIT_EXAMPLES } from '../../src/units/energy-units.ts';

// docs/record-format.md is the project's own reference for the record format: its examples must be records the
// parser accepts, and it must name every field, status, energy unit and config setting the code knows.
const DOC = readFileSync(join(import.meta.dirname, '..', '..', 'docs', 'record-format.md'), 'utf8');

describe('docs/record-format.md', () => {
  it('has examples that parse as spec blocks without problems', () => {
    // The first example sits inside a ````markdown fence, where Markdown (rightly) sees no block: take every one out.
    const fenced = [...DOC.matchAll(/^```variational\n[\s\S]*?^```$/gm)].map((m) => m[0]).join('\n\n');
    const blocks = parseRecord('docs/record-format.md', fenced).blocks;
    expect(blocks.length).toBeGreaterThanOrEqual(3);
    for (const block of blocks) expect(block.kind === 'invalid' ? block.problems : []).toEqual([]);
  });

  it('names every field of a spec block and of its nested maps', () => {
    const fields = [[], ['reference'], ['claim'], ['report'], ['parameters', 'a']].flatMap((path) => knownFields(path));
    for (const field of fields) expect(DOC, field).toContain(`\`${field}\``);
  });

  it('names every status in the order in which they win', () => {
    expect(DOC).toContain(`**${STATUS_ORDER.join(', ')}**`);
  });

  it('names every energy unit and every config setting', () => {
    for (const unit of ENERGY_UNIT_EXAMPLES) expect(DOC).toContain(`\`${unit}\``);
    for (const key of Object.keys(DEFAULTS)) expect(DOC).toContain(`\`${key}\``);
  });
});
