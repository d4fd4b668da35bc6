/** Gauss–Lobatto–Legendre points on [-1, 1]: the element basis of the finite-element DVR. */

export interface GllRule {
  /** Number of points n (polynomial degree n - 1). */
  points: number;
  /** Ascending nodes, the endpoints -1 and 1 included. */
  nodes: Float64Array;
  weights: Float64Array;
  /** derivative[i * n + j] = l_j'(x_i), the derivative of the j-th Lagrange cardinal polynomial at node i. */
  derivative: Float64Array;
  /** Newton steps spent on all interior nodes together. */
  iterations: number;
  converged: boolean;
}

interface LegendreValues {
  p: number;
  previous: number;
}

/** P_N(x) and P_{N-1}(x) by the three-term recurrence (Abramowitz & Stegun 22.7.10). */
function legendre(degree: number, x: number): LegendreValues {
  let previous = 1;
  let p = x;
  for (let k = 1; k < degree; k++) {
    const next = ((2 * k + 1) * x * p - k * previous) / (k + 1);
    previous = p;
    p = next;
  }
  return { p, previous };
}

const maxNewtonSteps = 100;

/**
 * n-point Gauss–Lobatto–Legendre rule: Newton's method for the roots of P'_{n-1} (Abramowitz & Stegun 25.4.32;
 * Canuto, Hussaini, Quarteroni & Zang, Spectral Methods in Fluid Dynamics, Springer 1988, §2.3).
 */
export function gllRule(points: number): GllRule {
  if (!Number.isInteger(points) || points < 2) throw new RangeError(`GLL rule needs an integer n >= 2, got ${points}`);
  const degree = points - 1;
  const nodes = new Float64Array(points);
  nodes[0] = -1;
  nodes[degree] = 1;
  let iterations = 0;
  let converged = true;
  // Only the left half is iterated; mirroring makes the rule exactly symmetric, which keeps even/odd states clean.
  for (let i = 1; 2 * i < degree; i++) {
    let x = -Math.cos((Math.PI * i) / degree);
    let done = false;
    for (let step = 0; step < maxNewtonSteps && !done; step++) {
      iterations++;
      const { p, previous } = legendre(degree, x);
      const dp = (degree * (x * p - previous)) / (x * x - 1);
      // Legendre's equation gives P'' from P and P', so no second recurrence is needed.
      const d2p = (2 * x * dp - degree * (degree + 1) * p) / (1 - x * x);
      const delta = dp / d2p;
      x -= delta;
      done = Math.abs(delta) <= 4 * Number.EPSILON;
    }
    converged &&= done;
    nodes[i] = x;
    nodes[degree - i] = -x;
  }
  if (degree % 2 === 0) nodes[degree / 2] = 0;

  const weights = new Float64Array(points);
  const pAtNodes = new Float64Array(points);
  for (let i = 0; i < points; i++) {
    pAtNodes[i] = legendre(degree, nodes[i]).p;
    weights[i] = 2 / (degree * (degree + 1) * pAtNodes[i] * pAtNodes[i]);
  }
  return { points, nodes, weights, derivative: lagrangeDerivative(nodes, pAtNodes), iterations, converged };
}

/** Closed form of the GLL collocation derivative (Canuto, Hussaini, Quarteroni & Zang 1988, §2.3.2). */
function lagrangeDerivative(nodes: Float64Array, pAtNodes: Float64Array): Float64Array {
  const n = nodes.length;
  const degree = n - 1;
  const d = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (i !== j) d[i * n + j] = pAtNodes[i] / (pAtNodes[j] * (nodes[i] - nodes[j]));
    }
  }
  d[0] = (-degree * (degree + 1)) / 4;
  d[n * n - 1] = (degree * (degree + 1)) / 4;
  return d;
}
