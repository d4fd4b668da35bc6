import { describe, expect, it } from 'vitest';
import { gridLevels } from '../../src/engine/grid-levels.ts';

const relative = (value: number, exact: number) => Math.abs(value - exact) / Math.abs(exact);

describe('grid levels on the plane (weighted FE-DVR with a Radau first element)', () => {
  // 2-D hydrogen, V = -1/r: E = -1/(2 (n - 1/2)^2), n = n_r + |m| + 1 (Yang, Guo, Chan, Wong & Ching, Phys. Rev. A 43, 1186 (1991)).
  it.each([0, 1, -1, 2, -5])('reproduces the 2-D hydrogen levels for m = %i to 1e-8', (m) => {
    const grid = gridLevels({ space: 'plane', mass: 1, potential: (r) => -1 / r, angularMomentum: m, breakpoints: [], hint: { center: 1, width: 1 } });
    expect(grid.converged, grid.message ?? '').toBe(true);
    const n = Math.abs(m) + 1;
    expect(relative(grid.levels[0], -1 / (2 * (n - 0.5) ** 2))).toBeLessThan(1e-8);
    expect(relative(grid.levels[1], -1 / (2 * (n + 0.5) ** 2))).toBeLessThan(1e-8);
  });

  // 2-D isotropic oscillator, V = mass omega^2 r^2 / 2: E = (2 n_r + |m| + 1) hbar omega (Cohen-Tannoudji, Diu & Laloë,
  // Quantum Mechanics, complement D_VI; from memory). Here mass 2, omega 0.7.
  it.each([0, 1, -3])('reproduces the 2-D oscillator levels for m = %i to 1e-8', (m) => {
    const mass = 2;
    const omega = 0.7;
    const grid = gridLevels({ space: 'plane', mass, potential: (r) => (mass * omega * omega * r * r) / 2, angularMomentum: m, levels: 3 });
    expect(grid.converged, grid.message ?? '').toBe(true);
    for (let k = 0; k < 3; k++) expect(relative(grid.levels[k], (2 * k + Math.abs(m) + 1) * omega)).toBeLessThan(1e-8);
    // The grid function chi = sqrt(r) R is normalised with the lumped weights: sum w chi^2 = int r R^2 dr = 1.
    const norm = grid.ground.reduce((s, chi, i) => s + grid.weights[i] * chi * chi, 0);
    expect(Math.abs(norm - 1)).toBeLessThan(1e-12);
  });

  it('refuses a non-integer m', () => {
    const grid = gridLevels({ space: 'plane', mass: 1, potential: (r) => r * r, angularMomentum: 0.5 });
    expect(grid.converged).toBe(false);
    expect(grid.message).toMatch(/integer/);
  });
});
