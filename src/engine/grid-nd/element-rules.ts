/**
 * Reference-element rules of the product-grid FE-DVR on [-1, 1]: Gauss–Lobatto–Legendre for ordinary elements and a
 * Gauss–Radau rule with weight (1 + x) for the element that touches the cylinder axis rho = 0.
 */
import { gllRule } from '../gll.ts';

export interface ElementRule {
  /** Ascending nodes on [-1, 1]; the last is always 1 (the bridge to the next element). */
  nodes: Float64Array;
  /** Quadrature weights, the weight function of the rule included. */
  weights: Float64Array;
  /** derivative[i * n + j] = l_j'(x_i) of the Lagrange cardinal polynomials on `nodes`. */
  derivative: Float64Array;
  /** Barycentric weights of `nodes`, for interpolation. */
  barycentric: Float64Array;
  /** Whether the rule integrates against (1 + x) rather than 1. */
  axisWeighted: boolean;
}

/** Barycentric weights 1 / prod_{k != j} (x_j - x_k) (Berrut & Trefethen, SIAM Review 46, 501 (2004)). */
export function barycentricWeights(nodes: Float64Array): Float64Array {
  const n = nodes.length;
  const b = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let p = 1;
    for (let k = 0; k < n; k++) if (k !== j) p *= nodes[j] - nodes[k];
    b[j] = 1 / p;
  }
  return b;
}

/** Differentiation matrix of the Lagrange interpolant on any nodes (Berrut & Trefethen 2004, eq. 9.4). */
function differentiationMatrix(nodes: Float64Array, bary: Float64Array): Float64Array {
  const n = nodes.length;
  const d = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    let diagonal = 0;
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      const v = bary[j] / bary[i] / (nodes[i] - nodes[j]);
      d[i * n + j] = v;
      diagonal -= v;
    }
    d[i * n + i] = diagonal;
  }
  return d;
}

/** Values l_j(x) of all Lagrange cardinal polynomials at x, by the barycentric formula (Berrut & Trefethen 2004). */
export function lagrangeValues(nodes: Float64Array, bary: Float64Array, x: number, out: Float64Array): void {
  const n = nodes.length;
  for (let j = 0; j < n; j++) {
    if (x === nodes[j]) {
      out.fill(0);
      out[j] = 1;
      return;
    }
  }
  let sum = 0;
  for (let j = 0; j < n; j++) {
    out[j] = bary[j] / (x - nodes[j]);
    sum += out[j];
  }
  for (let j = 0; j < n; j++) out[j] /= sum;
}

const cache = new Map<string, ElementRule>();

/** The n-point Gauss–Lobatto–Legendre element (Abramowitz & Stegun 25.4.32), reused from the 1-D grid. */
export function lobattoElement(points: number): ElementRule {
  const key = `gll${points}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const rule = gllRule(points);
  const element = { nodes: rule.nodes, weights: rule.weights, derivative: rule.derivative, barycentric: barycentricWeights(rule.nodes), axisWeighted: false };
  cache.set(key, element);
  return element;
}

/**
 * n-point Gauss–Radau rule for int_{-1}^{1} (1 + x) f(x) dx with the fixed node x = 1: the free nodes are the zeros of
 * the Jacobi polynomial P_{n-1}^{(1,1)}, i.e. the interior nodes of the (n + 1)-point Lobatto rule (Gautschi,
 * Orthogonal Polynomials, 2004, §3.1.1; Abramowitz & Stegun 22.5.37), so the rule is exact to degree 2n - 2 and
 * has no node on the axis: psi stays a regular polynomial there with no condition imposed, as for m = 0 it must.
 * The weights are the exact integrals of the cardinal polynomials against (1 + x).
 */
export function axisRadauElement(points: number): ElementRule {
  const key = `radau${points}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const lobatto = gllRule(points + 1);
  const nodes = new Float64Array(points);
  nodes.set(lobatto.nodes.subarray(1, points), 0);
  nodes[points - 1] = 1;
  const barycentric = barycentricWeights(nodes);
  // (1 + x) l_j(x) has degree n, well within the 2m - 3 of an m = n + 2 point Lobatto rule.
  const exact = gllRule(points + 2);
  const weights = new Float64Array(points);
  const values = new Float64Array(points);
  for (let k = 0; k < exact.points; k++) {
    lagrangeValues(nodes, barycentric, exact.nodes[k], values);
    for (let j = 0; j < points; j++) weights[j] += exact.weights[k] * (1 + exact.nodes[k]) * values[j];
  }
  const element = { nodes, weights, derivative: differentiationMatrix(nodes, barycentric), barycentric, axisWeighted: true };
  cache.set(key, element);
  return element;
}
