/**
 * The product-grid Hamiltonian H = sum_k 1 ⊗ .. ⊗ T_k ⊗ .. ⊗ 1 + diag(V), applied matrix-free on a row-major grid
 * (last axis fastest), and the fast-diagonalisation preconditioner (T + s)^-1 (Lynch, Rice & Thomas, Numer. Math. 6,
 * 185 (1964)): each 1-D T_k + U_k = Q_k diag(lambda_k) Q_k^T, so the inverse is a product of 1-D transforms. U_k
 * is a non-negative 1-D cut of V (exact for a separable V), so confining potentials are preconditioned too.
 */
import { denseAxisOperator, type AxisDvr } from './axis-dvr.ts';
import { symmetricEigen } from './symmetric-eigen.ts';

export interface ProductOperator {
  axes: AxisDvr[];
  shape: number[];
  size: number;
  /** V (the diagonal) at every grid point. */
  potential: Float64Array;
  /** out = H x. */
  apply(x: Float64Array, out: Float64Array): void;
  /** out = T x, the kinetic part alone. */
  applyKinetic(x: Float64Array, out: Float64Array): void;
  /** out = (T + U + shift)^-1 r, for a positive shift. */
  precondition(r: Float64Array, out: Float64Array, shift: number): void;
}

interface AxisSpectrum {
  values: Float64Array;
  /** Eigenvectors as columns, row-major size x size. */
  vectors: Float64Array;
}

/** Product of the sizes of the axes after `axis`: the stride of that axis in the row-major grid. */
function strideOf(shape: number[], axis: number): number {
  let stride = 1;
  for (let b = axis + 1; b < shape.length; b++) stride *= shape[b];
  return stride;
}

/** out += (1 ⊗ T_a ⊗ 1) x with the banded 1-D operator of axis a. */
function addAxisBand(axis: AxisDvr, shape: number[], a: number, x: Float64Array, out: Float64Array): void {
  const n = axis.size;
  const inner = strideOf(shape, a);
  const outer = x.length / (n * inner);
  const { bandwidth, band } = axis;
  const width = 2 * bandwidth + 1;
  for (let o = 0; o < outer; o++) {
    const base = o * n * inner;
    for (let i = 0; i < n; i++) {
      const target = base + i * inner;
      const lo = Math.max(0, i - bandwidth);
      const hi = Math.min(n - 1, i + bandwidth);
      for (let j = lo; j <= hi; j++) {
        const t = band[i * width + j - i + bandwidth];
        const source = base + j * inner;
        for (let s = 0; s < inner; s++) out[target + s] += t * x[source + s];
      }
    }
  }
}

/** out = (1 ⊗ M ⊗ 1) x with a dense size x size matrix on axis a, transposed if asked; out must not alias x. */
function axisTransform(matrix: Float64Array, n: number, shape: number[], a: number, transpose: boolean, x: Float64Array, out: Float64Array): void {
  const inner = strideOf(shape, a);
  const outer = x.length / (n * inner);
  out.fill(0);
  for (let o = 0; o < outer; o++) {
    const base = o * n * inner;
    for (let i = 0; i < n; i++) {
      const target = base + i * inner;
      for (let j = 0; j < n; j++) {
        const m = transpose ? matrix[j * n + i] : matrix[i * n + j];
        if (m === 0) continue;
        const source = base + j * inner;
        for (let s = 0; s < inner; s++) out[target + s] += m * x[source + s];
      }
    }
  }
}

/** Sum of the 1-D eigenvalues at every grid point: the spectrum of T in the product eigenbasis. */
function kineticSpectrum(spectra: AxisSpectrum[], shape: number[], size: number): Float64Array {
  const sum = new Float64Array(size);
  for (let a = 0; a < shape.length; a++) {
    const inner = strideOf(shape, a);
    const n = shape[a];
    // T_k + U_k is positive definite; an eigenvalue that rounding (of order eps ||T_k||) made negative counts as 0.
    for (let p = 0; p < size; p++) sum[p] += Math.max(0, spectra[a].values[Math.floor(p / inner) % n]);
  }
  return sum;
}

/** `cuts[k]` holds U_k at the nodes of axis k (non-negative), added to the 1-D operator of the preconditioner only. */
export function productOperator(axes: AxisDvr[], potential: Float64Array, cuts: Float64Array[]): ProductOperator {
  const shape = axes.map((a) => a.size);
  const size = potential.length;
  const spectra: AxisSpectrum[] = axes.map((axis, a) => {
    const dense = denseAxisOperator(axis);
    for (let i = 0; i < axis.size; i++) dense[i * axis.size + i] += cuts[a][i];
    return symmetricEigen(dense, axis.size);
  });
  const lambda = kineticSpectrum(spectra, shape, size);
  const work = [new Float64Array(size), new Float64Array(size)];
  const applyKinetic = (x: Float64Array, out: Float64Array): void => {
    out.fill(0);
    axes.forEach((axis, a) => addAxisBand(axis, shape, a, x, out));
  };
  const apply = (x: Float64Array, out: Float64Array): void => {
    applyKinetic(x, out);
    for (let p = 0; p < size; p++) out[p] += potential[p] * x[p];
  };
  const precondition = (r: Float64Array, out: Float64Array, shift: number): void => {
    let from = r;
    let to = work[0];
    for (let a = 0; a < axes.length; a++) {
      axisTransform(spectra[a].vectors, shape[a], shape, a, true, from, to);
      from = to;
      to = from === work[0] ? work[1] : work[0];
    }
    for (let p = 0; p < size; p++) from[p] /= lambda[p] + shift;
    for (let a = 0; a < axes.length; a++) {
      const target = a === axes.length - 1 ? out : to;
      axisTransform(spectra[a].vectors, shape[a], shape, a, false, from, target);
      from = target;
      to = from === work[0] ? work[1] : work[0];
    }
  };
  return { axes, shape, size, potential, apply, applyKinetic, precondition };
}
