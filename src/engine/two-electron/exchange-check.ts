import { g } from '../format.ts';
import type { FieldPlacement } from '../field-probe.ts';
import type { FieldTrial } from '../problem.ts';
import { gradedCheck, type GradedCheck } from '../status.ts';
import type { ExchangeSign } from './correlated-basis.ts';

/** A trial of the declared symmetry agrees with its exchanged self to rounding; this much of its peak is a real difference. */
const SYMMETRY_TOLERANCE = 1e-9;
const OFFSETS = [0.05, 0.2, 0.5, 1];
const SPANS = [0.1, 0.5, 0.9];

/**
 * psi(r2, r1, r12) = sign psi(r1, r2, r12) at points spread where the trial lives (r1 and r2 at fractions of the
 * largest perimetric coordinate's scale, r12 across its range |r1 - r2| .. r1 + r2); the worst mismatch against the
 * trial's peak decides.
 */
export function exchangeCheck(trial: FieldTrial, placement: FieldPlacement, sign: ExchangeSign, where: string): GradedCheck {
  const r = new Float64Array(3);
  const swapped = new Float64Array(3);
  const scale = placement.axes[0].scale;
  let worst = { ratio: 0, at: [0, 0, 0], psi: 0, exchanged: 0 };
  for (const a of OFFSETS) {
    for (const b of OFFSETS) {
      for (const c of SPANS) {
        r[0] = a * scale;
        r[1] = b * scale;
        r[2] = Math.abs(r[0] - r[1]) + c * (r[0] + r[1] - Math.abs(r[0] - r[1]));
        swapped[0] = r[1];
        swapped[1] = r[0];
        swapped[2] = r[2];
        const psi = trial.value(r);
        const exchanged = trial.value(swapped);
        const ratio = Math.abs(exchanged - sign * psi) / placement.peakAmplitude;
        if (!(ratio <= worst.ratio)) worst = { ratio, at: Array.from(r), psi, exchanged };
      }
    }
  }
  const declared = sign === 1 ? 'symmetric (a spin singlet)' : 'antisymmetric (a spin triplet)';
  const pass = worst.ratio <= SYMMETRY_TOLERANCE;
  const [r1, r2, r12] = worst.at.map((x) => g(x, 4));
  return gradedCheck(
    'exchange-symmetry',
    pass,
    pass
      ? `the trial is ${declared} under r1 <-> r2 at every sample point (worst mismatch ${g(worst.ratio, 2)} of its peak) at ${where}`
      : `exchange is declared ${sign === 1 ? 'symmetric' : 'antisymmetric'}, but at r1 = ${r1}, r2 = ${r2}, r12 = ${r12} the trial is ${g(worst.psi, 6)} and with r1 and r2 exchanged ${g(worst.exchanged, 6)} (must be ${sign === 1 ? 'equal' : 'opposite'}) at ${where}`,
    'invalid',
    'exchange',
  );
}
