/**
 * A fraction of a unit in the last written digit of a number: the tolerance a practitioner
 * means by writing "0.5591" without one. Half a unit for a rounded figure; a whole unit for
 * published tables, which are often truncated (common practice).
 */
export function writtenPrecision(source: string, value: number, unitFraction: 0.5 | 1 = 0.5): number {
  const match = /^[+-]?(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/.exec(source.trim());
  if (!match) return Math.abs(value) * 5e-16;
  const decimals = match[2]?.length ?? 0;
  const exponent = match[3] ? Number(match[3]) : 0;
  return unitFraction * 10 ** (exponent - decimals);
}
