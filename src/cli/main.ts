import { checkLog, collectRecordFiles } from '../log/check-log.ts';
import { TOOL_VERSION } from '../log/tool-version.ts';
import { formatTable } from './format-table.ts';

const USAGE = `groundwork ${TOOL_VERSION}

usage: groundwork check [files or folders...] [--json]

  check    recompute every variational block of the records (default folder: content/records)
  --json   print the machine-readable result instead of the table

Exit code 0 only when every block is confirmed.`;

/** Runs the command line; returns the exit code instead of exiting, so tests can call it. */
export function main(argv: string[], out: (text: string) => void, err: (text: string) => void): number {
  const [command, ...rest] = argv;
  if (command === undefined || command === '--help' || command === '-h' || command === 'help') {
    out(USAGE);
    return command === undefined ? 2 : 0;
  }
  if (command === '--version') {
    out(TOOL_VERSION);
    return 0;
  }
  if (command !== 'check') {
    err(`groundwork: unknown command ${command}\n\n${USAGE}`);
    return 2;
  }
  const unknown = rest.filter((a) => a.startsWith('-') && a !== '--json');
  if (unknown.length > 0) {
    err(`groundwork check: unknown option ${unknown.join(', ')}\n\n${USAGE}`);
    return 2;
  }
  const paths = rest.filter((a) => !a.startsWith('-'));
  const { files, missing } = collectRecordFiles(paths.length > 0 ? paths : ['content/records']);
  for (const path of missing) err(`groundwork check: ${path}: no such file or folder`);
  const log = checkLog(files);
  out(rest.includes('--json') ? JSON.stringify(log, null, 2) : formatTable(log));
  const allConfirmed = log.records.every((r) => r.problems.length === 0 && r.blocks.every((b) => b.status === 'confirmed'));
  return allConfirmed && missing.length === 0 ? 0 : 1;
}
