/** The record and spec-block contract (RECORD-FORMAT.md) as types: what the spec layer hands on. */

/** A space of one coordinate. */
export type LineSpace = 'line' | 'half-line' | 'radial' | 'plane';

/** The range of one Cartesian coordinate of a product space. */
export type CoordinateRange = 'line' | 'half-line' | [number, number];

/** 2 or 3 named Cartesian coordinates, in the order written, each with its range. */
export type ProductSpace = Record<string, CoordinateRange>;

export type Space = LineSpace | 'axial' | ProductSpace;

/** The coordinates a space's expressions are written in, in point order. */
export function coordinatesOf(space: Space): string[] {
  if (typeof space === 'object') return Object.keys(space);
  if (space === 'axial') return ['rho', 'z'];
  return [space === 'radial' || space === 'plane' ? 'r' : 'x'];
}

/** Whether the space has one coordinate (the engine's line spaces). */
export function isLineSpace(space: Space): space is LineSpace {
  return typeof space === 'string' && space !== 'axial';
}

/** The space as a word for messages: its name, or the product of its coordinates. */
export function spaceLabel(space: Space): string {
  return typeof space === 'object' ? `{ ${Object.entries(space).map(([k, v]) => `${k}: ${Array.isArray(v) ? `[${v.join(', ')}]` : v}`).join(', ')} }` : space;
}

/** Where a problem sits, so every message can name file, line, block and field. */
export interface SpecProblem {
  file: string;
  line: number;
  block: string | null;
  field: string | null;
  message: string;
}

/** An expression as written, with the line it starts on. */
export interface SourceText {
  text: string;
  line: number;
}

export interface VariedParameter {
  name: string;
  start: number;
  min: number;
  max: number;
  line: number;
}

/** A written number and the tolerance its written digits imply unless one is given. */
export interface Claimed {
  value: number;
  tolerance: number;
}

/**
 * A block written in quantity mode, converted to atomic units: how to state the engine's numbers in the block's
 * units (value in unit = atomic value * factor), and the physical constants the conversion rests on.
 */
/** A unit to state values of one kind in: value in unit = atomic value * perAtomic; a null unit is a pure number. */
export interface StatedUnit {
  unit: string | null;
  perAtomic: number;
}

export interface QuantityMode {
  energy: { unit: string; perHartree: number; definition: string };
  length: { unit: string; perBohr: number };
  parameters: Record<string, StatedUnit>;
  /** Declared constants: the unit each is stated in (as written, else coherent SI). */
  constants: Record<string, StatedUnit>;
  /** The unit the trial's norm integral is stated in. */
  norm: StatedUnit;
  constantsUsed: Array<{ name: string; value: number; unit: string; source: string }>;
  /** Names in `constants` that are mathjs units or constants bound by the conversion, not declared by the author. */
  bound: string[];
}

/**
 * The level a single trial approximates, as the block declares it: its parity under x -> -x (even
 * potentials on the line) and its 0-based index among the levels of that parity (or among all levels).
 */
export interface DeclaredLevel {
  symmetry: 'even' | 'odd' | null;
  index: number;
  /** Line of the symmetry field, or of level when symmetry is not given. */
  line: number;
}

export interface BlockSpec {
  id: string;
  caption: string | null;
  /** The system the block is about, when the author names it (`system:`); absent otherwise, so other blocks keep their input hash. */
  system?: string;
  line: number;
  units: 'atomic';
  space: Space;
  box: [number, number] | null;
  angularMomentum: number;
  /**
   * The mass in electron masses: a number, or an expression of the coordinate (in bohr) for a position-dependent
   * mass (heterostructures), compiled by compileBlock; in quantity mode its units are bound in `constants`. With a
   * mass per coordinate (product spaces) it is 1 and `masses` gives each.
   */
  mass: number | SourceText;
  masses: Record<string, number> | null;
  constants: Record<string, number>;
  potential: SourceText;
  /** Exactly one of trial and basis is given. */
  trial: SourceText | null;
  /** The linear variational method: the functions whose span is searched, and how many levels to report. */
  basis: SourceText[] | null;
  states: number;
  /** Given only when the block declares `symmetry` or `level` (so the input hash of other blocks stays as it was). */
  level?: DeclaredLevel;
  varied: VariedParameter[];
  fixed: Record<string, number>;
  reference: {
    solve: boolean;
    energy: Claimed | null;
    source: string | null;
    /** Set when the author wrote `reference.tolerance` (absent otherwise, so other blocks keep their input hash). */
    toleranceGiven?: true;
  };
  claim: {
    energy: Claimed | null;
    parameters: Record<string, Claimed>;
  } | null;
  report: {
    energyUnit: string | null;
    plots: Array<'scan' | 'density'>;
  };
  /** Set when the block was written in quantity mode; its numbers above are then in atomic units. */
  quantity: QuantityMode | null;
}

/** A block as found in the record: either a valid spec or the problems that make it invalid. */
export type BlockEntry =
  | { kind: 'spec'; spec: BlockSpec; source: string }
  | { kind: 'invalid'; id: string; line: number; caption: string | null; problems: SpecProblem[]; source: string };

export interface FrontMatter {
  title: string | null;
  author: string | null;
  date: string | null;
  tags: string[];
}

export interface RecordSpec {
  file: string;
  frontMatter: FrontMatter;
  /** Problems with the record as a whole (front matter, duplicate ids); blocks are still evaluated. */
  problems: SpecProblem[];
  blocks: BlockEntry[];
}
