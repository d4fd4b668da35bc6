// Writes schema/variational.json, the spec block's JSON Schema shipped in the package, from the parser's zod schema.
// tests/spec/json-schema.test.ts fails while the committed file differs from what this writes.
import { writeFileSync } from 'node:fs';
import { specJsonSchema } from '../src/spec/json-schema.ts';

writeFileSync(new URL('../schema/variational.json', import.meta.url), `${JSON.stringify(specJsonSchema(), null, 2)}\n`);
