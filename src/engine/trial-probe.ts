import { ATOMIC_DISPLAY, g, type ValueDisplay } from './format.ts';
import type { TrialFamily } from './problem.ts';
import type { CoordinateSpace, Domain } from './spaces/space.ts';

/** Where a trial's density lives: its peak, a length scale, and whether it is finite everywhere probed. */
export interface TrialProbe {
  center: number;
  scale: number;
  /** Largest |psi| seen (radial: |R|), the yardstick for the hard-wall condition. */
  peakAmplitude: number;
  /** Largest density |psi|^2 seen (radial: r^2 |R|^2), the yardstick for where the trial has decayed. */
  peakDensity: number;
  /** A coordinate where the trial was not a finite number, if any. */
  nonFiniteAt: number | null;
  evaluations: number;
}

/** Probing distances from 2^-12 to 2^14 at four points per factor of two covers any sensible scale. */
const PROBE_EXPONENTS = Array.from({ length: 105 }, (_, k) => (k - 48) / 4);
/** The density has fallen to this fraction of its peak where the length scale is read off. */
const SCALE_DROP = 1e-3;

export function probeTrial(value: (x: number) => number, domain: CoordinateSpace): TrialProbe {
  const points = probePoints(domain);
  const density = densityBuffer(points.length);
  let nonFiniteAt: number | null = null;
  let best = 0;
  let peakAmplitude = 0;
  for (let i = 0; i < points.length; i++) {
    const x = points[i];
    const psi = value(x);
    density[i] = psi * psi * domain.weight(x);
    if (Number.isFinite(psi)) peakAmplitude = Math.max(peakAmplitude, Math.abs(psi));
    else if (nonFiniteAt === null) nonFiniteAt = x;
    if (density[i] > density[best]) best = i;
  }
  const center = domain.lo === 0 ? domain.lo : points[best];
  // The scale is the farthest distance from the centre where the density is still appreciable.
  let scale = 0;
  const appreciable = SCALE_DROP * density[best];
  for (let i = 0; i < points.length; i++) {
    if (density[i] >= appreciable) scale = Math.max(scale, Math.abs(points[i] - center));
  }
  if (!(scale > 0)) scale = Number.isFinite(domain.hi - domain.lo) ? (domain.hi - domain.lo) / 2 : 1;
  return { center, scale, peakAmplitude, peakDensity: density[best], nonFiniteAt, evaluations: points.length };
}

/**
 * Outside its bulk, a point where the trial's density is below this fraction of its peak is left out
 * of the integrals: such a tail adds far less than their tolerance (1e-12 relative), while a trial
 * that is not normalisable (density falling like 1/x or slower) never gets this low within the
 * quadrature's reach of about 1e16 length scales, so its divergence is still caught.
 */
const NEGLIGIBLE_DENSITY = 1e-40;

/**
 * Whether the integrands need not be formed at x, given the trial's value psi there: x lies beyond
 * the trial's bulk (farther than `scale` from its centre) and its density is negligible. Far out the
 * trial's derivatives are products of factors that under- and overflow (sech^(p-1) with sech = 0 is
 * Infinity, times sech tanh = 0 is NaN) although the integrands they enter are 0 to every digit;
 * the domain ends, in effect, where the trial has decayed. A node of the trial (density 0, slope not)
 * lies inside its bulk and is integrated as before.
 */
export function negligibleAt(probe: TrialProbe, weight: (x: number) => number, x: number, psi: number): boolean {
  if (!(Math.abs(x - probe.center) > probe.scale)) return false;
  const density = psi * psi * weight(x);
  return density < NEGLIGIBLE_DENSITY * probe.peakDensity;
}

// Its densities go to one reused buffer: a typed array this size lives outside the heap and costs
// about a microsecond to allocate, as much as a tenth of the probe.
let densities = new Float64Array(0);
function densityBuffer(size: number): Float64Array {
  if (densities.length < size) densities = new Float64Array(size);
  return densities;
}

/**
 * Which factor of the energy integrands is not a finite number: the trial itself, V |psi|^2, or the
 * trial's derivative, in that order, each at the probe point nearest the trial's peak. A diagnosis
 * for when the quadrature met one, so the message can say which input is at fault and where.
 */
/** Which input a non-finite integrand comes from, and what it was there. */
export interface NonFiniteFactor {
  culprit: 'trial' | 'potential';
  detail: string;
}

export function findNonFiniteFactor(potential: (x: number) => number, trial: TrialFamily, domain: CoordinateSpace, probe: TrialProbe, show: ValueDisplay = ATOMIC_DISPLAY): NonFiniteFactor | null {
  const coordinate = domain.coordinate;
  // Where the trial has decayed the integrands are not formed, so nothing there is at fault.
  const samples = probePoints(domain)
    .map((x) => ({ x, psi: trial.value(x) }))
    .filter((p) => !(Number.isFinite(p.psi) && negligibleAt(probe, domain.weight, p.x, p.psi)));
  let peak = { x: 0, psi: 0 };
  for (const p of samples) if (Math.abs(p.psi) > Math.abs(peak.psi) && Number.isFinite(p.psi)) peak = p;
  samples.sort((a, b) => Math.abs(a.x - peak.x) - Math.abs(b.x - peak.x));
  const at = (x: number) => `${coordinate} = ${show.length(x, 6)}`;

  const bad = samples.find((p) => !Number.isFinite(p.psi));
  if (bad) return { culprit: 'trial', detail: `the trial is ${g(bad.psi)} at ${at(bad.x)} (${Number.isNaN(bad.psi) ? 'it is not defined there' : 'a trial that overflows is not square-integrable'})` };
  for (const { x, psi } of samples) {
    // Where the trial is 0 the potential does not enter the integrand (a wall far out may overflow).
    const v = psi === 0 ? 0 : potential(x);
    if (!Number.isFinite(v * psi * psi)) {
      return {
        culprit: 'potential',
        detail: `V |psi|^2 is not a finite number at ${at(x)} (the potential there is ${show.energy(v)}, the trial ${g(psi, 4)}); the potential must be finite wherever the trial lives`,
      };
    }
  }
  for (const { x, psi } of samples) {
    const slope = trial.d1(x);
    if (!Number.isFinite(slope)) return { culprit: 'trial', detail: `the trial's derivative is ${g(slope)} at ${at(x)} (the trial there is ${g(psi, 4)}); write the trial so that no intermediate value overflows` };
  }
  return null;
}

const DISTANCES = PROBE_EXPONENTS.map((k) => 2 ** k);
const HALF_LINE_POINTS: readonly number[] = DISTANCES;
const LINE_POINTS: readonly number[] = [...DISTANCES.map((d) => -d).reverse(), 0, ...DISTANCES];

/** The coordinates a trial is probed at: a geometric mesh about 0 on open ranges, an even one on a finite range. */
export function probePoints(domain: Domain): readonly number[] {
  if (Number.isFinite(domain.lo) && Number.isFinite(domain.hi)) {
    const n = 256;
    return Array.from({ length: n - 1 }, (_, i) => domain.lo + ((domain.hi - domain.lo) * (i + 1)) / n);
  }
  return domain.lo === 0 ? HALF_LINE_POINTS : LINE_POINTS;
}
