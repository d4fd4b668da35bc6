#!/usr/bin/env node
// Runs the command line from compiled/ (made by `npm run compile`, which npm install and npm ci run) when
// that is at least as new as every source it was made from; otherwise, after an edit or without a
// compile, from the TypeScript sources through tsx, so an edit never runs stale code.
import { readdirSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

/** True when compiled/ exists and none of the sources of its files changed after the compile started. */
function compiledIsFresh() {
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

let main;
if (compiledIsFresh()) ({ main } = await import('../compiled/cli/main.js'));
else {
  const { register } = await import('tsx/esm/api');
  register();
  ({ main } = await import('../src/cli/main.ts'));
}
process.exitCode = await main(process.argv.slice(2), (text) => process.stdout.write(text + '\n'), (text) => process.stderr.write(text + '\n'));
