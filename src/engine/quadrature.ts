// Globally adaptive Gauss–Kronrod integration of several integrands sharing the same points.
// The caller needs <psi|psi>, <psi'|psi'> and <psi|V|psi> together; evaluating psi once per
// point and integrating every component on the same subdivision costs a third of three separate runs.

export type VectorIntegrand = (x: number, out: Float64Array) => void;

export interface IntegrationOptions {
  breakpoints: number[];
  scale?: number;
  relTol?: number;
  absTol?: number;
  maxIntervals?: number;
}

export type IntegrationStatus = 'converged' | 'interval-limit' | 'roundoff' | 'non-finite';

export interface IntegrationResult {
  values: Float64Array;
  absValues: Float64Array;
  errorEstimates: Float64Array;
  evaluations: number;
  intervals: number;
  converged: boolean;
  status: IntegrationStatus;
  message: string | null;
}

export const DEFAULTS = {
  // 10 Gauss points extended to 21 Kronrod points: QUADPACK's default QAG key.
  gaussPoints: 10,
  scale: 1,
  relTol: 1e-12,
  absTol: 0,
  maxIntervals: 400,
} as const;

export interface GaussKronrodRule {
  gaussPoints: number;
  nodes: Float64Array;          // all 2n+1 nodes on (-1, 1), ascending
  kronrodWeights: Float64Array; // aligned with nodes
  gaussWeights: Float64Array;   // aligned with nodes; zero at the Kronrod-only nodes
}

/** Legendre P_n(x) and P_n'(x) by the three-term recurrence (Abramowitz & Stegun 22.7.10, 22.8.5). */
function legendre(n: number, x: number): { p: number; dp: number } {
  let previous = 1;
  let p = x;
  if (n === 0) return { p: 1, dp: 0 };
  for (let k = 2; k <= n; k++) {
    const next = ((2 * k - 1) * x * p - (k - 1) * previous) / k;
    previous = p;
    p = next;
  }
  // The derivative divides by 1 - x^2; the callers that use it stay strictly inside (-1, 1).
  return { p, dp: (n * (previous - x * p)) / (1 - x * x) };
}

/** Gauss–Legendre nodes and weights by Newton's method on P_n (Abramowitz & Stegun 25.4.29; Davis & Rabinowitz, Methods of Numerical Integration, 1984). */
function gaussLegendre(n: number): { nodes: Float64Array; weights: Float64Array } {
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    // Tricomi's asymptotic guess is close enough that Newton converges to the intended root.
    let x = -Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    // Newton converges quadratically until rounding takes over; a step that no longer shrinks
    // marks that point, so the loop ends at full precision without a fixed iteration count.
    let previous = Infinity;
    for (;;) {
      const { p, dp } = legendre(n, x);
      const step = p / dp;
      if (!(Math.abs(step) < previous)) break;
      x -= step;
      previous = Math.abs(step);
      if (step === 0) break;
    }
    const { dp } = legendre(n, x);
    nodes[i] = x;
    weights[i] = 2 / ((1 - x * x) * dp * dp);
  }
  // Exact symmetry lets the Kronrod construction pair nodes and find the Gauss ones by equality.
  for (let i = 0; i < n / 2; i++) {
    const mirrored = 0.5 * (nodes[n - 1 - i] - nodes[i]);
    nodes[i] = -mirrored;
    nodes[n - 1 - i] = mirrored;
    weights[n - 1 - i] = weights[i] = 0.5 * (weights[i] + weights[n - 1 - i]);
  }
  if (n % 2 === 1) nodes[(n - 1) / 2] = 0;
  return { nodes, weights };
}

/** Dense linear solve by Gaussian elimination with partial pivoting (Golub & Van Loan, Matrix Computations, 1996, Alg. 3.4.1). */
function solveLinear(matrix: number[][], rhs: number[]): number[] {
  const size = rhs.length;
  const a = matrix.map((row, i) => [...row, rhs[i]]);
  for (let column = 0; column < size; column++) {
    let pivot = column;
    for (let row = column + 1; row < size; row++) {
      if (Math.abs(a[row][column]) > Math.abs(a[pivot][column])) pivot = row;
    }
    [a[column], a[pivot]] = [a[pivot], a[column]];
    for (let row = column + 1; row < size; row++) {
      const factor = a[row][column] / a[column][column];
      for (let k = column; k <= size; k++) a[row][k] -= factor * a[column][k];
    }
  }
  const solution = new Array<number>(size).fill(0);
  for (let row = size - 1; row >= 0; row--) {
    let sum = a[row][size];
    for (let k = row + 1; k < size; k++) sum -= a[row][k] * solution[k];
    solution[row] = sum / a[row][row];
  }
  return solution;
}

/** Gauss–Kronrod rule: Kronrod nodes are the zeros of the Stieltjes polynomial E_{n+1} (Kronrod, Nodes and Weights of Quadrature Formulas, 1965); weights by moment matching. */
export function gaussKronrodRule(n: number): GaussKronrodRule {
  const gauss = gaussLegendre(n);
  // E_{n+1} = P_{n+1} + sum_j c_j P_j is fixed by orthogonality to P_0..P_n under the weight P_n.
  // Parity leaves only j = n-1, n-3, ... and, since E_{n+1} P_n has odd parity, odd k.
  const exact = gaussLegendre(Math.ceil((3 * n + 2) / 2)); // exact for the degree-(3n+1) triple products
  const tripleProduct = (a: number, b: number, c: number): number => {
    let sum = 0;
    for (let i = 0; i < exact.nodes.length; i++) {
      const x = exact.nodes[i];
      sum += exact.weights[i] * legendre(a, x).p * legendre(b, x).p * legendre(c, x).p;
    }
    return sum;
  };
  const degrees: number[] = [];
  for (let j = n - 1; j >= 0; j -= 2) degrees.push(j);
  const odd = degrees.map((_, i) => 2 * i + 1);
  const coefficients = solveLinear(
    odd.map((k) => degrees.map((j) => tripleProduct(j, n, k))),
    odd.map((k) => -tripleProduct(n + 1, n, k)),
  );
  const stieltjes = (x: number): number =>
    degrees.reduce((sum, j, i) => sum + coefficients[i] * legendre(j, x).p, legendre(n + 1, x).p);

  // Kronrod nodes interlace with the Gauss nodes (Szegő 1935), so each lies in a known bracket.
  const brackets = [-1, ...gauss.nodes, 1];
  const kronrodOnly: number[] = [];
  for (let i = 0; i + 1 < brackets.length; i++) {
    let lo = brackets[i];
    let hi = brackets[i + 1];
    const signLo = Math.sign(stieltjes(lo));
    for (;;) {
      const mid = 0.5 * (lo + hi);
      if (mid <= lo || mid >= hi) break;
      if (Math.sign(stieltjes(mid)) === signLo) lo = mid;
      else hi = mid;
    }
    kronrodOnly.push(0.5 * (lo + hi));
  }
  const nodes = Float64Array.from([...gauss.nodes, ...kronrodOnly].sort((a, b) => a - b));
  for (let i = 0; i < n; i++) nodes[i] = -nodes[2 * n - i];
  nodes[n] = 0; // the rule is symmetric, so its middle node is exactly 0

  // Symmetric weights: the even moments 0, 2, ..., 2n of sum_i w_i P_k(x_i) = 2 delta_k0 fix the n+1 distinct weights.
  const half = Array.from({ length: n + 1 }, (_, i) => n + i); // indices of nodes >= 0
  const weightsHalf = solveLinear(
    Array.from({ length: n + 1 }, (_, row) =>
      half.map((index) => (nodes[index] === 0 ? 1 : 2) * legendre(2 * row, nodes[index]).p),
    ),
    Array.from({ length: n + 1 }, (_, row) => (row === 0 ? 2 : 0)),
  );
  const kronrodWeights = new Float64Array(2 * n + 1);
  const gaussWeights = new Float64Array(2 * n + 1);
  half.forEach((index, i) => {
    kronrodWeights[index] = weightsHalf[i];
    kronrodWeights[2 * n - index] = weightsHalf[i];
  });
  for (let i = 0; i < n; i++) {
    const index = nodes.indexOf(gauss.nodes[i]);
    gaussWeights[index] = gauss.weights[i];
  }
  return { gaussPoints: n, nodes, kronrodWeights, gaussWeights };
}

const RULE = gaussKronrodRule(DEFAULTS.gaussPoints);
const OUTERMOST_NODE = RULE.nodes[RULE.nodes.length - 1];
const EPSILON = Number.EPSILON;
const UNDERFLOW = Number.MIN_VALUE;

// A segment between consecutive breakpoints, integrated over t with x = map(t).
interface Segment {
  tStart: number;
  tEnd: number;
  xLow: number; // open x-range the integrand may be evaluated on
  xHigh: number;
  map: (t: number) => number;
  jacobian: (t: number) => number;
}

function makeSegment(a: number, b: number, scale: number): Segment {
  if (a === -Infinity) {
    // x = b - scale t/(1-t), t in [0, 1): the infinite end is never reached.
    return {
      tStart: 0, tEnd: 1, xLow: -Infinity, xHigh: b,
      map: (t) => b - (scale * t) / (1 - t),
      jacobian: (t) => scale / ((1 - t) * (1 - t)),
    };
  }
  if (b === Infinity) {
    return {
      tStart: 0, tEnd: 1, xLow: a, xHigh: Infinity,
      map: (t) => a + (scale * t) / (1 - t),
      jacobian: (t) => scale / ((1 - t) * (1 - t)),
    };
  }
  return { tStart: a, tEnd: b, xLow: a, xHigh: b, map: (t) => t, jacobian: () => 1 };
}

// The rule may be applied only if rounding keeps its outermost nodes off the interval's ends,
// because integrands are allowed to be singular at an end (1/r at r = 0).
function ruleFits(segment: Segment, tA: number, tB: number): boolean {
  const center = 0.5 * (tA + tB);
  const half = 0.5 * (tB - tA);
  const first = center - half * OUTERMOST_NODE;
  const last = center + half * OUTERMOST_NODE;
  if (!(tA < first && last < tB)) return false;
  const x1 = segment.map(first);
  const x2 = segment.map(last);
  const inside = (x: number) => Number.isFinite(x) && segment.xLow < x && x < segment.xHigh;
  return inside(x1) && inside(x2) && x1 !== x2;
}

interface Interval {
  segment: Segment;
  tA: number;
  tB: number;
  values: Float64Array;
  absValues: Float64Array;
  errors: Float64Array;
  frozen: boolean; // too narrow to bisect in floating point
}

type RuleOutcome =
  | { interval: Interval; calls: number }
  | { badX: number; badValue: number; component: number; calls: number };

/** One Gauss–Kronrod panel with the QUADPACK error estimate (Piessens, de Doncker-Kapenga, Überhuber & Kahaner, QUADPACK, Springer 1983, routine QK21). */
function applyRule(
  f: VectorIntegrand,
  components: number,
  segment: Segment,
  tA: number,
  tB: number,
  samples: Float64Array,
  point: Float64Array,
): RuleOutcome {
  const center = 0.5 * (tA + tB);
  const half = 0.5 * (tB - tA);
  const count = RULE.nodes.length;
  for (let i = 0; i < count; i++) {
    const t = center + half * RULE.nodes[i];
    const x = segment.map(t);
    const jacobian = segment.jacobian(t);
    f(x, point);
    for (let k = 0; k < components; k++) {
      const value = point[k] * jacobian;
      if (!Number.isFinite(value)) return { badX: x, badValue: point[k], component: k, calls: i + 1 };
      samples[i * components + k] = value;
    }
  }
  const values = new Float64Array(components);
  const absValues = new Float64Array(components);
  const errors = new Float64Array(components);
  for (let k = 0; k < components; k++) {
    let kronrod = 0;
    let gauss = 0;
    let absolute = 0;
    for (let i = 0; i < count; i++) {
      const value = samples[i * components + k];
      kronrod += RULE.kronrodWeights[i] * value;
      gauss += RULE.gaussWeights[i] * value;
      absolute += RULE.kronrodWeights[i] * Math.abs(value);
    }
    const mean = 0.5 * kronrod;
    let spread = 0;
    for (let i = 0; i < count; i++) {
      spread += RULE.kronrodWeights[i] * Math.abs(samples[i * components + k] - mean);
    }
    const width = Math.abs(half);
    absolute *= width;
    spread *= width;
    // |K - G| overstates the error of the higher rule by orders of magnitude on smooth panels;
    // QUADPACK's (200|K-G|/spread)^1.5 rescaling keeps it honest without being wasteful.
    let error = Math.abs((kronrod - gauss) * half);
    if (spread !== 0 && error !== 0) error = spread * Math.min(1, Math.pow((200 * error) / spread, 1.5));
    if (absolute > UNDERFLOW / (50 * EPSILON)) error = Math.max(50 * EPSILON * absolute, error);
    values[k] = kronrod * half;
    absValues[k] = absolute;
    errors[k] = error;
  }
  return { interval: { segment, tA, tB, values, absValues, errors, frozen: false }, calls: count };
}

function segmentsFrom(breakpoints: number[], scale: number): Segment[] {
  if (breakpoints.length < 2) throw new RangeError('integrateVector: at least two breakpoints are needed');
  breakpoints.forEach((point, i) => {
    if (Number.isNaN(point)) throw new RangeError('integrateVector: breakpoint is NaN');
    if (i > 0 && !(point >= breakpoints[i - 1])) throw new RangeError('integrateVector: breakpoints must be sorted');
    if (point === -Infinity && i !== 0) throw new RangeError('integrateVector: -Infinity may only be the first breakpoint');
    if (point === Infinity && i !== breakpoints.length - 1) {
      throw new RangeError('integrateVector: Infinity may only be the last breakpoint');
    }
  });
  const points = breakpoints.length === 2 && breakpoints[0] === -Infinity && breakpoints[1] === Infinity
    ? [-Infinity, 0, Infinity]
    : breakpoints;
  const segments: Segment[] = [];
  for (let i = 0; i + 1 < points.length; i++) {
    if (points[i] === points[i + 1]) continue;
    const segment = makeSegment(points[i], points[i + 1], scale);
    if (!ruleFits(segment, segment.tStart, segment.tEnd)) {
      throw new RangeError(`integrateVector: breakpoints ${points[i]} and ${points[i + 1]} are too close to integrate between`);
    }
    segments.push(segment);
  }
  return segments;
}

/** Globally adaptive bisection of the worst panel (Piessens, de Doncker-Kapenga, Überhuber & Kahaner, QUADPACK, Springer 1983, routines QAG/QAGI/QAGP). */
export function integrateVector(f: VectorIntegrand, components: number, options: IntegrationOptions): IntegrationResult {
  const scale = options.scale ?? DEFAULTS.scale;
  const relTol = options.relTol ?? DEFAULTS.relTol;
  const absTol = options.absTol ?? DEFAULTS.absTol;
  const maxIntervals = options.maxIntervals ?? DEFAULTS.maxIntervals;
  if (!Number.isInteger(components) || components < 1) throw new RangeError('integrateVector: components must be a positive integer');
  if (!(scale > 0) || !Number.isFinite(scale)) throw new RangeError('integrateVector: scale must be positive and finite');
  if (!(relTol >= 0) || !(absTol >= 0) || relTol + absTol === 0) {
    throw new RangeError('integrateVector: tolerances must be non-negative and not both zero');
  }
  const segments = segmentsFrom(options.breakpoints, scale);
  if (!(maxIntervals >= segments.length)) throw new RangeError('integrateVector: maxIntervals is below the number of segments');

  const samples = new Float64Array(RULE.nodes.length * components);
  const point = new Float64Array(components);
  let evaluations = 0;
  const intervals: Interval[] = [];
  const values = new Float64Array(components);
  const absValues = new Float64Array(components);
  const errorEstimates = new Float64Array(components);
  const frozenErrors = new Float64Array(components);
  const tolerances = new Float64Array(components);

  const finish = (status: IntegrationStatus, message: string | null): IntegrationResult => ({
    values, absValues, errorEstimates, evaluations, intervals: intervals.length,
    converged: status === 'converged', status, message,
  });
  const evaluate = (segment: Segment, tA: number, tB: number): Interval | string => {
    const outcome = applyRule(f, components, segment, tA, tB, samples, point);
    evaluations += outcome.calls;
    if ('interval' in outcome) return outcome.interval;
    return `integrand component ${outcome.component} returned ${outcome.badValue} at x = ${outcome.badX}`;
  };
  const nonFinite = (message: string): IntegrationResult => {
    values.fill(NaN);
    errorEstimates.fill(Infinity);
    absValues.fill(NaN);
    return finish('non-finite', message);
  };

  for (const segment of segments) {
    const interval = evaluate(segment, segment.tStart, segment.tEnd);
    if (typeof interval === 'string') return nonFinite(interval);
    intervals.push(interval);
  }

  for (;;) {
    values.fill(0);
    absValues.fill(0);
    errorEstimates.fill(0);
    frozenErrors.fill(0);
    for (const interval of intervals) {
      for (let k = 0; k < components; k++) {
        values[k] += interval.values[k];
        absValues[k] += interval.absValues[k];
        errorEstimates[k] += interval.errors[k];
        if (interval.frozen) frozenErrors[k] += interval.errors[k];
      }
    }
    let converged = true;
    let stuck = -1;
    for (let k = 0; k < components; k++) {
      tolerances[k] = Math.max(absTol, relTol * absValues[k]);
      if (errorEstimates[k] > tolerances[k]) converged = false;
      if (frozenErrors[k] > tolerances[k]) stuck = k;
    }
    if (converged) return finish('converged', null);
    if (stuck >= 0) {
      const worst = intervals.filter((interval) => interval.frozen)
        .reduce((a, b) => (b.errors[stuck] > a.errors[stuck] ? b : a));
      return finish('roundoff',
        `component ${stuck}: error ${errorEstimates[stuck]} exceeds tolerance ${tolerances[stuck]} and is concentrated in a panel too narrow to bisect near x = ${worst.segment.map(0.5 * (worst.tA + worst.tB))}; the integrand may be singular or discontinuous there`);
    }
    if (intervals.length >= maxIntervals) {
      const k = errorEstimates.findIndex((error, i) => error > tolerances[i]);
      return finish('interval-limit',
        `component ${k}: error ${errorEstimates[k]} still exceeds tolerance ${tolerances[k]} after ${intervals.length} intervals; the integral may diverge, or needs more intervals or breakpoints`);
    }

    let worstIndex = -1;
    let worstRatio = -1;
    intervals.forEach((interval, i) => {
      if (interval.frozen) return;
      let ratio = 0;
      for (let k = 0; k < components; k++) {
        const error = interval.errors[k];
        if (error > 0) ratio = Math.max(ratio, tolerances[k] > 0 ? error / tolerances[k] : Infinity);
      }
      if (ratio > worstRatio) {
        worstRatio = ratio;
        worstIndex = i;
      }
    });
    // Not converged with every non-frozen panel exact would mean the frozen panels alone exceed
    // the tolerance, which the `stuck` test above has already reported.
    const worst = intervals[worstIndex];
    const middle = 0.5 * (worst.tA + worst.tB);
    if (!ruleFits(worst.segment, worst.tA, middle) || !ruleFits(worst.segment, middle, worst.tB)) {
      worst.frozen = true;
      continue;
    }
    const left = evaluate(worst.segment, worst.tA, middle);
    if (typeof left === 'string') return nonFinite(left);
    const right = evaluate(worst.segment, middle, worst.tB);
    if (typeof right === 'string') return nonFinite(right);
    intervals[worstIndex] = left;
    intervals.push(right);
  }
}
