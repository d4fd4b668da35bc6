/** Limits shared by the trial and the basis evaluations; the audit trail lists them. */

/** A trial counts as vanishing at a wall when |psi(wall)| is below this fraction of its peak. */
export const WALL_TOLERANCE = 1e-8;
/** Energies whose quadrature error estimate exceeds this (relative) are not trusted. */
export const ENERGY_RELATIVE_ERROR_LIMIT = 1e-9;
/** Floor of the tolerance in comparisons between energies, relative to their size. */
export const COMPARISON_FLOOR = 1e-11;
