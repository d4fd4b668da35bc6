import { Ajv } from 'ajv';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { findSpecBlocks } from '../../src/spec/find-blocks.ts';
import { specJsonSchema } from '../../src/spec/json-schema.ts';

// The JSON Schema is checked with Ajv, a general-purpose JSON Schema validator (draft-07), against the blocks the
// project's own parser accepts: the demo log and the benchmark records.
const ROOT = join(import.meta.dirname, '..', '..');
const folders = ['content/records', 'tests/fixtures/problems'];
const blocks = folders.flatMap((folder) =>
  readdirSync(join(ROOT, folder))
    .filter((name) => name.endsWith('.md'))
    .flatMap((name) => findSpecBlocks(readFileSync(join(ROOT, folder, name), 'utf8')).map((b) => ({ where: `${folder}/${name}:${b.line}`, data: parse(b.text) as unknown }))),
);
const validate = new Ajv({ allErrors: true, strict: false }).compile(specJsonSchema());

describe('the spec block JSON Schema', () => {
  it('accepts every block of the demo log and of the benchmark records', () => {
    expect(blocks.length).toBeGreaterThan(20);
    for (const { where, data } of blocks) expect(validate(data) ? [] : validate.errors, where).toEqual([]);
  });

  it('refuses a misspelt field and a wrong type, as the parser does', () => {
    expect(validate({ id: 'a', potental: 'x^2', trial: 'exp(-x^2)' })).toBe(false);
    expect(validate({ id: 'a', potential: 'x^2', trial: 'exp(-x^2)', space: 'sphere' })).toBe(false);
    expect(validate({ id: 'a', potential: 'x^2', trial: 'exp(-x^2)', system: 'oscillator' })).toBe(true);
  });

  it('is the file shipped in the package (npm run schema rewrites it)', () => {
    expect(JSON.parse(readFileSync(join(ROOT, 'schema', 'variational.json'), 'utf8'))).toEqual(specJsonSchema());
  });
});
