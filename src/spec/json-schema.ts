import { zodToJsonSchema } from 'zod-to-json-schema';
import { blockSchema } from './block-schema.ts';

/** Where the site publishes the schema, so an editor can fetch it by address. */
export const SCHEMA_PATH = 'schema/variational.json';

/**
 * The spec block as a JSON Schema (draft-07), generated from the zod schema the parser checks blocks with, so
 * the two cannot drift apart. Inputs as written: an expression may be text or a number, a quantity a number or
 * text such as "2 nm". Checks that need more than one field (min < max, one of trial and basis) stay with the parser.
 */
export function specJsonSchema(): Record<string, unknown> {
  const schema = zodToJsonSchema(blockSchema, { effectStrategy: 'input', pipeStrategy: 'input', $refStrategy: 'none', target: 'jsonSchema7' }) as Record<string, unknown>;
  return {
    ...schema,
    $id: `https://groundwork.invalid/${SCHEMA_PATH}`,
    title: 'groundwork variational spec block',
    description: 'The YAML of a ```variational block in a groundwork record (docs/record-format.md).',
  };
}
