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

/** What the result states about the virial theorem: a ratio where it applies, or why none is given. */
export interface VirialReport {
  virial: Virial | null;
  /** Why a power-law potential gets no ratio; null when the ratio is given or the potential is not a power law. */
  virialNote: string | null;
}

export const WALL_VIRIAL_NOTE = 'no virial theorem with hard walls away from the origin';
export const MASS_VIRIAL_NOTE = 'no virial theorem in this form with a position-dependent mass';

/**
 * The virial ratio where the theorem 2<T> = k<V> holds: the dilation psi(x) -> psi(s x) must keep the
 * trial in its domain, so every hard wall must sit at the origin (the half-line; a radial problem).
 * A wall at a != 0 adds the surface term (hbar^2/2m) [x |psi'|^2] over the walls to the exact
 * relation (hypervirial theorem with a boundary term; e.g. a particle in [0, L] with V = 0 has
 * 2<T> = (hbar^2/2m) L |psi'(L)|^2, not 0; Fernandez & Castro, Hypervirial Theorems, Springer 1987,
 * from memory), so a ratio there measures the wall, not the trial. The theorem in this form also
 * rests on a constant mass (a mass m(x) scales with the dilation too).
 */
export function virialReport(potential: (x: number) => number, walls: readonly number[], twoSided: boolean, kinetic: number, potentialEnergy: number, massVaries = false): VirialReport {
  const virial = virialRatio(potential, twoSided, kinetic, potentialEnergy);
  if (virial && massVaries) return { virial: null, virialNote: MASS_VIRIAL_NOTE };
  if (virial && walls.some((wall) => wall !== 0)) return { virial: null, virialNote: WALL_VIRIAL_NOTE };
  return { virial, virialNote: null };
}
