/** Gauss–Radau points on [-1, 1] for the weight (1 + t)^power with the node t = 1 fixed: the first element of a weighted FE-DVR at r = 0. */
import { gllRule } from './gll.ts';

export interface RadauRule {
  points: number;
  power: number;
  /** Ascending nodes; the last is 1, none is -1. */
  nodes: Float64Array;
  /** int_{-1}^{1} l_k(t) (1 + t)^power dt: exact for polynomials of degree 2n - 2 times the weight. */
  weights: Float64Array;
  /** derivative[i * n + j] = l_j'(t_i). */
  derivative: Float64Array;
}

const cache = new Map<string, RadauRule>();

/**
 * n-point Gauss–Radau rule for (1 + t)^power with t = 1 fixed: the free nodes are the zeros of the Jacobi polynomial
 * P_{n-1}^{(1, power)} (Gautschi, Orthogonal Polynomials: Computation and Approximation, OUP 2004, §3.1.1), found as
 * the eigenvalues of its Jacobi matrix (Golub & Welsch, Math. Comp. 23, 221 (1969)) by Sturm-sequence bisection; the
 * weights integrate the cardinal polynomials times the weight exactly with a Gauss–Lobatto–Legendre rule.
 */
export function radauRule(points: number, power: number): RadauRule {
  if (!Number.isInteger(points) || points < 2) throw new RangeError(`Radau rule needs an integer n >= 2, got ${points}`);
  if (!(power >= 0)) throw new RangeError(`Radau rule needs a weight power >= 0, got ${power}`);
  const key = `${points}:${power}`;
  const cached = cache.get(key);
  if (cached) return cached;
  const free = jacobiZeros(points - 1, 1, power);
  const nodes = Float64Array.from([...free, 1]);
  const lagrange = cardinals(nodes);
  // The integrand l_k(t) (1 + t)^power is a polynomial of degree n - 1 + power; GLL with p points is exact to 2p - 3.
  const exact = gllRule(Math.max(2, Math.ceil((points + power + 2) / 2) + 1));
  const weights = new Float64Array(points);
  for (let q = 0; q < exact.points; q++) {
    const t = exact.nodes[q];
    const w = exact.weights[q] * (1 + t) ** power;
    if (w === 0) continue;
    for (let k = 0; k < points; k++) weights[k] += w * lagrange(k, t);
  }
  const rule = { points, power, nodes, weights, derivative: differentiation(nodes) };
  cache.set(key, rule);
  return rule;
}

/** Zeros of P_n^{(a, b)}: eigenvalues of the symmetric tridiagonal matrix of its three-term recurrence. */
function jacobiZeros(n: number, a: number, b: number): number[] {
  const diagonal: number[] = [];
  const offSquared: number[] = [0];
  for (let k = 0; k < n; k++) {
    const s = 2 * k + a + b;
    diagonal.push(s === 0 ? (b - a) / (a + b + 2) : (b * b - a * a) / (s * (s + 2)));
    if (k >= 1) offSquared.push((4 * k * (k + a) * (k + b) * (k + a + b)) / (s * s * (s + 1) * (s - 1)));
  }
  const below = (x: number) => {
    let count = 0;
    let d = 1;
    for (let i = 0; i < n; i++) {
      d = diagonal[i] - x - (i > 0 ? offSquared[i] / d : 0);
      if (d === 0) d = -Number.MIN_VALUE;
      if (d < 0) count++;
    }
    return count;
  };
  const zeros: number[] = [];
  for (let k = 0; k < n; k++) {
    let lo = -1;
    let hi = 1;
    while (hi - lo > 2 * Number.EPSILON) {
      const mid = 0.5 * (lo + hi);
      if (mid <= lo || mid >= hi) break;
      if (below(mid) > k) hi = mid;
      else lo = mid;
    }
    zeros.push(0.5 * (lo + hi));
  }
  return zeros;
}

function cardinals(nodes: Float64Array): (k: number, t: number) => number {
  return (k, t) => {
    let value = 1;
    for (let j = 0; j < nodes.length; j++) if (j !== k) value *= (t - nodes[j]) / (nodes[k] - nodes[j]);
    return value;
  };
}

/** Collocation derivative from barycentric weights (Berrut & Trefethen, SIAM Rev. 46, 501 (2004), eq. 9.4). */
function differentiation(nodes: Float64Array): Float64Array {
  const n = nodes.length;
  const lambda = new Float64Array(n).fill(1);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (i !== j) lambda[i] /= nodes[i] - nodes[j];
  const d = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    let diagonal = 0;
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      d[i * n + j] = lambda[j] / lambda[i] / (nodes[i] - nodes[j]);
      diagonal -= d[i * n + j];
    }
    d[i * n + i] = diagonal;
  }
  return d;
}
