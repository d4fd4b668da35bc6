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
  /** Panels to start from (a previous run's `partition`); ignored unless it has as many segments as these breakpoints make. */
  start?: Partition;
  /**
   * How many leading components decide convergence and which panel is bisected (default all); the
   * rest are integrated along on the same panels, e.g. the error estimates of inner integrals.
   */
  tested?: number;
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
  /** The panels the run ended with. */
  partition: Partition;
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
const NODES = RULE.nodes;
const KRONROD_WEIGHTS = RULE.kronrodWeights;
const GAUSS_WEIGHTS = RULE.gaussWeights;
const RULE_POINTS = NODES.length;
const OUTERMOST_NODE = NODES[RULE_POINTS - 1];
const EPSILON = Number.EPSILON;
const UNDERFLOW = Number.MIN_VALUE;

/**
 * The panels an adaptive run settled on, as fractions of each segment's parameter range, so that a
 * run at a nearby parameter point can start from them instead of from whole segments.
 */
export interface Partition {
  segments: number;
  /** (segment index, start fraction, end fraction) per panel. */
  panels: number[];
}

// How a segment between consecutive breakpoints maps its parameter t to x.
const FINITE = 0; // x = t on [a, b]
const FROM_MINUS_INFINITY = 1; // x = b - scale t/(1-t), t in [0, 1): the infinite end is never reached
const TO_INFINITY = 2; // x = a + scale t/(1-t)

interface Segment {
  kind: typeof FINITE | typeof FROM_MINUS_INFINITY | typeof TO_INFINITY;
  a: number;
  b: number;
  scale: number;
  tStart: number;
  tEnd: number;
}

function xAt(segment: Segment, t: number): number {
  if (segment.kind === FINITE) return t;
  const stretch = (segment.scale * t) / (1 - t);
  return segment.kind === TO_INFINITY ? segment.a + stretch : segment.b - stretch;
}

function jacobianAt(segment: Segment, t: number): number {
  if (segment.kind === FINITE) return 1;
  const complement = 1 - t;
  return segment.scale / (complement * complement);
}

function makeSegment(a: number, b: number, scale: number): Segment {
  if (a === -Infinity) return { kind: FROM_MINUS_INFINITY, a, b, scale, tStart: 0, tEnd: 1 };
  if (b === Infinity) return { kind: TO_INFINITY, a, b, scale, tStart: 0, tEnd: 1 };
  return { kind: FINITE, a, b, scale, tStart: a, tEnd: b };
}

// The rule may be applied only if rounding keeps its outermost nodes off the interval's ends,
// because integrands are allowed to be singular at an end (1/r at r = 0).
function ruleFits(segment: Segment, tA: number, tB: number): boolean {
  const center = 0.5 * (tA + tB);
  const half = 0.5 * (tB - tA);
  const first = center - half * OUTERMOST_NODE;
  const last = center + half * OUTERMOST_NODE;
  if (!(tA < first && last < tB)) return false;
  const x1 = xAt(segment, first);
  const x2 = xAt(segment, last);
  return inside(segment, x1) && inside(segment, x2) && x1 !== x2;
}

function inside(segment: Segment, x: number): boolean {
  const low = segment.kind === FROM_MINUS_INFINITY ? -Infinity : segment.a;
  const high = segment.kind === TO_INFINITY ? Infinity : segment.b;
  return Number.isFinite(x) && low < x && x < high;
}

interface NonFinitePoint {
  badX: number;
  badValue: number;
  component: number;
  /** Integrand calls made up to and including the failing one. */
  calls: number;
}

/**
 * The panels of one run in flat arrays, and the run's scratch. Per panel and component, `sums` holds
 * the value, the integral of |f| and the error estimate, in that order. Typed arrays beyond a few
 * dozen bytes live outside the heap and cost about a microsecond each to allocate, so workspaces are
 * kept, one per nesting depth: a run inside an integrand (an iterated integral) takes the next one.
 */
class Panels {
  count = 0;
  components = 0;
  segment = new Int32Array(64);
  tA = new Float64Array(64);
  tB = new Float64Array(64);
  frozen = new Uint8Array(64); // too narrow to bisect in floating point
  sums = new Float64Array(64 * 9);
  samples = new Float64Array(0);
  point = new Float64Array(0);

  reset(components: number): this {
    this.count = 0;
    this.components = components;
    if (this.samples.length < RULE_POINTS * components) {
      this.samples = new Float64Array(RULE_POINTS * components);
      this.point = new Float64Array(components);
    }
    if (this.sums.length < this.tA.length * 3 * components) this.sums = new Float64Array(this.tA.length * 3 * components);
    return this;
  }

  /** Reserves room for one more panel and returns its index. */
  add(segment: number, tA: number, tB: number): number {
    if (this.count === this.tA.length) this.grow();
    const index = this.count++;
    this.segment[index] = segment;
    this.tA[index] = tA;
    this.tB[index] = tB;
    this.frozen[index] = 0;
    return index;
  }

  private grow(): void {
    const size = 2 * this.tA.length;
    const segment = new Int32Array(size);
    const tA = new Float64Array(size);
    const tB = new Float64Array(size);
    const frozen = new Uint8Array(size);
    const sums = new Float64Array(size * 3 * this.components);
    segment.set(this.segment);
    tA.set(this.tA);
    tB.set(this.tB);
    frozen.set(this.frozen);
    sums.set(this.sums.subarray(0, this.count * 3 * this.components));
    Object.assign(this, { segment, tA, tB, frozen, sums });
  }
}

const WORKSPACES: Panels[] = [];
let depth = 0;

/**
 * One Gauss–Kronrod panel with the QUADPACK error estimate (Piessens, de Doncker-Kapenga, Überhuber & Kahaner, QUADPACK, Springer 1983, routine QK21),
 * written into panel `index` of `panels`; returns the first non-finite integrand value met, if any.
 */
function applyRule(f: VectorIntegrand, panels: Panels, index: number, segment: Segment): NonFinitePoint | null {
  const { components, samples, point } = panels;
  const tA = panels.tA[index];
  const tB = panels.tB[index];
  const center = 0.5 * (tA + tB);
  const half = 0.5 * (tB - tA);
  for (let i = 0; i < RULE_POINTS; i++) {
    const t = center + half * NODES[i];
    const x = xAt(segment, t);
    const jacobian = jacobianAt(segment, t);
    f(x, point);
    for (let k = 0; k < components; k++) {
      const value = point[k] * jacobian;
      if (!Number.isFinite(value)) return { badX: x, badValue: point[k], component: k, calls: i + 1 };
      samples[i * components + k] = value;
    }
  }
  const width = Math.abs(half);
  const sums = panels.sums;
  const base = index * 3 * components;
  for (let k = 0; k < components; k++) {
    let kronrod = 0;
    let gauss = 0;
    let absolute = 0;
    for (let i = 0; i < RULE_POINTS; i++) {
      const value = samples[i * components + k];
      kronrod += KRONROD_WEIGHTS[i] * value;
      gauss += GAUSS_WEIGHTS[i] * value;
      absolute += KRONROD_WEIGHTS[i] * Math.abs(value);
    }
    const mean = 0.5 * kronrod;
    let spread = 0;
    for (let i = 0; i < RULE_POINTS; i++) spread += KRONROD_WEIGHTS[i] * Math.abs(samples[i * components + k] - mean);
    absolute *= width;
    spread *= width;
    // |K - G| overstates the error of the higher rule by orders of magnitude on smooth panels;
    // QUADPACK's (200|K-G|/spread)^1.5 rescaling keeps it honest without being wasteful.
    let error = Math.abs((kronrod - gauss) * half);
    if (spread !== 0 && error !== 0) {
      const ratio = (200 * error) / spread;
      error = spread * Math.min(1, ratio * Math.sqrt(ratio));
    }
    if (absolute > UNDERFLOW / (50 * EPSILON)) error = Math.max(50 * EPSILON * absolute, error);
    sums[base + k] = kronrod * half;
    sums[base + components + k] = absolute;
    sums[base + 2 * components + k] = error;
  }
  return null;
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

// A fraction of a segment's parameter range back to the parameter; the ends stay exact.
function tOf(segment: Segment, u: number): number {
  if (u <= 0) return segment.tStart;
  if (u >= 1) return segment.tEnd;
  return segment.tStart + u * (segment.tEnd - segment.tStart);
}

/** Fills `panels` with the starting panels: those of a previous run when they fit these segments, else one per segment. */
function startingPanels(panels: Panels, segments: Segment[], start: Partition | undefined): void {
  if (start && start.segments === segments.length) {
    let fits = true;
    for (let p = 0; p < start.panels.length && fits; p += 3) {
      const segment = segments[start.panels[p]];
      const tA = tOf(segment, start.panels[p + 1]);
      const tB = tOf(segment, start.panels[p + 2]);
      fits = ruleFits(segment, tA, tB);
      panels.add(start.panels[p], tA, tB);
    }
    if (fits) return;
    panels.count = 0;
  }
  for (let i = 0; i < segments.length; i++) panels.add(i, segments[i].tStart, segments[i].tEnd);
}

function partitionOf(panels: Panels, segments: Segment[]): Partition {
  const flat = new Array<number>(3 * panels.count);
  for (let i = 0; i < panels.count; i++) {
    const segment = segments[panels.segment[i]];
    const range = segment.tEnd - segment.tStart;
    flat[3 * i] = panels.segment[i];
    flat[3 * i + 1] = (panels.tA[i] - segment.tStart) / range;
    flat[3 * i + 2] = (panels.tB[i] - segment.tStart) / range;
  }
  return { segments: segments.length, panels: flat };
}

/**
 * Globally adaptive bisection of the worst panel (Piessens, de Doncker-Kapenga, Überhuber & Kahaner, QUADPACK, Springer 1983, routines QAG/QAGI/QAGP),
 * started from whole segments or from the partition of an earlier run (`options.start`).
 */
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
  const tested = options.tested ?? components;
  if (!Number.isInteger(tested) || tested < 1 || tested > components) throw new RangeError('integrateVector: tested must be an integer from 1 to components');
  const segments = segmentsFrom(options.breakpoints, scale);
  if (!(maxIntervals >= segments.length)) throw new RangeError('integrateVector: maxIntervals is below the number of segments');

  if (depth === WORKSPACES.length) WORKSPACES.push(new Panels());
  const panels = WORKSPACES[depth++];
  try {
    panels.reset(components);
    startingPanels(panels, segments, options.start);
    return adapt(f, panels, segments, relTol, absTol, maxIntervals, tested);
  } finally {
    depth--;
  }
}

function failed(status: IntegrationStatus, message: string, run: Run): IntegrationResult {
  if (status === 'non-finite') {
    run.values.fill(NaN);
    run.errorEstimates.fill(Infinity);
    run.absValues.fill(NaN);
  }
  return finished(status, message, run);
}

function finished(status: IntegrationStatus, message: string | null, run: Run): IntegrationResult {
  const { values, absValues, errorEstimates, evaluations, panels, segments } = run;
  return {
    values, absValues, errorEstimates, evaluations, intervals: panels.count,
    converged: status === 'converged', status, message, partition: partitionOf(panels, segments),
  };
}

interface Run {
  panels: Panels;
  segments: Segment[];
  values: Float64Array;
  absValues: Float64Array;
  errorEstimates: Float64Array;
  evaluations: number;
}

// Evaluates panel `index`; returns a message if the integrand was not a finite number somewhere.
function evaluatePanel(f: VectorIntegrand, run: Run, index: number): string | null {
  const bad = applyRule(f, run.panels, index, run.segments[run.panels.segment[index]]);
  if (!bad) {
    run.evaluations += RULE_POINTS;
    return null;
  }
  run.evaluations += bad.calls;
  return `integrand component ${bad.component} returned ${bad.badValue} at x = ${bad.badX}`;
}

function adapt(f: VectorIntegrand, panels: Panels, segments: Segment[], relTol: number, absTol: number, maxIntervals: number, tested: number): IntegrationResult {
  const components = panels.components;
  const run: Run = {
    panels, segments, evaluations: 0,
    values: new Float64Array(components), absValues: new Float64Array(components), errorEstimates: new Float64Array(components),
  };
  const { values, absValues, errorEstimates } = run;
  const frozenErrors = new Float64Array(components);
  const tolerances = new Float64Array(components);

  for (let i = 0; i < panels.count; i++) {
    const bad = evaluatePanel(f, run, i);
    if (bad) return failed('non-finite', bad, run);
  }

  const stride = 3 * components;
  for (;;) {
    values.fill(0);
    absValues.fill(0);
    errorEstimates.fill(0);
    frozenErrors.fill(0);
    const sums = panels.sums;
    for (let i = 0; i < panels.count; i++) {
      const base = i * stride;
      for (let k = 0; k < components; k++) {
        values[k] += sums[base + k];
        absValues[k] += sums[base + components + k];
        errorEstimates[k] += sums[base + 2 * components + k];
        if (panels.frozen[i]) frozenErrors[k] += sums[base + 2 * components + k];
      }
    }
    let converged = true;
    let stuck = -1;
    for (let k = 0; k < tested; k++) {
      tolerances[k] = Math.max(absTol, relTol * absValues[k]);
      if (errorEstimates[k] > tolerances[k]) converged = false;
      if (frozenErrors[k] > tolerances[k]) stuck = k;
    }
    if (converged) return finished('converged', null, run);
    if (stuck >= 0) {
      let worst = -1;
      for (let i = 0; i < panels.count; i++) {
        const error = sums[i * stride + 2 * components + stuck];
        if (panels.frozen[i] && (worst < 0 || error > sums[worst * stride + 2 * components + stuck])) worst = i;
      }
      const where = xAt(segments[panels.segment[worst]], 0.5 * (panels.tA[worst] + panels.tB[worst]));
      return failed('roundoff',
        `component ${stuck}: error ${errorEstimates[stuck]} exceeds tolerance ${tolerances[stuck]} and is concentrated in a panel too narrow to bisect near x = ${where}; the integrand may be singular or discontinuous there`, run);
    }
    if (panels.count >= maxIntervals) {
      const k = errorEstimates.findIndex((error, i) => i < tested && error > tolerances[i]);
      return failed('interval-limit',
        `component ${k}: error ${errorEstimates[k]} still exceeds tolerance ${tolerances[k]} after ${panels.count} intervals; the integral may diverge, or needs more intervals or breakpoints`, run);
    }

    let worst = -1;
    let worstRatio = -1;
    for (let i = 0; i < panels.count; i++) {
      if (panels.frozen[i]) continue;
      let ratio = 0;
      for (let k = 0; k < tested; k++) {
        const error = sums[i * stride + 2 * components + k];
        if (error > 0) ratio = Math.max(ratio, tolerances[k] > 0 ? error / tolerances[k] : Infinity);
      }
      if (ratio > worstRatio) {
        worstRatio = ratio;
        worst = i;
      }
    }
    // Not converged with every non-frozen panel exact would mean the frozen panels alone exceed
    // the tolerance, which the `stuck` test above has already reported.
    const segment = segments[panels.segment[worst]];
    const tA = panels.tA[worst];
    const tB = panels.tB[worst];
    const middle = 0.5 * (tA + tB);
    if (!ruleFits(segment, tA, middle) || !ruleFits(segment, middle, tB)) {
      panels.frozen[worst] = 1;
      continue;
    }
    // The left half takes the worst panel's place, the right half goes to the end.
    panels.tB[worst] = middle;
    const left = evaluatePanel(f, run, worst);
    if (left) return failed('non-finite', left, run);
    const right = evaluatePanel(f, run, panels.add(panels.segment[worst], middle, tB));
    if (right) return failed('non-finite', right, run);
  }
}
