/** A number for a message: ten significant digits, no trailing zeros. */
export function g(value: number, digits = 10): string {
  if (!Number.isFinite(value)) return String(value);
  return String(Number(value.toPrecision(digits)));
}

/**
 * How a check's detail states energies, lengths and parameter values: atomic units by default, the
 * block's own in quantity mode. Every detail that quotes a dimensioned number goes through one of these.
 */
export interface ValueDisplay {
  energy(value: number, digits?: number): string;
  parameter(name: string, value: number, digits?: number): string;
  /** A position or distance: a wall, a grid domain's end, a point where an integrand fails. */
  length(value: number, digits?: number): string;
  /** The norm integral of the trial (|psi|^2 dx, or |R|^2 r^2 dr on the half-line). */
  norm(value: number, digits?: number): string;
}

export const ATOMIC_DISPLAY: ValueDisplay = {
  energy: (value, digits) => g(value, digits),
  parameter: (_name, value, digits) => g(value, digits),
  length: (value, digits) => g(value, digits),
  norm: (value, digits) => g(value, digits),
};
