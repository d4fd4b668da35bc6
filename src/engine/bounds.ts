/** Bounds and consistency tests that follow from E = <H>, its variance and known levels. */

/**
 * Temple's lower bound E0 >= E - var / (E1 - E), valid when E < E1 (Temple, Proc. R. Soc. A 119, 276 (1928)),
 * where E1 is any lower bound to the first level above E0 (the next level, or the continuum threshold).
 */
export function templeBound(energy: number, variance: number | null, nextLevel: number | null): number | null {
  if (variance === null || nextLevel === null || !Number.isFinite(nextLevel) || !(energy < nextLevel)) return null;
  return energy - variance / (nextLevel - energy);
}

/** Weinstein's interval: [E - sigma, E + sigma] holds at least one eigenvalue (Weinstein, PNAS 20, 529 (1934)). */
export function weinsteinInterval(energy: number, variance: number | null): [number, number] | null {
  if (variance === null) return null;
  const sigma = Math.sqrt(Math.max(variance, 0));
  return [energy - sigma, energy + sigma];
}

/**
 * Eckart's criterion: the trial's overlap with the ground state obeys
 * |<psi|psi0>|^2 >= 1 - (E - E0) / (E1 - E0) (Eckart, Phys. Rev. 36, 878 (1930)).
 */
export function eckartOverlapFloor(energy: number, ground: number, nextLevel: number | null): number | null {
  if (nextLevel === null || !Number.isFinite(nextLevel) || !(nextLevel > ground)) return null;
  return 1 - (energy - ground) / (nextLevel - ground);
}
