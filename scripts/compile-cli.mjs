// Compiles the command line and the block evaluator once into compiled/ (git-ignored), so that
// `groundwork` starts without transpiling TypeScript on every run. npm runs it as `prepare` after
// `npm install` and `npm ci`; `npm run compile` runs it by hand. The stamp it leaves carries the time the
// compile started: bin/groundwork.js runs the sources through tsx whenever one is newer than that.
import { spawnSync } from 'node:child_process';
import { rmSync, utimesSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const out = join(root, 'compiled');
let tsc;
try {
  tsc = createRequire(join(root, 'package.json')).resolve('typescript/bin/tsc');
} catch {
  // An install without dev dependencies: the launcher runs the sources through tsx instead.
  console.warn('groundwork: typescript is not installed, so the command line will run its sources through tsx (slower start-up)');
  process.exit(0);
}
const started = new Date();
rmSync(out, { recursive: true, force: true });
// --noCheck: emitting needs no type check, which `npm run typecheck` does on its own.
const run = spawnSync(process.execPath, [tsc, '-p', join(root, 'tsconfig.build.json'), '--noCheck'], { stdio: 'inherit' });
if (run.status !== 0) {
  rmSync(out, { recursive: true, force: true });
  process.exit(run.status ?? 1);
}
const stamp = join(out, '.stamp');
writeFileSync(stamp, 'Compiled from src/ by scripts/compile-cli.mjs; the modification time is when the compile started.\n');
utimesSync(stamp, started, started);
