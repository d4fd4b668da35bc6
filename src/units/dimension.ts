/**
 * Physical dimensions as exponents of the five SI base dimensions a Hamiltonian can involve.
 * Plane angle counts as dimensionless (SI Brochure, 9th ed., 2.3.3), so rad and deg are plain factors.
 */
export type Dimension = readonly [mass: number, length: number, time: number, current: number, temperature: number];

/** A literal zero: it may stand beside a term of any dimension (`x < 0`, `c ? V0 : 0`). */
export const ANY = 'any' as const;
export type DimensionOrAny = Dimension | typeof ANY;

export const DIMENSIONLESS: Dimension = [0, 0, 0, 0, 0];
export const MASS: Dimension = [1, 0, 0, 0, 0];
export const LENGTH: Dimension = [0, 1, 0, 0, 0];
export const ENERGY: Dimension = [1, 2, -2, 0, 0];
export const ACTION: Dimension = [1, 2, -1, 0, 0];

const BASE_NAMES = ['mass', 'length', 'time', 'current', 'temperature'] as const;
/** Exponents that come from halving (sqrt) are compared to this absolute tolerance. */
const EXPONENT_TOLERANCE = 1e-12;

/** mathjs lists nine base dimensions; these are the ones beyond our five and what they measure. */
const MATHJS_EXTRA = ['luminous intensity', 'amount of substance', 'angle', 'information'] as const;

export function multiply(a: DimensionOrAny, b: DimensionOrAny): DimensionOrAny {
  if (a === ANY || b === ANY) return ANY;
  return a.map((exponent, i) => exponent + b[i]) as unknown as Dimension;
}

export function power(a: DimensionOrAny, exponent: number): DimensionOrAny {
  if (a === ANY) return ANY;
  return a.map((e) => e * exponent) as unknown as Dimension;
}

export function sameDimension(a: Dimension, b: Dimension): boolean {
  return a.every((exponent, i) => Math.abs(exponent - b[i]) < EXPONENT_TOLERANCE);
}

export function isDimensionless(d: DimensionOrAny): boolean {
  return d === ANY || sameDimension(d, DIMENSIONLESS);
}

/** The dimension two terms share, `any` giving way to the other; null when they disagree. */
export function unify(a: DimensionOrAny, b: DimensionOrAny): DimensionOrAny | null {
  if (a === ANY) return b;
  if (b === ANY) return a;
  return sameDimension(a, b) ? a : null;
}

/** A mathjs Unit's `dimensions` array as ours, or what it measures that a Hamiltonian cannot. */
export function fromMathjs(dimensions: readonly number[]): { ok: true; dimension: Dimension } | { ok: false; measures: string } {
  for (let k = 0; k < MATHJS_EXTRA.length; k++) {
    if (MATHJS_EXTRA[k] !== 'angle' && dimensions[5 + k] !== 0) return { ok: false, measures: MATHJS_EXTRA[k] };
  }
  return { ok: true, dimension: dimensions.slice(0, 5) as unknown as Dimension };
}

const NAMED: Array<[Dimension, string]> = [
  [MASS, 'mass'],
  [LENGTH, 'length'],
  [[0, 0, 1, 0, 0], 'time'],
  [[0, 0, 0, 0, 1], 'temperature'],
  [ENERGY, 'energy'],
  [ACTION, 'action (energy times time)'],
  [[0, 0, -1, 0, 0], 'frequency'],
  [[0, 0, 1, 1, 0], 'charge'],
];

/** The name of a dimension ("energy") or its formula in base dimensions ("length^-2"). */
export function dimensionName(d: Dimension): string {
  if (sameDimension(d, DIMENSIONLESS)) return 'no dimension';
  const named = NAMED.find(([candidate]) => sameDimension(candidate, d));
  if (named) return named[1];
  return BASE_NAMES.flatMap((name, i) => (Math.abs(d[i]) < EXPONENT_TOLERANCE ? [] : [d[i] === 1 ? name : `${name}^${round(d[i])}`])).join(' ');
}

/** Words for a dimension as they read after "is": "an energy", "dimensionless", "of dimension length^-2". */
export function describeDimension(d: DimensionOrAny): string {
  if (d === ANY) return 'zero';
  if (sameDimension(d, DIMENSIONLESS)) return 'dimensionless';
  const name = dimensionName(d);
  if (!NAMED.some(([, n]) => n === name)) return `of dimension ${name}`;
  return /^[aeiou]/.test(name) ? `an ${name}` : `a ${name}`;
}

function round(exponent: number): string {
  return String(Math.round(exponent * 1e6) / 1e6);
}
