import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join, sep } from 'node:path';
import { TOOL_ROOT } from './tool-root.ts';
import { TOOL_VERSION } from './tool-version.ts';

// Folders that only present results; every other source file may change what a block evaluates to.
const PRESENTATION = new Set(['cli', 'components', 'content.config.ts', 'layouts', 'pages', 'remark', 'render', 'site', 'styles']);

/**
 * sha256 of the evaluator's source (everything under src/ but the presentation folders), the tool
 * version, the mathjs version and the V8 version. The version number alone would let a fixed engine
 * keep serving results computed before the fix, since it only changes at releases; floating-point
 * library calls may differ between V8 releases. It reads the sources each time (a few milliseconds),
 * so a long-running process that opens a new cache sees edits made since the last one. It reads src/
 * even when the command line runs the compiled copy, which the launcher uses only while it matches src/.
 */
export function evaluatorFingerprint(root: string = TOOL_ROOT): string {
  const src = join(root, 'src');
  const hash = createHash('sha256');
  const sources = readdirSync(src, { recursive: true, encoding: 'utf8' })
    .filter((path) => /\.(ts|mjs)$/.test(path) && !PRESENTATION.has(path.split(sep)[0]))
    .sort();
  for (const path of sources) hash.update(path).update('\0').update(readFileSync(join(src, path))).update('\0');
  const mathjs: string = createRequire(join(root, 'package.json'))('mathjs/package.json').version;
  hash.update(JSON.stringify({ tool: TOOL_VERSION, mathjs, v8: process.versions.v8 }));
  return 'sha256:' + hash.digest('hex');
}
