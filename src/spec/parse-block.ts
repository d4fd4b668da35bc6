import { isScalar, LineCounter, parseDocument, type Document } from 'yaml';
import type { ZodIssue } from 'zod';
import { blockSchema, knownFields, RESERVED_NAMES, type QuantityText, type RawBlock } from './block-schema.ts';
import type { FencedBlock } from './find-blocks.ts';
import { coordinatesOf, isLineSpace, spaceLabel, type BlockEntry, type BlockSpec, type Claimed, type SpecProblem } from './types.ts';
import { didYouMean } from './nearest-name.ts';
import { writtenPrecision } from './written-precision.ts';
import { locateYamlError } from './yaml-errors.ts';
import { convertQuantityBlock, type QuantityBlockSource, type QuantitySource } from '../units/quantity-block.ts';

/** Turns one fenced block into a validated spec, or into the problems that make it invalid. */
export function parseBlock(file: string, fenced: FencedBlock, index: number): BlockEntry {
  const lineCounter = new LineCounter();
  const doc = parseDocument(fenced.text, { lineCounter, prettyErrors: false, uniqueKeys: true, logLevel: 'error' });
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
    const lines = fenced.text.split('\n');
    const seen = new Set<string>();
    const problems = doc.errors.flatMap((e): SpecProblem[] => {
      const { index, field, reason } = locateYamlError(lines, e, lineCounter.linePos(e.pos[0]).line - 1);
      const found = { file, line: fenced.line + 1 + index, block: looseId, field, message: `the block is not valid YAML: ${reason}` };
      // Deep nesting fails once per level with the same message; one is enough.
      const key = `${found.line} ${found.message}`;
      if (seen.has(key)) return [];
      seen.add(key);
      return [found];
    });
    return invalid(problems);
  }
  let data: unknown;
  try {
    data = doc.toJS();
  } catch (error) {
    // Aliases that expand without bound, or that name no anchor, fail only when the YAML is expanded.
    const reason = error instanceof Error ? error.message : String(error);
    return invalid([problem([], `the block's YAML aliases (*name) cannot be expanded: ${reason}`)]);
  }
  if (data === null || typeof data !== 'object' || Array.isArray(data)) {
    return invalid([problem([], 'the block must be a YAML map of fields (id, potential, trial, ...)')]);
  }
  const parsed = blockSchema.safeParse(data);
  if (!parsed.success) {
    return invalid(
      parsed.error.issues.flatMap((issue) => {
        // An unknown key is reported on its own line, under its own name; in a map that may take several forms
        // (a varied parameter's range) a misspelt key also explains the field it leaves missing.
        const unknown = issue.code === 'invalid_union' ? issue.unionErrors.flatMap((e) => e.issues).find((i) => i.code === 'unrecognized_keys') : issue;
        return unknown?.code === 'unrecognized_keys'
          ? unknown.keys.map((key) => problem([...unknown.path, key], `unknown field ${key}${didYouMean(key, knownFields(unknown.path))}`))
          : [problem(issue.path, describeIssue(issue))];
      }),
    );
  }
  const raw = parsed.data;
  const problems = meaningProblems(raw).map(([path, message]) => problem(path, message));
  if (problems.length > 0) return invalid(problems);
  if (isQuantityMode(raw)) {
    const converted = convertQuantityBlock(file, quantitySource(raw, fenced.line, doc, lineOf));
    return converted.ok ? { kind: 'spec', spec: converted.spec, source: fenced.text } : invalid(converted.problems);
  }
  return { kind: 'spec', spec: toSpec(raw as AtomicBlock, fenced.line, doc, lineOf), source: fenced.text };
}

/** The potential and the trial or basis, each with its line, and how many states a basis reports. */
function expressions(raw: RawBlock, lineOf: (path: Path) => number): Pick<BlockSpec, 'potential' | 'trial' | 'basis' | 'states' | 'level'> {
  const declared = raw.symmetry !== undefined || raw.level !== undefined;
  return {
    potential: { text: raw.potential, line: lineOf(['potential']) },
    trial: raw.trial === undefined ? null : { text: raw.trial, line: lineOf(['trial']) },
    basis: raw.basis === undefined ? null : raw.basis.map((text, i) => ({ text, line: lineOf(['basis', i]) })),
    states: raw.states ?? 1,
    ...(declared ? { level: { symmetry: raw.symmetry ?? null, index: raw.level ?? 0, line: lineOf([raw.symmetry !== undefined ? 'symmetry' : 'level']) } } : {}),
  };
}

/** `units` written as a map ({ length: nm, energy: meV }) puts the block in quantity mode. */
function isQuantityMode(raw: RawBlock): raw is RawBlock & { units: Record<string, string> } {
  return raw.units !== undefined && raw.units !== 'atomic';
}

type Path = (string | number)[];

/** Every field that holds a number, or in quantity mode a quantity, with its path. */
function quantityFields(raw: RawBlock): Array<[Path, number | string]> {
  const fields: Array<[Path, number | string | undefined]> = [
    ...(typeof raw.mass === 'object' ? Object.entries(raw.mass).map(([k, v]): [Path, number | string] => [['mass', k], v]) : [[['mass'], raw.mass] as [Path, number | string | undefined]]),
    [['reference', 'energy'], raw.reference?.energy],
    [['reference', 'tolerance'], raw.reference?.tolerance],
    [['claim', 'energy'], raw.claim?.energy],
    [['claim', 'tolerance'], raw.claim?.tolerance],
    ...(raw.box ?? []).map((v, i): [Path, number | string] => [['box', i], v]),
    ...Object.entries(raw.constants ?? {}).map(([k, v]): [Path, number | string] => [['constants', k], v]),
  ];
  for (const [k, v] of Object.entries(raw.parameters ?? {})) {
    if (typeof v === 'object') fields.push([['parameters', k, 'start'], v.start], [['parameters', k, 'min'], v.min], [['parameters', k, 'max'], v.max]);
    else fields.push([['parameters', k], v]);
  }
  for (const [k, v] of Object.entries(raw.claim?.parameters ?? {})) {
    if (typeof v === 'object') fields.push([['claim', 'parameters', k, 'value'], v.value], [['claim', 'parameters', k, 'tolerance'], v.tolerance]);
    else fields.push([['claim', 'parameters', k], v]);
  }
  return fields.filter((f): f is [Path, number | string] => f[1] !== undefined);
}

/** A block whose numeric fields all hold plain numbers (atomic units; quantityFields has checked them). */
type Numeric<T> = T extends QuantityText ? never : T extends object ? { [K in keyof T]: Numeric<T[K]> } : T;
// The mass may be text in atomic units too: an expression of the coordinate.
type AtomicBlock = Omit<Numeric<RawBlock>, 'mass'> & Pick<RawBlock, 'mass'>;

/** The quantity-mode block with every number kept as its written text and line, for the units layer to read. */
function quantitySource(raw: RawBlock & { units: Record<string, string> }, line: number, doc: Document, lineOf: (path: Path) => number): QuantityBlockSource {
  const at = (path: Path, value: number | string): QuantitySource => ({ text: scalarSource(doc, path) ?? String(value), line: lineOf(path) });
  const optional = (path: Path, value: number | string | undefined) => (value === undefined ? null : at(path, value));
  const varied: QuantityBlockSource['varied'] = [];
  const fixed: Record<string, QuantitySource> = {};
  for (const [name, entry] of Object.entries(raw.parameters ?? {})) {
    const path = ['parameters', name];
    if (typeof entry === 'object') varied.push({ name, start: at([...path, 'start'], entry.start), min: at([...path, 'min'], entry.min), max: at([...path, 'max'], entry.max), line: lineOf(path) });
    else fixed[name] = at(path, entry);
  }
  const claimParameters: NonNullable<QuantityBlockSource['claim']>['parameters'] = {};
  for (const [name, entry] of Object.entries(raw.claim?.parameters ?? {})) {
    const path = ['claim', 'parameters', name];
    claimParameters[name] = typeof entry === 'object' ? { value: at([...path, 'value'], entry.value), tolerance: at([...path, 'tolerance'], entry.tolerance) } : { value: at(path, entry), tolerance: null };
  }
  return {
    id: raw.id,
    caption: raw.caption ?? null,
    ...(raw.system !== undefined ? { system: raw.system } : {}),
    line,
    units: { entries: Object.fromEntries(Object.entries(raw.units).map(([k, v]) => [k, at(['units', k], v)])), line: lineOf(['units']) },
    space: raw.space ?? 'line',
    box: raw.box ? [at(['box', 0], raw.box[0]), at(['box', 1], raw.box[1])] : null,
    angularMomentum: raw['angular-momentum'] ?? 0,
    // A mass per coordinate is refused in quantity mode (meaningProblems), so the mass here is one quantity.
    mass: typeof raw.mass === 'object' ? null : optional(['mass'], raw.mass),
    constants: Object.fromEntries(Object.entries(raw.constants ?? {}).map(([k, v]) => [k, at(['constants', k], v)])),
    ...expressions(raw, lineOf),
    varied,
    fixed,
    reference: {
      solve: raw.reference?.solve ?? true,
      energy: optional(['reference', 'energy'], raw.reference?.energy),
      tolerance: optional(['reference', 'tolerance'], raw.reference?.tolerance),
      source: raw.reference?.source ?? null,
    },
    claim: raw.claim
      ? { energy: optional(['claim', 'energy'], raw.claim.energy), tolerance: optional(['claim', 'tolerance'], raw.claim.tolerance), parameters: claimParameters }
      : null,
    report: { energyUnit: optional(['report', 'energy-unit'], raw.report?.['energy-unit']), plots: raw.report?.plots ?? ['scan', 'density'] },
  };
}

/**
 * Varied parameters a block may have. The search and the curvature at its optimum cost more than
 * the square of their number in energy evaluations (32 take seconds, 200 take minutes); honest trial
 * families vary a handful.
 */
export const MAX_VARIED_PARAMETERS = 32;

/** Rules that need more than one field, or that later versions will lift. */
function meaningProblems(raw: RawBlock): Array<[(string | number)[], string]> {
  const found: Array<[(string | number)[], string]> = [];
  const quantityMode = isQuantityMode(raw);
  if (!quantityMode) {
    const coordinate = coordinatesOf(raw.space ?? 'line')[0];
    for (const [path, value] of quantityFields(raw)) {
      // Text under mass that names the coordinate is a position-dependent mass, read by compileBlock.
      if (typeof value !== 'string' || (path[0] === 'mass' && namesCoordinate(value, coordinate))) continue;
      const alternative = path[0] === 'mass' ? ` (or an expression of the coordinate ${coordinate}, for a mass that depends on it)` : '';
      found.push([path, `must be a number in atomic units${alternative}; ${JSON.stringify(value)} is text (a quantity with a unit needs quantity mode: units: { length: nm, energy: meV })`]);
    }
  }
  if (raw.trial === undefined && raw.basis === undefined) found.push([['trial'], 'the block needs a trial function (trial) or a basis (basis)']);
  if (raw.trial !== undefined && raw.basis !== undefined) found.push([['basis'], 'a block has either a trial or a basis, not both']);
  if (raw.basis !== undefined && raw.basis.length === 0) found.push([['basis'], 'the basis needs at least one function']);
  if (raw.states !== undefined && raw.basis === undefined) found.push([['states'], 'states goes with basis: a single trial gives one level']);
  const space = raw.space ?? 'line';
  for (const field of ['symmetry', 'level'] as const) {
    if (raw[field] !== undefined && raw.basis !== undefined) found.push([[field], `${field} goes with a single trial: a basis reports its lowest levels (states)`]);
  }
  if (raw.symmetry !== undefined && space !== 'line') found.push([['symmetry'], `symmetry (parity under x -> -x) applies to space line only, not ${spaceLabel(space)}`]);
  if (raw.level !== undefined && !isLineSpace(space)) found.push([['level'], `level is not yet available on ${spaceLabel(space)}: a block there is compared with the ground level`]);
  if (raw.box !== undefined) {
    if (space !== 'line') found.push([['box'], `box applies to space line only, not ${spaceLabel(space)}${typeof space === 'object' ? ' (give each coordinate its range [a, b] in the map)' : ''}`]);
    else if (typeof raw.box[0] === 'number' && typeof raw.box[1] === 'number' && !(raw.box[0] < raw.box[1])) found.push([['box'], `box [${raw.box[0]}, ${raw.box[1]}] must have its left wall below its right wall`]);
  }
  found.push(...spaceProblems(raw, quantityMode));
  const angular = raw['angular-momentum'];
  if (angular !== undefined && space !== 'radial' && space !== 'plane' && space !== 'axial') found.push([['angular-momentum'], 'angular-momentum applies to spaces radial, plane and axial only']);
  else if (typeof angular === 'number' && space === 'radial' && angular < 0) found.push([['angular-momentum'], `must be 0 or more on space radial (l = ${angular}); only plane takes a negative m`]);
  if (raw.reference?.energy !== undefined && raw.reference.source === undefined) found.push([['reference', 'source'], 'a published reference energy needs its source (a citation)']);
  if (raw.reference?.tolerance !== undefined && raw.reference.energy === undefined) found.push([['reference', 'tolerance'], 'tolerance applies to a published reference energy, and none is given']);
  if (raw.claim?.tolerance !== undefined && raw.claim.energy === undefined) found.push([['claim', 'tolerance'], 'tolerance applies to a claimed energy, and none is given']);
  if (!quantityMode && raw.report?.['energy-unit'] !== undefined && raw.report['energy-unit'] !== 'hartree') {
    found.push([['report', 'energy-unit'], `energy-unit ${raw.report['energy-unit']} needs quantity mode (units: { length: nm, energy: meV }); atomic-unit blocks report in hartree`]);
  }
  const parameterNames = Object.keys(raw.parameters ?? {});
  const varied = Object.values(raw.parameters ?? {}).filter((entry) => typeof entry !== 'number').length;
  if (varied > MAX_VARIED_PARAMETERS) {
    found.push([['parameters'], `${varied} parameters are varied; at most ${MAX_VARIED_PARAMETERS} may be: hold the others fixed (a plain value each)`]);
  }
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

/** Rules of the spaces with more than one coordinate: how many coordinates, their ranges and names, masses per coordinate. */
function spaceProblems(raw: RawBlock, quantityMode: boolean): Array<[Path, string]> {
  const found: Array<[Path, string]> = [];
  const space = raw.space ?? 'line';
  if (typeof space === 'object') {
    const names = Object.keys(space);
    if (names.length < 2 || names.length > 3) found.push([['space'], `a product space has 2 or 3 coordinates, not ${names.length}`]);
    for (const name of names) {
      const range = space[name];
      if (Array.isArray(range) && !(range[0] < range[1])) found.push([['space', name], `[${range[0]}, ${range[1]}] must have its left wall below its right wall`]);
      if (['pi', 'e', 'mass', 'hbar'].includes(name)) found.push([['space', name], `${name} is a built-in name and cannot be a coordinate`]);
      if (quantityMode && Array.isArray(range)) found.push([['space', name], 'a coordinate range [a, b] is not yet read in quantity mode: write the block in atomic units']);
    }
    if (raw.basis !== undefined) found.push([['basis'], 'a basis (linear method) is not yet available on a product space: write one trial']);
  }
  if (space === 'axial' && raw.basis !== undefined) found.push([['basis'], 'a basis (linear method) is not yet available on space axial: write one trial']);
  const coordinates = coordinatesOf(space);
  for (const [group, names] of [['constants', Object.keys(raw.constants ?? {})], ['parameters', Object.keys(raw.parameters ?? {})]] as const) {
    for (const name of names) {
      if (coordinates.includes(name) && !(RESERVED_NAMES as readonly string[]).includes(name)) found.push([[group, name], `${name} is a coordinate of this space; choose another name`]);
    }
  }
  // In quantity mode text is a mass with its unit; it depends on the coordinates only where it names one.
  const massNamesCoordinate = typeof raw.mass === 'string' && (!quantityMode || coordinatesOf(space).some((c) => namesCoordinate(raw.mass as string, c)));
  if (massNamesCoordinate && (typeof space === 'object' || space === 'axial')) {
    found.push([['mass'], 'a mass that depends on the coordinates is available on spaces of one coordinate only; give a number (or a map of numbers per coordinate on a product space)']);
  }
  if (typeof raw.mass === 'object') {
    if (typeof space !== 'object') found.push([['mass'], `a mass per coordinate applies to a product space (a map of coordinates), not ${space}`]);
    else {
      for (const name of Object.keys(raw.mass)) if (!(name in space)) found.push([['mass', name], `${name} is not a coordinate of this space (${Object.keys(space).join(', ')})`]);
      for (const name of Object.keys(space)) if (!(name in raw.mass)) found.push([['mass'], `the mass map gives no mass for coordinate ${name}`]);
    }
    if (quantityMode) found.push([['mass'], 'a mass per coordinate is not yet read in quantity mode: write the block in atomic units']);
  }
  return found;
}

/** Whether the text holds the coordinate as a name of its own (not inside exp or max). */
function namesCoordinate(text: string, coordinate: string): boolean {
  return new RegExp(`(^|[^A-Za-z0-9_])${coordinate}([^A-Za-z0-9_]|$)`).test(text);
}

function toSpec(raw: AtomicBlock, line: number, doc: Document, lineOf: (path: (string | number)[]) => number): BlockSpec {
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
    ...(raw.system !== undefined ? { system: raw.system } : {}),
    line,
    units: 'atomic',
    space: raw.space ?? 'line',
    box: raw.box ?? null,
    angularMomentum: raw['angular-momentum'] ?? 0,
    mass: typeof raw.mass === 'string' ? { text: raw.mass, line: lineOf(['mass']) } : typeof raw.mass === 'object' ? 1 : (raw.mass ?? 1),
    masses: typeof raw.mass === 'object' ? (raw.mass as Record<string, number>) : null,
    constants: raw.constants ?? {},
    ...expressions(raw, lineOf),
    varied,
    fixed,
    reference: {
      solve: raw.reference?.solve ?? true,
      energy: raw.reference?.energy === undefined ? null : claimed(['reference', 'energy'], raw.reference.energy, raw.reference.tolerance, 1),
      source: raw.reference?.source ?? null,
      ...(raw.reference?.tolerance !== undefined ? { toleranceGiven: true as const } : {}),
    },
    claim: raw.claim
      ? { energy: raw.claim.energy === undefined ? null : claimed(['claim', 'energy'], raw.claim.energy, raw.claim.tolerance), parameters: claimParameters }
      : null,
    report: { energyUnit: raw.report?.['energy-unit'] ?? null, plots: raw.report?.plots ?? ['scan', 'density'] },
    quantity: null,
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
    // The key's line first: a nested map's own range starts at its first entry, a line too late.
    const parent = depth > 1 ? doc.getIn(path.slice(0, depth - 1), true) : doc.contents;
    const pair = (parent as { items?: Array<{ key?: { value?: unknown; range?: [number, number, number] } }> } | null)?.items?.find(
      (item) => item.key?.value === path[depth - 1],
    );
    if (pair?.key?.range) return lineAt(pair.key.range[0]);
    const node = doc.getIn(path.slice(0, depth), true) as { range?: [number, number, number] } | undefined;
    if (node?.range) return lineAt(node.range[0]);
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
