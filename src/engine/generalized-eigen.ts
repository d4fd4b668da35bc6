// Small dense symmetric eigenproblems: H c = E S c for the linear variational method, where S may be
// nearly singular because the basis is nearly linearly dependent.

export interface SymmetricEigen {
  /** Eigenvalues, ascending. */
  values: Float64Array;
  /** Eigenvectors as columns, row-major n x n, in the order of `values`; orthonormal. */
  vectors: Float64Array;
  sweeps: number;
  rotations: number;
  converged: boolean;
}

export const JACOBI_DEFAULTS = {
  // Cyclic Jacobi converges quadratically once off-diagonal elements are small; 50 sweeps is far beyond
  // what any matrix of a few dozen rows needs, so hitting it means something is wrong (NaN input).
  maxSweeps: 50,
} as const;

/**
 * Eigenpairs of a symmetric matrix (row-major n x n) by the cyclic-by-row Jacobi method with Rutishauser's
 * updates (Golub & Van Loan, Matrix Computations, 4th ed. 2013, Alg. 8.5.3; Rutishauser, Handbook for
 * Automatic Computation II, contribution II/1, 1971). Chosen over a QR-based solver because a rotation is
 * skipped only when |a_pq| <= eps sqrt(|a_pp a_qq|), which computes the small eigenvalues of a positive
 * definite matrix to high relative accuracy (Demmel & Veselić, SIAM J. Matrix Anal. Appl. 13, 1204 (1992)):
 * those small eigenvalues of S decide which basis directions are dropped.
 */
export function jacobiEigen(matrix: ArrayLike<number>, size: number): SymmetricEigen {
  if (matrix.length !== size * size) throw new RangeError(`jacobiEigen: expected ${size * size} entries, got ${matrix.length}`);
  const a = Float64Array.from(matrix);
  const v = new Float64Array(size * size);
  for (let i = 0; i < size; i++) v[i * size + i] = 1;
  let norm = 0;
  for (let k = 0; k < a.length; k++) norm += a[k] * a[k];
  // Below this an off-diagonal element is negligible against the whole matrix even where its diagonal is 0.
  const floor = Number.EPSILON * Number.EPSILON * Math.sqrt(norm);
  let sweeps = 0;
  let rotations = 0;
  let converged = false;
  while (sweeps < JACOBI_DEFAULTS.maxSweeps) {
    let rotated = false;
    for (let p = 0; p < size - 1; p++) {
      for (let q = p + 1; q < size; q++) {
        const apq = a[p * size + q];
        const app = a[p * size + p];
        const aqq = a[q * size + q];
        if (Math.abs(apq) <= Math.max(Number.EPSILON * Math.sqrt(Math.abs(app * aqq)), floor)) continue;
        rotated = true;
        rotations++;
        const tau = (aqq - app) / (2 * apq);
        // The smaller root of t^2 + 2 tau t - 1 = 0 keeps the rotation angle below pi/4.
        const t = Math.abs(tau) > 1e150 ? 1 / (2 * tau) : Math.sign(tau || 1) / (Math.abs(tau) + Math.sqrt(1 + tau * tau));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = t * c;
        a[p * size + p] = app - t * apq;
        a[q * size + q] = aqq + t * apq;
        a[p * size + q] = a[q * size + p] = 0;
        for (let r = 0; r < size; r++) {
          if (r !== p && r !== q) {
            const arp = a[r * size + p];
            const arq = a[r * size + q];
            a[r * size + p] = a[p * size + r] = c * arp - s * arq;
            a[r * size + q] = a[q * size + r] = s * arp + c * arq;
          }
          const vrp = v[r * size + p];
          const vrq = v[r * size + q];
          v[r * size + p] = c * vrp - s * vrq;
          v[r * size + q] = s * vrp + c * vrq;
        }
      }
    }
    sweeps++;
    if (!rotated) {
      converged = true;
      break;
    }
  }
  const order = Array.from({ length: size }, (_, i) => i).sort((i, j) => a[i * size + i] - a[j * size + j]);
  const values = Float64Array.from(order, (i) => a[i * size + i]);
  const vectors = new Float64Array(size * size);
  order.forEach((from, to) => {
    for (let r = 0; r < size; r++) vectors[r * size + to] = v[r * size + from];
  });
  return { values, vectors, sweeps, rotations, converged };
}

export interface GeneralizedEigen {
  /** Eigenvalues E of H c = E S c in the kept subspace, ascending. */
  values: Float64Array;
  /** Coefficient vectors in the original basis, one per value, normalised to c^T S c = 1. */
  vectors: Float64Array[];
  /** Eigenvalues of S scaled to unit diagonal, ascending: their spread measures linear dependence. */
  overlapEigenvalues: Float64Array;
  /** Largest over smallest eigenvalue of the unit-diagonal S (Infinity when the smallest is not positive: S is singular to rounding). */
  conditionNumber: number;
  /** Largest over smallest kept eigenvalue: the conditioning of the subspace actually solved in (NaN when none is kept). */
  keptConditionNumber: number;
  /** Directions of S dropped for eigenvalues at or below cutoff. */
  dropped: number;
  /** The cutoff on the unit-diagonal S's eigenvalues: the larger of relativeThreshold * largest and the noise floor. */
  cutoff: number;
  /** Weyl bound ||D dS D||_F on how far the errors of S can move its unit-diagonal eigenvalues (0 without errors). */
  noiseFloor: number;
  sweeps: number;
  converged: boolean;
  message: string | null;
}

export const GENERALIZED_DEFAULTS = {
  // Overlap eigenvalues at or below this fraction of the largest are dropped even when the errors of S are
  // smaller: a kept direction with eigenvalue s amplifies the rounding of H and S (about 1e-15) by 1/s, so at
  // 1e-12 its Rayleigh quotient is still good to a few parts in a thousand and cannot turn into a spurious
  // low level, while the directions a smooth basis needs are kept.
  relativeThreshold: 1e-12,
} as const;

/**
 * H c = E S c for a symmetric H and a positive semi-definite S (row-major n x n) by canonical
 * orthogonalisation (Löwdin, Adv. Phys. 5, 1 (1956); Szabo & Ostlund, Modern Quantum Chemistry, 1982, §3.4.5):
 * S is scaled to unit diagonal, diagonalised, directions with eigenvalue at or below the cutoff are dropped,
 * the rest are scaled by s^-1/2, and H in that orthonormal basis is diagonalised. The cutoff is the larger of
 * relativeThreshold * largest and, when the absolute errors of S are given, the Weyl bound on how far they can
 * move an eigenvalue (Golub & Van Loan, Matrix Computations, 4th ed. 2013, Thm 8.1.6): an eigenvalue below it
 * cannot be told from zero.
 */
export function solveGeneralized(
  h: ArrayLike<number>,
  s: ArrayLike<number>,
  size: number,
  relativeThreshold: number = GENERALIZED_DEFAULTS.relativeThreshold,
  overlapErrors?: ArrayLike<number>,
): GeneralizedEigen {
  if (h.length !== size * size || s.length !== size * size) throw new RangeError(`solveGeneralized: expected ${size * size} entries per matrix`);
  if (!(relativeThreshold >= 0 && relativeThreshold < 1)) throw new RangeError('solveGeneralized: relativeThreshold must lie in [0, 1)');
  const fail = (message: string): GeneralizedEigen => ({
    values: new Float64Array(0), vectors: [], overlapEigenvalues: new Float64Array(0), conditionNumber: NaN, keptConditionNumber: NaN,
    dropped: 0, cutoff: NaN, noiseFloor: NaN, sweeps: 0, converged: false, message,
  });
  for (let k = 0; k < size * size; k++) {
    if (!Number.isFinite(h[k]) || !Number.isFinite(s[k])) return fail(`matrix element ${Math.floor(k / size)},${k % size} is not finite`);
  }
  // Unit diagonal makes the threshold and the condition number independent of how each function is normalised.
  const d = new Float64Array(size);
  for (let i = 0; i < size; i++) {
    const sii = s[i * size + i];
    if (!(sii > 0)) return fail(`function ${i} has overlap <${i}|${i}> = ${sii}, so it is zero or S is not an overlap matrix`);
    d[i] = 1 / Math.sqrt(sii);
  }
  const scaledS = new Float64Array(size * size);
  const scaledH = new Float64Array(size * size);
  for (let i = 0; i < size; i++) {
    for (let j = 0; j < size; j++) {
      scaledS[i * size + j] = d[i] * d[j] * 0.5 * (s[i * size + j] + s[j * size + i]);
      scaledH[i * size + j] = d[i] * d[j] * 0.5 * (h[i * size + j] + h[j * size + i]);
    }
  }
  const overlap = jacobiEigen(scaledS, size);
  const largest = overlap.values[size - 1];
  const smallest = overlap.values[0];
  const conditionNumber = smallest > 0 ? largest / smallest : Infinity;
  let noise = 0;
  if (overlapErrors) {
    for (let i = 0; i < size; i++) for (let j = 0; j < size; j++) noise += (d[i] * d[j] * overlapErrors[i * size + j]) ** 2;
  }
  const noiseFloor = Math.sqrt(noise);
  const cutoff = Math.max(relativeThreshold * largest, noiseFloor);
  const kept: number[] = [];
  for (let k = 0; k < size; k++) if (overlap.values[k] > cutoff) kept.push(k);
  const m = kept.length;
  // X = U_kept s^-1/2 maps the orthonormal combinations back to the scaled basis; X^T S' X = 1.
  const x = new Float64Array(size * m);
  kept.forEach((k, column) => {
    const factor = 1 / Math.sqrt(overlap.values[k]);
    for (let r = 0; r < size; r++) x[r * m + column] = overlap.vectors[r * size + k] * factor;
  });
  const hx = new Float64Array(size * m);
  for (let i = 0; i < size; i++) {
    for (let c = 0; c < m; c++) {
      let sum = 0;
      for (let j = 0; j < size; j++) sum += scaledH[i * size + j] * x[j * m + c];
      hx[i * m + c] = sum;
    }
  }
  const reduced = new Float64Array(m * m);
  for (let a = 0; a < m; a++) {
    for (let b = a; b < m; b++) {
      let sum = 0;
      for (let i = 0; i < size; i++) sum += x[i * m + a] * hx[i * m + b];
      reduced[a * m + b] = reduced[b * m + a] = sum;
    }
  }
  const energy = jacobiEigen(reduced, m);
  const vectors: Float64Array[] = [];
  for (let level = 0; level < m; level++) {
    const c = new Float64Array(size);
    for (let i = 0; i < size; i++) {
      let sum = 0;
      for (let a = 0; a < m; a++) sum += x[i * m + a] * energy.vectors[a * m + level];
      c[i] = d[i] * sum;
    }
    // The sign of an eigenvector is arbitrary; making its largest normalised component positive keeps
    // reported coefficients stable from one run (or parameter point) to the next.
    let largestAt = 0;
    for (let i = 1; i < size; i++) if (Math.abs(c[i] / d[i]) > Math.abs(c[largestAt] / d[largestAt])) largestAt = i;
    if (c[largestAt] < 0) c.forEach((value, i) => { c[i] = -value; });
    vectors.push(c);
  }
  const converged = overlap.converged && energy.converged;
  return {
    values: energy.values,
    vectors,
    overlapEigenvalues: overlap.values,
    conditionNumber,
    keptConditionNumber: m > 0 ? largest / overlap.values[kept[0]] : NaN,
    dropped: size - m,
    cutoff,
    noiseFloor,
    sweeps: overlap.sweeps + energy.sweeps,
    converged,
    message: converged ? null : `the Jacobi iteration did not converge in ${JACOBI_DEFAULTS.maxSweeps} sweeps`,
  };
}
