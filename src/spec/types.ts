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

export interface BlockSpec {
  id: string;
  caption: string | null;
  line: number;
  units: 'atomic';
  space: Space;
  box: [number, number] | null;
  angularMomentum: number;
  mass: number;
  constants: Record<string, number>;
  potential: SourceText;
  trial: SourceText;
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
