import type { MathNode } from 'mathjs';
import type { DimensionScope } from './check-dimensions.ts';
import { ACTION, DIMENSIONLESS, type DimensionOrAny } from './dimension.ts';
import type { PhysicalName } from './physical-names.ts';
import { evaluateFixed } from './evaluate-fixed.ts';
import { analyseExpression } from './quantity-expression.ts';

/** A number or quantity as written in a block field, evaluated once in atomic units. */
export interface Quantity {
  atomic: number;
  dimension: DimensionOrAny;
  tree: MathNode;
  physical: Map<string, PhysicalName>;
}

export type QuantityReading = { ok: true; quantity: Quantity } | { ok: false; token: string; message: string };

/** Names a quantity may use besides mathjs units and constants (hbar is the reduced Planck constant, 1 in atomic units). */
export const QUANTITY_SCOPE: DimensionScope = {
  variables: {},
  constants: { pi: { dimension: DIMENSIONLESS, atomic: Math.PI }, e: { dimension: DIMENSIONLESS, atomic: Math.E }, hbar: { dimension: ACTION, atomic: 1 } },
};

/** Reads `0.067 electronMass`, `2 pi THz`, `-5.48 meV`, `12.9`: allow-listed, dimension-checked, evaluated. */
export function readQuantity(text: string): QuantityReading {
  const analysed = analyseExpression(text, QUANTITY_SCOPE);
  if (!analysed.ok) return analysed;
  const atomic = evaluateFixed(analysed.tree, QUANTITY_SCOPE, analysed.physical);
  if (!Number.isFinite(atomic)) return { ok: false, token: text, message: `${text} is not a finite number` };
  return { ok: true, quantity: { atomic, dimension: analysed.dimension, tree: analysed.tree, physical: analysed.physical } };
}
