/** Moves node values from one product grid to another, axis by axis (the interpolant is the tensor product of the 1-D ones). */
import { interpolationMatrix, type AxisDvr } from './axis-dvr.ts';

/** Values on grid `from` (row-major, last axis fastest) interpolated to the nodes of grid `to`. */
export function transferValues(from: AxisDvr[], to: AxisDvr[], values: Float64Array): Float64Array {
  let shape = from.map((a) => a.size);
  let current = values;
  for (let a = 0; a < from.length; a++) {
    const matrix = interpolationMatrix(from[a], to[a]);
    const n = from[a].size;
    const m = to[a].size;
    let inner = 1;
    for (let b = a + 1; b < shape.length; b++) inner *= shape[b];
    const outer = current.length / (n * inner);
    const next = new Float64Array(outer * m * inner);
    for (let o = 0; o < outer; o++) {
      for (let i = 0; i < m; i++) {
        const target = (o * m + i) * inner;
        for (let j = 0; j < n; j++) {
          const c = matrix[i * n + j];
          if (c === 0) continue;
          const source = (o * n + j) * inner;
          for (let s = 0; s < inner; s++) next[target + s] += c * current[source + s];
        }
      }
    }
    shape = shape.map((size, b) => (b === a ? m : size));
    current = next;
  }
  return current;
}
