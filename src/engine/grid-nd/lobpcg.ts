/**
 * Lowest eigenpairs of a large symmetric operator by the locally optimal block preconditioned conjugate gradient method
 * (LOBPCG; Knyazev, SIAM J. Sci. Comput. 23, 517 (2001)), with the trial subspace [X, W, P] orthonormalised
 * explicitly before each Rayleigh–Ritz step for stability (Hetmaniuk & Lehoucq, J. Comput. Phys. 218, 324 (2006)).
 */
import { jacobiEigen } from '../generalized-eigen.ts';

export interface LobpcgOperator {
  size: number;
  apply(x: Float64Array, out: Float64Array): void;
  /** An approximation of (H - sigma)^-1 that is symmetric positive definite; `scale` is a kinetic energy scale. */
  precondition(r: Float64Array, out: Float64Array, scale: number): void;
  /** <x|T|x> / <x|x> for the preconditioner's shift: the kinetic energy of a trial vector. */
  kineticEnergy(x: Float64Array): number;
}

export interface LobpcgOptions {
  /** Eigenpairs whose residuals must fall below tolerance; the block may be larger (guard vectors). */
  wanted: number;
  /** Starting block (any number of vectors; completed with smooth pseudo-random ones up to blockSize). */
  start: Float64Array[];
  blockSize: number;
  /** Residual norm ||H x - theta x|| (x normalised) at which a pair counts as converged. */
  tolerance: number;
  maxIterations: number;
}

export interface LobpcgResult {
  values: number[];
  vectors: Float64Array[];
  residuals: number[];
  iterations: number;
  converged: boolean;
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

function axpy(alpha: number, x: Float64Array, y: Float64Array): void {
  for (let i = 0; i < x.length; i++) y[i] += alpha * x[i];
}

/**
 * Orthonormalises `candidates` in place against `basis` (already orthonormal) and each other by Gram–Schmidt applied
 * twice ("twice is enough", Giraud, Langou & Rozložník, Comput. Math. Appl. 50, 1069 (2005)); a candidate that keeps
 * no more than `dropBelow` of its norm is dependent and left out. Returns the indices of the kept candidates.
 */
function orthonormalise(basis: Float64Array[], candidates: Float64Array[], dropBelow: number): number[] {
  const kept: number[] = [];
  for (let c = 0; c < candidates.length; c++) {
    const v = candidates[c];
    const before = Math.sqrt(dot(v, v));
    if (!(before > 0)) continue;
    const against = [...basis, ...kept.map((k) => candidates[k])];
    for (let pass = 0; pass < 2; pass++) {
      for (const b of against) axpy(-dot(b, v), b, v);
    }
    const after = Math.sqrt(dot(v, v));
    if (!(after > dropBelow * before)) continue;
    for (let i = 0; i < v.length; i++) v[i] /= after;
    kept.push(c);
  }
  return kept;
}

/** A smooth, deterministic start vector: low products of sines over the index, so runs are reproducible. */
function startVector(size: number, index: number): Float64Array {
  const v = new Float64Array(size);
  for (let i = 0; i < size; i++) v[i] = Math.sin((Math.PI * (i + 1) * (index + 1)) / (size + 1)) + 1e-3 * Math.sin(12.9898 * (i + 7 * index));
  return v;
}

function combine(vectors: Float64Array[], coefficients: Float64Array, columns: number, column: number, from: number, size: number): Float64Array {
  const out = new Float64Array(size);
  for (let r = from; r < vectors.length; r++) {
    const c = coefficients[r * columns + column];
    if (c !== 0) axpy(c, vectors[r], out);
  }
  return out;
}

export function lobpcg(op: LobpcgOperator, options: LobpcgOptions): LobpcgResult {
  const { size } = op;
  const k = Math.min(options.blockSize, size);
  const wanted = Math.min(options.wanted, k);
  const seeds: Float64Array[] = options.start.slice(0, k).map((v) => Float64Array.from(v));
  for (let i = seeds.length; i < k; i++) seeds.push(startVector(size, i));
  let x: Float64Array[] = [];
  orthonormalise([], seeds, 1e-8).forEach((i) => x.push(seeds[i]));
  for (let i = 0; x.length < k && i < 4 * k; i++) {
    const extra = [startVector(size, k + i)];
    if (orthonormalise(x, extra, 1e-8).length) x.push(extra[0]);
  }
  const image = (v: Float64Array): Float64Array => {
    const out = new Float64Array(size);
    op.apply(v, out);
    return out;
  };
  let ax = x.map(image);
  let p: Float64Array[] = [];
  let values: number[] = [];
  let residuals: number[] = [];
  let iterations = 0;
  let converged = false;
  for (;;) {
    // Rayleigh–Ritz on the orthonormal basis S = [X, W, P] with its images AS.
    const s = x;
    const as = ax;
    const m = s.length;
    const g = new Float64Array(m * m);
    for (let i = 0; i < m; i++) {
      for (let j = i; j < m; j++) {
        const v = 0.5 * (dot(s[i], as[j]) + dot(s[j], as[i]));
        g[i * m + j] = v;
        g[j * m + i] = v;
      }
    }
    const eig = jacobiEigen(g, m);
    const block = Math.min(k, m);
    const newX: Float64Array[] = [];
    const newP: Float64Array[] = [];
    for (let c = 0; c < block; c++) {
      newX.push(combine(s, eig.vectors, m, c, 0, size));
      if (m > block) {
        newP.push(combine(s, eig.vectors, m, c, block, size));
      }
    }
    values = Array.from(eig.values.subarray(0, block));
    x = newX;
    // Fresh images keep the residuals honest after many recombinations.
    ax = x.map(image);
    const r = x.map((v, c) => {
      const res = Float64Array.from(ax[c]);
      axpy(-values[c], v, res);
      return res;
    });
    residuals = r.map((v) => Math.sqrt(dot(v, v)));
    if (residuals.slice(0, wanted).every((res) => res <= options.tolerance)) {
      converged = true;
      break;
    }
    if (iterations >= options.maxIterations) break;
    iterations++;
    const shift = Math.max(op.kineticEnergy(x[0]), Number.MIN_VALUE);
    const w = r.map((res) => {
      const out = new Float64Array(size);
      op.precondition(res, out, shift);
      return out;
    });
    const keptP = orthonormalise(x, newP, 1e-10);
    p = keptP.map((i) => newP[i]);
    const keptW = orthonormalise([...x, ...p], w, 1e-10);
    const wKept = keptW.map((i) => w[i]);
    // Images of W and P are computed afresh: carried along, they lose accuracy when orthogonalisation cancels much
    // of a vector, and the Rayleigh–Ritz matrix would no longer match the basis.
    const aw = wKept.map(image);
    const ap = p.map(image);
    x = [...x, ...wKept, ...p];
    ax = [...ax, ...aw, ...ap];
  }
  return { values: values.slice(0, k), vectors: x.slice(0, k), residuals, iterations, converged };
}
