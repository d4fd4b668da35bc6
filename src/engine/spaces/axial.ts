import { axialEnergyIntegrand, axialVarianceIntegrand } from '../cubature/energy-integrands.ts';
import { integrateAxial, type AxialPartition } from '../cubature/integrate-axial.ts';
import type { PointFunction } from '../problem.ts';
import { gridHint, type AxisPlacement, type FieldSpace } from './field-space.ts';
import { lineSpace } from './line.ts';
import { planeSpace } from './plane.ts';

const RHO = 0;
const Z = 1;
/** Samples per factor of two in distance along the axis when looking for nuclei, as in the 1-D breakpoint search. */
const SAMPLES_PER_OCTAVE = 8;
/** |V| at a located maximum on the axis beyond this multiple of its neighbours' is a singularity (a nucleus). */
const SINGULAR_RATIO = 1e8;

/**
 * `axial`: 3-D with symmetry about the z axis, psi = f(rho, z) e^{i m phi}, volume element 2 pi rho drho dz. Along
 * rho the volume element is that of the plane with the same m; along z that of the line.
 */
export function axialSpace(m: number, mass: number): FieldSpace {
  const closures = (trial: Parameters<FieldSpace['energyIntegrand']>[0], potential: PointFunction) => ({
    value: trial.value,
    dRho: trial.gradient[RHO],
    dZ: trial.gradient[Z],
    potential,
    mass,
    magnetic: m,
  });
  return {
    name: 'axial',
    coordinates: ['rho', 'z'],
    axes: [planeSpace(m), lineSpace],
    energyIntegrand: (trial, potential) => axialEnergyIntegrand(closures(trial, potential)),
    varianceIntegrand: (trial, potential, energy) => axialVarianceIntegrand({ ...closures(trial, potential), laplacian: trial.laplacian }, energy),
    // Polar coordinates about each centre on the axis (the nuclei, else the trial's centre), split by fuzzy cells.
    integrate: (integrand, components, placements, options) => {
      const centres = placements[Z].breakpoints.length > 0 ? placements[Z].breakpoints : [placements[Z].center];
      const scale = Math.max(placements[RHO].scale, placements[Z].scale);
      return integrateAxial(integrand, components, centres, { scale, relTol: options.relTol, absTol: options.absTol, start: options.start as AxialPartition | undefined });
    },
    singularities: (potential, placements) => [{ axis: Z, points: nucleiOnAxis(potential, placements[Z]) }],
    gridProblem: (potential, placements) => ({
      axes: [
        { name: 'rho', kind: 'rho', mass, breakpoints: placements[RHO].breakpoints, hint: gridHint(placements[RHO]) },
        { name: 'z', kind: 'line', mass, breakpoints: placements[Z].breakpoints, hint: gridHint(placements[Z]) },
      ],
      potential,
      angularMomentum: m,
    }),
  };
}

/**
 * Where V(0, z) is singular (a Coulomb centre on the axis): local maxima of |V| on a geometric mesh about the trial's
 * centre, each narrowed by golden-section search (Kiefer, Proc. AMS 4, 502 (1953)); a maximum whose |V| grows beyond
 * SINGULAR_RATIO times that of the mesh points beside it is a singularity. Such points become panel edges of the
 * cubature and element edges of the grid.
 */
export function nucleiOnAxis(potential: PointFunction, along: AxisPlacement): number[] {
  const point = new Float64Array(2);
  const size = (z: number) => {
    point[RHO] = 0;
    point[Z] = z;
    const v = Math.abs(potential(point));
    return Number.isNaN(v) ? Infinity : v;
  };
  const mesh = new Set<number>([along.center]);
  for (let k = -20 * SAMPLES_PER_OCTAVE; k <= 20 * SAMPLES_PER_OCTAVE; k++) {
    const d = along.scale * 2 ** (k / SAMPLES_PER_OCTAVE);
    mesh.add(along.center + d);
    mesh.add(along.center - d);
  }
  const zs = [...mesh].sort((a, b) => a - b);
  const values = zs.map(size);
  const found: number[] = [];
  for (let i = 1; i + 1 < zs.length; i++) {
    if (values[i] === Infinity) {
      found.push(zs[i]);
      continue;
    }
    if (!(values[i] >= values[i - 1] && values[i] >= values[i + 1])) continue;
    let [a, b] = [zs[i - 1], zs[i + 1]];
    const ratio = (Math.sqrt(5) - 1) / 2;
    for (let step = 0; step < 200 && b - a > 4 * Number.EPSILON * Math.max(1, Math.abs(a)); step++) {
      const c = b - ratio * (b - a);
      const d = a + ratio * (b - a);
      if (size(c) >= size(d)) b = d;
      else a = c;
    }
    const at = 0.5 * (a + b);
    if (size(at) > SINGULAR_RATIO * Math.max(values[i - 1], values[i + 1], Number.MIN_VALUE)) found.push(at);
  }
  return found.filter((z, i) => i === 0 || z - found[i - 1] > 1e-12 * Math.max(1, Math.abs(z)));
}
