import { describe, expect, it } from 'vitest';
import {
  axialEnergyIntegrand, axialVarianceIntegrand, cartesianEnergyIntegrand, cartesianVarianceIntegrand,
  energyFromIntegrals, RHO, varianceAbsTol, Z, type AxialClosures, type CartesianClosures,
} from '../../../src/engine/cubature/energy-integrands.ts';
import { integrateAxial } from '../../../src/engine/cubature/integrate-axial.ts';
import { integrateProduct, type CubatureAxis, type ProductIntegrand } from '../../../src/engine/cubature/integrate-product.ts';

const relativeError = (value: number, exact: number) => Math.abs(value - exact) / Math.abs(exact);
const SQRT_PI = Math.sqrt(Math.PI);
const line = (scale = 1): CubatureAxis => ({ lo: -Infinity, hi: Infinity, breakpoints: [], center: 0, scale });

/** Runs the energy integrals and checks that the estimate covers the true error of the energy. */
function energyOf(integrand: ProductIntegrand, axes: CubatureAxis[]) {
  const result = integrateProduct(integrand, 3, axes, { relTol: 1e-10 });
  expect(result.converged).toBe(true);
  return energyFromIntegrals(result);
}

/** The same over the axial half-plane with Coulomb centres on the axis at `centres`. */
function axialEnergyOf(integrand: ProductIntegrand, centres: number[], scale: number) {
  const result = integrateAxial(integrand, 3, centres, { scale, relTol: 1e-10 });
  expect(result.converged).toBe(true);
  return energyFromIntegrals(result);
}

/** A hydrogen-like trial centred on the origin, psi = f(r), from f and f'. */
function radialTrial(f: (r: number) => number, df: (r: number) => number, potential: (r: number) => number): AxialClosures {
  const r = (p: Float64Array) => Math.hypot(p[RHO], p[Z]);
  return {
    value: (p) => f(r(p)),
    dRho: (p) => df(r(p)) * p[RHO] / r(p),
    dZ: (p) => df(r(p)) * p[Z] / r(p),
    potential: (p) => potential(r(p)),
    mass: 1,
    magnetic: 0,
  };
}
const coulomb = (r: number) => -1 / r;

describe('axial energy integrands', () => {

  it('give the hydrogen 1s kinetic and potential energies', () => {
    // psi = e^{-r}: <T> = 1/2, <V> = -1 hartree (virial theorem; any quantum mechanics text, e.g. Griffiths, Introduction to Quantum Mechanics, §4.2).
    const e = axialEnergyOf(axialEnergyIntegrand(radialTrial((r) => Math.exp(-r), (r) => -Math.exp(-r), coulomb)), [0], 1);
    expect(Math.abs(e.kinetic - 0.5)).toBeLessThan(1e-10);
    expect(Math.abs(e.potential + 1)).toBeLessThan(1e-10);
    expect(Math.abs(e.energy + 0.5)).toBeLessThanOrEqual(Math.max(e.errorEstimate, 1e-15));
  });

  it('give the Gaussian trial energy for hydrogen, E(a) = 3a/2 - 2 sqrt(2a/pi), and its variance', () => {
    // E(a) = 3a/2 - 2 sqrt(2a/pi), minimum -4/(3 pi) at a = 8/(9 pi) (closed form; the Gaussian trial for
    // hydrogen is a textbook exercise, e.g. Griffiths, Introduction to Quantum Mechanics, ch. 7; from memory).
    // Variance: (H - E) psi = (-2a^2 r^2 + 3a - E - 1/r) psi, integrated with the Gaussian moments
    // int_0^inf r^n e^{-2a r^2} dr = Gamma((n+1)/2) / (2 (2a)^((n+1)/2)) (DLMF 5.9.1, closed form).
    const gammaHalf = [SQRT_PI, 1, SQRT_PI / 2, 1, (3 * SQRT_PI) / 4, 2, (15 * SQRT_PI) / 8]; // Gamma((n+1)/2), n = 0..6
    for (const a of [8 / (9 * Math.PI), 0.1, 1.5]) {
      const trial = {
        ...radialTrial((r) => Math.exp(-a * r * r), (r) => -2 * a * r * Math.exp(-a * r * r), coulomb),
        laplacian: (p: Float64Array) => { const r2 = p[RHO] ** 2 + p[Z] ** 2; return (4 * a * a * r2 - 6 * a) * Math.exp(-a * r2); },
      };
      const e = axialEnergyOf(axialEnergyIntegrand(trial), [0], 1 / Math.sqrt(a));
      const exact = 1.5 * a - 2 * Math.sqrt((2 * a) / Math.PI);
      expect(relativeError(e.energy, exact)).toBeLessThan(1e-9);
      expect(Math.abs(e.energy - exact)).toBeLessThanOrEqual(e.errorEstimate);

      const moment = (n: number) => gammaHalf[n] / (2 * (2 * a) ** ((n + 1) / 2));
      const [A, B, C] = [-2 * a * a, 1.5 * a + 2 * Math.sqrt((2 * a) / Math.PI), -1]; // B = 3a - E(a)
      const variance = (4 * Math.PI * (A * A * moment(6) + B * B * moment(2) + C * C * moment(0) + 2 * A * B * moment(4) + 2 * A * C * moment(3) + 2 * B * C * moment(1)))
        / (Math.PI / (2 * a)) ** 1.5;
      // |(H - E) psi|^2 holds psi^2/r^2 at the nucleus, smooth only in polar coordinates about it.
      const result = integrateAxial(axialVarianceIntegrand(trial, e.energy), 1, [0], { absTol: varianceAbsTol(e), scale: 1 / Math.sqrt(a), relTol: 1e-10 });
      expect(result.converged).toBe(true);
      expect(relativeError(result.values[0] / e.norm, variance)).toBeLessThan(1e-9);
      expect(Math.abs(result.values[0] / e.norm - variance)).toBeLessThanOrEqual(result.errorEstimates[0] / e.norm);
    }
    const minimum = axialEnergyOf(axialEnergyIntegrand(radialTrial((r) => Math.exp(-8 * r * r / (9 * Math.PI)), (r) => (-16 * r / (9 * Math.PI)) * Math.exp(-8 * r * r / (9 * Math.PI)), coulomb)), [0], 2);
    expect(relativeError(minimum.energy, -4 / (3 * Math.PI))).toBeLessThan(1e-9);
  });

  it('give a variance at rounding level for the exact hydrogen 1s state', () => {
    // H e^{-r} = -1/2 e^{-r} exactly (hydrogen ground state, any quantum mechanics text): ||(H - E) psi||^2 = 0.
    const trial = {
      ...radialTrial((r) => Math.exp(-r), (r) => -Math.exp(-r), coulomb),
      laplacian: (p: Float64Array) => { const r = Math.hypot(p[RHO], p[Z]); return (1 - 2 / r) * Math.exp(-r); },
    };
    const e = axialEnergyOf(axialEnergyIntegrand(trial), [0], 1);
    const result = integrateAxial(axialVarianceIntegrand(trial, e.energy), 1, [0], { absTol: varianceAbsTol(e), scale: 1 });
    expect(result.converged).toBe(true);
    expect(result.values[0] / e.norm).toBeLessThan(1e-12);
  });

  it('add m^2 / (2 rho^2) for a magnetic number: the hydrogen 2p(m = 1) state', () => {
    // psi = rho e^{-r/2} is hydrogen's n = 2, m = 1 state: E = -1/8, <T> = 1/8, <V> = -1/4 (Bohr levels and virial theorem).
    const trial: AxialClosures = {
      value: (p) => p[RHO] * Math.exp(-Math.hypot(p[RHO], p[Z]) / 2),
      dRho: (p) => { const r = Math.hypot(p[RHO], p[Z]); return (1 - (p[RHO] * p[RHO]) / (2 * r)) * Math.exp(-r / 2); },
      dZ: (p) => { const r = Math.hypot(p[RHO], p[Z]); return (-p[RHO] * p[Z]) / (2 * r) * Math.exp(-r / 2); },
      potential: (p) => -1 / Math.hypot(p[RHO], p[Z]),
      mass: 1,
      magnetic: 1,
    };
    const e = axialEnergyOf(axialEnergyIntegrand(trial), [0], 2);
    expect(Math.abs(e.kinetic - 0.125)).toBeLessThan(1e-10);
    expect(Math.abs(e.potential + 0.25)).toBeLessThan(1e-10);
  });

  it('give the energy of a polarised trial for hydrogen in a field along z', () => {
    // psi = (1 + b z) e^{-r}, V = -1/r + F z: with int e^{-2r} = pi, int z^2 e^{-2r} = pi, H0 (z e^{-r}) = (1/r - 1/2) z e^{-r}
    // and int z^2 e^{-2r}/r = pi/2 (closed forms), E(b) = (-1/2 + 2 b F)/(1 + b^2), whose minimum gives the
    // polarisability 4 of this trial (e.g. Schiff, Quantum Mechanics, 3rd ed., §32; from memory).
    const F = 0.05;
    for (const b of [-0.1, 0.3]) {
      const trial: AxialClosures = {
        value: (p) => (1 + b * p[Z]) * Math.exp(-Math.hypot(p[RHO], p[Z])),
        dRho: (p) => { const r = Math.hypot(p[RHO], p[Z]); return (-(1 + b * p[Z]) * p[RHO] / r) * Math.exp(-r); },
        dZ: (p) => { const r = Math.hypot(p[RHO], p[Z]); return (b - (1 + b * p[Z]) * p[Z] / r) * Math.exp(-r); },
        potential: (p) => -1 / Math.hypot(p[RHO], p[Z]) + F * p[Z],
        mass: 1,
        magnetic: 0,
      };
      const e = axialEnergyOf(axialEnergyIntegrand(trial), [0], 1);
      const exact = (-0.5 + 2 * b * F) / (1 + b * b);
      expect(relativeError(e.energy, exact)).toBeLessThan(1e-9);
      expect(Math.abs(e.energy - exact)).toBeLessThanOrEqual(e.errorEstimate);
    }
  });

  it('give the LCAO energy of H2+ at R = 2 with two nuclei on the axis', () => {
    // psi = e^{-r_a} + e^{-r_b}, nuclei a distance R apart. Closed-form integrals of 1s orbitals
    // (Pauling & Wilson, Introduction to Quantum Mechanics, 1935, §42; Slater, Quantum Theory of
    // Molecules and Solids vol. 1, 1963): S = e^{-R}(1 + R + R^2/3), J = <a|1/r_b|a> = 1/R - e^{-2R}(1 + 1/R),
    // K = <a|1/r_a|b> = e^{-R}(1 + R). Then H_aa = -1/2 - J, H_ab = -S/2 - K, so the gerade energy is
    // E_elec = (H_aa + H_ab)/(1 + S) = -1/2 - (J + K)/(1 + S) = -1.0537715 at R = 2, and the kinetic part
    // <T> = (1/2 + K - S/2)/(1 + S), since <a|-nabla^2/2|b> = -S/2 + <a|1/r_b|b> = K - S/2.
    const R = 2;
    const [za, zb] = [-R / 2, R / 2];
    const distances = (p: Float64Array) => [Math.hypot(p[RHO], p[Z] - za), Math.hypot(p[RHO], p[Z] - zb)];
    const trial: AxialClosures = {
      value: (p) => { const [ra, rb] = distances(p); return Math.exp(-ra) + Math.exp(-rb); },
      dRho: (p) => { const [ra, rb] = distances(p); return -p[RHO] * (Math.exp(-ra) / ra + Math.exp(-rb) / rb); },
      dZ: (p) => { const [ra, rb] = distances(p); return -((p[Z] - za) * Math.exp(-ra)) / ra - ((p[Z] - zb) * Math.exp(-rb)) / rb; },
      potential: (p) => { const [ra, rb] = distances(p); return -1 / ra - 1 / rb; },
      mass: 1,
      magnetic: 0,
    };
    const S = Math.exp(-R) * (1 + R + (R * R) / 3);
    const J = 1 / R - Math.exp(-2 * R) * (1 + 1 / R);
    const K = Math.exp(-R) * (1 + R);
    const e = axialEnergyOf(axialEnergyIntegrand(trial), [za, zb], 1);
    // <psi|psi> = <a|a> + <b|b> + 2<a|b> = 2 pi (1 + S), as int e^{-2r} d^3r = pi (closed form).
    expect(relativeError(e.norm, 2 * Math.PI * (1 + S))).toBeLessThan(1e-10);
    expect(relativeError(e.energy, -0.5 - (J + K) / (1 + S))).toBeLessThan(1e-9);
    expect(Math.abs(e.energy + 0.5 + (J + K) / (1 + S))).toBeLessThanOrEqual(e.errorEstimate);
    expect(relativeError(e.kinetic, (0.5 + K - S / 2) / (1 + S))).toBeLessThan(1e-9);
    expect(e.energy).toBeCloseTo(-1.0537715, 7); // Slater's tabulated LCAO value at R = 2 bohr (from memory)
  });
});

describe('Cartesian energy integrands', () => {
  /** Gaussian trial prod_k exp(-a_k x_k^2) in an oscillator sum_k m_k w_k^2 x_k^2 / 2. */
  function oscillator(widths: number[], masses: number[], omegas: number[]): CartesianClosures & { laplacian: (p: Float64Array) => number } {
    const value = (p: Float64Array) => Math.exp(-widths.reduce((sum, a, k) => sum + a * p[k] * p[k], 0));
    return {
      value,
      gradient: widths.map((a, k) => (p: Float64Array) => -2 * a * p[k] * value(p)),
      potential: (p) => masses.reduce((sum, m, k) => sum + 0.5 * m * omegas[k] ** 2 * p[k] * p[k], 0),
      masses,
      laplacian: (p) => widths.reduce((sum, a, k) => sum + ((4 * a * a * p[k] * p[k] - 2 * a) * value(p)) / masses[k], 0),
    };
  }

  it('give the anisotropic oscillator energies of Gaussian trials in 2 and 3 coordinates, and their variance', () => {
    // Per coordinate, psi = e^{-a x^2}: <T> = a/(2m), <V> = m w^2/(8a), so E = sum_k a_k/(2 m_k) + m_k w_k^2/(8 a_k),
    // equal to sum_k w_k/2 at a_k = m_k w_k/2 (harmonic oscillator ground state, closed form). The variance
    // is sum_k c_k^2/(8 a_k^2) with c_k = m_k w_k^2/2 - 2 a_k^2/m_k (from <x^2> = 1/(4a), <x^4> = 3/(16 a^2), closed form).
    const cases = [
      { widths: [0.7, 0.2], masses: [1, 3], omegas: [1, 0.5] },
      { widths: [0.5, 1.2, 0.9], masses: [1, 2, 0.5], omegas: [1, 1.2, 4] },
      { widths: [0.5, 1.2], masses: [1, 2], omegas: [1, 1.2] }, // the exact ground state
    ];
    for (const { widths, masses, omegas } of cases) {
      const trial = oscillator(widths, masses, omegas);
      const axes = widths.map((a) => line(1 / Math.sqrt(a)));
      const e = energyOf(cartesianEnergyIntegrand(trial), axes);
      const exact = widths.reduce((sum, a, k) => sum + a / (2 * masses[k]) + (masses[k] * omegas[k] ** 2) / (8 * a), 0);
      expect(relativeError(e.energy, exact)).toBeLessThan(1e-9);
      expect(Math.abs(e.energy - exact)).toBeLessThanOrEqual(e.errorEstimate);
      const variance = widths.reduce((sum, a, k) => sum + (0.5 * masses[k] * omegas[k] ** 2 - (2 * a * a) / masses[k]) ** 2 / (8 * a * a), 0);
      const result = integrateProduct(cartesianVarianceIntegrand(trial, e.energy), 1, axes, { absTol: varianceAbsTol(e), relTol: 1e-9 });
      expect(result.converged).toBe(true);
      expect(Math.abs(result.values[0] / e.norm - variance)).toBeLessThan(1e-8 * Math.max(variance, e.energy * e.energy));
    }
  }, 120_000); // three-dimensional nesting: millions of integrand calls

  it('give the box-and-oscillator energy of sin(pi x/L) exp(-b y^2) on [0, L] x line', () => {
    // E = pi^2/(2 m_x L^2) + b/(2 m_y) + m_y w^2/(8 b): the particle in a box's ground state plus a
    // Gaussian trial in an oscillator (closed forms, e.g. Griffiths, Introduction to Quantum Mechanics, §2.2-2.3).
    const [L, b, mx, my, w] = [3, 0.4, 2, 1.5, 0.8];
    const trial: CartesianClosures = {
      value: (p) => Math.sin((Math.PI * p[0]) / L) * Math.exp(-b * p[1] * p[1]),
      gradient: [
        (p) => (Math.PI / L) * Math.cos((Math.PI * p[0]) / L) * Math.exp(-b * p[1] * p[1]),
        (p) => -2 * b * p[1] * Math.sin((Math.PI * p[0]) / L) * Math.exp(-b * p[1] * p[1]),
      ],
      potential: (p) => 0.5 * my * w * w * p[1] * p[1],
      masses: [mx, my],
    };
    const box: CubatureAxis = { lo: 0, hi: L, breakpoints: [], center: L / 2, scale: 1 };
    const e = energyOf(cartesianEnergyIntegrand(trial), [box, line(1 / Math.sqrt(b))]);
    const exact = (Math.PI ** 2) / (2 * mx * L * L) + b / (2 * my) + (my * w * w) / (8 * b);
    expect(relativeError(e.energy, exact)).toBeLessThan(1e-9);
    expect(relativeError(e.norm, (L / 2) * Math.sqrt(Math.PI / (2 * b)))).toBeLessThan(1e-10); // int sin^2 = L/2, Gaussian integral
  });

  it('give 0, never NaN, where the trial underflows against an overflowing potential', () => {
    // Common practice: psi = 0 far out makes V |psi|^2 = 0 even where V is infinite.
    const trial: CartesianClosures = {
      value: (p) => Math.exp(-(p[0] ** 2 + p[1] ** 2) * 1e3),
      gradient: [() => 0, () => 0],
      potential: (p) => Math.exp(p[0] * p[0] * 1e3),
      masses: [1, 1],
    };
    const out = new Float64Array(3);
    cartesianEnergyIntegrand(trial)(Float64Array.of(40, 0), out);
    expect(Array.from(out)).toEqual([0, 0, 0]);
  });
});
