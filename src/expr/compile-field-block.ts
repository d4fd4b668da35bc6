import type { MathNode } from 'mathjs';
import type { AxisSwitch, FieldTrial, PointFunction } from '../engine/problem.ts';
import { coordinatesOf, type BlockSpec } from '../spec/types.ts';
import { checkExpression, type NameScope } from './allow-list.ts';
import { blockConstants, derivativeTooLarge, explainRefusal, type ExpressionProblem } from './block-scope.ts';
import { add, div, mul, num, pow, sub, sym } from './build.ts';
import { compileTree, type Compiled } from './compile.ts';
import { dependsOn, differentiate } from './differentiate.ts';
import { switchFunctions } from './switch-points.ts';

/** A block of several coordinates compiled to closures over a point (a Float64Array in the space's coordinate order). */
export interface CompiledFieldBlock {
  trees: { coordinates: string[]; potential: MathNode; trial: MathNode };
  potential: PointFunction;
  /** Kinks and steps of the potential along one coordinate each (a switch that mixes coordinates is left to the cubature). */
  potentialSwitches: AxisSwitch[];
  trial: FieldTrial;
}

export type CompileFieldResult = { ok: true; block: CompiledFieldBlock } | { ok: false; problems: ExpressionProblem[] };

/**
 * Checks the potential and trial of an axial or product-space block against its coordinates and declarations, and
 * compiles the trial, each first partial derivative and the Laplacian the space needs (axial: the cylindrical
 * d2_rho + d_rho/rho + d2_z; a product space: sum_k d2_k / m_k; two-electron: (laplacian_1 + laplacian_2) / mass in
 * r1, r2, r12) from symbolic derivatives.
 */
export function compileFieldBlock(spec: BlockSpec): CompileFieldResult {
  const coordinates = coordinatesOf(spec.space);
  const varied = spec.varied.map((p) => p.name);
  const constants = blockConstants(spec);
  const problems: ExpressionProblem[] = [];
  if (!spec.trial) return { ok: false, problems: [{ field: 'basis', line: spec.line, token: null, message: 'a basis is not yet available on a space of several coordinates: write one trial' }] };
  const trialSource = { field: 'trial', ...spec.trial };
  const check = (field: string, text: string, line: number, variables: string[]): MathNode | null => {
    const result = checkExpression(text, { variables, constants } satisfies NameScope);
    if (result.ok) return result.tree;
    problems.push({ field, line, token: result.token, message: explainRefusal(result.token, result.message, spec, field) });
    return null;
  };
  const potentialTree = check('potential', spec.potential.text, spec.potential.line, coordinates);
  const trialTree = check('trial', trialSource.text, trialSource.line, [...coordinates, ...varied]);
  if (!potentialTree || !trialTree) return { ok: false, problems };
  for (const parameter of spec.varied) {
    if (!dependsOn(trialTree, parameter.name)) problems.push({ field: `parameters.${parameter.name}`, line: parameter.line, token: parameter.name, message: `parameter ${parameter.name} is varied but the trial does not use it` });
  }
  if (!coordinates.some((c) => dependsOn(trialTree, c))) problems.push({ field: 'trial', line: trialSource.line, token: null, message: `the trial does not depend on any coordinate (${coordinates.join(', ')})` });
  if (problems.length > 0) return { ok: false, problems };

  const gradientTrees: MathNode[] = [];
  for (const c of coordinates) {
    const tree = differentiate(trialTree, c);
    const refusal = derivativeTooLarge(tree, `first (d/d${c})`, trialSource);
    if (refusal) return { ok: false, problems: [refusal] };
    gradientTrees.push(tree);
  }
  const second = (k: number) => differentiate(gradientTrees[k], coordinates[k]);
  let laplacianTree: MathNode;
  if (spec.space === 'axial') {
    laplacianTree = add(add(second(0), div(gradientTrees[0], sym('rho'))), second(1));
  } else if (spec.space === 'two-electron') {
    laplacianTree = div(twoElectronLaplacian(gradientTrees, second), num(spec.mass as number));
  } else {
    const masses = spec.masses ?? {};
    laplacianTree = coordinates.map((c, k) => div(second(k), num(masses[c] ?? spec.mass))).reduce((a, b) => add(a, b));
  }
  const refusal = derivativeTooLarge(laplacianTree, 'second (the Laplacian)', trialSource);
  if (refusal) return { ok: false, problems: [refusal] };

  const d = coordinates.length;
  const slotOf: Record<string, number> = {};
  coordinates.forEach((c, k) => (slotOf[c] = k));
  varied.forEach((name, i) => (slotOf[name] = d + i));
  const slots = new Float64Array(d + varied.length);
  const compile = (tree: MathNode) => compileTree(tree, slotOf, constants);
  const atPoint = (f: Compiled): PointFunction =>
    d === 2
      ? (p) => {
          slots[0] = p[0];
          slots[1] = p[1];
          return f(slots);
        }
      : (p) => {
          slots[0] = p[0];
          slots[1] = p[1];
          slots[2] = p[2];
          return f(slots);
        };
  // Two-electron axes are perimetric, so no switch of r1, r2 or r12 lies along one of them: the cubature finds kinks itself.
  const axisSwitches = (tree: MathNode): AxisSwitch[] =>
    spec.space === 'two-electron' ? [] : switchFunctions(tree).flatMap((g) => {
      const on = coordinates.map((c, k) => (dependsOn(g, c) ? k : -1)).filter((k) => k >= 0);
      if (on.length !== 1) return [];
      const axis = on[0];
      const f = compile(g);
      return [{ axis, at: (x: number) => ((slots[axis] = x), f(slots)) }];
    });
  const trial: FieldTrial = {
    setParameters: (values) => {
      for (let i = 0; i < varied.length; i++) slots[d + i] = values[i];
    },
    value: atPoint(compile(trialTree)),
    gradient: gradientTrees.map((t) => atPoint(compile(t))),
    laplacian: atPoint(compile(laplacianTree)),
    switches: axisSwitches(trialTree),
  };
  return {
    ok: true,
    block: { trees: { coordinates, potential: potentialTree, trial: trialTree }, potential: atPoint(compile(potentialTree)), potentialSwitches: axisSwitches(potentialTree), trial },
  };
}

/**
 * The Laplacian of both particles for an S state psi(r1, r2, r12) (Hylleraas, Z. Phys. 54, 347 (1929); Bethe & Salpeter,
 * Quantum Mechanics of One- and Two-Electron Atoms, 1957, §32): psi_11 + 2 psi_1/r1 + psi_22 + 2 psi_2/r2 + 2 psi_uu + 4 psi_u/u
 * + (r1^2 - r2^2 + u^2)/(r1 u) psi_1u + (r2^2 - r1^2 + u^2)/(r2 u) psi_2u with u = r12; the last two come from
 * grad_1 r1 . grad_1 r12 = cos(r1, r12).
 */
function twoElectronLaplacian(gradient: MathNode[], second: (k: number) => MathNode): MathNode {
  const [r1, r2, u] = [sym('r1'), sym('r2'), sym('r12')];
  const sq = (x: MathNode) => pow(x, num(2));
  const radial = (k: number, r: MathNode) => add(second(k), div(mul(num(2), gradient[k]), r));
  const mixed = (k: number, r: MathNode, other: MathNode) => mul(div(add(sub(sq(r), sq(other)), sq(u)), mul(r, u)), differentiate(gradient[k], 'r12'));
  const pair = add(mul(num(2), second(2)), div(mul(num(4), gradient[2]), u));
  return add(add(add(radial(0, r1), radial(1, r2)), pair), add(mixed(0, r1, r2), mixed(1, r2, r1)));
}
