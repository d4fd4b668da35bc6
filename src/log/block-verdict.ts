import type { BlockResult, LogResult } from './result-types.ts';

/**
 * What a reviewer needs to trust a block, as numbers: its status and why, the gap to the reference, the bracket
 * the bounds give, the claim against the recomputation and how many checks pass. Derived from the result (so
 * cached results carry it too) and stated in the block's energy unit.
 */
export interface Verdict {
  status: BlockResult['status'];
  /** Why the block has its status: the failing checks' details, or what a confirmed block was confirmed against. */
  reason: string;
  /** The resolution E is worth writing to: the finest of the gap, the claim's tolerance, the quadrature error. */
  resolution: number | null;
  /** E - E_ref against the reference the status was decided on (the grid level, else the published value); `resolved` is false when the gap is below what the numerics resolve (zero within that). */
  gap: { reference: number; method: 'grid' | 'published'; absolute: number; relative: number | null; resolved: boolean } | null;
  /** [best lower bound, E]: the lower end is the highest valid lower bound, named. */
  bracket: { lower: number; upper: number; width: number; lowerFrom: 'Temple' | 'Weinstein' } | null;
  /** The claimed energy against the recomputation; null when the block claims no energy. */
  claim: { energy: number; tolerance: number; difference: number; agrees: boolean } | null;
  checks: { passed: number; total: number };
}

export function blockVerdict(result: BlockResult): Verdict {
  const E = result.energy?.value ?? null;
  const passed = result.checks.filter((c) => c.pass).length;
  const ref = result.reference;
  const gap =
    E !== null && ref?.energy !== null && ref?.energy !== undefined && ref.method !== null
      ? { reference: ref.energy, method: ref.method, absolute: E - ref.energy, relative: ref.energy === 0 ? null : (E - ref.energy) / Math.abs(ref.energy), resolved: true }
      : null;
  const lowers: Array<[number, 'Temple' | 'Weinstein']> = [];
  if (result.bounds.lower !== null) lowers.push([result.bounds.lower, 'Temple']);
  if (result.bounds.weinstein) lowers.push([result.bounds.weinstein[0], 'Weinstein']);
  // The highest lower bound is the best; a bound above E could only come from rounding and is no bound.
  const best = lowers.filter(([v]) => E !== null && v <= E).sort((a, b) => b[0] - a[0])[0];
  const bracket = E !== null && best ? { lower: best[0], upper: E, width: E - best[0], lowerFrom: best[1] } : null;
  const claimed = result.claim?.energy ?? null;
  const claim =
    E !== null && claimed !== null && result.claim?.tolerance !== null && result.claim?.tolerance !== undefined
      ? { energy: claimed, tolerance: result.claim.tolerance, difference: E - claimed, agrees: Math.abs(E - claimed) <= result.claim.tolerance }
      : null;
  // E is written finer than what it is compared with (a tenth of the gap or of the claim's tolerance), never finer
  // than the numerics resolve: the quadrature error, and ten significant digits.
  const floor = numericFloor(result);
  if (gap) gap.resolved = Math.abs(gap.absolute) > floor;
  const compared = [gap?.resolved ? Math.abs(gap.absolute) / 10 : null, claim && claim.tolerance / 10].filter((v): v is number => v !== null && v > 0 && Number.isFinite(v));
  const resolution = compared.length > 0 ? Math.max(Math.min(...compared), floor) : floor > 0 ? floor : null;
  return { status: result.status, reason: reasonOf(result, gap, claim), resolution, gap, bracket, claim, checks: { passed, total: result.checks.length } };
}

/** The smallest energy difference the numbers resolve: the quadrature error of E, and ten significant digits of E. */
export function numericFloor(result: BlockResult): number {
  return Math.max(result.diagnostics?.energyError ?? 0, Math.abs(result.energy?.value ?? 0) * 1e-10);
}

function reasonOf(result: BlockResult, gap: Verdict['gap'], claim: Verdict['claim']): string {
  if (result.status !== 'confirmed') return result.message ?? result.problems.map((p) => p.message).join('; ') ?? result.status;
  const against = gap ? `at or above the ${gap.method === 'grid' ? 'grid' : 'published'} reference` : 'no reference to compare with';
  const parametersOnly = !claim && result.claim && Object.keys(result.claim.parameters).length > 0;
  return `${against}; ${claim ? 'the claim agrees' : parametersOnly ? 'the claimed parameters agree' : 'no claim made'}; every check passes`;
}

/** The log with each block's verdict beside it, as `check --json` and the record JSON give it; plot samples only when asked. */
export function withVerdicts(log: LogResult, options: { plots: boolean }): LogResult {
  return {
    ...log,
    records: log.records.map((record) => ({
      ...record,
      blocks: record.blocks.map((block) => ({ ...block, plots: options.plots ? block.plots : null, verdict: blockVerdict(block) })),
    })),
  };
}
