import { TriangleIntegrals } from './triangle-integrals.ts';

/** One exponent pair of a correlated basis and the largest total power i + j + k of its terms. */
export interface ExponentSet {
  alpha: number;
  beta: number;
  omega: number;
}

/** r1^i r2^j r12^k exp(-alpha r1 - beta r2), before symmetrisation. */
export interface CorrelatedTerm {
  i: number;
  j: number;
  k: number;
  alpha: number;
  beta: number;
}

/** +1 for spin singlets (space part symmetric under r1 <-> r2), -1 for triplets. */
export type ExchangeSign = 1 | -1;

/**
 * The terms of every set with i + j + k <= omega, symmetrised as t(r1, r2) + sign t(r2, r1). Where alpha = beta the
 * terms (i, j) and (j, i) give the same function, so only i <= j is kept (i < j for triplets, where i = j vanishes).
 */
export function correlatedTerms(sets: ExponentSet[], sign: ExchangeSign): CorrelatedTerm[] {
  const terms: CorrelatedTerm[] = [];
  for (const { alpha, beta, omega } of sets) {
    for (let total = 0; total <= omega; total++) {
      for (let k = 0; k <= total; k++) {
        for (let i = 0; i <= total - k; i++) {
          const j = total - k - i;
          if (alpha === beta && (sign === 1 ? i > j : i >= j)) continue;
          terms.push({ i, j, k, alpha, beta });
        }
      }
    }
  }
  return terms;
}

/**
 * Offsets (di, dj, dk) and coefficients of (laplacian_1 t) / t for t = r1^i r2^j r12^k exp(-alpha r1 - beta r2), from
 * the Laplacian of an S-state function of (r1, r2, r12) (Hylleraas, Z. Phys. 54, 347 (1929); Bethe & Salpeter,
 * Quantum Mechanics of One- and Two-Electron Atoms, 1957, §32):
 * laplacian_1 f = f_11 + 2 f_1 / r1 + f_uu + 2 f_u / u + (r1^2 - r2^2 + u^2) / (r1 u) f_1u, u = r12.
 * Laplacian 2 is the same with the electrons' roles swapped.
 */
function laplacianOne(i: number, k: number, alpha: number): Array<[number, number, number, number]> {
  return [
    [-2, 0, 0, i * (i + 1) + k * i],
    [-1, 0, 0, -2 * alpha * (i + 1) - k * alpha],
    [0, 0, 0, alpha * alpha],
    [0, 0, -2, k * (k + 1) + k * i],
    [-2, 2, -2, -k * i],
    [1, 0, -2, -k * alpha],
    [-1, 2, -2, k * alpha],
  ];
}

/** Overlap and Hamiltonian matrices of a symmetrised correlated basis. */
export interface CorrelatedMatrices {
  size: number;
  overlap: Float64Array;
  hamiltonian: Float64Array;
}

/**
 * S and H for H = -(1/2)(laplacian_1 + laplacian_2) - 1/r1 - 1/r2 + lambda / r12 (a helium-like ion in units of its
 * hydrogenic scale, lambda = 1/Z), every element a closed-form triangle integral (see TriangleIntegrals); the kinetic
 * element is <t'| -laplacian/2 |t>, whose powers stay non-negative once the volume element r1 r2 r12 is included.
 */
export function correlatedMatrices(terms: CorrelatedTerm[], sign: ExchangeSign, lambda: number): CorrelatedMatrices {
  const n = terms.length;
  const tables = new Map<string, TriangleIntegrals>();
  const table = (alpha: number, beta: number) => {
    const key = `${alpha},${beta}`;
    let found = tables.get(key);
    if (!found) tables.set(key, (found = new TriangleIntegrals(alpha, beta)));
    return found;
  };
  const element = (left: CorrelatedTerm, right: CorrelatedTerm): [number, number] => {
    const J = table(left.alpha + right.alpha, left.beta + right.beta);
    const a = left.i + right.i + 1;
    const b = left.j + right.j + 1;
    const c = left.k + right.k + 1;
    const s = J.value(a, b, c);
    let kinetic = 0;
    for (const [di, dj, dk, coef] of laplacianOne(right.i, right.k, right.alpha)) if (coef !== 0) kinetic += coef * J.value(a + di, b + dj, c + dk);
    for (const [dj, di, dk, coef] of laplacianOne(right.j, right.k, right.beta)) if (coef !== 0) kinetic += coef * J.value(a + di, b + dj, c + dk);
    const potential = -J.value(a - 1, b, c) - J.value(a, b - 1, c) + lambda * J.value(a, b, c - 1);
    return [s, -0.5 * kinetic + potential];
  };
  const overlap = new Float64Array(n * n);
  const hamiltonian = new Float64Array(n * n);
  for (let p = 0; p < n; p++) {
    for (let q = p; q < n; q++) {
      const right = terms[q];
      const [s1, h1] = element(terms[p], right);
      const [s2, h2] = element(terms[p], { i: right.j, j: right.i, k: right.k, alpha: right.beta, beta: right.alpha });
      // 8 pi^2 from the angles, 2 from <t + P t| O |t' + P t'> = 2 <t| O |t' + P t'> for an exchange-symmetric O.
      const factor = 16 * Math.PI * Math.PI;
      overlap[p * n + q] = overlap[q * n + p] = factor * (s1 + sign * s2);
      hamiltonian[p * n + q] = hamiltonian[q * n + p] = factor * (h1 + sign * h2);
    }
  }
  return { size: n, overlap, hamiltonian };
}
