import type { YAMLError } from 'yaml';

/** Where a YAML syntax error sits in the text, which field it concerns, and why, in a writer's terms. */
export interface LocatedYamlError {
  /** 0-based line of the text. */
  index: number;
  /** Dotted path of the field written on that line, or null when the line names none. */
  field: string | null;
  reason: string;
}

/**
 * Places a YAML syntax error on the line a writer has to fix, with a hint where a common slip
 * causes it. An unclosed quote is reported by the parser where the text ends; it is moved back
 * to the line that opens the quote.
 */
export function locateYamlError(lines: string[], error: YAMLError, index: number): LocatedYamlError {
  const quote = error.code === 'MISSING_CHAR' ? /closing (["'])/.exec(error.message)?.[1] : undefined;
  if (quote) {
    for (let i = Math.min(index, lines.length - 1); i >= 0; i--) {
      if (lines[i].split(quote).length % 2 === 0) {
        index = i;
        break;
      }
    }
  }
  return { index, field: fieldOnLine(lines, index), reason: describe(error, lines[index] ?? '') };
}

function describe(error: YAMLError, line: string): string {
  switch (error.code) {
    case 'BLOCK_AS_IMPLICIT_KEY':
      return `a value holds ': ' (quote an expression that does, such as "c ? a : b")`;
    case 'TAB_AS_INDENT':
      return 'it is indented with a tab; indent with spaces';
    case 'DUPLICATE_KEY':
      return `the field ${line.split(':')[0].trim()} is given twice`;
    case 'MULTIPLE_DOCS':
      return 'a line --- starts a second document; one map of fields is expected';
    case 'RESOURCE_EXHAUSTION':
      return 'it nests too deeply';
    default:
      return error.message.split('\n')[0];
  }
}

/**
 * The dotted path of the field written on a line: its parents are the nearest less indented keys
 * that open a nested map (a key with no value on its line). Used where the YAML is too broken to
 * ask the parser.
 */
function fieldOnLine(lines: string[], index: number): string | null {
  const own = /^(\s*)([A-Za-z_][\w-]*)\s*:/.exec(lines[index] ?? '');
  if (!own) return null;
  const path = [own[2]];
  let indent = own[1].length;
  for (let i = index - 1; i >= 0 && indent > 0; i--) {
    const parent = /^(\s*)([A-Za-z_][\w-]*)\s*:\s*(#.*)?$/.exec(lines[i]);
    if (parent && parent[1].length < indent) {
      path.unshift(parent[2]);
      indent = parent[1].length;
    }
  }
  return path.join('.');
}
