/** A number for a message: ten significant digits, no trailing zeros. */
export function g(value: number, digits = 10): string {
  if (!Number.isFinite(value)) return String(value);
  return String(Number(value.toPrecision(digits)));
}

/** How a check's detail states energies and parameter values: atomic units by default, the block's own in quantity mode. */
export interface ValueDisplay {
  energy(value: number, digits?: number): string;
  parameter(name: string, value: number, digits?: number): string;
}

export const ATOMIC_DISPLAY: ValueDisplay = {
  energy: (value, digits) => g(value, digits),
  parameter: (_name, value, digits) => g(value, digits),
};
