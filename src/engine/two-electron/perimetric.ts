/** 8 pi^2 from the angles of an S state, times 1/4 from dr1 dr2 dr12 = du dv dw / 4. */
export const PERIMETRIC_WEIGHT = 2 * Math.PI * Math.PI;

/**
 * r1 = (u + v)/2, r2 = (u + w)/2, r12 = (v + w)/2 from the perimetric coordinates u, v, w >= 0 (Pekeris, Phys. Rev. 112,
 * 1649 (1958)): the triangle |r1 - r2| <= r12 <= r1 + r2 is the octant.
 */
export function fromPerimetric(point: ArrayLike<number>, out: Float64Array): Float64Array {
  const u = point[0];
  const v = point[1];
  const w = point[2];
  out[0] = 0.5 * (u + v);
  out[1] = 0.5 * (u + w);
  out[2] = 0.5 * (v + w);
  return out;
}

/** The six orderings of (u, v, w): which perimetric coordinate is the largest, the middle and the smallest. */
const ORDERINGS = [[0, 1, 2], [0, 2, 1], [1, 0, 2], [1, 2, 0], [2, 0, 1], [2, 1, 0]] as const;
/**
 * One of each pair of orderings that exchanging v and w (r1 <-> r2) maps onto each other: an integrand that is even
 * under the exchange (|psi|^2, the energy densities and |(H - E) psi|^2 of a trial of either symmetry with a symmetric
 * potential) integrates to twice its sum over these.
 */
export const EXCHANGE_REPRESENTATIVES = [0, 2, 3] as const;

/**
 * The cubature's coordinates (q, s, t) in [0, inf) x [0, 1] x [0, 1]: in each of the six orderings of the perimetric
 * coordinates the largest is q, the middle q s, the smallest q s t, so du dv dw = q^2 s dq ds dt (Duffy's transformation,
 * SIAM J. Numer. Anal. 19, 1260 (1982), applied to the octant's edges). Each r1, r2, r12 is then q times a factor that is
 * either bounded below or s itself, so the Jacobian absorbs the 1/r1, 1/r2, 1/r12 singularities of |(H - E) psi|^2 and
 * the integrands are smooth; the exponential decay is in q alone. Writes the r-point of ordering k and returns the
 * volume element there (8 pi^2 r1 r2 r12 / 4 times the Jacobian).
 */
export function simplexPoint(point: ArrayLike<number>, ordering: number, out: Float64Array): number {
  const q = point[0];
  const s = point[1];
  const t = point[2];
  const [first, second, third] = ORDERINGS[ordering];
  const uvw = SCRATCH;
  uvw[first] = q;
  uvw[second] = q * s;
  uvw[third] = q * s * t;
  fromPerimetric(uvw, out);
  return PERIMETRIC_WEIGHT * out[0] * out[1] * out[2] * q * q * s;
}
const SCRATCH = new Float64Array(3);
