import type { MathNode } from 'mathjs';
import { coordinatesOf, type BlockSpec } from '../spec/types.ts';
import { checkExpression, type NameScope } from './allow-list.ts';
import { derivativeTooLarge, explainRefusal, sharedConstants, type ExpressionProblem } from './block-scope.ts';
import { compileTree } from './compile.ts';
import { dependsOn, differentiate } from './differentiate.ts';
import { switchFunctions } from './switch-points.ts';

export type { ExpressionProblem } from './block-scope.ts';


/** The trees a block's numbers come from, kept for typesetting. */
export interface BlockTrees {
  coordinate: string;
  potential: MathNode;
  /** The mass when it depends on the coordinate; null for a constant mass. */
  mass: MathNode | null;
  /** The trial, or null for a basis block. */
  trial: MathNode | null;
  /** The basis functions, or null for a trial block. */
  basis: MathNode[] | null;
}

/** A compiled state function and its first coordinate derivative (all a basis function needs). */
export interface CompiledFunction {
  value(x: number): number;
  d1(x: number): number;
}

export interface CompiledBlock {
  trees: BlockTrees;
  /** The constant mass, or NaN when `massProfile` gives it as a function of the coordinate. */
  mass: number;
  /** A mass that depends on the coordinate, its symbolic slope, and where it switches branch; null for a constant one. */
  massProfile: (CompiledFunction & { switches: Array<(x: number) => number> }) | null;
  potential: (x: number) => number;
  potentialSwitches: Array<(x: number) => number>;
  /** Exactly one of trial and basis is set, as the block says. */
  /** A trial also has its second derivative, for H psi in the variance. */
  trial: (CompiledFunction & { d2(x: number): number; setParameters(values: ArrayLike<number>): void; switches: Array<(x: number) => number> }) | null;
  basis: { functions: CompiledFunction[]; setParameters(values: ArrayLike<number>): void; switches: Array<(x: number) => number> } | null;
}

export type CompileResult = { ok: true; block: CompiledBlock } | { ok: false; problems: ExpressionProblem[] };


/**
 * Checks a block's expressions against its declarations and compiles the potential, the trial
 * and the trial's first two coordinate derivatives into closures sharing one slot array.
 */
export function compileBlock(spec: BlockSpec): CompileResult {
  const coordinate = coordinatesOf(spec.space)[0];
  const varied = spec.varied.map((p) => p.name);
  const shared = sharedConstants(spec);
  const problems: ExpressionProblem[] = [];
  const mass = readMass(spec, coordinate, shared);
  if (!mass.ok) return { ok: false, problems: [mass.problem] };
  // A mass that depends on the coordinate has no single value for the name `mass` to stand for.
  const constants: Record<string, number> = mass.tree ? shared : { ...shared, mass: mass.value };

  // A trial block has one state function named `trial`; a basis block has `basis[0]`, `basis[1]`, ...
  const states = spec.trial ? [{ field: 'trial', ...spec.trial }] : (spec.basis ?? []).map((b, i) => ({ field: `basis[${i}]`, ...b }));
  const check = (field: string, text: string, line: number, variables: string[]): MathNode | null => {
    const result = checkExpression(text, { variables, constants } satisfies NameScope);
    if (result.ok) return result.tree;
    problems.push({ field, line, token: result.token, message: explainRefusal(result.token, result.message, spec, field) });
    return null;
  };
  const potentialTree = check('potential', spec.potential.text, spec.potential.line, [coordinate]);
  const massTree = mass.tree;
  const stateTrees = states.map((f) => check(f.field, f.text, f.line, [coordinate, ...varied]));
  if (!potentialTree || stateTrees.some((t) => t === null)) return { ok: false, problems };
  const trees = stateTrees as MathNode[];
  const unused = spec.trial ? 'the trial does not use it' : 'no basis function uses it';

  for (const parameter of spec.varied) {
    if (!trees.some((t) => dependsOn(t, parameter.name))) {
      problems.push({ field: `parameters.${parameter.name}`, line: parameter.line, token: parameter.name, message: `parameter ${parameter.name} is varied but ${unused}` });
    }
  }
  trees.forEach((tree, i) => {
    if (!dependsOn(tree, coordinate)) problems.push({ field: states[i].field, line: states[i].line, token: null, message: `${states[i].field === 'trial' ? 'the trial' : `basis function ${i}`} does not depend on the coordinate ${coordinate}` });
  });
  if (problems.length > 0) return { ok: false, problems };

  const slotOf: Record<string, number> = { [coordinate]: 0 };
  varied.forEach((name, i) => (slotOf[name] = i + 1));
  const slots = new Float64Array(varied.length + 1);
  const compile = (tree: MathNode) => compileTree(tree, slotOf, constants);
  const at = (f: (s: Float64Array) => number) => (x: number) => {
    slots[0] = x;
    return f(slots);
  };
  const setParameters = (values: ArrayLike<number>) => {
    for (let i = 0; i < varied.length; i++) slots[i + 1] = values[i];
  };
  const onCoordinate = (tree: MathNode) => switchFunctions(tree).filter((g) => dependsOn(g, coordinate)).map((g) => at(compile(g)));

  const functions: CompiledFunction[] = [];
  const d1Trees: MathNode[] = [];
  for (let i = 0; i < trees.length; i++) {
    const d1Tree = differentiate(trees[i], coordinate);
    const d1Refusal = derivativeTooLarge(d1Tree, 'first', states[i]);
    if (d1Refusal) return { ok: false, problems: [d1Refusal] };
    d1Trees.push(d1Tree);
    functions.push({ value: at(compile(trees[i])), d1: at(compile(d1Tree)) });
  }
  const switches = trees.flatMap(onCoordinate);
  const massProfile = massTree ? { value: at(compile(massTree)), d1: at(compile(differentiate(massTree, coordinate))), switches: onCoordinate(massTree) } : null;
  const block = { potential: at(compile(potentialTree)), potentialSwitches: onCoordinate(potentialTree), mass: massTree ? Number.NaN : mass.value, massProfile };
  if (!spec.trial) {
    return { ok: true, block: { ...block, trees: { coordinate, potential: potentialTree, mass: massTree, trial: null, basis: trees }, trial: null, basis: { functions, setParameters, switches } } };
  }
  const d2Tree = differentiate(d1Trees[0], coordinate);
  const d2Refusal = derivativeTooLarge(d2Tree, 'second', states[0]);
  if (d2Refusal) return { ok: false, problems: [d2Refusal] };
  const trial = { ...functions[0], d2: at(compile(d2Tree)), setParameters, switches };
  return { ok: true, block: { ...block, trees: { coordinate, potential: potentialTree, mass: massTree, trial: trees[0], basis: null }, trial, basis: null } };
}

type MassReading = { ok: true; value: number; tree: MathNode | null } | { ok: false; problem: ExpressionProblem };

/**
 * The mass as a number, or as an expression of the coordinate (in electron masses; a position-dependent mass in the
 * BenDaniel–Duke kinetic form; the spec layer lets text through only when it names the coordinate). It may use the
 * constants and fixed parameters, not the varied ones nor itself.
 */
function readMass(spec: BlockSpec, coordinate: string, constants: Record<string, number>): MassReading {
  if (typeof spec.mass === 'number') return { ok: true, value: spec.mass, tree: null };
  const { line } = spec.mass;
  const checked = checkExpression(spec.mass.text, { variables: [coordinate], constants });
  if (checked.ok) return { ok: true, value: Number.NaN, tree: checked.tree };
  const message = explainRefusal(checked.token, checked.message, spec, 'mass');
  // Often a unit written in an atomic-unit block.
  const hint = spec.quantity === null && message.startsWith('unknown name') ? '; a mass with a unit, such as 0.067 electronMass, needs quantity mode (units: { length: nm, energy: meV })' : '';
  return { ok: false, problem: { field: 'mass', line, token: checked.token, message: message + hint } };
}


