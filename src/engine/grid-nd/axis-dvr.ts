/**
 * One axis of a product grid as a finite-element DVR (Rescigno & McCurdy, Phys. Rev. A 62, 032706 (2000)): the nodes,
 * the lumped overlap (quadrature weights) and the 1-D kinetic operator in the orthonormal DVR basis, banded.
 */
import { axisRadauElement, lagrangeValues, lobattoElement, type ElementRule } from './element-rules.ts';

export type AxisKind = 'line' | 'half-line' | 'interval' | 'rho';

export interface AxisMesh {
  kind: AxisKind;
  mass: number;
  /** Element edges, ascending; the first and last are the ends of the domain. */
  boundaries: number[];
  /** Gauss–Lobatto points of each element (polynomial degree + 1); elements may differ (an hp mesh). */
  orders: number[];
  /** Magnetic quantum number m, only on a 'rho' axis. */
  angularMomentum: number;
}

export interface AxisDvr {
  mesh: AxisMesh;
  size: number;
  nodes: Float64Array;
  /** Lumped overlap: quadrature weight of each node, the rho dependence and 2 pi of a 'rho' axis included. */
  weights: Float64Array;
  /** Half bandwidth of `band`. */
  bandwidth: number;
  /**
   * T_ij / sqrt(W_i W_j) (plus m^2 / (2 M rho^2) on the diagonal of a 'rho' axis) in full band storage:
   * band[i * (2 * bandwidth + 1) + (j - i + bandwidth)].
   */
  band: Float64Array;
  /** Whether the first raw node (at the lower end) is kept: only the axis element of an m = 0 'rho' axis. */
  keepsFirst: boolean;
}

function elementRule(mesh: AxisMesh, element: number): ElementRule {
  const onAxis = mesh.kind === 'rho' && element === 0 && mesh.angularMomentum === 0;
  return onAxis ? axisRadauElement(mesh.orders[element]) : lobattoElement(mesh.orders[element]);
}

/** Global index of the first raw node of every element (elements share their edge nodes), and the raw node count. */
function elementOffsets(orders: number[]): { offsets: number[]; total: number } {
  const offsets: number[] = [];
  let next = 0;
  for (const order of orders) {
    offsets.push(next);
    next += order - 1;
  }
  return { offsets, total: next + 1 };
}

/**
 * Physical quadrature weight of local node k: (h/2) w_k, times 2 pi rho_k on a 'rho' axis; on the axis element the
 * Radau rule already carries (1 + x) = 2 rho / h, so there it is 2 pi (h/2)^2 w_k.
 */
function physicalWeight(mesh: AxisMesh, rule: ElementRule, half: number, rho: number, k: number): number {
  if (mesh.kind !== 'rho') return half * rule.weights[k];
  return rule.axisWeighted ? 2 * Math.PI * half * half * rule.weights[k] : 2 * Math.PI * half * rule.weights[k] * rho;
}

/**
 * Builds the axis operator. Nodes at a wall or at a truncated open end are dropped (psi = 0 there); on a 'rho' axis
 * with m != 0 the node rho = 0 is dropped too, since psi ~ rho^|m| vanishes on the axis (the Lobatto quadrature times
 * rho still integrates the stiffness exactly), while for m = 0 the first element is the axis Radau element.
 */
export function buildAxis(mesh: AxisMesh): AxisDvr {
  const { boundaries, orders } = mesh;
  const elements = boundaries.length - 1;
  const { offsets, total } = elementOffsets(orders);
  const keepsFirst = mesh.kind === 'rho' && mesh.angularMomentum === 0;
  const first = keepsFirst ? 0 : 1;
  const size = total - 1 - first;
  const rawNodes = new Float64Array(total);
  const rawWeights = new Float64Array(total);
  const bandwidth = Math.max(...orders) - 1;
  const width = 2 * bandwidth + 1;
  const band = new Float64Array(size * width);
  const kineticFactor = 1 / (2 * mesh.mass);
  const local = new Float64Array(bandwidth + 1);
  for (let e = 0; e < elements; e++) {
    const order = orders[e];
    const base = offsets[e];
    const rule = elementRule(mesh, e);
    const half = 0.5 * (boundaries[e + 1] - boundaries[e]);
    const start = boundaries[e];
    for (let k = 0; k < order; k++) {
      const x = start + half * (1 + rule.nodes[k]);
      rawNodes[base + k] = k === order - 1 ? boundaries[e + 1] : x;
      local[k] = physicalWeight(mesh, rule, half, x, k);
      rawWeights[base + k] += local[k];
    }
    // Stiffness int W (d chi_i)(d chi_j) by the element quadrature, exact for polynomials of the element degree.
    const scale = kineticFactor / (half * half);
    for (let i = 0; i < order; i++) {
      const row = base + i - first;
      if (row < 0 || row >= size) continue;
      for (let j = 0; j < order; j++) {
        const column = base + j - first;
        if (column < 0 || column >= size) continue;
        let s = 0;
        for (let k = 0; k < order; k++) s += local[k] * rule.derivative[k * order + i] * rule.derivative[k * order + j];
        band[row * width + column - row + bandwidth] += scale * s;
      }
    }
  }
  const nodes = rawNodes.slice(first, first + size);
  const weights = rawWeights.slice(first, first + size);
  const centrifugal = mesh.kind === 'rho' ? (mesh.angularMomentum * mesh.angularMomentum) / (2 * mesh.mass) : 0;
  for (let row = 0; row < size; row++) {
    for (let offset = -bandwidth; offset <= bandwidth; offset++) {
      const column = row + offset;
      if (column < 0 || column >= size) continue;
      band[row * width + offset + bandwidth] /= Math.sqrt(weights[row] * weights[column]);
    }
    if (centrifugal !== 0) band[row * width + bandwidth] += centrifugal / (nodes[row] * nodes[row]);
  }
  return { mesh, size, nodes, weights, bandwidth, band, keepsFirst };
}

/** The axis operator as a dense row-major matrix, for its eigen-decomposition. */
export function denseAxisOperator(axis: AxisDvr): Float64Array {
  const { size, bandwidth, band } = axis;
  const width = 2 * bandwidth + 1;
  const dense = new Float64Array(size * size);
  for (let row = 0; row < size; row++) {
    for (let offset = -bandwidth; offset <= bandwidth; offset++) {
      const column = row + offset;
      if (column >= 0 && column < size) dense[row * size + column] = band[row * width + offset + bandwidth];
    }
  }
  return dense;
}

/**
 * interpolation[i * from.size + j]: the weight of from's node value j in the value at to's node i, by the element
 * polynomials of `from`; outside from's domain the value is 0 (beyond a truncated end psi is taken as vanished).
 */
export function interpolationMatrix(from: AxisDvr, to: AxisDvr): Float64Array {
  const { boundaries, orders } = from.mesh;
  const { offsets } = elementOffsets(orders);
  const first = from.keepsFirst ? 0 : 1;
  const matrix = new Float64Array(to.size * from.size);
  const values = new Float64Array(Math.max(...orders));
  let e = 0;
  for (let i = 0; i < to.size; i++) {
    const x = to.nodes[i];
    if (x < boundaries[0] || x > boundaries[boundaries.length - 1]) continue;
    while (e > 0 && x < boundaries[e]) e--;
    while (e < boundaries.length - 2 && x > boundaries[e + 1]) e++;
    const rule = elementRule(from.mesh, e);
    const half = 0.5 * (boundaries[e + 1] - boundaries[e]);
    lagrangeValues(rule.nodes, rule.barycentric, (x - boundaries[e]) / half - 1, values);
    for (let k = 0; k < orders[e]; k++) {
      const column = offsets[e] + k - first;
      if (column >= 0 && column < from.size) matrix[i * from.size + column] += values[k];
    }
  }
  return matrix;
}
