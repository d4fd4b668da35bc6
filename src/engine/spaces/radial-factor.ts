import type { MassProfile } from '../problem.ts';
import type { VectorIntegrand } from '../quadrature.ts';
import { negligibleAt, type TrialProbe } from '../trial-probe.ts';
import type { CoordinateSpace, TrialFunctions } from './space.ts';

/** How a rotationally symmetric space of `dimension` dimensions weighs its radial factor R(r). */
export interface RadialForm {
  /** 3 for `radial`, 2 for `plane`. */
  dimension: 2 | 3;
  /** l(l+1) in 3-D, m^2 in 2-D: the angular part of the kinetic energy is angular / (2 mass r^2). */
  angular: number;
  /** r^(dimension - 1): the volume element up to its constant angular factor. */
  weight(r: number): number;
  /** angular * weight(r) / r^2, written so that it stays finite where it should (r = 0 with no angular part). */
  centrifugal(r: number): number;
}

/**
 * The integrands of a space whose trial is a radial factor R(r) of a state with definite angular momentum:
 * 2m T = |R'|^2 + angular R^2 / r^2 (gradient form) and H R = -(R'' + (dimension - 1) R'/r)/2m + angular R/(2m r^2) + V R,
 * each times the weight r^(dimension - 1).
 */
export function radialFactor(form: RadialForm): Pick<CoordinateSpace, 'coordinate' | 'weight' | 'energyIntegrand' | 'varianceIntegrand' | 'centrifugal'> {
  const { weight, centrifugal, angular } = form;
  const friction = form.dimension - 1;
  return {
    coordinate: 'r',
    weight,
    centrifugal,
    energyIntegrand(trial: TrialFunctions, potential: (r: number) => number, profile: MassProfile | null, probe: TrialProbe): VectorIntegrand {
      if (profile) {
        return (r, out) => {
          const R = trial.value(r);
          if (negligibleAt(probe, weight, r, R)) return out.fill(0);
          const dR = trial.d1(r);
          const w = weight(r);
          out[0] = w * R * R;
          out[1] = (w * dR * dR + centrifugal(r) * R * R) / profile.value(r);
          out[2] = R === 0 ? 0 : w * potential(r) * R * R;
        };
      }
      return (r, out) => {
        const R = trial.value(r);
        if (negligibleAt(probe, weight, r, R)) return out.fill(0);
        const dR = trial.d1(r);
        const w = weight(r);
        out[0] = w * R * R;
        out[1] = w * dR * dR + centrifugal(r) * R * R;
        out[2] = R === 0 ? 0 : w * potential(r) * R * R;
      };
    },
    varianceIntegrand(trial: TrialFunctions, potential: (r: number) => number, mass: number, energy: number, profile: MassProfile | null, probe: TrialProbe): VectorIntegrand {
      if (profile) {
        return (r, out) => {
          const R = trial.value(r);
          if (negligibleAt(probe, weight, r, R)) {
            out[0] = 0;
            return;
          }
          const m = profile.value(r);
          const d1 = trial.d1(r);
          const laplacian = trial.d2(r) + (friction * d1) / r;
          const hR = -(laplacian / m - (profile.d1(r) * d1) / (m * m)) / 2 + (angular / (2 * m * r * r) + potential(r) - energy) * R;
          out[0] = weight(r) * hR * hR;
        };
      }
      return (r, out) => {
        const R = trial.value(r);
        if (negligibleAt(probe, weight, r, R)) {
          out[0] = 0;
          return;
        }
        const hR = -(trial.d2(r) + (friction * trial.d1(r)) / r) / (2 * mass) + (angular / (2 * mass * r * r) + potential(r) - energy) * R;
        out[0] = weight(r) * hR * hR;
      };
    },
  };
}
