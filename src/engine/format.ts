/** A number for a message: ten significant digits, no trailing zeros. */
export function g(value: number, digits = 10): string {
  if (!Number.isFinite(value)) return String(value);
  return String(Number(value.toPrecision(digits)));
}
