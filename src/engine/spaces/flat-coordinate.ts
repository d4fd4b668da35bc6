import type { MassProfile } from '../problem.ts';
import type { VectorIntegrand } from '../quadrature.ts';
import { negligibleAt, type TrialProbe } from '../trial-probe.ts';
import type { CoordinateSpace, TrialFunctions } from './space.ts';

/** The parts shared by the spaces of one Cartesian coordinate (line, half-line, box): weight 1, T = |psi'|^2 / 2m. */
const weight = () => 1;

export const flatCoordinate: Pick<CoordinateSpace, 'coordinate' | 'weight' | 'energyIntegrand' | 'varianceIntegrand' | 'centrifugal' | 'gridFactor'> = {
  coordinate: 'x',
  weight,
  centrifugal: () => 0,
  gridFactor: () => 1,
  energyIntegrand(trial: TrialFunctions, potential: (x: number) => number, profile: MassProfile | null, probe: TrialProbe): VectorIntegrand {
    if (profile) {
      return (x, out) => {
        const psi = trial.value(x);
        if (negligibleAt(probe, weight, x, psi)) return out.fill(0);
        const dpsi = trial.d1(x);
        out[0] = psi * psi;
        out[1] = (dpsi * dpsi) / profile.value(x);
        out[2] = psi === 0 ? 0 : potential(x) * psi * psi;
      };
    }
    return (x, out) => {
      const psi = trial.value(x);
      if (negligibleAt(probe, weight, x, psi)) return out.fill(0);
      const dpsi = trial.d1(x);
      out[0] = psi * psi;
      out[1] = dpsi * dpsi;
      // Far out a trial underflows to 0 where V may overflow (a Morse wall): the product is 0, not NaN.
      out[2] = psi === 0 ? 0 : potential(x) * psi * psi;
    };
  },
  varianceIntegrand(trial: TrialFunctions, potential: (x: number) => number, mass: number, energy: number, profile: MassProfile | null, probe: TrialProbe): VectorIntegrand {
    if (profile) {
      return (x, out) => {
        const psi = trial.value(x);
        if (negligibleAt(probe, weight, x, psi)) {
          out[0] = 0;
          return;
        }
        const m = profile.value(x);
        const hPsi = -(trial.d2(x) / m - (profile.d1(x) * trial.d1(x)) / (m * m)) / 2 + (potential(x) - energy) * psi;
        out[0] = hPsi * hPsi;
      };
    }
    return (x, out) => {
      const psi = trial.value(x);
      if (negligibleAt(probe, weight, x, psi)) {
        out[0] = 0;
        return;
      }
      const hPsi = -trial.d2(x) / (2 * mass) + (potential(x) - energy) * psi;
      out[0] = hPsi * hPsi;
    };
  },
};
