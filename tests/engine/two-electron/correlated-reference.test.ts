import { describe, expect, it } from 'vitest';
import { correlatedMatrices, correlatedTerms } from '../../../src/engine/two-electron/correlated-basis.ts';
import { correlatedReference } from '../../../src/engine/two-electron/correlated-reference.ts';
import { TriangleIntegrals } from '../../../src/engine/two-electron/triangle-integrals.ts';

const relativeError = (value: number, exact: number) => Math.abs(value - exact) / Math.abs(exact);

describe('TriangleIntegrals', () => {
  it('gives J(0, 0, 0) = 2 / (alpha beta (alpha + beta)), the integral of 2 min(r1, r2) exp(-alpha r1 - beta r2)', () => {
    // The r12 integral over |r1 - r2| .. r1 + r2 is 2 min(r1, r2); the rest is elementary (closed form, by hand).
    for (const [alpha, beta] of [[1, 1], [2, 0.5], [0.3, 4.7]]) {
      const exact = 2 / (alpha * beta * (alpha + beta));
      expect(relativeError(new TriangleIntegrals(alpha, beta).value(0, 0, 0), exact)).toBeLessThan(1e-15);
    }
  });

  it('gives the hydrogenic 1s^2 norm (pi / Z^3)^2 and <1/r12> = 5Z/8 through 8 pi^2 J', () => {
    // int exp(-2 Z r) d^3r = pi / Z^3 (Griffiths, Introduction to Quantum Mechanics, 2nd ed., §4.2); <1/r12> = 5Z/8 for
    // two 1s electrons of charge Z (Griffiths §7.2; Bethe & Salpeter, 1957, §32).
    for (const Z of [1, 2, 3.7]) {
      const J = new TriangleIntegrals(2 * Z, 2 * Z);
      const norm = 8 * Math.PI ** 2 * J.value(1, 1, 1);
      expect(relativeError(norm, (Math.PI / Z ** 3) ** 2)).toBeLessThan(1e-14);
      expect(relativeError(J.value(1, 1, 0) / J.value(1, 1, 1), (5 * Z) / 8)).toBeLessThan(1e-14);
    }
  });

  it('agrees with the r12 integral done first, (r1 + r2)^2 - (r1 - r2)^2 = 4 r1 r2, for C = 1', () => {
    // int r12 dr12 over the triangle's r12 range = 2 r1 r2, so J(A, B, 1) = 2 (A+1)! (B+1)! / (alpha^(A+2) beta^(B+2)) (by hand).
    const factorial = (n: number): number => (n <= 1 ? 1 : n * factorial(n - 1));
    const [alpha, beta] = [1.3, 0.7];
    const J = new TriangleIntegrals(alpha, beta);
    for (const [A, B] of [[0, 0], [3, 1], [6, 9]]) {
      const exact = (2 * factorial(A + 1) * factorial(B + 1)) / (alpha ** (A + 2) * beta ** (B + 2));
      expect(relativeError(J.value(A, B, 1), exact)).toBeLessThan(1e-14);
    }
  });

  it('refuses negative or fractional powers', () => {
    const J = new TriangleIntegrals(1, 1);
    expect(() => J.value(-1, 0, 0)).toThrow(/powers/);
    expect(() => J.value(0, 0.5, 0)).toThrow(/powers/);
    expect(() => new TriangleIntegrals(0, 1)).toThrow(/positive/);
  });
});

describe('correlatedMatrices', () => {
  it('gives the screened-charge energy zeta^2 - 2 Z zeta + 5 zeta / 8, least -(Z - 5/16)^2 at zeta = Z - 5/16', () => {
    // Closed form of the product trial exp(-zeta (r1 + r2)) (Griffiths, Introduction to Quantum Mechanics, 2nd ed., §7.2;
    // Bethe & Salpeter, 1957, §32). In units of the hydrogenic scale the exponent is zeta / Z and the energy E / Z^2.
    for (const Z of [1, 2, 3]) {
      for (const zeta of [Z - 5 / 16, 0.8 * Z]) {
        const terms = correlatedTerms([{ alpha: zeta / Z, beta: zeta / Z, omega: 0 }], 1);
        const { hamiltonian, overlap } = correlatedMatrices(terms, 1, 1 / Z);
        const energy = (Z * Z * hamiltonian[0]) / overlap[0];
        expect(relativeError(energy, zeta * zeta - 2 * Z * zeta + (5 * zeta) / 8)).toBeLessThan(1e-14);
      }
    }
  });

  it('keeps the triplet basis free of the functions that vanish under antisymmetry', () => {
    const terms = correlatedTerms([{ alpha: 1, beta: 1, omega: 2 }], -1);
    expect(terms.every((t) => t.i < t.j)).toBe(true);
    const { overlap, size } = correlatedMatrices(terms, -1, 0.5);
    for (let p = 0; p < size; p++) expect(overlap[p * size + p]).toBeGreaterThan(0);
  });
});

describe('correlatedReference', () => {
  // Nonrelativistic infinite-mass energies (hartree): Drake, in Springer Handbook of Atomic, Molecular and Optical
  // Physics (2006), ch. 11, table of helium-like energies (from memory, table number not checked); H- as in Frankowski &
  // Pekeris, Phys. Rev. 146, 46 (1966) and Drake's table (from memory). Each must be reached to the stated relative error.
  const cases = [
    { name: 'helium 1 1S', charge: 2, sign: 1 as const, exact: -2.903724377034, tol: 1e-8, next: -2.145974046054 },
    { name: 'helium 2 3S', charge: 2, sign: -1 as const, exact: -2.175229378237, tol: 1e-8, next: null },
    { name: 'H- 1 1S', charge: 1, sign: 1 as const, exact: -0.527751016544, tol: 1e-7, next: null },
    { name: 'Li+ 1 1S', charge: 3, sign: 1 as const, exact: -7.279913412669, tol: 1e-8, next: null },
  ];
  for (const c of cases) {
    it(`reaches ${c.name} ${c.exact} to ${c.tol} relative, from above, with the last change bounding the error`, () => {
      const ref = correlatedReference({ mass: 1, charge: c.charge, coupling: 1 }, c.sign);
      expect(ref.converged, ref.message ?? '').toBe(true);
      expect(relativeError(ref.levels[0], c.exact)).toBeLessThan(c.tol);
      // Variational: the basis level lies above the exact one (Hylleraas–Undheim–MacDonald theorem).
      expect(ref.levels[0]).toBeGreaterThan(c.exact);
      expect(ref.levels[0] - c.exact).toBeLessThanOrEqual(ref.errorEstimate[0]);
      expect(ref.threshold).toBe(-(c.charge ** 2) / 2);
      // He 2 1S to 1e-8 (Drake's table, from memory): the next singlet level, Temple's E1.
      if (c.next !== null) expect(relativeError(ref.levels[1], c.next)).toBeLessThan(1e-8);
    }, 60_000);
  }

  it('finds H- with no second bound singlet: the next level of the basis lies in the continuum above -1/2', () => {
    // H- has one bound state (Hill, J. Math. Phys. 18, 2316 (1977)).
    const ref = correlatedReference({ mass: 1, charge: 1, coupling: 1 }, 1);
    expect(ref.levels[1]).toBeGreaterThan(ref.threshold);
  }, 60_000);

  it('scales with the mass and the strengths: a donor ion of mass m and dielectric constant eps has E = m / eps^2 E(H-)', () => {
    // Effective-mass scaling of the hydrogenic problem (Yu & Cardona, Fundamentals of Semiconductors, §4.2; common practice).
    const [m, eps] = [0.067, 12.9];
    const scaled = correlatedReference({ mass: m, charge: 1 / eps, coupling: 1 / eps }, 1);
    expect(relativeError(scaled.levels[0], (m / eps ** 2) * -0.527751016544)).toBeLessThan(1e-7);
    expect(relativeError(scaled.threshold, -m / (2 * eps ** 2))).toBeLessThan(1e-15);
  }, 60_000);
});
