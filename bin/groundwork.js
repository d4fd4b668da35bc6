#!/usr/bin/env node
// The sources are TypeScript; tsx compiles them on load so there is no build step to forget.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('../src/cli/main.ts');
process.exitCode = await main(process.argv.slice(2), (text) => process.stdout.write(text + '\n'), (text) => process.stderr.write(text + '\n'));
