import { isScalar, LineCounter, parseDocument, type Document } from 'yaml';
import type { ZodIssue } from 'zod';
import { blockSchema, RESERVED_NAMES, type RawBlock } from './block-schema.ts';
import type { FencedBlock } from './find-blocks.ts';
import type { BlockEntry, BlockSpec, Claimed, SpecProblem } from './types.ts';
import { writtenPrecision } from './written-precision.ts';

/** Turns one fenced block into a validated spec, or into the problems that make it invalid. */
export function parseBlock(file: string, fenced: FencedBlock, index: number): BlockEntry {
  const lineCounter = new LineCounter();
  const doc = parseDocument(fenced.text, { lineCounter, prettyErrors: false, uniqueKeys: true });
  // The YAML starts on the line after the opening fence.
  const lineAt = (offset: number) => fenced.line + lineCounter.linePos(offset).line;
  const lineOf = (path: (string | number)[]) => nodeLine(doc, path, lineAt) ?? fenced.line;
  const looseId = guessId(doc) ?? `block-${index + 1}`;
  const caption = typeof doc.get('caption') === 'string' ? (doc.get('caption') as string) : null;
  const invalid = (problems: SpecProblem[]): BlockEntry => ({ kind: 'invalid', id: looseId, line: fenced.line, caption, problems, source: fenced.text });
  const problem = (path: (string | number)[], message: string): SpecProblem => ({
    file,
    line: lineOf(path),
    block: looseId,
    field: path.length ? path.join('.') : null,
    message,
  });

  if (doc.errors.length > 0) {
    return invalid(doc.errors.map((e) => ({ file, line: lineAt(e.pos[0]), block: looseId, field: null, message: `the block is not valid YAML: ${firstLine(e.message)} (quote an expression that holds ': ', such as "c ? a : b")` })));
  }
  const data: unknown = doc.toJS();
  if (data === null || typeof data !== 'object' || Array.isArray(data)) {
    return invalid([problem([], 'the block must be a YAML map of fields (id, potential, trial, ...)')]);
  }
  const parsed = blockSchema.safeParse(data);
  if (!parsed.success) {
    return invalid(
      parsed.error.issues.flatMap((issue) =>
        // An unknown key is reported on its own line, under its own name.
        issue.code === 'unrecognized_keys' ? issue.keys.map((key) => problem([...issue.path, key], `unknown field ${key}`)) : [problem(issue.path, describeIssue(issue))],
      ),
    );
  }
  const raw = parsed.data;
  const problems = meaningProblems(raw).map(([path, message]) => problem(path, message));
  if (problems.length > 0) return invalid(problems);
  return { kind: 'spec', spec: toSpec(raw, fenced.line, doc, lineOf), source: fenced.text };
}

/** Rules that need more than one field, or that later versions will lift. */
function meaningProblems(raw: RawBlock): Array<[(string | number)[], string]> {
  const found: Array<[(string | number)[], string]> = [];
  if (raw.units !== undefined && raw.units !== 'atomic') found.push([['units'], 'quantity mode (units as a map) is not supported yet; write the block in atomic units']);
  if (raw.basis !== undefined) found.push([['basis'], 'the linear variational method (basis) is not supported yet']);
  if (raw.states !== undefined) found.push([['states'], 'states goes with basis, which is not supported yet']);
  if (raw.trial === undefined && raw.basis === undefined) found.push([['trial'], 'the block needs a trial function (trial)']);
  const space = raw.space ?? 'line';
  if (raw.box !== undefined) {
    if (space !== 'line') found.push([['box'], `box applies to space line only, not ${space}`]);
    else if (!(raw.box[0] < raw.box[1])) found.push([['box'], `box [${raw.box[0]}, ${raw.box[1]}] must have its left wall below its right wall`]);
  }
  if (raw['angular-momentum'] !== undefined && space !== 'radial') found.push([['angular-momentum'], 'angular-momentum applies to space radial only']);
  if (raw.reference?.energy !== undefined && raw.reference.source === undefined) found.push([['reference', 'source'], 'a published reference energy needs its source (a citation)']);
  if (raw.reference?.tolerance !== undefined && raw.reference.energy === undefined) found.push([['reference', 'tolerance'], 'tolerance applies to a published reference energy, and none is given']);
  if (raw.claim?.tolerance !== undefined && raw.claim.energy === undefined) found.push([['claim', 'tolerance'], 'tolerance applies to a claimed energy, and none is given']);
  if (raw.report?.['energy-unit'] !== undefined && raw.report['energy-unit'] !== 'hartree') {
    found.push([['report', 'energy-unit'], `energy unit ${raw.report['energy-unit']} is not supported yet in atomic units; results are in hartree`]);
  }
  const parameterNames = Object.keys(raw.parameters ?? {});
  for (const [group, names] of [['constants', Object.keys(raw.constants ?? {})], ['parameters', parameterNames]] as const) {
    for (const name of names) {
      if ((RESERVED_NAMES as readonly string[]).includes(name)) found.push([[group, name], `${name} is a reserved name (coordinate or built-in); choose another`]);
    }
  }
  for (const name of Object.keys(raw.constants ?? {})) {
    if (parameterNames.includes(name)) found.push([['constants', name], `${name} is declared both as a constant and as a parameter`]);
  }
  for (const name of Object.keys(raw.claim?.parameters ?? {})) {
    if (!parameterNames.includes(name)) found.push([['claim', 'parameters', name], `claim names parameter ${name}, which the block does not declare`]);
  }
  return found;
}

function toSpec(raw: RawBlock, line: number, doc: Document, lineOf: (path: (string | number)[]) => number): BlockSpec {
  const claimed = (path: (string | number)[], value: number, tolerance?: number, unitFraction: 0.5 | 1 = 0.5): Claimed => ({
    value,
    tolerance: tolerance ?? writtenPrecision(scalarSource(doc, path) ?? String(value), value, unitFraction),
  });
  const varied: BlockSpec['varied'] = [];
  const fixed: Record<string, number> = {};
  for (const [name, entry] of Object.entries(raw.parameters ?? {})) {
    if (typeof entry === 'number') fixed[name] = entry;
    else varied.push({ name, ...entry, line: lineOf(['parameters', name]) });
  }
  const claimParameters: Record<string, Claimed> = {};
  for (const [name, entry] of Object.entries(raw.claim?.parameters ?? {})) {
    claimParameters[name] = typeof entry === 'number' ? claimed(['claim', 'parameters', name], entry) : { value: entry.value, tolerance: entry.tolerance };
  }
  return {
    id: raw.id,
    caption: raw.caption ?? null,
    line,
    units: 'atomic',
    space: raw.space ?? 'line',
    box: raw.box ?? null,
    angularMomentum: raw['angular-momentum'] ?? 0,
    mass: raw.mass ?? 1,
    constants: raw.constants ?? {},
    potential: { text: raw.potential, line: lineOf(['potential']) },
    trial: { text: raw.trial ?? '', line: lineOf(['trial']) },
    varied,
    fixed,
    reference: {
      solve: raw.reference?.solve ?? true,
      energy: raw.reference?.energy === undefined ? null : claimed(['reference', 'energy'], raw.reference.energy, raw.reference.tolerance, 1),
      source: raw.reference?.source ?? null,
    },
    claim: raw.claim
      ? { energy: raw.claim.energy === undefined ? null : claimed(['claim', 'energy'], raw.claim.energy, raw.claim.tolerance), parameters: claimParameters }
      : null,
    report: { energyUnit: raw.report?.['energy-unit'] ?? null, plots: raw.report?.plots ?? ['scan', 'density'] },
  };
}

function describeIssue(issue: ZodIssue): string {
  if (issue.code === 'invalid_type' && issue.received === 'undefined') return issue.message === 'Required' ? 'is required' : issue.message;
  if (issue.code === 'invalid_union') {
    // The most specific branch is the one that got furthest before failing.
    const deepest = issue.unionErrors.flatMap((e) => e.issues).sort((a, b) => b.path.length - a.path.length)[0];
    if (deepest && deepest.path.length > issue.path.length) return `${deepest.path.slice(issue.path.length).join('.')}: ${describeIssue(deepest)}`;
  }
  return issue.message;
}

function nodeLine(doc: Document, path: (string | number)[], lineAt: (offset: number) => number): number | null {
  for (let depth = path.length; depth > 0; depth--) {
    const node = doc.getIn(path.slice(0, depth), true) as { range?: [number, number, number] } | undefined;
    if (node?.range) return lineAt(node.range[0]);
    const parent = depth > 1 ? doc.getIn(path.slice(0, depth - 1), true) : doc.contents;
    const pair = (parent as { items?: Array<{ key?: { value?: unknown; range?: [number, number, number] } }> } | null)?.items?.find(
      (item) => item.key?.value === path[depth - 1],
    );
    if (pair?.key?.range) return lineAt(pair.key.range[0]);
  }
  return null;
}

function scalarSource(doc: Document, path: (string | number)[]): string | null {
  const node = doc.getIn(path, true);
  return isScalar(node) && typeof node.source === 'string' ? node.source : null;
}

function guessId(doc: Document): string | null {
  const id = doc.get('id');
  return typeof id === 'string' || typeof id === 'number' ? String(id) : null;
}

function firstLine(message: string): string {
  return message.split('\n')[0];
}
