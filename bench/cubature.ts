import { axialEnergyIntegrand, cartesianEnergyIntegrand, energyFromIntegrals, RHO, Z, type AxialClosures, type CartesianClosures } from '../src/engine/cubature/energy-integrands.ts';
import { integrateAxial, type AxialPartition } from '../src/engine/cubature/integrate-axial.ts';
import { integrateProduct, type CubaturePartition, type CubatureResult, type ProductIntegrand } from '../src/engine/cubature/integrate-product.ts';

/**
 * The variational part of a two-parameter search in the axial and product spaces: energies at a
 * sequence of points spiralling in on an optimum, as a minimiser visits them, each started from the
 * previous point's panels (warm) or from whole segments (cold). Prints one JSON document.
 * Usage: tsx bench/cubature.ts [points]. `integrandNs` is the integrand alone per call, so
 * `overIntegrand` = nsPerCall / integrandNs is the cost of the cubature around it.
 */
const POINTS = Number(process.argv[2] ?? 100);
const REL_TOL = 1e-10;

type Start = AxialPartition | CubaturePartition | undefined;

interface Case {
  components: ProductIntegrand;
  /** One energy run from the given panels; the axial space splits at its nuclei, a product space integrates its axes. */
  run: (start: Start) => Omit<CubatureResult, 'partition'> & { partition: Start | null };
  dims: number;
  lower: number[];
  optimum: [number, number];
  set: (p: [number, number]) => void;
  points: number;
}

let a = 1;
let b = 1;

/** Hydrogen with an anisotropic Gaussian exp(-a rho^2 - b z^2). */
function hydrogenGaussian(): Case {
  const trial: AxialClosures = {
    value: (p) => Math.exp(-a * p[RHO] * p[RHO] - b * p[Z] * p[Z]),
    dRho: (p) => -2 * a * p[RHO] * Math.exp(-a * p[RHO] * p[RHO] - b * p[Z] * p[Z]),
    dZ: (p) => -2 * b * p[Z] * Math.exp(-a * p[RHO] * p[RHO] - b * p[Z] * p[Z]),
    potential: (p) => -1 / Math.sqrt(p[RHO] * p[RHO] + p[Z] * p[Z]),
    mass: 1,
    magnetic: 0,
  };
  return axial(axialEnergyIntegrand(trial), [0], 1 / Math.sqrt(0.28), { optimum: [0.283, 0.283], set: ([x, y]) => { a = x; b = y; }, points: POINTS });
}

/** H2+ at R = 2 with a polarised LCAO trial (1 + b (z - z_a)) e^{-a r_a} + (1 - b (z - z_b)) e^{-a r_b}. */
function molecularIon(): Case {
  const [za, zb] = [-1, 1];
  const trial: AxialClosures = {
    value: (p) => {
      const ra = Math.sqrt(p[RHO] * p[RHO] + (p[Z] - za) ** 2);
      const rb = Math.sqrt(p[RHO] * p[RHO] + (p[Z] - zb) ** 2);
      return (1 + b * (p[Z] - za)) * Math.exp(-a * ra) + (1 - b * (p[Z] - zb)) * Math.exp(-a * rb);
    },
    dRho: (p) => {
      const ra = Math.sqrt(p[RHO] * p[RHO] + (p[Z] - za) ** 2);
      const rb = Math.sqrt(p[RHO] * p[RHO] + (p[Z] - zb) ** 2);
      return -a * p[RHO] * ((1 + b * (p[Z] - za)) * Math.exp(-a * ra) / ra + (1 - b * (p[Z] - zb)) * Math.exp(-a * rb) / rb);
    },
    dZ: (p) => {
      const ra = Math.sqrt(p[RHO] * p[RHO] + (p[Z] - za) ** 2);
      const rb = Math.sqrt(p[RHO] * p[RHO] + (p[Z] - zb) ** 2);
      const ea = Math.exp(-a * ra);
      const eb = Math.exp(-a * rb);
      return b * ea - (1 + b * (p[Z] - za)) * a * (p[Z] - za) / ra * ea - b * eb - (1 - b * (p[Z] - zb)) * a * (p[Z] - zb) / rb * eb;
    },
    potential: (p) => -1 / Math.sqrt(p[RHO] * p[RHO] + (p[Z] - za) ** 2) - 1 / Math.sqrt(p[RHO] * p[RHO] + (p[Z] - zb) ** 2),
    mass: 1,
    magnetic: 0,
  };
  return axial(axialEnergyIntegrand(trial), [za, zb], 1, { optimum: [1.24, 0.14], set: ([x, y]) => { a = x; b = y; }, points: POINTS });
}

/** An anisotropic oscillator (masses 1 and 3, frequencies 1 and 0.5) with exp(-a x^2 - b y^2), or in 3 coordinates with a third (mass 0.5, frequency 2, fixed width). */
function oscillator(dims: 2 | 3): Case {
  const value = dims === 2
    ? (p: Float64Array) => Math.exp(-a * p[0] * p[0] - b * p[1] * p[1])
    : (p: Float64Array) => Math.exp(-a * p[0] * p[0] - b * p[1] * p[1] - 0.5 * p[2] * p[2]);
  const widths = [() => a, () => b, () => 0.5];
  const trial: CartesianClosures = {
    value,
    gradient: widths.slice(0, dims).map((w, k) => (p: Float64Array) => -2 * w() * p[k] * value(p)),
    potential: dims === 2
      ? (p) => 0.5 * p[0] * p[0] + 0.375 * p[1] * p[1]
      : (p) => 0.5 * p[0] * p[0] + 0.375 * p[1] * p[1] + p[2] * p[2],
    masses: [1, 3, 0.5].slice(0, dims),
  };
  const axes = [0.5, 0.75, 0.5].slice(0, dims).map((w) => ({ lo: -Infinity, hi: Infinity, breakpoints: [], center: 0, scale: 1 / Math.sqrt(w) }));
  const components = cartesianEnergyIntegrand(trial);
  return {
    components, dims, lower: axes.map(() => -3), optimum: [0.5, 0.75], set: ([x, y]) => { a = x; b = y; }, points: dims === 2 ? POINTS : 10,
    run: (start) => integrateProduct(components, 3, axes, { relTol: REL_TOL, start: start as CubaturePartition | undefined }),
  };
}

function axial(components: ProductIntegrand, centres: number[], scale: number, search: Pick<Case, 'optimum' | 'set' | 'points'>): Case {
  return {
    ...search, components, dims: 2, lower: [0, -3],
    run: (start) => integrateAxial(components, 3, centres, { scale, relTol: REL_TOL, start: start as AxialPartition | undefined }),
  };
}

/** Nanoseconds per call of the integrand alone, on points spread where the trial lives. */
function integrandNs(c: Case): number {
  c.set(c.optimum);
  const samples = Array.from({ length: 1024 }, (_, i) => Float64Array.from({ length: c.dims }, (_, k) => {
    const lo = c.lower[k];
    return lo + (3 - lo) * (((i * (k + 3)) % 1024 + 0.5) / 1024);
  }));
  const out = new Float64Array(3);
  let best = Infinity;
  let sink = 0;
  for (let round = 0; round < 5; round++) {
    const started = performance.now();
    for (let i = 0; i < 200_000; i++) {
      c.components(samples[i & 1023], out);
      sink += out[0];
    }
    best = Math.min(best, ((performance.now() - started) * 1e6) / 200_000);
  }
  return sink === -1 ? NaN : best;
}

function search(c: Case, warm: boolean) {
  let start: Start;
  let evaluations = 0;
  let worstEstimate = 0;
  let converged = true;
  const started = performance.now();
  for (let i = 0; i < c.points; i++) {
    const shrink = 0.3 * 0.95 ** i;
    c.set([c.optimum[0] * (1 + shrink * Math.sin(i)), c.optimum[1] * (1 + shrink * Math.cos(i))]);
    const result = c.run(start);
    if (warm) start = result.partition ?? undefined;
    evaluations += result.evaluations;
    converged &&= result.converged;
    const energy = energyFromIntegrals(result);
    worstEstimate = Math.max(worstEstimate, energy.errorEstimate / Math.abs(energy.energy));
  }
  const totalMs = performance.now() - started;
  return {
    points: c.points,
    totalMs: Math.round(totalMs),
    msPerPoint: +(totalMs / c.points).toFixed(3),
    callsPerPoint: Math.round(evaluations / c.points),
    nsPerCall: +((totalMs * 1e6) / evaluations).toFixed(1),
    worstRelativeEnergyEstimate: +worstEstimate.toExponential(2),
    converged,
  };
}

const cases: Record<string, () => Case> = {
  'axial hydrogen, exp(-a rho^2 - b z^2)': hydrogenGaussian,
  'axial H2+ R = 2, polarised LCAO': molecularIon,
  'line x line oscillator, exp(-a x^2 - b y^2)': () => oscillator(2),
  'line^3 oscillator, exp(-a x^2 - b y^2 - z^2/2)': () => oscillator(3),
};
const report: Record<string, unknown> = {};
for (const [name, make] of Object.entries(cases)) {
  const c = make();
  search(c, true); // warm-up of the JIT
  const floor = integrandNs(c);
  const warm = search(c, true);
  const cold = search(c, false);
  report[name] = { relTol: REL_TOL, integrandNs: +floor.toFixed(1), warm, cold, overIntegrand: +(warm.nsPerCall / floor).toFixed(2) };
  process.stderr.write(`${name} done\n`);
}
process.stdout.write(JSON.stringify({ node: process.version, report }, null, 2) + '\n');
