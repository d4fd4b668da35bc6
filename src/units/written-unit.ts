import type { MathNode, OperatorNode, SymbolNode } from 'mathjs';
import { constantValue } from '../expr/build.ts';
import { toAtomic } from './atomic-scale.ts';
import type { Dimension } from './dimension.ts';
import type { PhysicalName } from './physical-names.ts';

/** A unit to state a value in, with its size in atomic units. */
export interface WrittenUnit {
  text: string;
  atomic: number;
}

const NUMBER_NAMES = new Set(['pi', 'e']);

/**
 * The unit an author wrote with a number: "nm^-2" of `0.5 nm^-2`, "meV nm^-2" of `0.5 meV/nm^2`,
 * "electronMass" of `0.067 electronMass`. Null for a plain number, or when the text is more than a
 * number times units and constants (a sum, a function), so there is no single unit to quote.
 */
export function writtenUnit(tree: MathNode, physical: ReadonlyMap<string, PhysicalName>): WrittenUnit | null {
  const powers = new Map<string, number>();
  if (!collectFactors(tree, 1, physical, powers)) return null;
  const factors = [...powers].filter(([, p]) => p !== 0);
  if (factors.length === 0) return null;
  return {
    text: factors.map(([name, p]) => (p === 1 ? name : `${name}^${p}`)).join(' '),
    atomic: factors.reduce((size, [name, p]) => size * physical.get(name)!.atomic ** p, 1),
  };
}

function collectFactors(node: MathNode, exponent: number, physical: ReadonlyMap<string, PhysicalName>, powers: Map<string, number>): boolean {
  switch (node.type) {
    case 'ConstantNode':
      return true;
    case 'SymbolNode': {
      const name = (node as SymbolNode).name;
      if (NUMBER_NAMES.has(name)) return true;
      if (!physical.has(name)) return false;
      powers.set(name, (powers.get(name) ?? 0) + exponent);
      return true;
    }
    case 'ParenthesisNode':
      return collectFactors((node as unknown as { content: MathNode }).content, exponent, physical, powers);
    case 'OperatorNode': {
      const n = node as OperatorNode;
      const [a, b] = n.args;
      if (n.fn === 'unaryMinus' || n.fn === 'unaryPlus') return collectFactors(a, exponent, physical, powers);
      if (n.fn === 'multiply') return collectFactors(a, exponent, physical, powers) && collectFactors(b, exponent, physical, powers);
      if (n.fn === 'divide') return collectFactors(a, exponent, physical, powers) && collectFactors(b, -exponent, physical, powers);
      if (n.fn === 'pow') {
        const p = constantValue(b);
        return p !== null && collectFactors(a, exponent * p, physical, powers);
      }
      return false;
    }
    default:
      return false;
  }
}

const SI_BASE = ['kg', 'm', 's', 'A', 'K'] as const;

/** The coherent SI unit of a dimension ("kg m^2 s^-2"), for values whose written unit cannot be quoted. */
export function siUnit(dimension: Dimension): WrittenUnit {
  const text = SI_BASE.flatMap((name, i) => (dimension[i] === 0 ? [] : [dimension[i] === 1 ? name : `${name}^${dimension[i]}`])).join(' ');
  return { text, atomic: toAtomic(1, dimension) };
}
