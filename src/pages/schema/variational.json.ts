import type { APIRoute } from 'astro';
import { specJsonSchema } from '../../spec/json-schema.ts';

/** The spec block's JSON Schema, for editors: generated from the parser's own schema at build time. */
export const GET: APIRoute = () => new Response(`${JSON.stringify(specJsonSchema(), null, 2)}\n`, { headers: { 'Content-Type': 'application/schema+json' } });
