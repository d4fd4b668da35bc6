#!/usr/bin/env node
// Runs the command line from compiled/ (made by `npm run compile`, which npm install and npm ci run) when
// that is at least as new as every source it was made from; otherwise, after an edit or without a
// compile, from the TypeScript sources through tsx, so an edit never runs stale code.
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { compiledIsFresh } from './compiled-is-fresh.js';

let main;
if (compiledIsFresh(join(dirname(fileURLToPath(import.meta.url)), '..'))) ({ main } = await import('../compiled/cli/main.js'));
else {
  const { register } = await import('tsx/esm/api');
  register();
  ({ main } = await import('../src/cli/main.ts'));
}
process.exitCode = await main(process.argv.slice(2), (text) => process.stdout.write(text + '\n'), (text) => process.stderr.write(text + '\n'));
