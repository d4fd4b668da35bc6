import { performance } from 'node:perf_hooks';
import { evaluateBasisProblem } from '../engine/evaluate-basis.ts';
import { evaluateProblem, type EngineResult } from '../engine/evaluate-problem.ts';
import type { FieldProblem, ProblemBase } from '../engine/problem.ts';
import type { MathNode } from 'mathjs';
import { evaluateFieldProblem } from '../engine/evaluate-field-problem.ts';
import { axialSpace } from '../engine/spaces/axial.ts';
import { cartesianSpace } from '../engine/spaces/cartesian.ts';
import { compileBlock } from '../expr/compile-block.ts';
import { compileFieldBlock } from '../expr/compile-field-block.ts';
import { texOptions } from '../expr/symbol-tex.ts';
import { coordinatesOf, isLineSpace, type BlockEntry, type BlockSpec, type LineSpace, type SpecProblem } from '../spec/types.ts';
import { hamiltonianSamples } from './hamiltonian-samples.ts';
import { inputHash } from './input-hash.ts';
import { invalidBlock, unparsedBlock } from './invalid-block.ts';
import { blockUnitsDisplay, inBlockUnits } from './units-back.ts';
import type { BlockInputs, BlockResult, Hamiltonian } from './result-types.ts';

const ENERGY_UNIT = 'hartree';

/** Evaluates one block of a record; whatever goes wrong becomes an `invalid` result, never an exception. */
export function evaluateBlock(file: string, entry: BlockEntry): BlockResult {
  const started = performance.now();
  if (entry.kind === 'invalid') {
    return unparsedBlock(entry, started);
  }
  const { spec } = entry;
  const hash = inputHash(spec);
  const evaluated = isLineSpace(spec.space) ? evaluateLineBlock(spec) : evaluateFieldBlock(spec);
  if (!evaluated.ok) {
    const problems = evaluated.problems.map((p) => ({ file, line: p.line, block: spec.id, field: p.field, message: p.message }));
    return invalidBlock(spec.id, spec.line, spec.caption, problems, hash, started);
  }
  const { engine, trees, mass } = evaluated;
  // Units bound as constants in quantity mode stay upright; everything the author declared is a symbol.
  const bound = new Set(spec.quantity?.bound ?? []);
  const declared = new Set([...coordinatesOf(spec.space), ...spec.varied.map((p) => p.name), ...Object.keys(spec.fixed), ...Object.keys(spec.constants).filter((name) => !bound.has(name))]);
  const tex = texOptions(declared);
  const inputs: BlockInputs = {
    space: spec.space,
    coordinates: coordinatesOf(spec.space),
    box: spec.box,
    angularMomentum: spec.angularMomentum,
    mass: trees.mass ? null : mass,
    massTex: trees.mass?.toTex(tex) ?? null,
    masses: spec.masses,
    coordinate: coordinatesOf(spec.space)[0],
    lengthUnit: 'bohr',
    potentialTex: trees.potential.toTex(tex),
    trialTex: trees.trial?.toTex(tex) ?? null,
    basisTex: trees.basis?.map((tree) => tree.toTex(tex)) ?? null,
    constants: spec.constants,
    ranges: spec.varied.map(({ name, start, min, max }) => ({ name, start, min, max })),
  };
  const result = { ...toBlockResult(file, spec, inputs, engine, hash, started), hamiltonian: evaluated.hamiltonian };
  return spec.quantity ? inBlockUnits(result, spec.quantity) : result;
}

type Evaluated =
  | { ok: true; engine: EngineResult; trees: { potential: MathNode; mass: MathNode | null; trial: MathNode | null; basis: MathNode[] | null }; mass: number; hamiltonian: Hamiltonian | null }
  | { ok: false; problems: Array<{ line: number; field: string | null; message: string }> };

/** A block on a space of one coordinate: compiled to functions of x (or r), evaluated by the one-coordinate engine. */
function evaluateLineBlock(spec: BlockSpec): Evaluated {
  const compiled = compileBlock(spec);
  if (!compiled.ok) return { ok: false, problems: compiled.problems };
  const base: ProblemBase = {
    space: spec.space as LineSpace,
    box: spec.box,
    angularMomentum: spec.angularMomentum,
    mass: compiled.block.mass,
    massProfile: compiled.block.massProfile,
    potential: compiled.block.potential,
    potentialSwitches: compiled.block.potentialSwitches,
    ...shared(spec),
  };
  const { trial, basis } = compiled.block;
  const hamiltonian = hamiltonianSamples(spec, spec.space as LineSpace, compiled.block);
  return guarded(spec, () => (trial ? evaluateProblem({ ...base, trial }) : evaluateBasisProblem({ ...base, basis: basis!, states: spec.states })), compiled.block.trees, compiled.block.mass, hamiltonian);
}

/** A block on axial or a product space: compiled to functions of a point, evaluated by product cubature and grid. */
function evaluateFieldBlock(spec: BlockSpec): Evaluated {
  const compiled = compileFieldBlock(spec);
  if (!compiled.ok) return { ok: false, problems: compiled.problems };
  const { block } = compiled;
  const written = spec.space;
  // The spec refuses a mass that depends on the coordinates here, so it is one number (1 when given per coordinate).
  const mass = spec.mass as number;
  const space =
    typeof written === 'object'
      ? cartesianSpace(Object.entries(written).map(([name, range]) => ({ name, range, mass: spec.masses?.[name] ?? mass })))
      : axialSpace(spec.angularMomentum, mass);
  const problem: FieldProblem = { space, potential: block.potential, potentialSwitches: block.potentialSwitches, trial: block.trial, ...shared(spec) };
  // Systems are found among blocks of one coordinate; sampling a field's Hamiltonian is left for later.
  return guarded(spec, () => evaluateFieldProblem(problem), { potential: block.trees.potential, mass: null, trial: block.trees.trial, basis: null }, mass, null);
}

/** What every engine problem takes from the spec besides its space, potential and trial. */
function shared(spec: BlockSpec): Pick<ProblemBase, 'parameters' | 'reference' | 'claim' | 'plots' | 'display' | 'level'> {
  return {
    parameters: spec.varied,
    reference: {
      solve: spec.reference.solve,
      published: spec.reference.energy
        ? {
            ...spec.reference.energy,
            source: spec.reference.source ?? '',
            toleranceBasis: spec.reference.toleranceGiven ? 'as reference.tolerance gives it' : 'one unit in its last written digit, since published tables are often truncated; set reference.tolerance to change it',
          }
        : null,
    },
    claim: spec.claim,
    plots: spec.report.plots,
    display: spec.quantity ? blockUnitsDisplay(spec.quantity) : undefined,
    level: spec.level && { symmetry: spec.level.symmetry, index: spec.level.index },
  };
}

/** The evaluation, with an exception (a bug, never bad input) turned into an invalid block. */
function guarded(spec: BlockSpec, run: () => EngineResult, trees: Extract<Evaluated, { ok: true }>['trees'], mass: number, hamiltonian: Hamiltonian | null): Evaluated {
  try {
    return { ok: true, engine: run(), trees, mass, hamiltonian };
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    return { ok: false, problems: [{ line: spec.line, field: null, message: `the evaluation failed: ${reason}` }] };
  }
}

function toBlockResult(file: string, spec: BlockSpec, inputs: BlockInputs, engine: EngineResult, hash: string, started: number): BlockResult {
  const grid = engine.grid && engine.grid.levels.length > 0 ? engine.grid : null;
  const { level } = engine;
  const gridLevel = grid?.levels[level.gridIndex] ?? null;
  const published = spec.reference.energy ? { energy: spec.reference.energy.value, tolerance: spec.reference.energy.tolerance, source: spec.reference.source ?? '' } : null;
  const parameters: BlockResult['parameters'] = {};
  for (const p of engine.parameters) parameters[p.name] = { value: p.value, unit: null, varied: true };
  for (const [name, value] of Object.entries(spec.fixed)) parameters[name] = { value, unit: null, varied: false };
  const relative = (reference: number | null) => (engine.energy === null || reference === null ? null : (engine.energy - reference) / Math.abs(reference));
  // Invalid results carry the failing check's location: the potential when the fault is traced there, else the trial or basis.
  const problems: SpecProblem[] =
    engine.status === 'invalid' ? engine.checks
          .filter((c) => !c.pass)
          .map((c) =>
            c.field === 'potential'
              ? { file, line: spec.potential.line, block: spec.id, field: 'potential', message: c.detail }
              : c.field === 'mass'
                ? { file, line: typeof spec.mass === 'number' ? spec.line : spec.mass.line, block: spec.id, field: 'mass', message: c.detail }
                : c.field === 'symmetry'
                  ? { file, line: spec.level?.line ?? spec.line, block: spec.id, field: 'symmetry', message: c.detail }
                  : { file, line: (spec.trial ?? spec.basis![0]).line, block: spec.id, field: spec.trial ? 'trial' : 'basis', message: c.detail },
          ) : [];
  return {
    id: spec.id,
    line: spec.line,
    caption: spec.caption,
    inputs,
    status: engine.status,
    message: engine.message,
    problems,
    energy: engine.energy === null ? null : { value: engine.energy, unit: ENERGY_UNIT },
    parameters,
    variance: engine.variance?.value ?? null,
    varianceNote: engine.variance?.note ?? null,
    states: engine.states.map((state) => ({ energy: state.energy, reference: state.reference, errorEstimate: state.errorEstimate })),
    basis: engine.basis,
    components: engine.components,
    reference:
      grid || published
        ? {
            energy: grid ? gridLevel : published!.energy,
            excited: grid?.levels[level.nextGridIndex] ?? null,
            threshold: grid && Number.isFinite(grid.threshold) ? grid.threshold : null,
            method: grid ? 'grid' : 'published',
            published,
            level: { index: level.index, symmetry: level.symmetry },
          }
        : null,
    errors: { vsGrid: relative(gridLevel), vsPublished: relative(published?.energy ?? null) },
    bounds: { upper: engine.bounds.upper, lower: engine.bounds.lower, weinstein: engine.bounds.weinstein },
    overlap: engine.overlap,
    virial: engine.virial,
    virialNote: engine.virialNote,
    claim: spec.claim
      ? { energy: spec.claim.energy?.value ?? null, tolerance: spec.claim.energy?.tolerance ?? null, parameters: spec.claim.parameters }
      : null,
    checks: engine.checks.map(({ name, pass, detail, measure }) => (measure ? { name, pass, detail, measure } : { name, pass, detail })),
    plots: engine.plots,
    diagnostics: {
      energyError: engine.energyError,
      optimiser: engine.optimiser
        ? {
            method: engine.optimiser.method,
            iterations: engine.optimiser.iterations,
            evaluations: engine.optimiser.evaluations,
            converged: engine.optimiser.converged,
            starts: engine.optimiser.starts,
            activeLimits: engine.optimiser.activeLimits,
            curvature: engine.optimiser.hessian,
          }
        : null,
      grid: engine.grid
        ? {
            size: engine.grid.size,
            elements: engine.grid.elements,
            elementOrder: engine.grid.elementOrder,
            refinements: engine.grid.refinements,
            domain: engine.grid.domain,
            errorEstimate: engine.grid.errorEstimate,
            converged: engine.grid.converged,
            ...(engine.grid.axes ? { axes: engine.grid.axes } : {}),
          }
        : null,
      energyEvaluations: engine.counts.energyEvaluations,
      trialEvaluations: engine.counts.trialEvaluations,
      plotEvaluations: engine.plots?.evaluations ?? 0,
      variationalMs: engine.timings.variationalMs,
      referenceMs: engine.timings.referenceMs,
    },
    quantity: null,
    hamiltonian: null,
    inputHash: hash,
    timeMs: performance.now() - started,
  };
}
