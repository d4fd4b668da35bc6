import { g } from '../format.ts';
import type { FieldPlacement } from '../field-probe.ts';
import type { FieldProblem, PointFunction } from '../problem.ts';
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
export function exchangeChecks(problem: FieldProblem, placement: FieldPlacement, sign: ExchangeSign, where: string): GradedCheck[] {
  const potential = worstMismatch(problem.potential, placement, 1);
  const trial = worstMismatch(problem.trial.value, placement, sign);
  const declared = sign === 1 ? 'symmetric (a spin singlet)' : 'antisymmetric (a spin triplet)';
  const at = (p: Mismatch) => p.at.map((x, i) => `${['r1', 'r2', 'r12'][i]} = ${g(x, 4)}`).join(', ');
  return [
    gradedCheck(
      'exchange-symmetric-potential',
      potential.ratio <= SYMMETRY_TOLERANCE,
      potential.ratio <= SYMMETRY_TOLERANCE
        ? 'the potential is symmetric under r1 <-> r2'
        : `the potential must treat both particles alike, but at ${at(potential)} it is ${g(potential.value, 6)} and with r1 and r2 exchanged ${g(potential.exchanged, 6)}`,
      'invalid',
      'potential',
    ),
    gradedCheck(
      'exchange-symmetry',
      trial.ratio <= SYMMETRY_TOLERANCE,
      trial.ratio <= SYMMETRY_TOLERANCE
        ? `the trial is ${declared} under r1 <-> r2 at every sample point (worst mismatch ${g(trial.ratio, 2)} of its peak) at ${where}`
        : `exchange is declared ${sign === 1 ? 'symmetric' : 'antisymmetric'}, but at ${at(trial)} the trial is ${g(trial.value, 6)} and with r1 and r2 exchanged ${g(trial.exchanged, 6)} (must be ${sign === 1 ? 'equal' : 'opposite'}) at ${where}`,
      'invalid',
      'exchange',
    ),
  ];
}

interface Mismatch {
  ratio: number;
  at: number[];
  value: number;
  exchanged: number;
}

/** The largest |f(r2, r1, r12) - sign f(r1, r2, r12)| over the sample points, against the largest |f| there. */
function worstMismatch(f: PointFunction, placement: FieldPlacement, sign: ExchangeSign): Mismatch {
  const r = new Float64Array(3);
  const swapped = new Float64Array(3);
  const scale = placement.axes[0].scale;
  const samples: Array<Omit<Mismatch, 'ratio'>> = [];
  let peak = 0;
  for (const a of OFFSETS) {
    for (const b of OFFSETS) {
      for (const c of SPANS) {
        r[0] = a * scale;
        r[1] = b * scale;
        r[2] = Math.abs(r[0] - r[1]) + c * (r[0] + r[1] - Math.abs(r[0] - r[1]));
        swapped[0] = r[1];
        swapped[1] = r[0];
        swapped[2] = r[2];
        const value = f(r);
        const exchanged = f(swapped);
        samples.push({ at: Array.from(r), value, exchanged });
        peak = Math.max(peak, Math.abs(value));
      }
    }
  }
  let worst: Mismatch = { ratio: 0, at: [0, 0, 0], value: 0, exchanged: 0 };
  for (const s of samples) {
    const ratio = Math.abs(s.exchanged - sign * s.value) / peak;
    if (!(ratio <= worst.ratio)) worst = { ratio, ...s };
  }
  return worst;
}
