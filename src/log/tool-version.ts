import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { TOOL_ROOT } from './tool-root.ts';

/** The version in package.json: it names the engine in every result and cache key. */
export const TOOL_VERSION: string = JSON.parse(readFileSync(join(TOOL_ROOT, 'package.json'), 'utf8')).version;
