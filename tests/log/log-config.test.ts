import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CONFIG_FILE, DEFAULTS, findLogRoot, LogConfigError, loadLogConfig } from '../../src/log/log-config.ts';

function logRoot(config?: string): string {
  const root = mkdtempSync(join(os.tmpdir(), 'groundwork-config-'));
  if (config !== undefined) writeFileSync(join(root, CONFIG_FILE), config);
  return root;
}

function refusal(config: string): LogConfigError {
  try {
    loadLogConfig(logRoot(config));
  } catch (error) {
    if (error instanceof LogConfigError) return error;
    throw error;
  }
  throw new Error('the configuration was accepted');
}

describe('log configuration', () => {
  it('uses the defaults without a configuration file, one worker per available core (node:os)', () => {
    const root = logRoot();
    expect(loadLogConfig(root)).toEqual({
      timeLimitSeconds: DEFAULTS.timeLimitSeconds,
      memoryLimitMb: DEFAULTS.memoryLimitMb,
      workers: os.availableParallelism(),
      cacheFolder: join(root, DEFAULTS.cacheFolder),
      historyDepth: DEFAULTS.historyDepth,
    });
  });

  it('takes each field from groundwork.config.json, relative cache folders from the log root', () => {
    const root = logRoot(JSON.stringify({ timeLimitSeconds: 2.5, memoryLimitMb: 256, workers: 3, cacheFolder: 'build/results', historyDepth: 5 }));
    expect(loadLogConfig(root)).toEqual({ timeLimitSeconds: 2.5, memoryLimitMb: 256, workers: 3, cacheFolder: join(root, 'build', 'results'), historyDepth: 5 });
    expect(loadLogConfig(logRoot(JSON.stringify({ workers: 1 }))).timeLimitSeconds).toBe(DEFAULTS.timeLimitSeconds);
  });

  it('refuses a bad value naming the file and the field', () => {
    const error = refusal(JSON.stringify({ workers: 0 }));
    expect(error.field).toBe('workers');
    expect(error.message).toMatch(new RegExp(`${CONFIG_FILE}: workers: must be at least 1$`));
    expect(refusal(JSON.stringify({ timeLimitSeconds: 'long' })).message).toMatch(/timeLimitSeconds: must be a number of seconds/);
    expect(refusal(JSON.stringify({ memoryLimitMb: 12.5 })).field).toBe('memoryLimitMb');
  });

  it('refuses unknown fields, JSON errors and non-objects', () => {
    const unknown = refusal(JSON.stringify({ worker: 2 }));
    expect(unknown.field).toBe('worker');
    expect(unknown.message).toMatch(/unknown field \(known: timeLimitSeconds, memoryLimitMb, workers, cacheFolder, historyDepth\)/);
    expect(refusal('{ "workers": 2, }').message).toMatch(new RegExp(`${CONFIG_FILE}: is not valid JSON`));
    expect(refusal('[1, 2]').message).toMatch(/must be a JSON object of fields/);
  });

  it('finds the log root from the paths checked: the nearest folder above them holding the file, else the working folder', () => {
    const log = logRoot('{}');
    mkdirSync(join(log, 'records', 'old'), { recursive: true });
    writeFileSync(join(log, 'records', 'a.md'), '');
    const elsewhere = logRoot();
    expect(findLogRoot([join(log, 'records', 'a.md'), join(log, 'records', 'old')], elsewhere)).toBe(log);
    expect(findLogRoot(['records'], log)).toBe(log);
    expect(findLogRoot([join(log, 'records'), elsewhere], elsewhere)).toBe(elsewhere);
    expect(findLogRoot([], log)).toBe(log);
  });
});
