import type { FieldGridReference } from '../field-grid-reference.ts';
import type { GridLevels } from '../grid-levels.ts';
import type { FieldProblem } from '../problem.ts';
import type { ExchangeSign } from './correlated-basis.ts';
import { correlatedReference } from './correlated-reference.ts';
import { coulombForm } from './coulomb-form.ts';

/**
 * The independent reference of a two-electron block: its potential read as -Z/r1 - Z/r2 + c/r12, then the correlated
 * basis of the declared exchange symmetry (correlatedReference). Its levels are the bound ones of that symmetry (below
 * the threshold); the threshold, the one-electron ion's ground level -mass Z^2/2, is where binding starts and the next
 * level for Temple's bound when only one level is bound.
 */
export function twoElectronReference(problem: FieldProblem, mass: number, sign: ExchangeSign): FieldGridReference {
  const started = performance.now();
  const none = { grid: null, referenceMs: 0, product: null };
  const form = coulombForm(problem.potential);
  if (!form.ok) return { ...none, gridError: `the correlated-basis reference needs ${form.reason}`, bindingThreshold: null };
  const threshold = -mass * form.strengths.charge ** 2 / 2;
  if (!problem.reference.solve) return { ...none, gridError: null, bindingThreshold: threshold };
  const ref = correlatedReference({ mass, ...form.strengths }, sign);
  const bound = ref.levels.filter((e) => e < ref.threshold);
  const empty = new Float64Array(0);
  const grid: GridLevels = {
    levels: bound,
    threshold: ref.threshold,
    nodes: empty,
    weights: empty,
    ground: empty,
    excited: null,
    states: [],
    domain: [0, Infinity],
    converged: ref.converged && bound.length > 0,
    errorEstimate: ref.errorEstimate.slice(0, Math.max(bound.length, 1)),
    refinements: ref.steps.length - 1,
    size: ref.size,
    elementOrder: 0,
    elements: 0,
    eigenIterations: 0,
    potentialEvaluations: 0,
    message: bound.length === 0 ? `no level of this symmetry lies below the threshold ${threshold} hartree: nothing is bound` : ref.message,
    correlated: {
      charge: form.strengths.charge,
      coupling: form.strengths.coupling,
      sets: ref.sets,
      dropped: ref.dropped,
      relTol: ref.relTol,
      steps: ref.steps.map((s) => ({ omega: s.omega, size: s.size, levels: s.levels })),
    },
  };
  return { grid, gridError: null, referenceMs: performance.now() - started, product: null, bindingThreshold: threshold };
}
