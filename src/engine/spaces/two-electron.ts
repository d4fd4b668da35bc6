import { integrateProduct, type CubaturePartition, type ProductIntegrand } from '../cubature/integrate-product.ts';
import type { FieldTrial, PointFunction } from '../problem.ts';
import type { ExchangeSign } from '../two-electron/correlated-basis.ts';
import { exchangeChecks } from '../two-electron/exchange-check.ts';
import { EXCHANGE_REPRESENTATIVES, simplexPoint } from '../two-electron/perimetric.ts';
import { boxSpace } from './box.ts';
import { twoElectronReference } from '../two-electron/two-electron-reference.ts';
import { cubatureAxes, type FieldSpace } from './field-space.ts';
import { halfLineSpace } from './half-line.ts';
import type { CoordinateSpace } from './space.ts';

const R1 = 0;
const R2 = 1;
const R12 = 2;

/**
 * 1e-10 relative is what the two-electron energies are asked for; each evaluation here calls the trial and its gradient
 * at three simplex points, so the general 1e-11 of the other spaces would cost a third more for a digit nobody reads.
 */
const ENERGY_REL_TOL = 1e-10;

/** The largest perimetric coordinate q >= 0 and the ratios s, t in [0, 1] (see simplexPoint); no walls anywhere. */
const radialAxis: CoordinateSpace = { ...halfLineSpace, walls: [] };
const ratioAxis: CoordinateSpace = { ...boxSpace(0, 1), walls: [] };


/**
 * `two-electron`: S states of two particles of one mass about a fixed centre, the trial a function of r1, r2, r12.
 * The six-dimensional integrals reduce to dtau = 8 pi^2 r1 r2 r12 dr1 dr2 dr12 over the triangle, integrated in the
 * perimetric coordinates u = r1 + r2 - r12, v = r1 - r2 + r12, w = -r1 + r2 + r12 >= 0 (Pekeris, Phys. Rev. 112, 1649
 * (1958)), where the region is the octant, split by the order of u, v, w into six simplices mapped onto one product
 * [0, inf) x [0, 1]^2 (simplexPoint) so that the Coulomb singularities on the octant's edges disappear.
 */
export function twoElectronSpace(mass: number, exchange: ExchangeSign): FieldSpace & { exchange: ExchangeSign; mass: number } {
  return {
    name: 'two-electron',
    coordinates: ['r1', 'r2', 'r12'],
    axes: [radialAxis, ratioAxis, ratioAxis],
    pointOf: (point, out) => (simplexPoint(point, 0, out), out),
    energyIntegrand: (trial, potential) => twoElectronEnergyIntegrand(trial, potential, mass),
    varianceIntegrand: (trial, potential, energy) => twoElectronVarianceIntegrand(trial, potential, energy),
    integrate(integrand, components, placements, options) {
      const relTol = Math.max(options.relTol, ENERGY_REL_TOL);
      return integrateProduct(integrand, components, cubatureAxes(this, placements), { relTol, absTol: options.absTol, start: options.start as CubaturePartition | undefined });
    },
    // The Coulomb singularities sit on the faces of the octant (r1 = 0 is u = v = 0), where the cubature's nodes never go.
    singularities: () => [],
    // The integrands sum one ordering of each exchanged pair twice, which these checks make sound.
    trialChecks: (problem, placement, where) => exchangeChecks(problem, placement, exchange, where),
    reference: (problem) => twoElectronReference(problem, mass, exchange),
    exchange,
    mass,
  };
}

/**
 * Integrands of N, <T> and <V> over the perimetric octant, T in the first-derivative form for S states of
 * (Hylleraas, Z. Phys. 54, 347 (1929); Bethe & Salpeter, Quantum Mechanics of One- and Two-Electron Atoms, 1957, §32):
 * 2m T = psi_1^2 + psi_2^2 + 2 psi_12^2 + psi_1 psi_12 (r1^2 - r2^2 + r12^2)/(r1 r12) + psi_2 psi_12 (r2^2 - r1^2 + r12^2)/(r2 r12),
 * which is |grad_1 psi|^2 + |grad_2 psi|^2 with cos(r1, r12) = (r1^2 - r2^2 + r12^2)/(2 r1 r12).
 */
export function twoElectronEnergyIntegrand(trial: Pick<FieldTrial, 'value' | 'gradient'>, potential: PointFunction, mass: number): ProductIntegrand {
  const r = new Float64Array(3);
  const [d1, d2, d12] = trial.gradient;
  const halfOverMass = 1 / (2 * mass);
  return (point, out) => {
    out[0] = out[1] = out[2] = 0;
    for (const k of EXCHANGE_REPRESENTATIVES) {
      const w = 2 * simplexPoint(point, k, r);
      const [r1, r2, r12] = [r[R1], r[R2], r[R12]];
      const psi = trial.value(r);
      const g1 = d1(r);
      const g2 = d2(r);
      const g12 = d12(r);
      const c1 = (r1 * r1 - r2 * r2 + r12 * r12) / (r1 * r12);
      const c2 = (r2 * r2 - r1 * r1 + r12 * r12) / (r2 * r12);
      out[0] += w * psi * psi;
      out[1] += w * halfOverMass * (g1 * g1 + g2 * g2 + 2 * g12 * g12 + c1 * g1 * g12 + c2 * g2 * g12);
      if (psi !== 0) out[2] += w * potential(r) * psi * psi;
    }
  };
}

/** |(H - E) psi|^2 over the octant; `laplacian` is (laplacian_1 + laplacian_2) psi / mass in r1, r2, r12 (see twoElectronLaplacian). */
export function twoElectronVarianceIntegrand(trial: Pick<FieldTrial, 'value' | 'laplacian'>, potential: PointFunction, energy: number): ProductIntegrand {
  const r = new Float64Array(3);
  return (point, out) => {
    out[0] = 0;
    for (const k of EXCHANGE_REPRESENTATIVES) {
      const w = 2 * simplexPoint(point, k, r);
      const psi = trial.value(r);
      if (psi === 0) continue;
      const residual = -0.5 * trial.laplacian(r) + (potential(r) - energy) * psi;
      out[0] += w * residual * residual;
    }
  };
}
