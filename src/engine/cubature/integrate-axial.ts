// Integrals over the axial half-plane (rho >= 0, z) with Coulomb centres on the axis. In (rho, z) a
// 1/r^2 at a centre (|(H - E) psi|^2 of a trial without the cusp) costs millions of calls; in polar
// coordinates about the centre, rho drho dz = r dr dtheta and the same integrand is smooth.
import { RHO, Z } from './energy-integrands.ts';
import { integrateProduct, STATUS_RANK, type CubatureAxis, type CubaturePartition, type CubatureResult, type ProductIntegrand } from './integrate-product.ts';
import type { IntegrationStatus } from '../quadrature.ts';

export interface AxialOptions {
  /** Length scale of the trial, for the map of r to infinity. */
  scale: number;
  relTol?: number;
  absTol?: number;
  maxIntervals?: number;
  /** A previous result's `partition`, at nearby parameters with the same centres. */
  start?: AxialPartition;
}

/** The panels of each centre's piece. */
export interface AxialPartition {
  centres: number[];
  pieces: (CubaturePartition | null)[];
}

export interface AxialResult extends Omit<CubatureResult, 'partition'> {
  partition: AxialPartition | null;
}

/** Becke's cell function s(mu) = (1 - p(p(p(mu))))/2 with p(mu) = 3mu/2 - mu^3/2: 1 at mu = -1, 0 at mu = 1, flat at both. */
function cell(mu: number): number {
  let p = mu;
  for (let i = 0; i < 3; i++) p = 1.5 * p - 0.5 * p * p * p;
  return 0.5 * (1 - p);
}

/**
 * Integral over the half-plane of an integrand that carries its own volume element (2 pi rho), split
 * into one piece per centre by Becke's fuzzy cells (A. D. Becke, J. Chem. Phys. 88, 2547 (1988)), each
 * piece integrated in polar coordinates (r, theta) about its centre by the nested Gauss–Kronrod
 * cubature, theta outermost and r split at the distances of the other centres. The weights sum to 1
 * everywhere and vanish smoothly at every other centre, so no piece sees another's singularity.
 * With no nucleus, pass the trial's centre: one piece, weight 1.
 */
export function integrateAxial(integrand: ProductIntegrand, components: number, centres: number[], options: AxialOptions): AxialResult {
  const zs = [...new Set(centres)].sort((a, b) => a - b);
  if (zs.length === 0 || !zs.every(Number.isFinite)) throw new RangeError('integrateAxial: at least one finite centre is needed');
  const start = options.start && options.start.centres.length === zs.length && options.start.centres.every((z, i) => z === zs[i]) ? options.start : undefined;
  const count = zs.length;
  const distances = new Float64Array(count);
  const cells = new Float64Array(count);
  const inner = new Float64Array(components);
  const point = new Float64Array(2);

  const values = new Float64Array(components);
  const errorEstimates = new Float64Array(components);
  let evaluations = 0;
  let status: IntegrationStatus = 'converged';
  let message: string | null = null;
  const pieces: (CubaturePartition | null)[] = [];

  for (let i = 0; i < count; i++) {
    const zi = zs[i];
    // Becke's weight of centre i at the point: its cell product over the sum of all.
    const weight = (): number => {
      if (count === 1) return 1;
      for (let j = 0; j < count; j++) {
        const dz = point[Z] - zs[j];
        distances[j] = Math.sqrt(point[RHO] * point[RHO] + dz * dz);
      }
      let total = 0;
      for (let j = 0; j < count; j++) {
        let product = 1;
        for (let k = 0; k < count && product > 0; k++) {
          if (k !== j) product *= cell((distances[j] - distances[k]) / Math.abs(zs[j] - zs[k]));
        }
        cells[j] = product;
        total += product;
      }
      return cells[i] / total;
    };
    const polar: ProductIntegrand = (p, out) => {
      const r = p[0];
      const theta = p[1];
      point[RHO] = r * Math.sin(theta);
      point[Z] = zi + r * Math.cos(theta);
      const w = weight();
      if (w === 0) {
        out.fill(0);
        return;
      }
      integrand(point, inner);
      for (let k = 0; k < components; k++) out[k] = w * r * inner[k];
    };
    const axes: CubatureAxis[] = [
      { lo: 0, hi: Infinity, breakpoints: zs.filter((_, j) => j !== i).map((zj) => Math.abs(zj - zi)), center: 0, scale: options.scale },
      { lo: 0, hi: Math.PI, breakpoints: [], center: NaN, scale: 1 },
    ];
    const result = integrateProduct(polar, components, axes, {
      relTol: options.relTol, absTol: options.absTol, maxIntervals: options.maxIntervals, order: [1, 0], start: start?.pieces[i] ?? undefined,
    });
    for (let k = 0; k < components; k++) {
      values[k] += result.values[k];
      errorEstimates[k] += result.errorEstimates[k];
    }
    evaluations += result.evaluations;
    pieces.push(result.partition);
    if (STATUS_RANK[result.status] > STATUS_RANK[status]) {
      status = result.status;
      message = `about the centre at z = ${zi}: ${result.message}`;
    }
  }
  const partition = status === 'non-finite' ? null : { centres: zs, pieces };
  return { values, errorEstimates, evaluations, converged: status === 'converged', status, message, partition };
}
