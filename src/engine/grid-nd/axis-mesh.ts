/**
 * Element edges of one product-grid axis: geometric grading toward the singular points, uniform elements in the core
 * and outward-growing elements in the open tails.
 */

/** Ratio of successive graded elements toward a singular point: near the optimum 0.15 of Babuška & Guo (SIAM J. Numer. Anal. 25, 837 (1988)). */
export const GRADING_RATIO = 0.15;
/** Growth of successive tail elements: an exponential tail needs resolving only relative to its own, falling size. */
export const TAIL_GROWTH = 1.25;

export interface AxisLayout {
  /** Fixed ends (walls, the half-line origin, the cylinder axis), or null where the end is open. */
  lo: number | null;
  hi: number | null;
  /** The core [coreLo, coreHi] holds the breakpoints and the bulk of the states; open tails extend beyond it. */
  coreLo: number;
  coreHi: number;
  /** Number of growing tail elements beyond an open end of the core. */
  tailLo: number;
  tailHi: number;
  /** Points toward which elements are graded geometrically (nuclei, the origin of a half-line or the axis). */
  singular: number[];
  /** Element edges that must exist (breakpoints). */
  breakpoints: number[];
}

/** Length of n tail elements starting at size h. */
export function tailLength(h: number, n: number): number {
  return (h * (TAIL_GROWTH ** n - 1)) / (TAIL_GROWTH - 1);
}

/** Smallest n whose tail reaches `length`. */
export function tailCount(h: number, length: number): number {
  return Math.max(1, Math.ceil(Math.log(1 + (length * (TAIL_GROWTH - 1)) / h) / Math.log(TAIL_GROWTH)));
}

function near(a: number, b: number, scale: number): boolean {
  return Math.abs(a - b) <= 1e-12 * scale;
}

export interface AxisElements {
  /** Element edges, ascending. */
  edges: number[];
  /** Gauss–Lobatto points of each element. */
  orders: number[];
}

/** Lowest element order anywhere: below it the bridge functions alone leave too little to resolve. */
const minOrder = 4;

/**
 * Edges for element size h in the core and `layers` geometric layers at each singular point, with the polynomial
 * order rising linearly away from the singular point and falling along the open tails: the hp-FEM mesh whose error
 * falls exponentially in the number of unknowns at point singularities (Babuška & Guo 1988; Schwab, p- and
 * hp-Finite Element Methods, Oxford 1998, ch. 4).
 */
export function axisElements(layout: AxisLayout, h: number, layers: number, order: number): AxisElements {
  const lo = layout.lo ?? layout.coreLo;
  const hi = layout.hi ?? layout.coreHi;
  const scale = Math.max(1, Math.abs(lo), Math.abs(hi));
  const cuts = [...new Set([lo, ...layout.breakpoints.filter((b) => b > lo && b < hi), hi])].sort((a, b) => a - b);
  // edges[i] with orders[i], the order of the element that starts at edges[i].
  const edges: number[] = [];
  const orders: number[] = [];
  const push = (x: number, p: number) => {
    edges.push(x);
    orders.push(Math.max(minOrder, p));
  };
  // The j-th graded layer counted from the singular point (j = 0 the smallest) gets order - (layers - j).
  const layerOrder = (j: number) => order - (layers - j);
  if (layout.lo === null) {
    for (let k = layout.tailLo; k >= 1; k--) push(lo - tailLength(h, k), order - k);
  }
  for (let s = 0; s + 1 < cuts.length; s++) {
    const [a, b] = [cuts[s], cuts[s + 1]];
    const gradedA = layout.singular.some((c) => near(c, a, scale));
    const gradedB = layout.singular.some((c) => near(c, b, scale));
    const graded = (gradedA ? 1 : 0) + (gradedB ? 1 : 0);
    let r0 = Math.min(h, (b - a) / Math.max(graded, 1));
    // A sliver left between the graded zones and the uniform part would be a needlessly stiff element: absorb it.
    const gap = b - a - graded * r0;
    if (graded > 0 && gap < 0.5 * h) r0 += gap / graded;
    const start = gradedA ? a + r0 : a;
    const end = gradedB ? b - r0 : b;
    const count = end - start > 1e-12 * scale ? Math.ceil((end - start) / h - 1e-9) : 0;
    if (gradedA) {
      push(a, layerOrder(0));
      for (let j = layers; j >= 1; j--) push(a + r0 * GRADING_RATIO ** j, layerOrder(layers - j + 1));
    }
    for (let e = 0; e < count; e++) push(start + ((end - start) * e) / count, order);
    if (gradedB) {
      push(end, layerOrder(layers));
      for (let j = 1; j <= layers; j++) push(b - r0 * GRADING_RATIO ** j, layerOrder(layers - j));
    }
  }
  if (layout.hi === null) {
    push(hi, order - 1);
    for (let k = 1; k < layout.tailHi; k++) push(hi + tailLength(h, k), order - k - 1);
    edges.push(hi + tailLength(h, layout.tailHi));
  } else {
    edges.push(hi);
  }
  // A repeated edge (an empty element) is dropped; the element that really starts there keeps the later order.
  const kept: AxisElements = { edges: [edges[0]], orders: [orders[0]] };
  for (let i = 1; i < edges.length; i++) {
    const last = kept.edges.length - 1;
    if (edges[i] <= kept.edges[last] + 1e-14 * scale) {
      if (i < orders.length) kept.orders[last] = orders[i];
      continue;
    }
    kept.edges.push(edges[i]);
    if (i < orders.length) kept.orders.push(orders[i]);
  }
  kept.orders.length = kept.edges.length - 1;
  return kept;
}
