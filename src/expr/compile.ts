import type { ConditionalNode, ConstantNode, FunctionNode, MathNode, OperatorNode, SymbolNode } from 'mathjs';
import { erf } from './erf.ts';

/** A compiled expression: reads its variables from slots of one shared array, returns a plain number. */
export type Compiled = (slots: Float64Array) => number;

/**
 * A compiled subtree and, when it is a leaf, what it is: a number known now (a literal, a constant,
 * or any subtree that reads no slot) or one slot. Operators specialise on leaf operands so that
 * the hot loops make one closure call per operator rather than one per node.
 */
interface Part {
  run: Compiled;
  constant: number | null;
  slot: number | null;
}

const NO_SLOTS = new Float64Array(0);
const constantPart = (value: number): Part => ({ run: () => value, constant: value, slot: null });
const computed = (run: Compiled): Part => ({ run, constant: null, slot: null });

/** Whole powers up to this are multiplied out; the error of the binary method grows like log2 n ulp. */
const MAX_MULTIPLIED_POWER = 64;

/**
 * Compiles an allow-listed tree into nested closures over plain numbers, once, so the hot loops
 * never parse, look names up or touch mathjs. Subtrees that read no slot are folded to numbers.
 */
export function compileTree(node: MathNode, slotOf: Readonly<Record<string, number>>, constants: Readonly<Record<string, number>>): Compiled {
  let cache = compiledNodes.get(slotOf);
  if (!cache || cache.constants !== constants) {
    cache = { constants, parts: new WeakMap() };
    compiledNodes.set(slotOf, cache);
  }
  return compilePart(node, slotOf, constants, cache.parts).run;
}

/**
 * Symbolic derivatives reuse the node objects of the tree they come from (d exp(u) = exp(u) u'), so
 * compiling each node object once per slot layout makes a trial and its derivatives share closures,
 * and with them the one-value memo of their costly functions: at one x, exp(u) is computed once.
 */
const compiledNodes = new WeakMap<object, { constants: object; parts: WeakMap<MathNode, Part> }>();

function compilePart(node: MathNode, slotOf: Readonly<Record<string, number>>, constants: Readonly<Record<string, number>>, parts: WeakMap<MathNode, Part>): Part {
  const known = parts.get(node);
  if (known) return known;
  const part = compileNode(node, slotOf, constants, parts);
  parts.set(node, part);
  return part;
}

function compileNode(node: MathNode, slotOf: Readonly<Record<string, number>>, constants: Readonly<Record<string, number>>, parts: WeakMap<MathNode, Part>): Part {
  const c = (n: MathNode) => compilePart(n, slotOf, constants, parts);
  switch (node.type) {
    case 'ConstantNode':
      return constantPart((node as ConstantNode).value as number);
    case 'SymbolNode': {
      const name = (node as SymbolNode).name;
      // Own keys only: a constant named constructor must not find Object's.
      if (Object.hasOwn(slotOf, name)) {
        const slot = slotOf[name];
        return { run: (s) => s[slot], constant: null, slot };
      }
      const value = Object.hasOwn(constants, name) ? constants[name] : undefined;
      if (value === undefined) throw new Error(`name ${name} has no value: the allow-list should have refused it`);
      return constantPart(value);
    }
    case 'ParenthesisNode':
      return c((node as unknown as { content: MathNode }).content);
    case 'ConditionalNode': {
      const n = node as ConditionalNode;
      const test = c(n.condition);
      const yes = c(n.trueExpr);
      const no = c(n.falseExpr);
      // Only the branch taken is evaluated, at run time as here.
      if (test.constant !== null) return test.constant !== 0 ? yes : no;
      const [t, y, f] = [test.run, yes.run, no.run];
      return computed((s) => (t(s) !== 0 ? y(s) : f(s)));
    }
    case 'RelationalNode': {
      const n = node as unknown as { conditionals: string[]; params: MathNode[] };
      const parts = n.params.map(c);
      const terms = parts.map((p) => p.run);
      const tests = n.conditionals.map(comparison);
      return folded(parts, (s) => {
        let left = terms[0](s);
        for (let i = 0; i < tests.length; i++) {
          const right = terms[i + 1](s);
          if (!tests[i](left, right)) return 0;
          left = right;
        }
        return 1;
      });
    }
    case 'OperatorNode':
      return compileOperator(node as OperatorNode, c);
    case 'FunctionNode': {
      const n = node as FunctionNode;
      const parts = n.args.map(c);
      const [u, v] = parts.map((p) => p.run);
      const name = n.fn.name;
      if (name === 'min') return folded(parts, (s) => Math.min(u(s), v(s)));
      if (name === 'max') return folded(parts, (s) => Math.max(u(s), v(s)));
      const run = unaryFunction(name, u);
      if (!run) throw new Error(`function ${name} cannot be compiled: the allow-list should have refused it`);
      return folded(parts, run);
    }
    default:
      throw new Error(`${node.type} cannot be compiled: the allow-list should have refused it`);
  }
}

/** A subtree whose operands are all known numbers is a number itself; it is computed once, by the same closure. */
function folded(operands: Part[], run: Compiled): Part {
  return operands.every((p) => p.constant !== null) ? constantPart(run(NO_SLOTS)) : computed(run);
}

// One closure per function: a call site that only ever sees Math.exp lets the engine inline it.
function unaryFunction(name: string, u: Compiled): Compiled | null {
  switch (name) {
    case 'exp': return remembered(u, Math.exp);
    case 'log': return remembered(u, Math.log);
    case 'sqrt': return (s) => Math.sqrt(u(s));
    case 'abs': return (s) => Math.abs(u(s));
    case 'sign': return (s) => Math.sign(u(s));
    case 'sin': return (s) => Math.sin(u(s));
    case 'cos': return remembered(u, Math.cos);
    case 'tan': return (s) => Math.tan(u(s));
    case 'sinh': return (s) => Math.sinh(u(s));
    case 'cosh': return remembered(u, Math.cosh);
    case 'tanh': return (s) => Math.tanh(u(s));
    case 'sech': return remembered(u, (v) => 1 / Math.cosh(v));
    case 'erf': return (s) => erf(u(s));
    default: return null;
  }
}

/**
 * f(u) remembering its last argument and value: the trial and its derivatives call the same exp(u)
 * at the same point several times. Only for functions with f(-0) = f(+0), since the test u === last
 * does not tell the two zeros apart; NaN never matches, so it is always recomputed.
 */
function remembered(u: Compiled, f: (v: number) => number): Compiled {
  let last = NaN;
  let value = NaN;
  return (s) => {
    const v = u(s);
    if (v !== last) {
      last = v;
      value = f(v);
    }
    return value;
  };
}

function compileOperator(node: OperatorNode, c: (n: MathNode) => Part): Part {
  const parts = node.args.map(c);
  const [pa, pb] = parts;
  const a = pa.run;
  const b = pb?.run;
  switch (node.fn) {
    case 'unaryPlus':
      return pa;
    case 'unaryMinus': {
      if (pa.constant !== null) return constantPart(-pa.constant);
      const i = pa.slot;
      return computed(i !== null ? (s) => -s[i] : (s) => -a(s));
    }
    case 'add':
      return arithmetic(ADD, pa, pb);
    case 'subtract':
      return arithmetic(SUBTRACT, pa, pb);
    case 'multiply':
      return arithmetic(MULTIPLY, pa, pb);
    case 'divide':
      return arithmetic(DIVIDE, pa, pb);
    case 'pow': {
      if (pa.constant !== null && pb.constant !== null) return constantPart(pa.constant ** pb.constant);
      const n = pb.constant;
      if (n !== null && Number.isInteger(n) && n >= 2 && n <= MAX_MULTIPLIED_POWER) return computed(integerPower(pa, n));
      return computed(n !== null ? (s) => a(s) ** n : (s) => a(s) ** b(s));
    }
    case 'and':
      return folded(parts, (s) => (a(s) !== 0 && b(s) !== 0 ? 1 : 0));
    case 'or':
      return folded(parts, (s) => (a(s) !== 0 || b(s) !== 0 ? 1 : 0));
    case 'not':
      return folded(parts, (s) => (a(s) === 0 ? 1 : 0));
    default: {
      const test = comparison(node.fn as string);
      return folded(parts, (s) => (test(a(s), b(s)) ? 1 : 0));
    }
  }
}

/** One binary operation in every operand shape: two subtrees, or a number or a slot on either side. */
interface Arithmetic {
  subtrees(a: Compiled, b: Compiled): Compiled;
  numberLeft(k: number, b: Compiled): Compiled;
  numberRight(a: Compiled, k: number): Compiled;
  slotLeft(i: number, b: Compiled): Compiled;
  slotRight(a: Compiled, j: number): Compiled;
  slots(i: number, j: number): Compiled;
  numberSlot(k: number, j: number): Compiled;
  slotNumber(i: number, k: number): Compiled;
}

const ADD: Arithmetic = {
  subtrees: (a, b) => (s) => a(s) + b(s),
  numberLeft: (k, b) => (s) => k + b(s),
  numberRight: (a, k) => (s) => a(s) + k,
  slotLeft: (i, b) => (s) => s[i] + b(s),
  slotRight: (a, j) => (s) => a(s) + s[j],
  slots: (i, j) => (s) => s[i] + s[j],
  numberSlot: (k, j) => (s) => k + s[j],
  slotNumber: (i, k) => (s) => s[i] + k,
};
const SUBTRACT: Arithmetic = {
  subtrees: (a, b) => (s) => a(s) - b(s),
  numberLeft: (k, b) => (s) => k - b(s),
  numberRight: (a, k) => (s) => a(s) - k,
  slotLeft: (i, b) => (s) => s[i] - b(s),
  slotRight: (a, j) => (s) => a(s) - s[j],
  slots: (i, j) => (s) => s[i] - s[j],
  numberSlot: (k, j) => (s) => k - s[j],
  slotNumber: (i, k) => (s) => s[i] - k,
};
const MULTIPLY: Arithmetic = {
  subtrees: (a, b) => (s) => a(s) * b(s),
  numberLeft: (k, b) => (s) => k * b(s),
  numberRight: (a, k) => (s) => a(s) * k,
  slotLeft: (i, b) => (s) => s[i] * b(s),
  slotRight: (a, j) => (s) => a(s) * s[j],
  slots: (i, j) => (s) => s[i] * s[j],
  numberSlot: (k, j) => (s) => k * s[j],
  slotNumber: (i, k) => (s) => s[i] * k,
};
const DIVIDE: Arithmetic = {
  subtrees: (a, b) => (s) => a(s) / b(s),
  numberLeft: (k, b) => (s) => k / b(s),
  numberRight: (a, k) => (s) => a(s) / k,
  slotLeft: (i, b) => (s) => s[i] / b(s),
  slotRight: (a, j) => (s) => a(s) / s[j],
  slots: (i, j) => (s) => s[i] / s[j],
  numberSlot: (k, j) => (s) => k / s[j],
  slotNumber: (i, k) => (s) => s[i] / k,
};

function arithmetic(op: Arithmetic, left: Part, right: Part): Part {
  const [k, m, i, j] = [left.constant, right.constant, left.slot, right.slot];
  if (k !== null && m !== null) return constantPart(op.subtrees(left.run, right.run)(NO_SLOTS));
  if (k !== null) return computed(j !== null ? op.numberSlot(k, j) : op.numberLeft(k, right.run));
  if (m !== null) return computed(i !== null ? op.slotNumber(i, m) : op.numberRight(left.run, m));
  if (i !== null) return computed(j !== null ? op.slots(i, j) : op.slotLeft(i, right.run));
  return computed(j !== null ? op.slotRight(left.run, j) : op.subtrees(left.run, right.run));
}

/**
 * u^n for a small whole n by repeated squaring (Knuth, TAOCP vol. 2, 4.6.3, the binary method):
 * the engine's ** costs tens of nanoseconds, a multiply one, and the result is within a few ulp of u^n.
 */
function integerPower(base: Part, n: number): Compiled {
  const a = base.run;
  const i = base.slot;
  if (n === 2) return i !== null ? (s) => s[i] * s[i] : (s) => { const u = a(s); return u * u; };
  if (n === 3) return i !== null ? (s) => s[i] * s[i] * s[i] : (s) => { const u = a(s); return u * u * u; };
  if (n === 4) return (s) => { const u = a(s); const u2 = u * u; return u2 * u2; };
  return (s) => {
    let factor = a(s);
    let result = 1;
    for (let k = n; ; ) {
      if (k & 1) result *= factor;
      k >>= 1;
      if (k === 0) return result;
      factor *= factor;
    }
  };
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
