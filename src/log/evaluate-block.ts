import { performance } from 'node:perf_hooks';
import { evaluateBasisProblem } from '../engine/evaluate-basis.ts';
import { evaluateProblem, type EngineResult } from '../engine/evaluate-problem.ts';
import type { FieldProblem, ParameterSpec, ProblemBase } from '../engine/problem.ts';
import type { MathNode } from 'mathjs';
import { evaluateFieldProblem } from '../engine/evaluate-field-problem.ts';
import { axialSpace } from '../engine/spaces/axial.ts';
import { cartesianSpace } from '../engine/spaces/cartesian.ts';
import { twoElectronSpace } from '../engine/spaces/two-electron.ts';
import { compileBlock } from '../expr/compile-block.ts';
import { compileFieldBlock } from '../expr/compile-field-block.ts';
import { texOptions } from '../expr/symbol-tex.ts';
import { coordinatesOf, isLineSpace, type BlockEntry, type BlockSpec, type LineSpace, type SpecProblem } from '../spec/types.ts';
import { hamiltonianSamples } from './hamiltonian-samples.ts';
import { claimChecks } from '../engine/checks.ts';
import { fieldExpectationOf, lineExpectationOf, type ExtraExpectation } from '../engine/expectation-of.ts';
import { ATOMIC_DISPLAY } from '../engine/format.ts';
import { gradedCheck, statusOf } from '../engine/status.ts';
import type { Compiled } from '../expr/compile.ts';
import { blockConstants } from '../expr/block-scope.ts';
import { recompileLinePotential } from '../expr/compile-derivative.ts';
import { dependsOn } from '../expr/differentiate.ts';
import { evaluateSweep } from './evaluate-sweep.ts';
import { inputHash } from './input-hash.ts';
import { sensitivities } from './sensitivities.ts';
import { invalidBlock, unparsedBlock } from './invalid-block.ts';
import { blockUnitsDisplay, inBlockUnits } from './units-back.ts';
import type { BlockInputs, BlockResult, Hamiltonian } from './result-types.ts';

const ENERGY_UNIT = 'hartree';

/**
 * Evaluates one block of a record; whatever goes wrong becomes an `invalid` result, never an exception. For a sweep,
 * `knownPoints` are points already computed (see sweepPointEntries), in order, null where a point is new.
 */
export function evaluateBlock(file: string, entry: BlockEntry, knownPoints?: ReadonlyArray<BlockResult | null>): BlockResult {
  const started = performance.now();
  if (entry.kind === 'invalid') {
    return unparsedBlock(entry, started);
  }
  const { spec } = entry;
  const stated = (result: BlockResult) => (spec.quantity ? inBlockUnits(result, spec.quantity) : result);
  return spec.sweep ? evaluateSweep(spec, (point, withSensitivities) => stated(evaluateAtomic(file, point, withSensitivities)), knownPoints) : stated(evaluateAtomic(file, spec, true));
}

/** One evaluation in atomic units, with the sensitivities and propagated uncertainty when asked for. */
function evaluateAtomic(file: string, spec: BlockSpec, withSensitivities: boolean): BlockResult {
  const started = performance.now();
  const hash = inputHash(spec);
  const evaluated = evaluateSpec(spec);
  if (!evaluated.ok) {
    const problems = evaluated.problems.map((p) => ({ file, line: p.line, block: spec.id, field: p.field, message: p.message }));
    return invalidBlock(spec.id, spec.line, spec.caption, problems, hash, started);
  }
  const { trees, mass } = evaluated;
  const sensitivityStarted = performance.now();
  const response = withSensitivities && evaluated.engine.energy !== null && evaluated.engine.status !== 'invalid' ? guardedSensitivities(spec, evaluated) : null;
  const sensitivityMs = performance.now() - sensitivityStarted;
  const engine = response ? withResponseChecks(spec, evaluated.engine, response) : evaluated.engine;
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
    ...(spec.exchange ? { exchange: spec.exchange.value } : {}),
  };
  const result = toBlockResult(file, spec, inputs, engine, hash, started);
  return {
    ...result,
    hamiltonian: evaluated.hamiltonian,
    sensitivities: response?.sensitivities ?? null,
    uncertainty: response?.uncertainty ?? null,
    diagnostics: result.diagnostics && { ...result.diagnostics, sensitivityMs },
  };
}

type Evaluated =
  | {
      ok: true;
      engine: EngineResult;
      trees: { potential: MathNode; mass: MathNode | null; trial: MathNode | null; basis: MathNode[] | null };
      mass: number;
      /** What identifies the Hamiltonian across records (systems); null where it is not sampled. */
      hamiltonian: Hamiltonian | null;
      /** <f> over the optimum's density by the space's own integrator (f reads the coordinates from its first slots); null for a basis. */
      expectationOf: ((f: Compiled, parameters: number[]) => ExtraExpectation) | null;
      /**
       * The variational energy re-optimised (local search from `start`, no grid) with one input changed, reusing the
       * compiled trial; undefined where only a full recompilation can tell (the input is in the trial or the mass).
       */
      reoptimise?: (name: string, value: number, start: ParameterSpec[]) => EngineResult | undefined;
    }
  | { ok: false; problems: Array<{ line: number; field: string | null; message: string }> };

/** `localSearch`: a re-optimisation warm-started at the block's own optimum, which needs no multistart. */
function evaluateSpec(spec: BlockSpec, localSearch = false): Evaluated {
  return isLineSpace(spec.space) ? evaluateLineBlock(spec, localSearch) : evaluateFieldBlock(spec, localSearch);
}

/** Sensitivities of the evaluated block, each finite difference and re-evaluation a re-optimisation without the grid reference. */
function blockSensitivities(spec: BlockSpec, evaluated: Extract<Evaluated, { ok: true }>): ReturnType<typeof sensitivities> {
  const { engine, trees } = evaluated;
  const optimum = engine.parameters.map((p) => p.value);
  // Warm-started at the optimum: the changed input moves it only a little.
  const varied = spec.varied.map((p, i) => ({ ...p, start: Math.min(p.max, Math.max(p.min, optimum[i])) }));
  const energyAt = (name: string, value: number): number | null => {
    const changed: BlockSpec = {
      ...withInput(spec, name, value),
      varied,
      reference: { solve: false, energy: null, source: null },
      claim: null,
      report: { ...spec.report, plots: [] },
    };
    const fast = evaluated.reoptimise?.(name, value, varied);
    if (fast) return fast.status !== 'invalid' && fast.energy !== null ? fast.energy : null;
    const again = evaluateSpec(changed, true);
    return again.ok && again.engine.status !== 'invalid' && again.engine.energy !== null ? again.engine.energy : null;
  };
  return sensitivities({
    spec,
    energy: engine.energy!,
    energyError: engine.energyError ?? 0,
    kinetic: engine.components?.kinetic ?? null,
    trees: { potential: trees.potential, states: trees.trial ? [trees.trial] : (trees.basis ?? []), mass: trees.mass },
    expectationOf: evaluated.expectationOf && ((f) => evaluated.expectationOf!(f, optimum)),
    energyAt,
    checkEvery: isLineSpace(spec.space),
  });
}

/** The sensitivities, with an exception (a bug, never bad input) turned into a failed check rather than thrown. */
function guardedSensitivities(spec: BlockSpec, evaluated: Extract<Evaluated, { ok: true }>): ReturnType<typeof sensitivities> {
  try {
    return blockSensitivities(spec, evaluated);
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    return { sensitivities: [], uncertainty: null, checks: [gradedCheck('sensitivities', false, `the sensitivities failed: ${reason}`, 'unsettled')] };
  }
}

/** The spec with one constant, fixed parameter or the mass set to another value. */
function withInput(spec: BlockSpec, name: string, value: number): BlockSpec {
  if (name === 'mass') return { ...spec, mass: value };
  if (Object.hasOwn(spec.fixed, name)) return { ...spec, fixed: { ...spec.fixed, [name]: value } };
  return { ...spec, constants: { ...spec.constants, [name]: value } };
}

/**
 * The engine's checks with the sensitivity checks added and, when the inputs are uncertain, the claimed energy
 * checked within its tolerance plus the propagated uncertainty (the recomputed E is only known that well).
 */
function withResponseChecks(spec: BlockSpec, engine: EngineResult, response: ReturnType<typeof sensitivities>): EngineResult {
  let checks = [...engine.checks, ...response.checks];
  const claimed = spec.claim?.energy;
  const widen = response.uncertainty?.uncertainty ?? 0;
  if (claimed && widen > 0 && engine.energy !== null) {
    const problem = { ...shared(spec), claim: { energy: { value: claimed.value, tolerance: claimed.tolerance + widen }, parameters: {} } };
    const [widened] = claimChecks(problem, engine.energy, []);
    const noted = { ...widened, detail: `${widened.detail}; tolerance includes the propagated uncertainty ${(problem.display ?? ATOMIC_DISPLAY).energy(widen, 3)}` };
    checks = checks.map((c) => (c.name === 'claim-energy' ? noted : c));
  }
  if (checks.length === engine.checks.length && widen === 0) return engine;
  return { ...engine, checks, ...statusOf(checks) };
}

/** A block on a space of one coordinate: compiled to functions of x (or r), evaluated by the one-coordinate engine. */
function evaluateLineBlock(spec: BlockSpec, localSearch: boolean): Evaluated {
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
    localSearch,
  };
  const { trial, basis } = compiled.block;
  const hamiltonian = hamiltonianSamples(spec, spec.space as LineSpace, compiled.block);
  const slot = new Float64Array(1);
  const expectationOf = trial ? (f: Compiled, parameters: number[]) => lineExpectationOf({ ...base, trial }, (x) => ((slot[0] = x), f(slot)), parameters) : null;
  const { trees } = compiled.block;
  const reoptimise = (name: string, value: number, start: ParameterSpec[]): EngineResult | undefined => {
    if (!trial || trees.mass || dependsOn(trees.trial!, name)) return undefined;
    const recompiled = recompileLinePotential(trees.potential, trees.coordinate, { ...blockConstants(spec), [name]: value });
    const variant = { ...base, trial, potential: recompiled.potential, potentialSwitches: recompiled.switches, mass: name === 'mass' ? value : base.mass };
    return evaluateProblem({ ...variant, parameters: start, reference: { solve: false, published: null }, claim: null, plots: [], localSearch: true });
  };
  const evaluated = guarded(spec, () => (trial ? evaluateProblem({ ...base, trial }) : evaluateBasisProblem({ ...base, basis: basis!, states: spec.states })), trees, compiled.block.mass, hamiltonian, expectationOf);
  return evaluated.ok ? { ...evaluated, reoptimise } : evaluated;
}

/** A block on axial or a product space: compiled to functions of a point, evaluated by product cubature and grid. */
function evaluateFieldBlock(spec: BlockSpec, localSearch: boolean): Evaluated {
  const compiled = compileFieldBlock(spec);
  if (!compiled.ok) return { ok: false, problems: compiled.problems };
  const { block } = compiled;
  const written = spec.space;
  // The spec refuses a mass that depends on the coordinates here, so it is one number (1 when given per coordinate).
  const mass = spec.mass as number;
  const space =
    typeof written === 'object'
      ? cartesianSpace(Object.entries(written).map(([name, range]) => ({ name, range, mass: spec.masses?.[name] ?? mass })))
      : written === 'two-electron'
        ? twoElectronSpace(mass, spec.exchange?.value === 'antisymmetric' ? -1 : 1)
        : axialSpace(spec.angularMomentum, mass);
  const problem: FieldProblem = { space, potential: block.potential, potentialSwitches: block.potentialSwitches, trial: block.trial, ...shared(spec), localSearch };
  // Systems are found among blocks of one coordinate; sampling a field's Hamiltonian is left for later.
  const expectationOf = (f: Compiled, parameters: number[]) => fieldExpectationOf(problem, (point) => f(point), parameters);
  return guarded(spec, () => evaluateFieldProblem(problem), { potential: block.trees.potential, mass: null, trial: block.trees.trial, basis: null }, mass, null, expectationOf);
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
function guarded(spec: BlockSpec, run: () => EngineResult, trees: Extract<Evaluated, { ok: true }>['trees'], mass: number, hamiltonian: Hamiltonian | null, expectationOf: Extract<Evaluated, { ok: true }>['expectationOf']): Evaluated {
  try {
    return { ok: true, engine: run(), trees, mass, hamiltonian, expectationOf };
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
                : c.field === 'exchange'
                  ? { file, line: spec.exchange?.line ?? spec.line, block: spec.id, field: 'exchange', message: c.detail }
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
            method: grid ? (grid.correlated ? 'correlated-basis' : 'grid') : 'published',
            published,
            level: { index: level.index, symmetry: level.symmetry },
          }
        : null,
    errors: { vsGrid: relative(gridLevel), vsPublished: relative(published?.energy ?? null) },
    ...(engine.binding !== undefined ? { binding: engine.binding && { ...engine.binding, detail: bindingDetail(engine.binding.below, engine.status) } } : {}),
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
            ...(engine.grid.correlated ? { correlated: engine.grid.correlated } : {}),
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
    sensitivities: null,
    uncertainty: null,
    sweep: null,
    inputHash: hash,
    timeMs: performance.now() - started,
  };
}

/** The verdict on binding in words: a trial above the threshold can still be a sound upper bound, it just shows no binding. */
function bindingDetail(below: boolean, status: BlockResult['status']): string {
  if (below) return 'the energy lies below the threshold: binding shown by this trial';
  return status === 'confirmed' ? 'confirmed, but binding not shown by this trial (its energy lies above the threshold)' : 'binding not shown by this trial (its energy lies above the threshold)';
}
