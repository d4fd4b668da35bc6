import type { ConditionalNode, ConstantNode, FunctionNode, MathNode, OperatorNode, SymbolNode } from 'mathjs';
import { erf } from './erf.ts';

/** A compiled expression: reads its variables from slots of one shared array, returns a plain number. */
export type Compiled = (slots: Float64Array) => number;

const FUNCTIONS: Record<string, (u: number) => number> = {
  exp: Math.exp,
  log: Math.log,
  sqrt: Math.sqrt,
  abs: Math.abs,
  sign: Math.sign,
  sin: Math.sin,
  cos: Math.cos,
  tan: Math.tan,
  sinh: Math.sinh,
  cosh: Math.cosh,
  tanh: Math.tanh,
  sech: (u) => 1 / Math.cosh(u),
  erf,
};

/**
 * Compiles an allow-listed tree into nested closures over plain numbers, once, so the hot loops
 * never parse, look names up or touch mathjs. Constants are folded in as numbers.
 */
export function compileTree(node: MathNode, slotOf: Readonly<Record<string, number>>, constants: Readonly<Record<string, number>>): Compiled {
  const c = (n: MathNode) => compileTree(n, slotOf, constants);
  switch (node.type) {
    case 'ConstantNode': {
      const value = (node as ConstantNode).value as number;
      return () => value;
    }
    case 'SymbolNode': {
      const name = (node as SymbolNode).name;
      // Own keys only: a constant named constructor must not find Object's.
      if (Object.hasOwn(slotOf, name)) {
        const slot = slotOf[name];
        return (s) => s[slot];
      }
      const value = Object.hasOwn(constants, name) ? constants[name] : undefined;
      if (value === undefined) throw new Error(`name ${name} has no value: the allow-list should have refused it`);
      return () => value;
    }
    case 'ParenthesisNode':
      return c((node as unknown as { content: MathNode }).content);
    case 'ConditionalNode': {
      const n = node as ConditionalNode;
      const test = c(n.condition);
      const yes = c(n.trueExpr);
      const no = c(n.falseExpr);
      return (s) => (test(s) !== 0 ? yes(s) : no(s));
    }
    case 'RelationalNode': {
      const n = node as unknown as { conditionals: string[]; params: MathNode[] };
      const terms = n.params.map(c);
      const tests = n.conditionals.map(comparison);
      return (s) => {
        let left = terms[0](s);
        for (let i = 0; i < tests.length; i++) {
          const right = terms[i + 1](s);
          if (!tests[i](left, right)) return 0;
          left = right;
        }
        return 1;
      };
    }
    case 'OperatorNode':
      return compileOperator(node as OperatorNode, c);
    case 'FunctionNode': {
      const n = node as FunctionNode;
      const args = n.args.map(c);
      if (n.fn.name === 'min') return (s) => Math.min(args[0](s), args[1](s));
      if (n.fn.name === 'max') return (s) => Math.max(args[0](s), args[1](s));
      const f = FUNCTIONS[n.fn.name];
      if (!f) throw new Error(`function ${n.fn.name} cannot be compiled: the allow-list should have refused it`);
      const u = args[0];
      return (s) => f(u(s));
    }
    default:
      throw new Error(`${node.type} cannot be compiled: the allow-list should have refused it`);
  }
}

function compileOperator(node: OperatorNode, c: (n: MathNode) => Compiled): Compiled {
  const args = node.args.map(c);
  const [a, b] = args;
  switch (node.fn) {
    case 'unaryPlus':
      return a;
    case 'unaryMinus':
      return (s) => -a(s);
    case 'add':
      return (s) => a(s) + b(s);
    case 'subtract':
      return (s) => a(s) - b(s);
    case 'multiply':
      return (s) => a(s) * b(s);
    case 'divide':
      return (s) => a(s) / b(s);
    case 'pow': {
      const exponent = node.args[1].type === 'ConstantNode' ? ((node.args[1] as ConstantNode).value as number) : null;
      // Squares dominate trial functions; a multiply is exact and far cheaper than Math.pow.
      if (exponent === 2) return (s) => { const u = a(s); return u * u; };
      return (s) => a(s) ** b(s);
    }
    case 'and':
      return (s) => (a(s) !== 0 && b(s) !== 0 ? 1 : 0);
    case 'or':
      return (s) => (a(s) !== 0 || b(s) !== 0 ? 1 : 0);
    case 'not':
      return (s) => (a(s) === 0 ? 1 : 0);
    default: {
      const test = comparison(node.fn as string);
      return (s) => (test(a(s), b(s)) ? 1 : 0);
    }
  }
}

function comparison(fn: string): (a: number, b: number) => boolean {
  switch (fn) {
    case 'smaller': return (a, b) => a < b;
    case 'larger': return (a, b) => a > b;
    case 'smallerEq': return (a, b) => a <= b;
    case 'largerEq': return (a, b) => a >= b;
    case 'equal': return (a, b) => a === b;
    case 'unequal': return (a, b) => a !== b;
    default: throw new Error(`operator ${fn} cannot be compiled: the allow-list should have refused it`);
  }
}
