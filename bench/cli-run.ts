import { spawn } from 'node:child_process';
import { performance } from 'node:perf_hooks';

const CLI = new URL('../bin/groundwork.js', import.meta.url).pathname;

/** Wall time of one `groundwork <args>` as a user runs it (process start-up included), and what it printed on stderr. */
export function timedCli(args: string[], cwd: string): Promise<{ ms: number; stderr: string }> {
  return new Promise((resolve, reject) => {
    const started = performance.now();
    const child = spawn(process.execPath, [CLI, ...args], { cwd, stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (chunk) => (stderr += chunk));
    child.on('error', reject);
    child.on('close', () => resolve({ ms: performance.now() - started, stderr }));
  });
}

/** The summary line a check prints on stderr; a run without one failed. */
export function summaryLine(stderr: string): string {
  const summary = stderr.split('\n').find((line) => line.startsWith('groundwork: '));
  if (!summary) throw new Error(`the check printed no summary line:\n${stderr}`);
  return summary;
}
