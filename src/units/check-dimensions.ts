import type { ConditionalNode, ConstantNode, FunctionNode, MathNode, OperatorNode, SymbolNode } from 'mathjs';
import { dependsOn } from '../expr/differentiate.ts';
import { ANY, DIMENSIONLESS, describeDimension, dimensionName, isDimensionless, multiply, power, unify, type DimensionOrAny } from './dimension.ts';
import { resolvePhysicalName, type PhysicalName } from './physical-names.ts';
import { evaluateFixed } from './evaluate-fixed.ts';

/** What the names of an expression stand for in quantity mode. */
export interface DimensionScope {
  /** Names whose value changes: the coordinate and the varied parameters. */
  variables: Readonly<Record<string, DimensionOrAny>>;
  /** Names with one value, in atomic units: built-ins, declared constants, fixed parameters. */
  constants: Readonly<Record<string, { dimension: DimensionOrAny; atomic: number }>>;
}

export type DimensionCheck =
  | { ok: true; dimension: DimensionOrAny; physical: Map<string, PhysicalName> }
  | { ok: false; term: string; message: string };

class Refusal {
  constructor(readonly term: string, readonly message: string) {}
}

const TRANSCENDENTAL = new Set(['exp', 'log', 'sin', 'cos', 'tan', 'sinh', 'cosh', 'tanh', 'sech', 'erf']);

/**
 * Dimensional analysis of an allow-listed tree: sums and comparisons need equal dimensions,
 * transcendental functions and exponents dimensionless arguments, a dimensioned base a fixed
 * exponent; sqrt halves. A mathjs unit may only follow a number (`2 nm`, `0.5 meV/nm^2`), so an
 * undeclared name that happens to spell a unit (m, s, h) is never taken for one silently.
 */
export function checkDimensions(tree: MathNode, scope: DimensionScope): DimensionCheck {
  const physical = new Map<string, PhysicalName>();
  try {
    return { ok: true, dimension: walk(tree, false, scope, physical), physical };
  } catch (error) {
    if (error instanceof Refusal) return { ok: false, term: error.term, message: error.message };
    throw error;
  }
}

function walk(node: MathNode, unitAllowed: boolean, scope: DimensionScope, physical: Map<string, PhysicalName>): DimensionOrAny {
  const w = (n: MathNode, allowed = false) => walk(n, allowed, scope, physical);
  switch (node.type) {
    case 'ConstantNode':
      return (node as ConstantNode).value === 0 ? ANY : DIMENSIONLESS;
    case 'SymbolNode':
      return symbolDimension((node as SymbolNode).name, unitAllowed, scope, physical);
    case 'ParenthesisNode':
      return w((node as unknown as { content: MathNode }).content, unitAllowed);
    case 'ConditionalNode': {
      const c = node as ConditionalNode;
      w(c.condition);
      return agree(node, [c.trueExpr, c.falseExpr], w, 'the two branches of a conditional must have the same dimension');
    }
    case 'RelationalNode':
      agree(node, (node as unknown as { params: MathNode[] }).params, w, 'a comparison needs both sides in the same dimension');
      return DIMENSIONLESS;
    case 'OperatorNode':
      return operatorDimension(node as OperatorNode, unitAllowed, w, scope, physical);
    case 'FunctionNode': {
      const f = node as FunctionNode;
      const name = f.fn.name;
      if (name === 'sqrt') return power(w(f.args[0]), 0.5);
      if (name === 'abs') return w(f.args[0]);
      if (name === 'min' || name === 'max') return agree(node, f.args, w, `the arguments of ${name} must have the same dimension`);
      if (TRANSCENDENTAL.has(name)) {
        const d = w(f.args[0]);
        if (!isDimensionless(d)) throw new Refusal(node.toString(), `${node.toString()} needs a dimensionless argument, but ${f.args[0].toString()} is ${describeDimension(d)}`);
        return DIMENSIONLESS;
      }
      throw new Refusal(name, `function ${name} has no dimensional rule: the allow-list should have refused it`);
    }
    default:
      throw new Refusal(node.toString(), `${node.type} has no dimensional rule: the allow-list should have refused it`);
  }
}

function operatorDimension(
  node: OperatorNode,
  unitAllowed: boolean,
  w: (n: MathNode, allowed?: boolean) => DimensionOrAny,
  scope: DimensionScope,
  physical: Map<string, PhysicalName>,
): DimensionOrAny {
  const [a, b] = node.args;
  switch (node.fn) {
    case 'unaryMinus':
    case 'unaryPlus':
      return w(a);
    case 'add':
    case 'subtract':
      return agree(node, [a, b], w, 'the terms of a sum must have the same dimension');
    case 'multiply':
    case 'divide': {
      // The right factor may be a unit when the left one starts with a number: 2 nm, 0.5 meV/nm^2.
      const left = w(a, unitAllowed);
      const right = w(b, unitAllowed || numberLed(a));
      return multiply(left, node.fn === 'divide' ? power(right, -1) : right);
    }
    case 'pow': {
      const base = w(a, unitAllowed);
      const exponent = w(b);
      if (!isDimensionless(exponent)) throw new Refusal(node.toString(), `the exponent ${b.toString()} in ${node.toString()} must be dimensionless, but it is ${describeDimension(exponent)}`);
      if (isDimensionless(base)) return base;
      const varying = Object.keys(scope.variables).find((name) => dependsOn(b, name));
      if (varying !== undefined) {
        const why = b.toString() === varying ? `${varying} is varied` : `${b.toString()} varies with ${varying}`;
        throw new Refusal(node.toString(), `${a.toString()} is ${describeDimension(base)}, so its exponent in ${node.toString()} must be a fixed number, but ${why}`);
      }
      const value = evaluateFixed(b, scope, physical);
      if (!Number.isFinite(value)) throw new Refusal(node.toString(), `the exponent ${b.toString()} in ${node.toString()} is not a finite number`);
      return power(base, value);
    }
    case 'and':
    case 'or':
    case 'not':
      node.args.forEach((arg) => w(arg));
      return DIMENSIONLESS;
    default:
      // smaller, larger, equal, ...: the allow-list lets only comparisons through here.
      agree(node, [a, b], w, 'a comparison needs both sides in the same dimension');
      return DIMENSIONLESS;
  }
}

/** The dimension terms share, or a refusal that names both disagreeing terms. */
function agree(node: MathNode, terms: MathNode[], w: (n: MathNode) => DimensionOrAny, rule: string): DimensionOrAny {
  let shared: DimensionOrAny = ANY;
  let sharedBy = terms[0];
  for (const term of terms) {
    const d = w(term);
    const joined = unify(shared, d);
    if (joined === null) {
      throw new Refusal(
        node.toString(),
        `in ${node.toString()}, ${sharedBy.toString()} is ${describeDimension(shared)} but ${term.toString()} is ${describeDimension(d)}: ${rule}`,
      );
    }
    if (d !== ANY && shared === ANY) sharedBy = term;
    shared = joined;
  }
  return shared;
}

function symbolDimension(name: string, unitAllowed: boolean, scope: DimensionScope, physical: Map<string, PhysicalName>): DimensionOrAny {
  if (name in scope.variables) return scope.variables[name];
  if (name in scope.constants) return scope.constants[name].dimension;
  const resolved = resolvePhysicalName(name);
  if (resolved === null) throw new Refusal(name, `unknown name ${name}: declare it under parameters or constants`);
  if (!resolved.ok) throw new Refusal(name, resolved.message);
  if (resolved.name.kind === 'unit' && !unitAllowed) {
    throw new Refusal(
      name,
      `${name} is a unit of ${dimensionName(resolved.name.dimension)}; a unit may only follow a number, as in 2 ${name}, so put a quantity in parentheses, as in x/(1 nm) or x^2 * (0.5 meV/nm^2); to use ${name} as a name, declare it under parameters or constants`,
    );
  }
  physical.set(name, resolved.name);
  return resolved.name.dimension;
}

/** Whether a product starts with a number, so that what it multiplies may be a unit. */
function numberLed(node: MathNode): boolean {
  switch (node.type) {
    case 'ConstantNode':
      return true;
    case 'ParenthesisNode':
      return numberLed((node as unknown as { content: MathNode }).content);
    case 'OperatorNode': {
      const n = node as OperatorNode;
      return ['unaryMinus', 'unaryPlus', 'multiply', 'divide'].includes(n.fn) && numberLed(n.args[0]);
    }
    default:
      return false;
  }
}
