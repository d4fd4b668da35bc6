/** The FE-DVR Hamiltonian on one grid of elements: the matrix that grid-levels diagonalises and refines. */
import type { SymmetricBand } from './banded-eigen.ts';
import type { ValueDisplay } from './format.ts';
import { gllRule, type GllRule } from './gll.ts';
import { radauRule } from './radau-jacobi.ts';

export type Outcome<T> = { ok: true; value: T } | { ok: false; message: string; tooLarge?: boolean };

/** What the assembly reads of a grid problem. */
export interface Assembly {
  /** The mass at x (constant unless the problem has a mass profile): WKB wavenumbers and kinetic scales. */
  massAt: (x: number) => number;
  /** The position-dependent mass, or null for the constant-mass kinetic matrix. */
  profile: { value(x: number): number } | null;
  /** How messages state energies and positions. */
  show: ValueDisplay;
  /** Whether a step of a position-dependent mass at an edge node adds the radial step term (space radial). */
  radialMassSteps: boolean;
  /** The potential on the diagonal (with a centrifugal term where the space's grid function carries one). */
  veff: (x: number) => number;
  breakpoints: number[];
  /**
   * null: psi = 0 at both ends (the first and last nodes are dropped). A number p: the weighted form on [0, b] for
   * f with volume element r^p and int f'^2 r^p dr as kinetic form, f free at r = 0, zero at b.
   */
  power: number | null;
}

export interface Grid {
  nodes: Float64Array;
  /** Lumped quadrature weights of the grid function (for the weighted form: of chi = r^(p/2) f, without r^p). */
  weights: Float64Array;
  band: SymmetricBand;
  /** V at the nodes (the diagonal potential), kept for the kinetic-energy scale. */
  potential: Float64Array;
  elements: number;
  order: number;
}

const stiffnessCache = new Map<number, { rule: GllRule; stiffness: Float64Array }>();

/** Reference stiffness K_ij = sum_k w_k l_i'(x_k) l_j'(x_k) = int l_i' l_j' on [-1, 1], exact because the integrand has degree 2n - 4. */
function referenceElement(order: number): { rule: GllRule; stiffness: Float64Array } {
  const cached = stiffnessCache.get(order);
  if (cached) return cached;
  const rule = gllRule(order);
  const { weights, derivative } = rule;
  const stiffness = new Float64Array(order * order);
  for (let i = 0; i < order; i++) {
    for (let j = 0; j < order; j++) {
      let s = 0;
      for (let k = 0; k < order; k++) s += weights[k] * derivative[k * order + i] * derivative[k * order + j];
      stiffness[i * order + j] = s;
    }
  }
  const entry = { rule, stiffness };
  stiffnessCache.set(order, entry);
  return entry;
}

/**
 * FE-DVR Hamiltonian with Gauss–Lobatto elements and bridge functions (Rescigno & McCurdy, Phys. Rev. A 62, 032706
 * (2000)): lumped overlap, kinetic (1/2m) int chi_i' chi_j' by GLL quadrature, diagonal potential; the two outermost
 * nodes are dropped, which imposes psi = 0 there.
 */
export function buildGrid(ctx: Assembly, boundaries: number[], order: number): Outcome<Grid> {
  if (ctx.power !== null) return buildWeightedGrid(ctx, ctx.power, boundaries, order);
  const { rule, stiffness } = referenceElement(order);
  const elements = boundaries.length - 1;
  const step = order - 1;
  const total = elements * step + 1;
  const size = total - 2;
  const xs = new Float64Array(total);
  const ws = new Float64Array(total);
  for (let e = 0; e < elements; e++) {
    const half = 0.5 * (boundaries[e + 1] - boundaries[e]);
    const mid = 0.5 * (boundaries[e + 1] + boundaries[e]);
    for (let i = 0; i < order; i++) {
      xs[e * step + i] = mid + half * rule.nodes[i];
      ws[e * step + i] += half * rule.weights[i];
    }
  }
  const nodes = xs.slice(1, total - 1);
  const weights = ws.slice(1, total - 1);
  const bandwidth = step;
  const width = bandwidth + 1;
  const upper = new Float64Array(size * width);
  const kineticFactor = ctx.profile ? 0.5 : 1 / (2 * ctx.massAt(0));
  for (let e = 0; e < elements; e++) {
    const scale = kineticFactor / (0.5 * (boundaries[e + 1] - boundaries[e]));
    const element = ctx.profile ? elementStiffness(ctx.profile.value, rule, boundaries[e], boundaries[e + 1]) : stiffness;
    if (!element) return { ok: false, message: `the mass is not a positive finite number in the element [${boundaries[e]}, ${boundaries[e + 1]}]` };
    for (let i = 0; i < order; i++) {
      const row = e * step + i - 1;
      if (row < 0 || row >= size) continue;
      for (let j = i; j < order; j++) {
        const column = e * step + j - 1;
        if (column >= size) continue;
        upper[row * width + column - row] += scale * element[i * order + j];
      }
    }
  }
  return withPotential(ctx, boundaries, { nodes, weights, upper, size, bandwidth, elements, order, offset: 1 }, weights);
}

/**
 * The weighted form for a radial factor in D dimensions, R = r^|m| f with volume element r^p (p = 2|m| + D - 1):
 * the kinetic form is (1/2m) int f'^2 r^p dr with no centrifugal term and f is smooth and free at r = 0, so the first
 * element carries a Gauss–Radau rule for the weight r^(p-1) (none of its nodes at 0; exact stiffness
 * there for a smooth V) and the others GLL with r^p at the nodes. A DVR on a Radau first element is the Lagrange-mesh idea of Baye
 * (Phys. Rep. 565, 1 (2015)) joined to the FE-DVR of Rescigno & McCurdy; the grid function reported is
 * chi = r^(p/2) f, whose square is the density in r.
 */
function buildWeightedGrid(ctx: Assembly, power: number, boundaries: number[], order: number): Outcome<Grid> {
  const { rule } = referenceElement(order);
  // The Radau weight is r^(p-1) and one factor r stays with the integrands: V r^p f^2 is then smooth for a Coulomb V as
  // well, where a rule for r^p would see a 1/r singularity and converge only algebraically.
  const radau = radauRule(order, power - 1);
  const elements = boundaries.length - 1;
  const step = order - 1;
  // The first element keeps all its nodes (none sits at 0); the last node, at the far end, is a wall.
  const total = elements * step + 1;
  const size = total - 1;
  const xs = new Float64Array(total);
  const weighted = new Float64Array(total);
  const firstHalf = 0.5 * (boundaries[1] - boundaries[0]);
  for (let i = 0; i < order; i++) {
    xs[i] = boundaries[0] + firstHalf * (1 + radau.nodes[i]);
    weighted[i] += firstHalf ** power * radau.weights[i] * xs[i];
  }
  for (let e = 1; e < elements; e++) {
    const half = 0.5 * (boundaries[e + 1] - boundaries[e]);
    const mid = 0.5 * (boundaries[e + 1] + boundaries[e]);
    for (let i = 0; i < order; i++) {
      const x = mid + half * rule.nodes[i];
      xs[e * step + i] = x;
      weighted[e * step + i] += half * rule.weights[i] * x ** power;
    }
  }
  const nodes = xs.slice(0, size);
  const bandwidth = step;
  const width = bandwidth + 1;
  const upper = new Float64Array(size * width);
  const kineticFactor = 1 / (2 * ctx.massAt(0));
  const local = new Float64Array(order * order);
  for (let e = 0; e < elements; e++) {
    const half = 0.5 * (boundaries[e + 1] - boundaries[e]);
    // Element stiffness int l_i' l_j' r^p dr: the Radau rule is exact on the first element; GLL with r^p elsewhere.
    const d = e === 0 ? radau.derivative : rule.derivative;
    for (let k = 0; k < order; k++) {
      const wk = e === 0 ? firstHalf ** (power - 2) * radau.weights[k] * xs[k] : (rule.weights[k] * xs[e * step + k] ** power) / half;
      for (let i = 0; i < order; i++) {
        const di = d[k * order + i];
        for (let j = i; j < order; j++) local[i * order + j] = (k === 0 ? 0 : local[i * order + j]) + wk * di * d[k * order + j];
      }
    }
    for (let i = 0; i < order; i++) {
      const row = e * step + i;
      if (row >= size) continue;
      for (let j = i; j < order; j++) {
        const column = e * step + j;
        if (column >= size) continue;
        upper[row * width + column - row] += kineticFactor * local[i * order + j];
      }
    }
  }
  const assembled = { nodes, weights: weighted.slice(0, size), upper, size, bandwidth, elements, order, offset: 0 };
  const plain = assembled.weights.map((w, i) => w / nodes[i] ** power);
  if (!plain.every((w) => Number.isFinite(w) && w > 0)) return { ok: false, message: `the weight r^${power} over- or underflows on this grid` };
  return withPotential(ctx, boundaries, assembled, plain);
}

interface Assembled {
  nodes: Float64Array;
  /** The overlap's lumped weights the kinetic matrix is scaled by. */
  weights: Float64Array;
  upper: Float64Array;
  size: number;
  bandwidth: number;
  elements: number;
  order: number;
  /** Index in the full node list of the first node kept. */
  offset: number;
}

/** Scales the kinetic matrix to the orthonormal DVR functions and adds V on the diagonal. */
function withPotential(ctx: Assembly, boundaries: number[], a: Assembled, reported: Float64Array): Outcome<Grid> {
  const { nodes, weights, upper, size, bandwidth, elements, order, offset } = a;
  const step = order - 1;
  const width = bandwidth + 1;
  const breaks = new Set(ctx.breakpoints);
  const potential = new Float64Array(size);
  for (let row = 0; row < size; row++) {
    const e = (row + offset) / step;
    const v = Number.isInteger(e) && e > 0 && breaks.has(boundaries[e]) ? breakpointPotential(ctx, boundaries, e) + radialMassStep(ctx, boundaries, e, weights[row]) : ctx.veff(nodes[row]);
    if (!Number.isFinite(v)) return { ok: false, message: `the potential is not finite at x = ${ctx.show.length(nodes[row])} (V = ${ctx.show.energy(v)})` };
    for (let k = 0; k < width && row + k < size; k++) upper[row * width + k] /= Math.sqrt(weights[row] * weights[row + k]);
    upper[row * width] += v;
    potential[row] = v;
  }
  return { ok: true, value: { nodes, weights: reported, band: { size, bandwidth, upper }, potential, elements, order } };
}

/**
 * A node on a step of V belongs to two elements, and each element's quadrature sees the limit of V from its own
 * side: the lumped weights (proportional to the element lengths) average the two one-sided values.
 */
function breakpointPotential(ctx: Assembly, boundaries: number[], index: number): number {
  const x = boundaries[index];
  const leftLength = x - boundaries[index - 1];
  const rightLength = boundaries[index + 1] - x;
  const offset = 4 * Number.EPSILON * Math.max(Math.abs(x), leftLength, rightLength);
  return (leftLength * ctx.veff(x - offset) + rightLength * ctx.veff(x + offset)) / (leftLength + rightLength);
}

/**
 * The element's stiffness (int l_i' l_j' / m on the reference element) by its own GLL rule, with 1/m at the nodes;
 * the end nodes take the mass from inside the element, so a mass step on an edge is seen from each side. Null where
 * the mass is not positive and finite.
 */
function elementStiffness(mass: (x: number) => number, rule: GllRule, left: number, right: number): Float64Array | null {
  const order = rule.nodes.length;
  const half = 0.5 * (right - left);
  const mid = 0.5 * (right + left);
  const offset = 4 * Number.EPSILON * Math.max(Math.abs(left), Math.abs(right), right - left);
  const inverse = new Float64Array(order);
  for (let k = 0; k < order; k++) {
    const x = k === 0 ? left + offset : k === order - 1 ? right - offset : mid + half * rule.nodes[k];
    const m = mass(x);
    if (!(m > 0) || !Number.isFinite(m)) return null;
    inverse[k] = 1 / m;
  }
  const { weights, derivative } = rule;
  const stiffness = new Float64Array(order * order);
  for (let i = 0; i < order; i++) {
    for (let j = 0; j < order; j++) {
      let s = 0;
      for (let k = 0; k < order; k++) s += weights[k] * inverse[k] * derivative[k * order + i] * derivative[k * order + j];
      stiffness[i * order + j] = s;
    }
  }
  return stiffness;
}

/**
 * Radially, a step of the mass at an edge node r0 puts (1/2) [1/m] u(r0)^2 / r0 into <T> (the step part of
 * (1/2) int u^2 (1/m)' / r dr); the node's DVR function has u(r0)^2 = 1/W there. Zero on the line and for a constant mass.
 */
function radialMassStep(ctx: Assembly, boundaries: number[], index: number, weight: number): number {
  if (!ctx.profile || !ctx.radialMassSteps) return 0;
  const x = boundaries[index];
  const offset = 4 * Number.EPSILON * Math.max(Math.abs(x), x - boundaries[index - 1], boundaries[index + 1] - x);
  const jump = 1 / ctx.profile.value(x + offset) - 1 / ctx.profile.value(x - offset);
  return jump / (2 * x * weight);
}
