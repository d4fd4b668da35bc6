import { describe, expect, it } from 'vitest';
import { nucleiOnAxis } from '../../src/engine/spaces/axial.ts';

describe('nucleiOnAxis', () => {
  it('finds two Coulomb centres on the axis, and none in a smooth well', () => {
    // Two unit charges at z = -0.7 and z = 1.3 (off the probing mesh about 0) and a smooth Gaussian well (elementary).
    const twoCentres = (p: Float64Array) => -1 / Math.hypot(p[0], p[1] + 0.7) - 1 / Math.hypot(p[0], p[1] - 1.3);
    const found = nucleiOnAxis(twoCentres, { center: 0, scale: 2, breakpoints: [] });
    expect(found).toHaveLength(2);
    expect(Math.abs(found[0] + 0.7)).toBeLessThan(1e-9);
    expect(Math.abs(found[1] - 1.3)).toBeLessThan(1e-9);
    expect(nucleiOnAxis((p) => -Math.exp(-p[0] * p[0] - (p[1] - 0.3) ** 2), { center: 0, scale: 2, breakpoints: [] })).toEqual([]);
  });
});
