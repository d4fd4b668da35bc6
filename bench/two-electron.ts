import { evaluateBlock } from '../src/log/evaluate-block.ts';
import { parseRecord } from '../src/spec/parse-record.ts';
import { correlatedReference } from '../src/engine/two-electron/correlated-reference.ts';

/**
 * The two-electron numbers of `npm run bench`: the screened-charge helium trial and Hylleraas' three-term correlated
 * trial (variational part: optimum and variance, without the reference), and the correlated-basis reference of helium
 * settled to 1e-8. Medians of a few runs after one warm-up, in one process.
 */
const RUNS = 3;
const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];

const block = (id: string, trial: string, parameters: string) => `\`\`\`variational
id: ${id}
space: two-electron
constants: { Z: 2 }
potential: -Z/r1 - Z/r2 + 1/r12
trial: ${trial}
parameters:
${parameters}
reference: { solve: false }
\`\`\`
`;
const record = parseRecord(
  'bench-two-electron.md',
  block('he-screened', 'exp(-zeta*(r1 + r2))', '  zeta: { start: 1.5, min: 0.5, max: 3 }') +
    '\n' +
    block('he-hylleraas-3', 'exp(-k*(r1 + r2)/2) * (1 + c1*r12 + c2*(r1 - r2)^2)', '  k: { start: 3.6, min: 2, max: 5 }\n  c1: { start: 0.3, min: -1, max: 2 }\n  c2: { start: 0.1, min: -1, max: 2 }'),
);

function timeBlock(index: number, runs: number): { variationalMs: number; energy: number | null; status: string } {
  const results = Array.from({ length: runs + 1 }, () => evaluateBlock('bench-two-electron.md', record.blocks[index])).slice(1);
  return { variationalMs: median(results.map((r) => r.diagnostics?.variationalMs ?? NaN)), energy: results[0].energy?.value ?? null, status: results[0].status };
}

export function benchTwoElectron(): Record<string, unknown> {
  const screened = timeBlock(0, RUNS);
  process.stderr.write('two-electron: screened-charge helium done\n');
  const hylleraas = timeBlock(1, 1);
  process.stderr.write('two-electron: three-term trial done\n');
  const referenceMs: number[] = [];
  let reference = correlatedReference({ mass: 1, charge: 2, coupling: 1 }, 1);
  for (let k = 0; k < RUNS; k++) {
    const started = performance.now();
    reference = correlatedReference({ mass: 1, charge: 2, coupling: 1 }, 1);
    referenceMs.push(performance.now() - started);
  }
  return {
    screenedHeliumMs: screened.variationalMs,
    screenedHeliumEnergy: screened.energy,
    threeTermMs: hylleraas.variationalMs,
    threeTermEnergy: hylleraas.energy,
    referenceMs: median(referenceMs),
    referenceBasisSize: reference.size,
    // Drake, Springer Handbook of AMO Physics (2006), ch. 11 (from memory).
    referenceRelError: (reference.levels[0] - -2.903724377034) / 2.903724377034,
  };
}
