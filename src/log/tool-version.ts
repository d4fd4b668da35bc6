import { readFileSync } from 'node:fs';

/** The version in package.json: it names the engine in every result and cache key. */
export const TOOL_VERSION: string = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')).version;
