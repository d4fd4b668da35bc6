// The integrands of <psi|psi>, <T>, <V> and ||(H - E) psi||^2 in the axial and Cartesian product
// spaces, built from plain closures of a point, so that the space modules only compile and place.
import { VARIANCE_FLOOR } from '../variance.ts';
import type { CubatureResult, ProductIntegrand } from './integrate-product.ts';

export type PointFunction = (point: Float64Array) => number;

/** Index of rho and of z in an axial point. */
export const RHO = 0;
export const Z = 1;

/** A trial in axial coordinates (rho, z): psi(rho, z) e^{i m phi}. */
export interface AxialClosures {
  value: PointFunction;
  dRho: PointFunction;
  dZ: PointFunction;
  potential: PointFunction;
  mass: number;
  /** The magnetic quantum number m; adds m^2 / (2 mass rho^2) to the kinetic energy. */
  magnetic: number;
}

/** A trial on a product of 2 or 3 Cartesian coordinates, each with its own mass. */
export interface CartesianClosures {
  value: PointFunction;
  /** d psi / d x_k, one per coordinate. */
  gradient: PointFunction[];
  potential: PointFunction;
  masses: number[];
}

const TWO_PI = 2 * Math.PI;

/**
 * Integrands of N = int |psi|^2 dV, int (|grad psi|^2 + m^2 |psi|^2 / rho^2) / (2 mass) dV (the gradient
 * form, which needs no second derivative) and int V |psi|^2 dV, with dV = 2 pi rho drho dz.
 * Where psi underflows to 0 the products are 0, never V * 0 = NaN at a singular or overflowing V.
 */
export function axialEnergyIntegrand(trial: AxialClosures): ProductIntegrand {
  const { value, dRho, dZ, potential } = trial;
  const halfOverMass = 1 / (2 * trial.mass);
  const m2 = trial.magnetic * trial.magnetic;
  return (point, out) => {
    const psi = value(point);
    const rho = point[RHO];
    const w = TWO_PI * rho;
    const gr = dRho(point);
    const gz = dZ(point);
    const density = psi * psi;
    out[0] = w * density;
    out[1] = w * halfOverMass * (gr * gr + gz * gz) + (m2 === 0 || psi === 0 ? 0 : TWO_PI * halfOverMass * m2 * density / rho);
    out[2] = psi === 0 ? 0 : w * potential(point) * density;
  };
}

/** Integrands of N, sum_k int |d_k psi|^2 / (2 m_k) and int V |psi|^2 over a Cartesian product (dV = dx dy [dz]). */
export function cartesianEnergyIntegrand(trial: CartesianClosures): ProductIntegrand {
  const { value, gradient, potential } = trial;
  if (gradient.length !== trial.masses.length) throw new RangeError('cartesianEnergyIntegrand: one mass per coordinate is needed');
  const halfOverMass = Float64Array.from(trial.masses, (m) => 1 / (2 * m));
  const dims = gradient.length;
  return (point, out) => {
    const psi = value(point);
    let kinetic = 0;
    for (let k = 0; k < dims; k++) {
      const g = gradient[k](point);
      kinetic += halfOverMass[k] * g * g;
    }
    out[0] = psi * psi;
    out[1] = kinetic;
    out[2] = psi === 0 ? 0 : potential(point) * psi * psi;
  };
}

/**
 * Integrand of ||(H - E) psi||^2 in axial coordinates; `laplacian` is the cylindrical Laplacian of psi
 * as a function of (rho, z), d2_rho psi + d_rho psi / rho + d2_z psi, to which the magnetic term
 * -m^2 psi / rho^2 is added here.
 */
export function axialVarianceIntegrand(trial: AxialClosures & { laplacian: PointFunction }, energy: number): ProductIntegrand {
  const { value, potential, laplacian } = trial;
  const halfOverMass = 1 / (2 * trial.mass);
  const m2 = trial.magnetic * trial.magnetic;
  return (point, out) => {
    const psi = value(point);
    if (psi === 0) {
      out[0] = 0;
      return;
    }
    const rho = point[RHO];
    const residual = -halfOverMass * (laplacian(point) - (m2 * psi) / (rho * rho)) + (potential(point) - energy) * psi;
    out[0] = TWO_PI * rho * residual * residual;
  };
}

/** Integrand of ||(H - E) psi||^2 over a Cartesian product; `laplacian` is the mass-weighted sum_k d2_k psi / m_k. */
export function cartesianVarianceIntegrand(trial: CartesianClosures & { laplacian: PointFunction }, energy: number): ProductIntegrand {
  const { value, potential, laplacian } = trial;
  return (point, out) => {
    const psi = value(point);
    if (psi === 0) {
      out[0] = 0;
      return;
    }
    const residual = -0.5 * laplacian(point) + (potential(point) - energy) * psi;
    out[0] = residual * residual;
  };
}

/** Energy and its parts from the three integrals of an energy integrand, the error propagated from their estimates. */
export interface ProductEnergy {
  norm: number;
  kinetic: number;
  potential: number;
  energy: number;
  errorEstimate: number;
}

export function energyFromIntegrals(result: Pick<CubatureResult, 'values' | 'errorEstimates'>): ProductEnergy {
  const [norm, t, v] = result.values;
  const [en, et, ev] = result.errorEstimates;
  const kinetic = t / norm;
  const potential = v / norm;
  const energy = kinetic + potential;
  return { norm, kinetic, potential, energy, errorEstimate: (et + ev + Math.abs(energy) * en) / Math.abs(norm) };
}

/** Absolute tolerance of a variance run: a variance at rounding level (a nearly exact trial) is resolved only to that level, as in one dimension. */
export function varianceAbsTol(at: ProductEnergy): number {
  return VARIANCE_FLOOR * Math.max(at.energy * at.energy, 1e-300) * at.norm;
}
