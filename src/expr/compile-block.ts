import type { MathNode } from 'mathjs';
import type { BlockSpec } from '../spec/types.ts';
import { checkExpression, type NameScope } from './allow-list.ts';
import { compileTree } from './compile.ts';
import { dependsOn, differentiate } from './differentiate.ts';
import { switchFunctions } from './switch-points.ts';

export interface ExpressionProblem {
  field: string;
  line: number;
  token: string | null;
  message: string;
}

/** The trees a block's numbers come from, kept for typesetting. */
export interface BlockTrees {
  coordinate: 'x' | 'r';
  potential: MathNode;
  trial: MathNode;
  trialD1: MathNode;
  trialD2: MathNode;
}

export interface CompiledBlock {
  trees: BlockTrees;
  potential: (x: number) => number;
  potentialSwitches: Array<(x: number) => number>;
  trial: {
    setParameters(values: ArrayLike<number>): void;
    value(x: number): number;
    d1(x: number): number;
    d2(x: number): number;
    switches: Array<(x: number) => number>;
  };
}

export type CompileResult = { ok: true; block: CompiledBlock } | { ok: false; problems: ExpressionProblem[] };

/** hbar in atomic units. */
const HBAR = 1;

/**
 * Checks a block's expressions against its declarations and compiles the potential, the trial
 * and the trial's first two coordinate derivatives into closures sharing one slot array.
 */
export function compileBlock(spec: BlockSpec): CompileResult {
  const coordinate = spec.space === 'radial' ? 'r' : 'x';
  const varied = spec.varied.map((p) => p.name);
  const constants: Record<string, number> = { pi: Math.PI, e: Math.E, ...spec.constants, ...spec.fixed, mass: spec.mass, hbar: HBAR };
  const problems: ExpressionProblem[] = [];

  const check = (field: 'potential' | 'trial', variables: string[]): MathNode | null => {
    const source = spec[field];
    const result = checkExpression(source.text, { variables, constants } satisfies NameScope);
    if (result.ok) return result.tree;
    problems.push({ field, line: source.line, token: result.token, message: explain(result.token, result.message, spec, coordinate, field) });
    return null;
  };
  const potentialTree = check('potential', [coordinate]);
  const trialTree = check('trial', [coordinate, ...varied]);
  if (!potentialTree || !trialTree) return { ok: false, problems };

  for (const parameter of spec.varied) {
    if (!dependsOn(trialTree, parameter.name)) {
      problems.push({ field: `parameters.${parameter.name}`, line: parameter.line, token: parameter.name, message: `parameter ${parameter.name} is varied but the trial does not use it` });
    }
  }
  if (!dependsOn(trialTree, coordinate)) {
    problems.push({ field: 'trial', line: spec.trial.line, token: null, message: `the trial does not depend on the coordinate ${coordinate}` });
  }
  if (problems.length > 0) return { ok: false, problems };

  const slotOf: Record<string, number> = { [coordinate]: 0 };
  varied.forEach((name, i) => (slotOf[name] = i + 1));
  const slots = new Float64Array(varied.length + 1);
  const compile = (tree: MathNode) => compileTree(tree, slotOf, constants);
  const at = (f: (s: Float64Array) => number) => (x: number) => {
    slots[0] = x;
    return f(slots);
  };

  const d1Tree = differentiate(trialTree, coordinate);
  const d2Tree = differentiate(d1Tree, coordinate);
  const onCoordinate = (tree: MathNode) => switchFunctions(tree).filter((g) => dependsOn(g, coordinate)).map((g) => at(compile(g)));
  return {
    ok: true,
    block: {
      trees: { coordinate, potential: potentialTree, trial: trialTree, trialD1: d1Tree, trialD2: d2Tree },
      potential: at(compile(potentialTree)),
      potentialSwitches: onCoordinate(potentialTree),
      trial: {
        setParameters(values) {
          for (let i = 0; i < varied.length; i++) slots[i + 1] = values[i];
        },
        value: at(compile(trialTree)),
        d1: at(compile(d1Tree)),
        d2: at(compile(d2Tree)),
        switches: onCoordinate(trialTree),
      },
    },
  };
}

function explain(token: string, message: string, spec: BlockSpec, coordinate: string, field: string): string {
  if (field === 'potential' && spec.varied.some((p) => p.name === token)) {
    return `the potential may not depend on the varied parameter ${token}; hold it fixed (a plain value under parameters) or move it to constants`;
  }
  const other = coordinate === 'r' ? 'x' : 'r';
  if (token === other) return `unknown name ${other}: the coordinate of space ${spec.space} is ${coordinate}`;
  return message;
}
