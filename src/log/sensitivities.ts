import type { MathNode } from 'mathjs';
import type { ExtraExpectation } from '../engine/expectation-of.ts';
import { g } from '../engine/format.ts';
import { gradedCheck, type GradedCheck } from '../engine/status.ts';
import type { Compiled } from '../expr/compile.ts';
import { compileDerivative } from '../expr/compile-derivative.ts';
import { dependsOn } from '../expr/differentiate.ts';
import { blockConstants } from '../expr/block-scope.ts';
import { coordinatesOf, type BlockSpec } from '../spec/types.ts';
import type { Sensitivity, UncertaintyResult } from './result-types.ts';

/** What the sensitivities need from one evaluated block (atomic units). */
export interface SensitivityInputs {
  spec: BlockSpec;
  energy: number;
  energyError: number;
  kinetic: number | null;
  trees: { potential: MathNode; states: MathNode[]; mass: MathNode | null };
  /** <f> over the optimum's density by the space's own integrator; null for a basis block (its levels mix functions). */
  expectationOf: ((f: Compiled) => ExtraExpectation) | null;
  /** The block re-optimised with one input changed (variational part only); null where that evaluation fails. */
  energyAt: (name: string, value: number) => number | null;
  /**
   * Whether every sensitivity gets its finite-difference check. On spaces of several coordinates a re-optimisation
   * costs about as much as the block, so there only the uncertain inputs (re-evaluated at c +- u anyway) get one.
   */
  checkEvery: boolean;
}

/** A central difference this fraction of the input (or of one atomic unit, for an input of 0) wide. */
const RELATIVE_STEP = 1e-3;
/** Hellmann–Feynman and the finite difference agree to this fraction, beyond the difference's own noise. */
const AGREEMENT = 1e-3;
/** First-order propagation is called linear while re-evaluation at c +- u agrees with it to this fraction. */
const LINEARITY = 0.1;

/**
 * dE/dc for every declared constant, uncertain fixed parameter and the constant mass: at the optimum by the Hellmann–Feynman
 * theorem, dE/dc = <dH/dc> (Feynman, Phys. Rev. 56, 340 (1939); it holds at a variational optimum of a trial that does
 * not itself use c, by the envelope theorem), dH/dc the symbolic derivative of the potential and, for the mass,
 * d<T>/dm = -<T>/m; each checked against a central difference of re-optimised energies. Inputs with an uncertainty
 * get first-order propagation (inputs uncorrelated, GUM eq. (10)) confirmed by re-evaluation at c +- u.
 */
export function sensitivities(inputs: SensitivityInputs): { sensitivities: Sensitivity[]; uncertainty: UncertaintyResult | null; checks: GradedCheck[] } {
  const { spec } = inputs;
  const bound = new Set(spec.quantity?.bound ?? []);
  const names: Array<[string, number]> = [
    ...Object.entries(spec.constants).filter(([name]) => !bound.has(name)),
    // A fixed parameter is usually a value held at an optimum found elsewhere; it counts as an input when uncertain.
    ...Object.entries(spec.fixed).filter(([name]) => Object.hasOwn(spec.uncertainties, name)),
    // A mass per coordinate, or one that depends on the coordinate, has no single value to vary.
    ...(typeof spec.mass === 'number' && spec.masses === null ? [['mass', spec.mass] as [string, number]] : []),
  ];
  const checks: GradedCheck[] = [];
  const list = names.map(([name, value]) => {
    const s = sensitivity(inputs, name, value);
    if (s.agrees === false) {
      checks.push(
        gradedCheck(
          `sensitivity-${name}`,
          false,
          `dE/d${name} by Hellmann–Feynman ${g(s.hellmannFeynman!, 6)} and by re-optimised finite difference ${g(s.finiteDifference!, 6)} disagree (the optimum may not be settled)`,
          'unsettled',
        ),
      );
    }
    return s;
  });
  return { sensitivities: list, uncertainty: propagate(inputs, list), checks };
}

function sensitivity(inputs: SensitivityInputs, name: string, value: number): Sensitivity {
  const { spec, trees } = inputs;
  const uncertainty = spec.uncertainties[name] ?? null;
  let hellmannFeynman: number | null = null;
  let note: string | null = null;
  if (!inputs.expectationOf) note = 'the linear method mixes its functions: finite difference only';
  else if (name !== 'mass' && trees.states.some((t) => dependsOn(t, name))) note = `the trial uses ${name}, so <dH/d${name}> is not dE/d${name}: finite difference only`;
  else if (name !== 'mass' && trees.mass && dependsOn(trees.mass, name)) note = `the mass uses ${name}: finite difference only`;
  else if (name === 'mass' && trees.states.some((t) => dependsOn(t, 'mass'))) note = 'the trial uses mass, so -<T>/m is not dE/dm: finite difference only';
  else {
    const constants = blockConstants(spec);
    const derivative = compileDerivative(trees.potential, name, coordinatesOf(spec.space), constants);
    const potentialPart = derivative ? inputs.expectationOf(derivative.at).value : 0;
    // T = p^2/(2m): dT/dm = -T/m at fixed state.
    hellmannFeynman = name === 'mass' ? -inputs.kinetic! / value + potentialPart : potentialPart;
  }

  const step = RELATIVE_STEP * (value === 0 ? 1 : Math.abs(value));
  const checked = inputs.checkEvery || uncertainty !== null || hellmannFeynman === null;
  const plus = checked ? inputs.energyAt(name, value + step) : null;
  const minus = checked ? inputs.energyAt(name, value - step) : null;
  const finiteDifference = plus === null || minus === null ? null : (plus - minus) / (2 * step);
  // Each re-optimised energy is settled to about the quadrature's estimate and the search's tolerance.
  const noise = (10 * inputs.energyError + 1e-9 * Math.max(1, Math.abs(inputs.energy))) / step;
  const agrees =
    hellmannFeynman === null || finiteDifference === null ? null : Math.abs(hellmannFeynman - finiteDifference) <= AGREEMENT * Math.max(Math.abs(hellmannFeynman), Math.abs(finiteDifference)) + noise;

  const slope = hellmannFeynman ?? finiteDifference;
  let reevaluated: number | null = null;
  let linear: boolean | null = null;
  if (uncertainty !== null && uncertainty > 0 && slope !== null) {
    if (name === 'mass' && uncertainty >= value) note = 'the mass minus its uncertainty is not positive: not re-evaluated';
    else {
      const up = inputs.energyAt(name, value + uncertainty);
      const down = inputs.energyAt(name, value - uncertainty);
      if (up !== null && down !== null) {
        reevaluated = (up - down) / 2;
        const first = slope * uncertainty;
        linear = Math.abs(Math.abs(reevaluated) - Math.abs(first)) <= LINEARITY * Math.max(Math.abs(first), Math.abs(reevaluated));
      }
    }
  }
  return {
    name,
    value,
    unit: null,
    hellmannFeynman,
    finiteDifference,
    step,
    agrees,
    note,
    uncertainty,
    contribution: uncertainty !== null && slope !== null ? Math.abs(slope) * uncertainty : null,
    reevaluated,
    linear,
    perUnit: null,
  };
}

/** E +- dE from the inputs with an uncertainty, first order and uncorrelated, with its confirmation by re-evaluation. */
function propagate(inputs: SensitivityInputs, list: Sensitivity[]): UncertaintyResult | null {
  const uncertain = list.filter((s) => s.uncertainty !== null);
  if (uncertain.length === 0) return null;
  const missing = uncertain.filter((s) => s.contribution === null).map((s) => s.name);
  const firstOrder = Math.hypot(...uncertain.map((s) => s.contribution ?? 0));
  const confirmed = uncertain.every((s) => s.uncertainty === 0 || s.reevaluated !== null);
  const reevaluated = confirmed ? Math.hypot(...uncertain.map((s) => s.reevaluated ?? 0)) : null;
  const nonlinear = uncertain.filter((s) => s.linear === false).map((s) => s.name);
  const notes = [
    ...(missing.length ? [`no sensitivity for ${missing.join(', ')}: left out of the propagation`] : []),
    ...(nonlinear.length
      ? [`re-evaluation at c +- uncertainty differs from first-order propagation by more than ${LINEARITY * 100}% for ${nonlinear.join(', ')}: the response is not linear there`]
      : []),
  ];
  return { energy: inputs.energy, uncertainty: firstOrder, reevaluated, linear: nonlinear.length === 0, note: notes.length ? notes.join('; ') : null };
}
