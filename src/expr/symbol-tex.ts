import type { MathNode } from 'mathjs';

/** Physical constants by the symbols a reader knows them by (CODATA's notation). */
const CONSTANTS: Record<string, string> = {
  electronMass: 'm_e',
  protonMass: 'm_p',
  neutronMass: 'm_n',
  elementaryCharge: 'e',
  electricConstant: '\\varepsilon_0',
  magneticConstant: '\\mu_0',
  reducedPlanckConstant: '\\hbar',
  planckConstant: 'h',
  speedOfLight: 'c',
  bohrRadius: 'a_0',
  hartreeEnergy: 'E_h',
  boltzmann: 'k_B',
  fineStructure: '\\alpha',
  coulombConstant: 'k_e',
  bohrMagneton: '\\mu_B',
  rydberg: 'R_\\infty',
};

const GREEK = ['alpha', 'beta', 'gamma', 'delta', 'epsilon', 'zeta', 'eta', 'theta', 'iota', 'kappa', 'lambda', 'mu', 'nu', 'xi', 'pi', 'rho', 'sigma', 'tau', 'upsilon', 'phi', 'chi', 'psi', 'omega'];
// Short spellings writers use for the Greek letter; epsilon is set as the rounded form physicists write.
const ALIASES: Record<string, string> = { eps: '\\varepsilon', epsilon: '\\varepsilon', lam: '\\lambda', om: '\\omega' };

function greek(word: string): string | null {
  if (ALIASES[word]) return ALIASES[word];
  if (GREEK.includes(word)) return `\\${word}`;
  // Capitals that TeX has a letter for (the rest look like Latin capitals and stay as written).
  if (['Gamma', 'Delta', 'Theta', 'Lambda', 'Xi', 'Pi', 'Sigma', 'Upsilon', 'Phi', 'Psi', 'Omega'].includes(word)) return `\\${word}`;
  return null;
}

/**
 * A declared name (parameter, constant, coordinate) or a physical constant as a math symbol: always italic even
 * when it is also a unit's name (s, b, F), Greek names as letters, a trailing number or short tail as a subscript
 * (x0 -> x_0, epsr -> epsilon_r), longer names as one italic word.
 */
export function symbolTex(name: string): string {
  if (CONSTANTS[name]) return CONSTANTS[name];
  const whole = greek(name);
  if (whole) return whole;
  const digits = /^([A-Za-z]+?)_?(\d+)$/.exec(name);
  if (digits) return `${symbolTex(digits[1])}_{${digits[2]}}`;
  for (const prefix of [...Object.keys(ALIASES), ...GREEK].sort((a, b) => b.length - a.length)) {
    const tail = name.slice(prefix.length);
    if (name.startsWith(prefix) && tail.length > 0 && tail.length <= 2 && /^[a-z0-9]+$/.test(tail)) return `${greek(prefix)}_{\\mathrm{${tail}}}`;
  }
  if (name.length === 1) return name;
  return `\\mathit{${name}}`;
}

type Loose = { type: string; fn?: string; args?: MathNode[]; value?: unknown; content?: MathNode };

/** A term that starts with a minus sign: -u, a negative number, (-u), or a product or quotient led by one. */
function isNegative(node: MathNode): boolean {
  const n = node as unknown as Loose;
  if (n.type === 'ParenthesisNode') return isNegative(n.content!);
  if (n.type === 'ConstantNode') return typeof n.value === 'number' && n.value < 0;
  if (n.type !== 'OperatorNode') return false;
  if (n.fn === 'unaryMinus') return true;
  return (n.fn === 'multiply' || n.fn === 'divide') && isNegative(n.args![0]);
}

/** The same term with its leading minus taken off (the caller writes the sign). */
function negated(node: MathNode): MathNode {
  const n = node as unknown as Loose;
  if (n.type === 'ParenthesisNode') return negated(n.content!);
  if (n.type === 'ConstantNode') {
    const copy = node.clone() as unknown as { value: number };
    copy.value = -copy.value;
    return copy as unknown as MathNode;
  }
  if (n.fn === 'unaryMinus') return n.args![0];
  const copy = node.clone() as unknown as { args: MathNode[] };
  copy.args = [negated(n.args![0]), ...n.args!.slice(1)];
  return copy as unknown as MathNode;
}

/**
 * The toTex options every input is typeset with: `declared` and the physical constants through symbolTex, signs
 * folded so that no "+ (-1)/r" or "\frac{-1}{r}" appears.
 */
/** A fraction's bar groups its parts: no parentheses needed around them. */
const unwrap = (node: MathNode): MathNode => ((node as unknown as Loose).type === 'ParenthesisNode' ? unwrap((node as unknown as Loose).content!) : node);

export function texOptions(declared: ReadonlySet<string>): { handler: (node: MathNode, options: object) => string | undefined } {
  const handler = (node: MathNode, options: object): string | undefined => {
    if (node.type === 'SymbolNode') {
      const name = (node as unknown as { name: string }).name;
      if (declared.has(name) || CONSTANTS[name]) return ` ${symbolTex(name)}`;
      return undefined;
    }
    if (node.type === 'OperatorNode') {
      const { fn, args } = node as unknown as { fn: string; args: MathNode[] };
      if (fn === 'divide' && args.length === 2 && isNegative(args[0])) return `-\\frac{${unwrap(negated(args[0])).toTex(options)}}{${unwrap(args[1]).toTex(options)}}`;
      if ((fn === 'add' || fn === 'subtract') && args.length === 2 && isNegative(args[1])) {
        const right = negated(args[1]);
        const wrap = right.type === 'OperatorNode' && ['add', 'subtract'].includes((right as unknown as { fn: string }).fn);
        const inner = right.toTex(options);
        return `${args[0].toTex(options)}${fn === 'add' ? '-' : '+'}${wrap ? `\\left(${inner}\\right)` : inner}`;
      }
    }
    return undefined;
  };
  return { handler };
}
