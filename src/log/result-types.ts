import type { BasisDiagnostics } from '../engine/evaluate-problem.ts';
import type { PlotData } from '../engine/plot-data.ts';
import type { Check, Status } from '../engine/status.ts';
import type { FrontMatter, QuantityMode, Space, SpecProblem } from '../spec/types.ts';
import type { Verdict } from './block-verdict.ts';

/** The machine-readable result of RECORD-FORMAT.md: what `groundwork check --json` prints and the pages render. */

export interface Valued {
  value: number;
  unit: string | null;
}

/** The inputs as the block stated them, typeset from the checked expression trees. */
export interface BlockInputs {
  /** The space as written: a name, or the map of a product space's coordinates and their ranges. */
  space: Space;
  /** Its coordinates in point order (one for line, half-line, radial, plane). */
  coordinates: string[];
  box: [number, number] | null;
  angularMomentum: number;
  /** The constant mass (electron masses), or null when it depends on the coordinate (see massTex). */
  mass: number | null;
  /** A position-dependent mass typeset, or null for a constant one. */
  massTex: string | null;
  /** The mass per coordinate of a product space that gives one; null otherwise. */
  masses: Record<string, number> | null;
  /** The first coordinate (the only one of a space of one coordinate). */
  coordinate: string;
  /** The unit lengths are given in: bohr in atomic units, the block's own in quantity mode. */
  lengthUnit: string;
  potentialTex: string;
  /** The trial typeset, or null for a basis block. */
  trialTex: string | null;
  /** The basis functions typeset, or null for a trial block. */
  basisTex: string[] | null;
  /** Declared constants: in atomic units, or in quantity mode in the unit `constantUnits` names. */
  constants: Record<string, number>;
  /** Quantity mode only: the unit each declared constant is stated in (as written, else coherent SI; null for a pure number). */
  constantUnits?: Record<string, string | null>;
  ranges: Array<{ name: string; start: number; min: number; max: number }>;
}

/**
 * The block's Hamiltonian as the systems view compares it (src/log/systems.ts): potential and mass sampled at
 * samplePoints(space, box), fixed points in bohr, null where not finite. Like every figure of a result, the walls
 * and the potential are stated in the block's units (`quantity`); the mass in electron masses.
 */
export interface Hamiltonian {
  space: string;
  /** The walls, or null. */
  box: [number, number] | null;
  angularMomentum: number;
  /** The name the block's `system:` field gives, or null. */
  system: string | null;
  potential: Array<number | null>;
  /** Electron masses. */
  mass: Array<number | null>;
}

export interface BlockResult {
  id: string;
  line: number;
  caption: string | null;
  inputs: BlockInputs | null;
  status: Status;
  message: string | null;
  /** Every problem that made the block invalid, each with its file, line, block and field. */
  problems: SpecProblem[];
  energy: Valued | null;
  parameters: Record<string, Valued & { varied: boolean }>;
  variance: number | null;
  varianceNote: string | null;
  /** Every level reported, lowest first; `reference` is the grid level of the same index. */
  states: Array<{ energy: number; reference: number | null; errorEstimate: number }>;
  /** The linear method's overlap diagnostics (null for a single trial). */
  basis: BasisDiagnostics | null;
  components: { kinetic: number; potential: number; norm: number } | null;
  reference: {
    energy: number | null;
    excited: number | null;
    threshold: number | null;
    method: 'grid' | 'published' | null;
    published: { energy: number; tolerance: number; source: string } | null;
    /**
     * The level `energy` (and the published value) stands for: 0-based among the levels of `symmetry` (parity under
     * x -> -x), or among all levels when it is null; `excited` is the next level of the same symmetry.
     */
    level: { index: number; symmetry: 'even' | 'odd' | null };
  } | null;
  errors: { vsGrid: number | null; vsPublished: number | null };
  bounds: { upper: number | null; lower: number | null; weinstein: [number, number] | null };
  overlap: number | null;
  virial: { exponent: number; ratio: number } | null;
  /** Why no virial ratio is given although the potential is a power law (hard walls away from the origin, a mass m(x)); else null. */
  virialNote: string | null;
  claim: { energy: number | null; tolerance: number | null; parameters: Record<string, { value: number; tolerance: number }> } | null;
  checks: Check[];
  /** Samples behind the scan and density plots (RECORD-FORMAT `report.plots`). */
  plots: PlotData | null;
  diagnostics: {
    energyError: number | null;
    optimiser: { method: string; iterations: number; evaluations: number; converged: boolean; starts: number; activeLimits: Array<'min' | 'max' | null>; curvature: number[][] } | null;
    grid: { size: number; elements: number; elementOrder: number; refinements: number; domain: [number, number]; errorEstimate: number[]; converged: boolean } | null;
    energyEvaluations: number;
    trialEvaluations: number;
    plotEvaluations: number;
    variationalMs: number;
    referenceMs: number;
  } | null;
  /** Quantity mode: the units the numbers above are stated in and the physical constants behind them; null in atomic units. */
  quantity: QuantityMode | null;
  /** What the block's Hamiltonian is, for finding the other blocks on the same system; null when its expressions did not compile. */
  hamiltonian: Hamiltonian | null;
  inputHash: string;
  timeMs: number;
  /** The reviewer's summary derived from the fields above (block-verdict.ts); present in JSON output, not in the cache. */
  verdict?: Verdict;
}

export interface RecordResult {
  file: string;
  title: string | null;
  frontMatter: FrontMatter;
  problems: SpecProblem[];
  blocks: BlockResult[];
}

export interface LogResult {
  tool: { name: 'groundwork'; version: string };
  records: RecordResult[];
}
