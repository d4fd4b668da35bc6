import { performance } from 'node:perf_hooks';
import type { BlockEntry, SpecProblem } from '../spec/types.ts';
import { inputHash } from './input-hash.ts';
import type { BlockResult } from './result-types.ts';

/**
 * The result of a block that was not evaluated: every computed field empty, the problems saying why. Kept apart
 * from the evaluator so that the main thread of a parallel run can make one without loading the expression library.
 */
export function invalidBlock(id: string, line: number, caption: string | null, problems: SpecProblem[], hash: string, started: number): BlockResult {
  return {
    id,
    line,
    caption,
    inputs: null,
    status: 'invalid',
    message: problems.map((p) => `${p.field ? p.field + ': ' : ''}${p.message}`).join('; '),
    problems,
    energy: null,
    parameters: {},
    variance: null,
    varianceNote: null,
    states: [],
    basis: null,
    components: null,
    reference: null,
    errors: { vsGrid: null, vsPublished: null },
    bounds: { upper: null, lower: null, weinstein: null },
    overlap: null,
    virial: null,
    virialNote: null,
    claim: null,
    checks: [],
    plots: null,
    diagnostics: null,
    quantity: null,
    hamiltonian: null,
    inputHash: hash,
    timeMs: performance.now() - started,
  };
}

/** The result of a block that did not parse: its problems, under the hash of its text. */
export function unparsedBlock(entry: Extract<BlockEntry, { kind: 'invalid' }>, started = performance.now()): BlockResult {
  return invalidBlock(entry.id, entry.line, entry.caption, entry.problems, inputHash(entry.source), started);
}
