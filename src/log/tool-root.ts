import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/**
 * The folder of groundwork's own package.json. Found by walking up, because this module runs both from
 * src/log (CLI) and from a bundled chunk under dist/ (the site build).
 */
function findToolRoot(): string {
  let folder = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const manifest = join(folder, 'package.json');
    if (existsSync(manifest) && JSON.parse(readFileSync(manifest, 'utf8')).name === 'groundwork') return folder;
    const parent = dirname(folder);
    if (parent === folder) throw new Error(`groundwork's package.json was not found above ${fileURLToPath(import.meta.url)}`);
    folder = parent;
  }
}

export const TOOL_ROOT = findToolRoot();
