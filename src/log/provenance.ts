import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { ENERGY_RELATIVE_ERROR_LIMIT, WALL_TOLERANCE } from '../engine/tolerances.ts';
import { EXPECTATION_DEFAULTS } from '../engine/expectation.ts';
import { GRID_DEFAULTS } from '../engine/grid-levels.ts';
import { DEFAULTS as MINIMIZE_DEFAULTS } from '../engine/minimize.ts';
import { TOOL_ROOT } from './tool-root.ts';
import { TOOL_VERSION } from './tool-version.ts';

/** What produced the numbers: the tool, the libraries the results depend on, and the engine's settings. */
export interface Provenance {
  tool: string;
  node: string;
  dependencies: Record<string, string>;
  settings: Record<string, number>;
}

/** Libraries whose behaviour shapes a result or its page. */
const DEPENDENCIES = ['mathjs', 'yaml', 'zod', 'katex', '@observablehq/plot', 'astro'];

function installedVersion(name: string): string {
  try {
    return JSON.parse(readFileSync(join(TOOL_ROOT, 'node_modules', name, 'package.json'), 'utf8')).version;
  } catch {
    return 'not installed';
  }
}

let known: Provenance | null = null;

/** Read once per process: every page of a build shares it. */
export function provenance(): Provenance {
  return (known ??= {
    tool: TOOL_VERSION,
    node: process.version,
    dependencies: Object.fromEntries(DEPENDENCIES.map((name) => [name, installedVersion(name)])),
    settings: {
      quadratureRelTol: EXPECTATION_DEFAULTS.relTol,
      quadratureMaxIntervals: EXPECTATION_DEFAULTS.maxIntervals,
      energyErrorLimit: ENERGY_RELATIVE_ERROR_LIMIT,
      wallTolerance: WALL_TOLERANCE,
      optimiserParameterTol: MINIMIZE_DEFAULTS.xTol,
      optimiserEnergyTol: MINIMIZE_DEFAULTS.fTol,
      optimiserSearchTol: MINIMIZE_DEFAULTS.searchFTol,
      optimiserMaxEvaluations: MINIMIZE_DEFAULTS.maxEvaluations,
      gridRelTol: GRID_DEFAULTS.relTol,
      gridMaxNodes: GRID_DEFAULTS.maxNodes,
    },
  });
}
