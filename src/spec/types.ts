/** The record and spec-block contract (RECORD-FORMAT.md) as types: what the spec layer hands on. */

export type Space = 'line' | 'half-line' | 'radial';

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
export interface QuantityMode {
  energy: { unit: string; perHartree: number; definition: string };
  length: { unit: string; perBohr: number };
  parameters: Record<string, { unit: string | null; perAtomic: number }>;
  constantsUsed: Array<{ name: string; value: number; unit: string; source: string }>;
  /** Names in `constants` that are mathjs units or constants bound by the conversion, not declared by the author. */
  bound: string[];
}

export interface BlockSpec {
  id: string;
  caption: string | null;
  line: number;
  units: 'atomic';
  space: Space;
  box: [number, number] | null;
  angularMomentum: number;
  /**
   * The mass in electron masses: a number, or an expression of the coordinate (in bohr) for a position-dependent
   * mass (heterostructures), compiled by compileBlock; in quantity mode its units are bound in `constants`.
   */
  mass: number | SourceText;
  constants: Record<string, number>;
  potential: SourceText;
  /** Exactly one of trial and basis is given. */
  trial: SourceText | null;
  /** The linear variational method: the functions whose span is searched, and how many levels to report. */
  basis: SourceText[] | null;
  states: number;
  varied: VariedParameter[];
  fixed: Record<string, number>;
  reference: {
    solve: boolean;
    energy: Claimed | null;
    source: string | null;
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
