/**
 * All eigenpairs of a dense symmetric matrix by Householder tridiagonalisation and the implicit QL method (tred2 and
 * tql2 of Wilkinson & Reinsch, Handbook for Automatic Computation II, contributions II/2 and II/3, 1971): O(n^3) with
 * a small constant, for the 1-D axis operators of a product grid, where cyclic Jacobi would take many sweeps.
 */

export interface DenseEigen {
  /** Eigenvalues, ascending. */
  values: Float64Array;
  /** Eigenvectors as columns, row-major n x n, in the order of `values`. */
  vectors: Float64Array;
  /** QL iterations spent on all eigenvalues together. */
  iterations: number;
  converged: boolean;
}

const maxIterationsPerValue = 60;

/** Householder reduction to tridiagonal form; `a` is overwritten by the accumulated orthogonal transform. */
function tridiagonalise(a: Float64Array, n: number, d: Float64Array, e: Float64Array): void {
  for (let i = n - 1; i > 0; i--) {
    const l = i - 1;
    let h = 0;
    if (l > 0) {
      let scale = 0;
      for (let k = 0; k <= l; k++) scale += Math.abs(a[i * n + k]);
      if (scale === 0) {
        e[i] = a[i * n + l];
      } else {
        for (let k = 0; k <= l; k++) {
          a[i * n + k] /= scale;
          h += a[i * n + k] * a[i * n + k];
        }
        let f = a[i * n + l];
        let g = f >= 0 ? -Math.sqrt(h) : Math.sqrt(h);
        e[i] = scale * g;
        h -= f * g;
        a[i * n + l] = f - g;
        f = 0;
        for (let j = 0; j <= l; j++) {
          a[j * n + i] = a[i * n + j] / h;
          g = 0;
          for (let k = 0; k <= j; k++) g += a[j * n + k] * a[i * n + k];
          for (let k = j + 1; k <= l; k++) g += a[k * n + j] * a[i * n + k];
          e[j] = g / h;
          f += e[j] * a[i * n + j];
        }
        const hh = f / (h + h);
        for (let j = 0; j <= l; j++) {
          const fj = a[i * n + j];
          const gj = e[j] - hh * fj;
          e[j] = gj;
          for (let k = 0; k <= j; k++) a[j * n + k] -= fj * e[k] + gj * a[i * n + k];
        }
      }
    } else {
      e[i] = a[i * n + l];
    }
    d[i] = h;
  }
  d[0] = 0;
  e[0] = 0;
  for (let i = 0; i < n; i++) {
    const l = i - 1;
    if (d[i] !== 0) {
      for (let j = 0; j <= l; j++) {
        let g = 0;
        for (let k = 0; k <= l; k++) g += a[i * n + k] * a[k * n + j];
        for (let k = 0; k <= l; k++) a[k * n + j] -= g * a[k * n + i];
      }
    }
    d[i] = a[i * n + i];
    a[i * n + i] = 1;
    for (let j = 0; j <= l; j++) a[j * n + i] = a[i * n + j] = 0;
  }
}

/** Implicit QL with Wilkinson shifts on the tridiagonal (d, e), rotations accumulated into the columns of z. */
function implicitQl(d: Float64Array, e: Float64Array, n: number, z: Float64Array): { iterations: number; converged: boolean } {
  for (let i = 1; i < n; i++) e[i - 1] = e[i];
  e[n - 1] = 0;
  let iterations = 0;
  for (let l = 0; l < n; l++) {
    let iter = 0;
    let m: number;
    do {
      for (m = l; m < n - 1; m++) {
        const dd = Math.abs(d[m]) + Math.abs(d[m + 1]);
        if (Math.abs(e[m]) <= Number.EPSILON * dd) break;
      }
      if (m === l) break;
      if (iter++ === maxIterationsPerValue) return { iterations, converged: false };
      iterations++;
      let g = (d[l + 1] - d[l]) / (2 * e[l]);
      let r = Math.hypot(g, 1);
      g = d[m] - d[l] + e[l] / (g + (g >= 0 ? r : -r));
      let s = 1;
      let c = 1;
      let p = 0;
      let i: number;
      let underflow = false;
      for (i = m - 1; i >= l; i--) {
        const f = s * e[i];
        const b = c * e[i];
        r = Math.hypot(f, g);
        e[i + 1] = r;
        if (r === 0) {
          d[i + 1] -= p;
          e[m] = 0;
          underflow = true;
          break;
        }
        s = f / r;
        c = g / r;
        g = d[i + 1] - p;
        r = (d[i] - g) * s + 2 * c * b;
        p = s * r;
        d[i + 1] = g + p;
        g = c * r - b;
        for (let k = 0; k < n; k++) {
          const zk = z[k * n + i + 1];
          z[k * n + i + 1] = s * z[k * n + i] + c * zk;
          z[k * n + i] = c * z[k * n + i] - s * zk;
        }
      }
      if (underflow) continue;
      d[l] -= p;
      e[l] = g;
      e[m] = 0;
    } while (m !== l);
  }
  return { iterations, converged: true };
}

export function symmetricEigen(matrix: ArrayLike<number>, n: number): DenseEigen {
  const a = Float64Array.from(matrix);
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  tridiagonalise(a, n, d, e);
  const { iterations, converged } = implicitQl(d, e, n, a);
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => d[i] - d[j]);
  const values = Float64Array.from(order, (i) => d[i]);
  const vectors = new Float64Array(n * n);
  order.forEach((from, to) => {
    for (let r = 0; r < n; r++) vectors[r * n + to] = a[r * n + from];
  });
  return { values, vectors, iterations, converged };
}
