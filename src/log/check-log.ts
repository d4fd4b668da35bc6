import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { parseRecord } from '../spec/parse-record.ts';
import { evaluateBlock } from './evaluate-block.ts';
import type { LogResult, RecordResult } from './result-types.ts';
import { TOOL_VERSION } from './tool-version.ts';

/** The Markdown files named, with folders searched recursively, in a stable order. */
export function collectRecordFiles(paths: string[]): { files: string[]; missing: string[] } {
  const files: string[] = [];
  const missing: string[] = [];
  const walk = (path: string) => {
    let stats;
    try {
      stats = statSync(path);
    } catch {
      missing.push(path);
      return;
    }
    if (stats.isDirectory()) {
      for (const name of readdirSync(path).sort()) {
        if (!name.startsWith('.') && name !== 'node_modules') {
          const child = join(path, name);
          if (statSync(child).isDirectory() || name.endsWith('.md')) walk(child);
        }
      }
    } else files.push(path);
  };
  paths.forEach(walk);
  return { files: [...new Set(files)], missing };
}

/** Parses and evaluates one record file; a block that fails never stops the others. */
export function checkRecord(file: string, cwd = process.cwd()): RecordResult {
  const name = relative(cwd, file) || file;
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    const frontMatter = { title: null, author: null, date: null, tags: [] };
    return { file: name, title: null, frontMatter, problems: [{ file: name, line: 1, block: null, field: null, message: `cannot read the record: ${reason}` }], blocks: [] };
  }
  const record = parseRecord(name, text);
  return {
    file: name,
    title: record.frontMatter.title,
    frontMatter: record.frontMatter,
    problems: record.problems,
    blocks: record.blocks.map((entry) => evaluateBlock(name, entry)),
  };
}

export function checkLog(files: string[]): LogResult {
  return { tool: { name: 'groundwork', version: TOOL_VERSION }, records: files.map((file) => checkRecord(file)) };
}
