/** Lowest eigenpairs of a real symmetric band matrix. */
// Hand-written: only the lowest two pairs of a banded matrix are needed; general dense libraries compute all of them.

/** upper[i * (bandwidth + 1) + k] = A[i][i + k] for 0 <= k <= bandwidth; slots past the last column are ignored. */
export interface SymmetricBand {
  size: number;
  bandwidth: number;
  upper: Float64Array;
}

export interface Eigenpairs {
  /** Ascending; each is the Rayleigh quotient of its vector. */
  values: number[];
  /** Orthonormal (Euclidean) eigenvectors, one per value. */
  vectors: Float64Array[];
  /** ||A v - lambda v||_2 per pair. */
  residuals: number[];
  bisectionSteps: number;
  inverseIterations: number;
  converged: boolean;
  message: string | null;
}

interface Bounds {
  lower: number;
  upper: number;
  norm: number;
}

/** Gershgorin discs enclose the whole spectrum; their extent also serves as the matrix norm for tolerances. */
function gershgorin(a: SymmetricBand): Bounds {
  const { size: n, bandwidth: p, upper } = a;
  const width = p + 1;
  let lower = Infinity;
  let high = -Infinity;
  for (let i = 0; i < n; i++) {
    let radius = 0;
    for (let k = 1; k <= p; k++) {
      if (i + k < n) radius += Math.abs(upper[i * width + k]);
      if (i - k >= 0) radius += Math.abs(upper[(i - k) * width + k]);
    }
    const d = upper[i * width];
    lower = Math.min(lower, d - radius);
    high = Math.max(high, d + radius);
  }
  return { lower, upper: high, norm: Math.max(Math.abs(lower), Math.abs(high)) };
}

export function multiplyBand(a: SymmetricBand, x: Float64Array, out: Float64Array): void {
  const { size: n, bandwidth: p, upper } = a;
  const width = p + 1;
  out.fill(0);
  for (let i = 0; i < n; i++) {
    const row = i * width;
    out[i] += upper[row] * x[i];
    const last = Math.min(p, n - 1 - i);
    for (let k = 1; k <= last; k++) {
      const aik = upper[row + k];
      out[i] += aik * x[i + k];
      out[i + k] += aik * x[i];
    }
  }
}

/**
 * Number of eigenvalues of A below sigma: the count of negative pivots of the band LDL^T factorisation of
 * A - sigma I (Sylvester's law of inertia), a zero or tiny pivot being replaced by -tiny as in the tridiagonal
 * Sturm count of Barth, Martin & Wilkinson, Numer. Math. 9, 386 (1967).
 */
export function countBelow(a: SymmetricBand, sigma: number, tinyPivot: number, work: Float64Array): number {
  const { size: n, bandwidth: p, upper } = a;
  const width = p + 1;
  work.set(upper.subarray(0, n * width));
  for (let i = 0; i < n; i++) work[i * width] -= sigma;
  let negatives = 0;
  for (let j = 0; j < n; j++) {
    const row = j * width;
    let d = work[row];
    if (Math.abs(d) < tinyPivot) d = -tinyPivot;
    if (d < 0) negatives++;
    const last = Math.min(p, n - 1 - j);
    for (let i = 1; i <= last; i++) {
      const aji = work[row + i];
      if (aji === 0) continue;
      const factor = aji / d;
      const target = (j + i) * width - i;
      for (let k = i; k <= last; k++) work[target + k] -= factor * work[row + k];
    }
  }
  return negatives;
}

interface BandLu {
  size: number;
  bandwidth: number;
  /** Row i holds columns i - p .. i + 2p at offsets 0 .. 3p (L multipliers left of the diagonal, U from it). */
  rows: Float64Array;
  pivots: Int32Array;
}

/**
 * LU factorisation with partial pivoting of the band matrix A - sigma I, U widening to 2p super-diagonals
 * (band Gaussian elimination with pivoting, Golub & Van Loan, Matrix Computations, 4th ed. 2013, §4.3).
 * A zero pivot is replaced by tinyPivot: inverse iteration deliberately factors at an eigenvalue.
 */
function factorBand(a: SymmetricBand, sigma: number, tinyPivot: number): BandLu {
  const { size: n, bandwidth: p, upper } = a;
  const width = 3 * p + 1;
  const rows = new Float64Array(n * width);
  const at = (i: number, j: number) => i * width + j - i + p;
  for (let i = 0; i < n; i++) {
    const last = Math.min(p, n - 1 - i);
    for (let k = 0; k <= last; k++) {
      const v = upper[i * (p + 1) + k];
      rows[at(i, i + k)] = v;
      rows[at(i + k, i)] = v;
    }
    rows[at(i, i)] -= sigma;
  }
  const pivots = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const lastRow = Math.min(k + p, n - 1);
    let pivotRow = k;
    for (let i = k + 1; i <= lastRow; i++) {
      if (Math.abs(rows[at(i, k)]) > Math.abs(rows[at(pivotRow, k)])) pivotRow = i;
    }
    pivots[k] = pivotRow;
    const lastCol = Math.min(k + 2 * p, n - 1);
    if (pivotRow !== k) {
      for (let j = k; j <= lastCol; j++) {
        const t = rows[at(k, j)];
        rows[at(k, j)] = rows[at(pivotRow, j)];
        rows[at(pivotRow, j)] = t;
      }
    }
    if (Math.abs(rows[at(k, k)]) < tinyPivot) rows[at(k, k)] = tinyPivot;
    const pivot = rows[at(k, k)];
    for (let i = k + 1; i <= lastRow; i++) {
      const factor = rows[at(i, k)] / pivot;
      rows[at(i, k)] = factor;
      if (factor === 0) continue;
      for (let j = k + 1; j <= lastCol; j++) rows[at(i, j)] -= factor * rows[at(k, j)];
    }
  }
  return { size: n, bandwidth: p, rows, pivots };
}

/** Solves (A - sigma I) x = b in place with the factors of factorBand. */
function solveBand(lu: BandLu, b: Float64Array): void {
  const { size: n, bandwidth: p, rows, pivots } = lu;
  const width = 3 * p + 1;
  for (let k = 0; k < n; k++) {
    const r = pivots[k];
    if (r !== k) {
      const t = b[k];
      b[k] = b[r];
      b[r] = t;
    }
    const lastRow = Math.min(k + p, n - 1);
    for (let i = k + 1; i <= lastRow; i++) b[i] -= rows[i * width + k - i + p] * b[k];
  }
  for (let i = n - 1; i >= 0; i--) {
    const base = i * width - i + p;
    const lastCol = Math.min(i + 2 * p, n - 1);
    let s = b[i];
    for (let j = i + 1; j <= lastCol; j++) s -= rows[base + j] * b[j];
    b[i] = s / rows[base + i];
  }
}

function dot(x: Float64Array, y: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i] * y[i];
  return s;
}

function normalise(x: Float64Array): void {
  const scale = 1 / Math.sqrt(dot(x, x));
  for (let i = 0; i < x.length; i++) x[i] *= scale;
}

function orthogonaliseAgainst(x: Float64Array, basis: Float64Array[]): void {
  for (const v of basis) {
    const c = dot(x, v);
    for (let i = 0; i < x.length; i++) x[i] -= c * v[i];
  }
}

interface Brackets {
  lower: number[];
  upper: number[];
  steps: number;
}

/**
 * Brackets of the lowest `count` eigenvalues, each shrunk until it isolates its eigenvalue to `relativeWidth`
 * (or to the rounding floor): Sturm-count bisection (Barth, Martin & Wilkinson, Numer. Math. 9, 386 (1967)),
 * started from brackets grown geometrically around the guesses when there are any.
 */
function bisectLowest(a: SymmetricBand, count: number, bounds: Bounds, relativeWidth: number, guesses: number[]): Brackets {
  const tiny = Number.EPSILON * bounds.norm;
  const floor = 16 * tiny;
  const work = new Float64Array(a.size * (a.bandwidth + 1));
  const lower = new Array<number>(count).fill(bounds.lower - floor);
  const upper = new Array<number>(count).fill(bounds.upper + floor);
  let steps = 0;
  // One count tightens every wanted bracket, not just the one being worked on.
  const probe = (sigma: number) => {
    const below = countBelow(a, sigma, tiny, work);
    steps++;
    for (let m = 0; m < count; m++) {
      if (below <= m) lower[m] = Math.max(lower[m], sigma);
      else upper[m] = Math.min(upper[m], sigma);
    }
  };
  const wanted = (k: number) => Math.max(relativeWidth * Math.max(Math.abs(lower[k]), Math.abs(upper[k])), floor);
  for (let k = 0; k < Math.min(count, guesses.length); k++) {
    const guess = guesses[k];
    if (!Number.isFinite(guess)) continue;
    for (let delta = Math.max(relativeWidth * Math.abs(guess), floor); ; delta *= 16) {
      if (lower[k] < guess - delta) probe(guess - delta);
      if (upper[k] > guess + delta) probe(guess + delta);
      if (lower[k] >= guess - delta && upper[k] <= guess + delta) break;
    }
  }
  for (let k = 0; k < count; k++) {
    while (upper[k] - lower[k] > wanted(k)) probe(0.5 * (lower[k] + upper[k]));
  }
  return { lower, upper, steps };
}

/** Deterministic start with no special symmetry, so it overlaps every eigenvector. */
function startVector(n: number, seed: number): Float64Array {
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = 1 + 0.5 * Math.sin(1.618 * (i + 1) + 2.7 * seed);
  return x;
}

const maxInverseIterations = 8;

interface InverseIterationResult {
  value: number;
  vector: Float64Array;
  residual: number;
  iterations: number;
  converged: boolean;
}

/**
 * Eigenvector for a shift at (or next to) an eigenvalue by inverse iteration, orthogonalised against the vectors
 * already found (Ipsen, SIAM Rev. 39, 254 (1997)); the value is the Rayleigh quotient of the final vector.
 */
function inverseIteration(
  a: SymmetricBand,
  shift: number,
  found: Float64Array[],
  seed: number,
  tolerance: number,
  tinyPivot: number,
): InverseIterationResult {
  const lu = factorBand(a, shift, tinyPivot);
  const x = startVector(a.size, seed);
  const ax = new Float64Array(a.size);
  let value = shift;
  let residual = Infinity;
  let iterations = 0;
  while (iterations < maxInverseIterations && residual > tolerance) {
    orthogonaliseAgainst(x, found);
    normalise(x);
    solveBand(lu, x);
    orthogonaliseAgainst(x, found);
    normalise(x);
    multiplyBand(a, x, ax);
    value = dot(x, ax);
    let r2 = 0;
    for (let i = 0; i < a.size; i++) r2 += (ax[i] - value * x[i]) ** 2;
    residual = Math.sqrt(r2);
    iterations++;
  }
  return { value, vector: x, residual, iterations, converged: residual <= tolerance };
}

/** Bisection stops once a bracket is this narrow relative to its eigenvalue; inverse iteration does the rest. */
const bracketWidth = 1e-9;

export interface EigenOptions {
  /** Approximate eigenvalues (e.g. from a coarser grid): the brackets start around them instead of the whole spectrum. */
  guesses?: number[];
}

/**
 * The `count` lowest eigenpairs of a symmetric band matrix: Sturm-count bisection brackets each eigenvalue, then
 * inverse iteration with a pivoted band solve gives its vector and a Rayleigh-quotient value.
 */
export function lowestEigenpairs(a: SymmetricBand, count: number, options: EigenOptions = {}): Eigenpairs {
  if (count < 1 || count > a.size) {
    return {
      values: [],
      vectors: [],
      residuals: [],
      bisectionSteps: 0,
      inverseIterations: 0,
      converged: false,
      message: `asked for ${count} eigenpairs of a ${a.size}x${a.size} matrix`,
    };
  }
  const bounds = gershgorin(a);
  const tiny = Number.EPSILON * bounds.norm;
  const brackets = bisectLowest(a, count, bounds, bracketWidth, options.guesses ?? []);
  // Rounding in forming A v already costs about eps ||A|| per component.
  const tolerance = 64 * Number.EPSILON * bounds.norm * Math.sqrt(a.size);
  const values: number[] = [];
  const vectors: Float64Array[] = [];
  const residuals: number[] = [];
  let inverseIterations = 0;
  let converged = true;
  const problems: string[] = [];
  for (let k = 0; k < count; k++) {
    const shift = 0.5 * (brackets.lower[k] + brackets.upper[k]);
    const pair = inverseIteration(a, shift, vectors, k, tolerance, tiny);
    inverseIterations += pair.iterations;
    // A near-degenerate partner may share the bracket, so the quotient may sit anywhere within its width.
    const slack = Math.max(16 * tiny, brackets.upper[k] - brackets.lower[k]);
    const inside = pair.value >= brackets.lower[k] - slack && pair.value <= brackets.upper[k] + slack;
    if (!pair.converged) problems.push(`eigenpair ${k}: residual ${pair.residual.toExponential(2)} above ${tolerance.toExponential(2)}`);
    if (!inside) problems.push(`eigenpair ${k}: Rayleigh quotient ${pair.value} outside its bisection bracket`);
    converged &&= pair.converged && inside;
    values.push(pair.value);
    vectors.push(pair.vector);
    residuals.push(pair.residual);
  }
  return {
    values,
    vectors,
    residuals,
    bisectionSteps: brackets.steps,
    inverseIterations,
    converged,
    message: problems.length > 0 ? problems.join('; ') : null,
  };
}
