/** The virial ratio 2<T> / (k <V>) for a potential homogeneous of degree k, V(s x) = s^k V(x). */
export interface Virial {
  exponent: number;
  ratio: number;
}

const PROBES = [0.37, 0.83, 1.71, 2.9];

/**
 * Detects a power-law potential numerically (V(2x)/V(x) the same at every probe, confirmed at
 * s = 3) and returns the virial ratio, which is 1 at an optimum that is stationary under dilation.
 */
export function virialRatio(potential: (x: number) => number, twoSided: boolean, kinetic: number, potentialEnergy: number): Virial | null {
  const xs = twoSided ? [...PROBES, ...PROBES.map((x) => -x)] : PROBES;
  let exponent: number | null = null;
  for (const x of xs) {
    const v = potential(x);
    if (!Number.isFinite(v) || v === 0) return null;
    const k = Math.log2(potential(2 * x) / v);
    if (!Number.isFinite(k)) return null;
    if (exponent === null) exponent = k;
    else if (Math.abs(k - exponent) > 1e-9) return null;
    if (Math.abs(potential(3 * x) - 3 ** k * v) > 1e-9 * Math.abs(3 ** k * v)) return null;
  }
  if (exponent === null || Math.abs(exponent) < 1e-9 || potentialEnergy === 0) return null;
  const rounded = Math.abs(exponent - Math.round(exponent)) < 1e-9 ? Math.round(exponent) : exponent;
  return { exponent: rounded, ratio: (2 * kinetic) / (rounded * potentialEnergy) };
}
