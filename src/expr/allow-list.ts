import { parse, Unit, type MathNode } from 'mathjs';
import { nearestName } from '../spec/nearest-name.ts';
import { treeShape } from './tree-shape.ts';

/** Functions a record may call (RECORD-FORMAT.md); `sign` is ours alone, it only appears in derivatives. */
export const RECORD_FUNCTIONS = ['exp', 'log', 'sqrt', 'abs', 'sin', 'cos', 'tan', 'sinh', 'cosh', 'tanh', 'sech', 'erf', 'min', 'max'] as const;
export const ARITY: Record<string, number> = { min: 2, max: 2 };
export const ARITHMETIC = new Set(['add', 'subtract', 'multiply', 'divide', 'pow', 'unaryMinus', 'unaryPlus']);
export const COMPARISON = new Set(['smaller', 'larger', 'smallerEq', 'largerEq', 'equal', 'unequal']);
export const LOGIC = new Set(['and', 'or', 'not']);
/** Long enough for any honest trial function; a larger text is refused before parsing. */
export const MAX_EXPRESSION_LENGTH = 20_000;
/** Far deeper than any honest expression; the derivatives nest several times deeper and must not exhaust the stack. */
export const MAX_EXPRESSION_DEPTH = 250;

export interface NameScope {
  /** Names that are free variables of the expression (the coordinate, varied parameters). */
  variables: readonly string[];
  /** Names that stand for a number (constants, fixed parameters, built-ins). */
  constants: Readonly<Record<string, number>>;
  /** Further names a writer may have meant (quantity mode's physical constants): offered in suggestions only. */
  suggestable?: readonly string[];
}

export type CheckResult = { ok: true; tree: MathNode } | { ok: false; token: string; message: string };

type Context = 'value' | 'condition';

/**
 * Parses expression text and accepts it only if every node is on the allow-list; the tree is
 * then data for our own compiler, never for mathjs's evaluator.
 */
export function checkExpression(text: string, scope: NameScope): CheckResult {
  if (text.length > MAX_EXPRESSION_LENGTH) {
    return { ok: false, token: text.slice(0, 20) + '...', message: `the expression is ${text.length} characters long; the limit is ${MAX_EXPRESSION_LENGTH}` };
  }
  if (text.trim() === '') return { ok: false, token: text, message: 'the expression is empty' };
  // A literal beyond the double range would reach the tree as Infinity, no longer as written.
  const huge = overflowingLiteral(text);
  if (huge) return { ok: false, token: huge, message: `the number ${huge} is too large for a double (the largest is about 1.8e308)` };
  let tree: MathNode;
  try {
    tree = parse(text);
  } catch (error) {
    if (error instanceof RangeError) return { ok: false, token: text.slice(0, 20) + '...', message: 'cannot read the expression: it nests too deeply' };
    const message = error instanceof Error ? error.message : String(error);
    // `**` is the power operator of several programming languages; mathjs reads the second * as a missing value.
    if (text.includes('**')) return { ok: false, token: '**', message: 'use ^ for powers: write x^2, not x**2' };
    const at = /char (\d+)/.exec(message);
    const token = at ? near(text, Number(at[1]) - 1) : text.slice(0, 40);
    return { ok: false, token, message: `cannot read the expression near "${token}": ${message}` };
  }
  const { depth } = treeShape(tree);
  if (depth > MAX_EXPRESSION_DEPTH) {
    return { ok: false, token: text.slice(0, 20) + '...', message: `the expression nests ${depth} levels deep; the limit is ${MAX_EXPRESSION_DEPTH} (each operator of a chain such as a + b + c adds a level)` };
  }
  const refusal = refuse(tree, scope, 'value');
  return refusal ? { ok: false, ...refusal } : { ok: true, tree };
}

/** The text around a parse error: a few characters before it for context, and the offending ones. */
function near(text: string, index: number): string {
  const excerpt = text.slice(Math.max(0, index - 12), index + 6).trim();
  return excerpt === '' ? text.slice(-12) : excerpt;
}

function overflowingLiteral(text: string): string | null {
  for (const match of text.matchAll(/(?<![A-Za-z_\d.])(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?/gi)) {
    if (!Number.isFinite(Number(match[0]))) return match[0];
  }
  return null;
}

function refuse(node: MathNode, scope: NameScope, context: Context): { token: string; message: string } | null {
  const any = node as MathNode & Record<string, unknown>;
  switch (node.type) {
    case 'ConstantNode': {
      const value = any.value;
      if (typeof value !== 'number') return { token: node.toString(), message: `only numbers may appear as literals, not ${node.toString()}` };
      if (!Number.isFinite(value)) return { token: node.toString(), message: `${node.toString()} is not a finite number; a record may use finite numbers only` };
      return context === 'value' ? null : notACondition(node);
    }
    case 'SymbolNode': {
      const name = any.name as string;
      if (declared(scope, name)) return context === 'value' ? null : notACondition(node);
      if ((RECORD_FUNCTIONS as readonly string[]).includes(name)) return { token: name, message: `unknown name ${name}: ${name} is a function, write ${name}(...)` };
      const near = nearestName(name, [...scope.variables, ...Object.keys(scope.constants), ...(scope.suggestable ?? [])]);
      const advice = near === null ? 'declare it under parameters or constants' : `did you mean ${near}? (or declare ${name} under parameters or constants)`;
      return { token: name, message: `unknown name ${name}: ${advice}` };
    }
    case 'ParenthesisNode':
      return refuse(any.content as MathNode, scope, context);
    case 'OperatorNode': {
      const fn = any.fn as string;
      const args = any.args as MathNode[];
      const unit = unitLiteral(any, scope);
      if (unit) return unit;
      if (ARITHMETIC.has(fn)) return context === 'value' ? first(args, scope, 'value') : notACondition(node);
      if (COMPARISON.has(fn)) return context === 'condition' ? first(args, scope, 'value') : { token: any.op as string, message: `a comparison (${any.op}) may only stand in the condition of c ? a : b` };
      if (LOGIC.has(fn)) return context === 'condition' ? first(args, scope, 'condition') : { token: any.op as string, message: `${any.op} may only stand in the condition of c ? a : b` };
      return { token: any.op as string, message: `operator ${any.op} is not allowed; use + - * / ^ and parentheses` };
    }
    case 'RelationalNode':
      return context === 'condition' ? first(any.params as MathNode[], scope, 'value') : { token: node.toString(), message: `a comparison (${node.toString()}) may only stand in the condition of c ? a : b` };
    case 'ConditionalNode':
      if (context !== 'value') return notACondition(node);
      return (
        refuse(any.condition as MathNode, scope, 'condition') ??
        refuse(any.trueExpr as MathNode, scope, 'value') ??
        refuse(any.falseExpr as MathNode, scope, 'value')
      );
    case 'FunctionNode': {
      const fnNode = any.fn as MathNode & { name?: string };
      if (fnNode.type !== 'SymbolNode' || !fnNode.name) return { token: node.toString(), message: `only the allowed functions may be called, by name, not ${node.toString()}` };
      const name = fnNode.name;
      if (!(RECORD_FUNCTIONS as readonly string[]).includes(name)) {
        return { token: name, message: `function ${name} is not allowed${suggest(name, RECORD_FUNCTIONS)}; allowed: ${RECORD_FUNCTIONS.join(', ')}` };
      }
      const args = any.args as MathNode[];
      const arity = ARITY[name] ?? 1;
      if (args.length !== arity) return { token: name, message: `${name} takes ${arity} argument${arity > 1 ? 's' : ''}, not ${args.length}` };
      return context === 'value' ? first(args, scope, 'value') : notACondition(node);
    }
    default:
    {
      const token = node.toString().slice(0, 40);
      return { token, message: `${describeNode(node.type)} is not allowed in an expression: ${token}` };
    }
  }
}

function suggest(name: string, candidates: readonly string[]): string {
  const near = nearestName(name, candidates);
  return near === null ? '' : ` (did you mean ${near}?)`;
}

/** Own keys only: inherited names such as constructor or __proto__ are not declarations. */
function declared(scope: NameScope, name: string): boolean {
  return scope.variables.includes(name) || Object.hasOwn(scope.constants, name);
}

/** `5 cm` in atomic units: mathjs reads a number followed by a unit as a quantity. (Quantity mode declares its units as constants.) */
function unitLiteral(node: MathNode & Record<string, unknown>, scope: NameScope): { token: string; message: string } | null {
  const [amount, unit] = node.args as MathNode[];
  if (node.fn !== 'multiply' || !node.implicit || amount.type !== 'ConstantNode' || unit.type !== 'SymbolNode') return null;
  const name = (unit as MathNode & { name: string }).name;
  if (declared(scope, name) || !Unit.isValuelessUnit(name)) return null;
  return { token: node.toString(), message: `${node.toString()} reads as a quantity in the unit ${name}; units belong to quantity mode (units: { length: nm, energy: meV }), in atomic units write a plain number` };
}

function first(nodes: MathNode[], scope: NameScope, context: Context) {
  for (const node of nodes) {
    const found = refuse(node, scope, context);
    if (found) return found;
  }
  return null;
}

function notACondition(node: MathNode) {
  return { token: node.toString(), message: `the condition of c ? a : b must be a comparison such as x < 1, not ${node.toString()}` };
}

function describeNode(type: string): string {
  const names: Record<string, string> = {
    AccessorNode: 'property or index access',
    ArrayNode: 'a matrix or list',
    AssignmentNode: 'assignment',
    BlockNode: 'a sequence of statements',
    FunctionAssignmentNode: 'a function definition',
    IndexNode: 'indexing',
    ObjectNode: 'an object',
    RangeNode: 'a range',
  };
  return names[type] ?? type;
}
