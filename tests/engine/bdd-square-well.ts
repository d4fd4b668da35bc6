/**
 * Levels of a finite square well whose mass differs inside (m_in, |x| < a) and outside (m_out): V = 0 inside, V0
 * outside, hbar = 1. With k = sqrt(2 m_in E) and kappa = sqrt(2 m_out (V0 - E)), continuity of psi and of psi'/m at
 * x = a (BenDaniel & Duke, Phys. Rev. 152, 683 (1966); Bastard, Wave Mechanics Applied to Semiconductor
 * Heterostructures (1988), ch. III) gives for even states (k/m_in) tan(k a) = kappa/m_out and for odd states
 * -(k/m_in) cot(k a) = kappa/m_out. Derivation (even): psi = cos(kx) inside, C e^{-kappa x} outside; psi continuous
 * gives C e^{-kappa a} = cos(ka), psi'/m continuous gives k sin(ka)/m_in = kappa C e^{-kappa a}/m_out; divide.
 * Solved without poles, (k/m_in) sin(ka) - (kappa/m_out) cos(ka) = 0 (even) and (k/m_in) cos(ka) + (kappa/m_out)
 * sin(ka) = 0 (odd), by bisection in z = k a on [j pi/2, (j+1) pi/2] for the j-th level.
 */
export interface SteppedWell {
  halfWidth: number;
  depth: number;
  massIn: number;
  massOut: number;
}

export function bisectRoot(f: (z: number) => number, lo: number, hi: number): number {
  let [neg, pos] = f(lo) < 0 ? [lo, hi] : [hi, lo];
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (neg + pos);
    if (f(mid) < 0) neg = mid;
    else pos = mid;
  }
  return 0.5 * (neg + pos);
}

/** The j-th level (j = 0 even, 1 odd, ...) measured from the well bottom. */
export function steppedWellLevel(well: SteppedWell, j: number): number {
  const { halfWidth: a, depth, massIn, massOut } = well;
  const energy = (z: number) => (z * z) / (2 * massIn * a * a);
  const kappa = (z: number) => Math.sqrt(2 * massOut * Math.max(depth - energy(z), 0));
  const even = j % 2 === 0;
  const f = (z: number) =>
    even ? (z / a / massIn) * Math.sin(z) - (kappa(z) / massOut) * Math.cos(z) : (z / a / massIn) * Math.cos(z) + (kappa(z) / massOut) * Math.sin(z);
  const zMax = Math.min(((j + 1) * Math.PI) / 2, a * Math.sqrt(2 * massIn * depth));
  return energy(bisectRoot(f, (j * Math.PI) / 2 + 1e-12, zMax - 1e-12));
}
