import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, sep } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/** groundwork's package name (scoped, so no package of the public registry can stand in for it). */
export const TOOL_PACKAGE = '@groundwork-log/groundwork';

/**
 * The folder of groundwork's own package.json. Found by walking up, because this module runs both from
 * src/log (CLI) and from a bundled chunk under dist/ (the site build).
 */
function findToolRoot(): string {
  let folder = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const manifest = join(folder, 'package.json');
    if (existsSync(manifest) && JSON.parse(readFileSync(manifest, 'utf8')).name === TOOL_PACKAGE) return folder;
    const parent = dirname(folder);
    if (parent === folder) throw new Error(`groundwork's package.json was not found above ${fileURLToPath(import.meta.url)}`);
    folder = parent;
  }
}

export const TOOL_ROOT = findToolRoot();

// The command line runs the JavaScript that scripts/compile-cli.mjs writes under compiled/ when it is
// fresh (see bin/groundwork.js); tests, the site build and tsx run the TypeScript under src/.
const COMPILED = join(TOOL_ROOT, 'compiled');
const runningCompiled = fileURLToPath(import.meta.url).startsWith(COMPILED + sep);

/**
 * A module of groundwork, named by its path under src/, in the form this process runs it: compiled
 * JavaScript when this process does, so a worker never transpiles at run time what its parent did not.
 */
export function toolModule(path: string): URL {
  return pathToFileURL(runningCompiled ? join(COMPILED, path.replace(/\.ts$/, '.js')) : join(TOOL_ROOT, 'src', path));
}
