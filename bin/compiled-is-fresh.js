import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

/**
 * True when `root`/compiled holds a finished compile (its .stamp, dated when the compile started) and no
 * source under `root`/src of a compiled file changed since. A source a compiled file now needs for the
 * first time is caught through the file that imports it, which had to change to import it.
 */
export function compiledIsFresh(root) {
  const out = join(root, 'compiled');
  let since;
  try {
    since = statSync(join(out, '.stamp')).mtimeMs;
  } catch {
    return false;
  }
  for (const path of readdirSync(out, { recursive: true, encoding: 'utf8' })) {
    if (!path.endsWith('.js')) continue;
    try {
      if (statSync(join(root, 'src', path.replace(/\.js$/, '.ts'))).mtimeMs >= since) return false;
    } catch {
      return false;
    }
  }
  return true;
}
