import type { MathNode } from 'mathjs';
import { coordinatesOf, type BlockSpec } from '../spec/types.ts';
import { checkExpression, type NameScope } from './allow-list.ts';
import { blockConstants, derivativeTooLarge, explainRefusal, stateFields, type ExpressionProblem } from './block-scope.ts';
import { compileTree } from './compile.ts';
import { dependsOn, differentiate } from './differentiate.ts';
import { switchFunctions } from './switch-points.ts';

export type { ExpressionProblem } from './block-scope.ts';


/** The trees a block's numbers come from, kept for typesetting. */
export interface BlockTrees {
  coordinate: string;
  potential: MathNode;
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
  const constants = blockConstants(spec);
  const problems: ExpressionProblem[] = [];

  const states = stateFields(spec);
  const check = (field: string, text: string, line: number, variables: string[]): MathNode | null => {
    const result = checkExpression(text, { variables, constants } satisfies NameScope);
    if (result.ok) return result.tree;
    problems.push({ field, line, token: result.token, message: explainRefusal(result.token, result.message, spec, field) });
    return null;
  };
  const potentialTree = check('potential', spec.potential.text, spec.potential.line, [coordinate]);
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
  const block = { potential: at(compile(potentialTree)), potentialSwitches: onCoordinate(potentialTree) };
  if (!spec.trial) {
    return { ok: true, block: { ...block, trees: { coordinate, potential: potentialTree, trial: null, basis: trees }, trial: null, basis: { functions, setParameters, switches } } };
  }
  const d2Tree = differentiate(d1Trees[0], coordinate);
  const d2Refusal = derivativeTooLarge(d2Tree, 'second', states[0]);
  if (d2Refusal) return { ok: false, problems: [d2Refusal] };
  const trial = { ...functions[0], d2: at(compile(d2Tree)), setParameters, switches };
  return { ok: true, block: { ...block, trees: { coordinate, potential: potentialTree, trial: trees[0], basis: null }, trial, basis: null } };
}


