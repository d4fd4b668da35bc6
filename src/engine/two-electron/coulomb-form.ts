import type { PointFunction } from '../problem.ts';
import type { TwoElectronHamiltonian } from './correlated-reference.ts';

/** Sample points (r1, r2, r12) inside the triangle |r1 - r2| <= r12 <= r1 + r2, spread over a few bohr. */
const SAMPLES: Array<[number, number, number]> = [
  [1, 1.5, 0.9], [0.4, 2.2, 2.0], [3.1, 0.7, 2.9], [1.3, 1.3, 0.2], [2.5, 2.0, 4.1], [0.15, 0.9, 0.8],
  [5.0, 4.0, 1.5], [0.8, 0.6, 1.3], [1.9, 3.7, 2.2], [7.0, 0.3, 6.9], [0.05, 0.05, 0.07], [12, 9, 19],
];
/** A potential of the Coulomb form matches its fit to rounding; anything else misses by far more. */
const FIT_TOLERANCE = 1e-9;

export type CoulombForm = { ok: true; strengths: Omit<TwoElectronHamiltonian, 'mass'> } | { ok: false; reason: string };

/**
 * Reads charge and coupling from a potential of the form -charge/r1 - charge/r2 + coupling/r12 (a helium-like ion of
 * nuclear charge Z: charge = Z, coupling = 1; a donor ion in a dielectric: both divided by eps_r): the three
 * coefficients solve the equations at three sample points, and every other sample point must agree.
 */
export function coulombForm(potential: PointFunction): CoulombForm {
  const point = new Float64Array(3);
  const at = ([r1, r2, r12]: [number, number, number]) => {
    point[0] = r1;
    point[1] = r2;
    point[2] = r12;
    return potential(point);
  };
  // Rows (-1/r1, -1/r2, 1/r12) at the first three samples, solved by Cramer's rule.
  const rows = SAMPLES.slice(0, 3).map(([r1, r2, r12]) => [-1 / r1, -1 / r2, 1 / r12]);
  const rhs = SAMPLES.slice(0, 3).map(at);
  const det = (m: number[][]) => m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
  const d = det(rows);
  const [a1, a2, c] = [0, 1, 2].map((k) => det(rows.map((row, i) => row.map((x, j) => (j === k ? rhs[i] : x)))) / d);
  for (const sample of SAMPLES) {
    const v = at(sample);
    const fit = -a1 / sample[0] - a2 / sample[1] + c / sample[2];
    if (!(Math.abs(v - fit) <= FIT_TOLERANCE * (Math.abs(a1 / sample[0]) + Math.abs(a2 / sample[1]) + Math.abs(c / sample[2])))) {
      return { ok: false, reason: `the potential is not of the form -Z/r1 - Z/r2 + c/r12 (at r1 = ${sample[0]}, r2 = ${sample[1]}, r12 = ${sample[2]} it is ${v.toPrecision(8)}, the form through three points gives ${fit.toPrecision(8)})` };
    }
  }
  if (!(Math.abs(a1 - a2) <= FIT_TOLERANCE * Math.abs(a1))) return { ok: false, reason: `the potential treats the two particles differently (${a1.toPrecision(8)}/r1 against ${a2.toPrecision(8)}/r2), so the exchange symmetry does not hold` };
  if (!(a1 > 0)) return { ok: false, reason: `the attraction to the centre, ${(-a1).toPrecision(8)}/r1, is not attractive: nothing is bound` };
  if (!(c >= 0)) return { ok: false, reason: `the interaction ${c.toPrecision(8)}/r12 is attractive; the correlated reference handles a repulsion (c >= 0) only` };
  return { ok: true, strengths: { charge: 0.5 * (a1 + a2), coupling: c } };
}
