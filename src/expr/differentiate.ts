import type { ConditionalNode, FunctionNode, MathNode, OperatorNode, SymbolNode } from 'mathjs';
import { add, call, conditional, constantValue, div, mul, neg, num, pow, smaller, sub, sym } from './build.ts';

/**
 * Symbolic derivative d/d(variable) of an allow-listed tree by the chain, product and quotient
 * rules; kinks (abs, min, max, conditionals) get their one-sided derivatives away from the switch point.
 */
export function differentiate(node: MathNode, variable: string): MathNode {
  const d = (n: MathNode) => differentiate(n, variable);
  switch (node.type) {
    case 'ConstantNode':
      return num(0);
    case 'SymbolNode':
      return num((node as SymbolNode).name === variable ? 1 : 0);
    case 'ParenthesisNode':
      return d((node as unknown as { content: MathNode }).content);
    case 'ConditionalNode': {
      const c = node as ConditionalNode;
      return conditional(c.condition, d(c.trueExpr), d(c.falseExpr));
    }
    case 'OperatorNode':
      return differentiateOperator(node as OperatorNode, variable);
    case 'FunctionNode':
      return differentiateFunction(node as FunctionNode, variable);
    default:
      throw new Error(`cannot differentiate ${node.type}: the allow-list should have refused it`);
  }
}

function differentiateOperator(node: OperatorNode, variable: string): MathNode {
  const [u, v] = node.args;
  const d = (n: MathNode) => differentiate(n, variable);
  switch (node.fn) {
    case 'unaryPlus':
      return d(u);
    case 'unaryMinus':
      return neg(d(u));
    case 'add':
      return add(d(u), d(v));
    case 'subtract':
      return sub(d(u), d(v));
    case 'multiply':
      return add(mul(d(u), v), mul(u, d(v)));
    case 'divide': {
      const du = d(u);
      const dv = d(v);
      if (constantValue(dv) === 0) return div(du, v);
      return div(sub(mul(du, v), mul(u, dv)), pow(v, num(2)));
    }
    case 'pow': {
      const du = d(u);
      const dv = d(v);
      if (constantValue(dv) === 0) {
        const exponent = constantValue(v);
        const lowered = exponent === null ? pow(u, sub(v, num(1))) : pow(u, num(exponent - 1));
        return mul(mul(v, lowered), du);
      }
      // u^v = exp(v log u): d = u^v (v' log u + v u'/u)
      return mul(node, add(mul(dv, call('log', u)), div(mul(v, du), u)));
    }
    default:
      throw new Error(`cannot differentiate operator ${node.fn}: the allow-list should have refused it`);
  }
}

function differentiateFunction(node: FunctionNode, variable: string): MathNode {
  const name = node.fn.name;
  const [u, v] = node.args;
  const du = differentiate(u, variable);
  const chain = (outer: MathNode) => mul(outer, du);
  switch (name) {
    case 'exp':
      return chain(node);
    case 'log':
      return div(du, u);
    case 'sqrt':
      return div(du, mul(num(2), node));
    case 'abs':
      return chain(call('sign', u));
    case 'sign':
      return num(0);
    case 'sin':
      return chain(call('cos', u));
    case 'cos':
      return neg(chain(call('sin', u)));
    case 'tan':
      return div(du, pow(call('cos', u), num(2)));
    case 'sinh':
      return chain(call('cosh', u));
    case 'cosh':
      return chain(call('sinh', u));
    case 'tanh':
      return chain(pow(call('sech', u), num(2)));
    case 'sech':
      return neg(chain(mul(node, call('tanh', u))));
    case 'erf':
      // d erf(u)/du = 2/sqrt(pi) exp(-u^2) (Abramowitz & Stegun 7.1.19)
      return chain(mul(div(num(2), call('sqrt', sym('pi'))), call('exp', neg(pow(u, num(2))))));
    case 'min':
    case 'max': {
      const dv = differentiate(v, variable);
      const firstWins = name === 'min' ? smaller(u, v) : smaller(v, u);
      return conditional(firstWins, du, dv);
    }
    default:
      throw new Error(`cannot differentiate ${name}: the allow-list should have refused it`);
  }
}

/** Whether a tree depends on a name (used to keep constant exponents in the power rule simple). */
export function dependsOn(node: MathNode, name: string): boolean {
  let found = false;
  node.traverse((n) => {
    if (n.type === 'SymbolNode' && (n as SymbolNode).name === name) found = true;
  });
  return found;
}
