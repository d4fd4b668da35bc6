/** Where switch functions change sign inside [lo, hi]: geometric sampling around a centre, then bisection. */
export interface BreakpointSearch {
  points: number[];
  evaluations: number;
}

/** Samples per factor of two in distance from the centre; fine enough to separate kinks a few percent apart. */
const SAMPLES_PER_OCTAVE = 8;
const OCTAVES = 40;

/**
 * Roots of each switch function by sign change on a geometric mesh about `center` (spanning
 * scale * 2^-20 to scale * 2^20), refined by bisection to the last representable bit.
 */
export function findBreakpoints(switches: Array<(x: number) => number>, lo: number, hi: number, center: number, scale: number): BreakpointSearch {
  if (switches.length === 0) return { points: [], evaluations: 0 };
  const mesh = samplingMesh(lo, hi, center, scale);
  const found: number[] = [];
  let evaluations = 0;
  for (const g of switches) {
    let left = mesh[0];
    let gl = g(left);
    evaluations++;
    if (gl === 0) found.push(left);
    for (let i = 1; i < mesh.length; i++) {
      const right = mesh[i];
      const gr = g(right);
      evaluations++;
      if (gr === 0) found.push(right);
      else if (gl !== 0 && Number.isFinite(gl) && Number.isFinite(gr) && gl < 0 !== gr < 0) {
        const root = bisect(g, left, right, gl);
        found.push(root.x);
        evaluations += root.evaluations;
      }
      left = right;
      gl = gr;
    }
  }
  const inside = found.filter((x) => x > lo && x < hi).sort((a, b) => a - b);
  const points = inside.filter((x, i) => i === 0 || x - inside[i - 1] > 1e-13 * Math.max(1, Math.abs(x)));
  return { points, evaluations };
}

/** The geometric mesh about `center` that findBreakpoints samples switch functions on. */
export function samplingMesh(lo: number, hi: number, center: number, scale: number): number[] {
  const mesh = new Set<number>([center]);
  for (let k = -20 * SAMPLES_PER_OCTAVE; k <= (OCTAVES - 20) * SAMPLES_PER_OCTAVE; k++) {
    const d = scale * 2 ** (k / SAMPLES_PER_OCTAVE);
    mesh.add(center + d);
    mesh.add(center - d);
  }
  if (Number.isFinite(lo)) mesh.add(lo);
  if (Number.isFinite(hi)) mesh.add(hi);
  return [...mesh].filter((x) => x >= lo && x <= hi).sort((a, b) => a - b);
}

function bisect(g: (x: number) => number, a: number, b: number, ga: number): { x: number; evaluations: number } {
  let evaluations = 0;
  for (;;) {
    const mid = 0.5 * (a + b);
    if (mid <= a || mid >= b) return { x: mid, evaluations };
    const gm = g(mid);
    evaluations++;
    if (gm === 0) return { x: mid, evaluations };
    if (gm < 0 === ga < 0) {
      a = mid;
      ga = gm;
    } else b = mid;
  }
}
