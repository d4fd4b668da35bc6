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

/**
 * Edges for element size h in the core and `layers` geometric layers at each singular point: the hp-FEM mesh whose
 * error falls exponentially in the number of unknowns at point singularities (Babuška & Guo 1988; Schwab, p- and
 * hp-Finite Element Methods, Oxford 1998, ch. 4).
 */
export function axisBoundaries(layout: AxisLayout, h: number, layers: number): number[] {
  const lo = layout.lo ?? layout.coreLo;
  const hi = layout.hi ?? layout.coreHi;
  const scale = Math.max(1, Math.abs(lo), Math.abs(hi));
  const cuts = [...new Set([lo, ...layout.breakpoints.filter((b) => b > lo && b < hi), hi])].sort((a, b) => a - b);
  const edges: number[] = [];
  if (layout.lo === null) {
    for (let k = layout.tailLo; k >= 1; k--) edges.push(lo - tailLength(h, k));
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
    edges.push(a);
    if (gradedA) {
      for (let j = layers; j >= 1; j--) edges.push(a + r0 * GRADING_RATIO ** j);
      edges.push(start);
    }
    for (let e = 1; e < count; e++) edges.push(start + ((end - start) * e) / count);
    if (gradedB) {
      edges.push(end);
      for (let j = 1; j <= layers; j++) edges.push(b - r0 * GRADING_RATIO ** j);
    }
  }
  edges.push(hi);
  if (layout.hi === null) {
    for (let k = 1; k <= layout.tailHi; k++) edges.push(hi + tailLength(h, k));
  }
  return edges.filter((x, i) => i === 0 || x > edges[i - 1] + 1e-14 * scale);
}
