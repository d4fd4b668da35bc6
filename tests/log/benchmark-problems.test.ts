import { describe, expect, it } from 'vitest';
import { collectRecordFiles } from '../../src/log/check-log.ts';
import { checkRecord } from '../../src/log/check-record.ts';
import type { BlockResult } from '../../src/log/result-types.ts';

// The benchmark records with published values (each names its source), copied from the project's shared set
// (../shared/problems) into tests/fixtures/problems so that a clone of this repository alone can run them.
const { files } = collectRecordFiles([new URL('../fixtures/problems', import.meta.url).pathname]);
// Evaluated afresh in this thread (no cache), so the figures below are the engine's own.
const blocks = new Map<string, BlockResult>(files.flatMap((file) => checkRecord(file).blocks.map((b) => [b.id, b] as const)));
const block = (id: string) => {
  const found = blocks.get(id);
  if (!found) throw new Error(`benchmark block ${id} not found`);
  return found;
};
const energy = (id: string) => block(id).energy!.value;
const relative = (value: number, expected: number) => Math.abs(value - expected) / Math.abs(expected);

describe('the benchmark problems', () => {
  it('finds all eight and confirms every one', () => {
    expect([...blocks.keys()].sort()).toEqual(['p1', 'p2', 'p3', 'p4', 'p5', 'p6', 'p7', 'p8']);
    for (const b of blocks.values()) expect(b.status, `${b.id}: ${b.message}`).toBe('confirmed');
  });

  it('reaches the closed-form optimum where the trial family has one, to 1e-9 relative', () => {
    // Oscillator with a Gaussian: E(a) = a/2 + 1/(8a), minimum 1/2 at a = 1/2 (any quantum mechanics textbook).
    expect(relative(energy('p1'), 0.5)).toBeLessThan(1e-9);
    expect(block('p1').parameters.a.value).toBeCloseTo(0.5, 5);
    // H = p^2 + x^4 with a Gaussian: E(a) = a + 3/(16 a^2), minimum (3/2)(3/8)^(1/3) (closed form, common practice).
    expect(relative(energy('p2'), 1.5 * (3 / 8) ** (1 / 3))).toBeLessThan(1e-9);
    // Hydrogen with a Gaussian: a = 8/(9 pi), E = -4/(3 pi) (the record's text; e.g. Griffiths, Introduction to QM, problem 7.2, from memory).
    expect(relative(energy('p4'), -4 / (3 * Math.PI))).toBeLessThan(1e-9);
    expect(relative(block('p4').parameters.a.value, 8 / (9 * Math.PI))).toBeLessThan(1e-5);
    // r exp(-a r) contains the exact 2p state: E = -1/8 at a = 1/2 (exact hydrogen level -1/(2 n^2)).
    expect(relative(energy('p5'), -0.125)).toBeLessThan(1e-9);
    // x exp(-a x) on the half-line with H = p^2 + x: E(a) = a^2 + 3/(2a), minimum 3 (3/4)^(2/3) (closed form, common practice).
    expect(relative(energy('p8'), 3 * (3 / 4) ** (2 / 3))).toBeLessThan(1e-9);
  });

  it('reproduces every published level with the grid reference to 1e-8 relative', () => {
    const published: Record<string, number> = {
      p1: 0.5, // (n + 1/2) hbar omega
      p2: 1.0603620904, // Hioe and Montroll, J. Math. Phys. 16, 1945 (1975)
      p3: 1.0603620904, // same
      p4: -0.5, // -1/(2 n^2)
      p5: -0.125, // -1/(2 n^2), n = 2
      p7: 1.0867839887, // Morse, Phys. Rev. 34, 57 (1929)
      p8: 2.338107410459767, // first zero of Ai, Abramowitz and Stegun Table 10.13
    };
    for (const [id, value] of Object.entries(published)) {
      expect(relative(block(id).reference!.energy!, value), id).toBeLessThan(1e-8);
    }
    // The first excited Morse level, w(3/2) - w^2 (3/2)^2/(4D) with w = sqrt(5), D = 10 (Morse 1929).
    const w = Math.sqrt(5);
    expect(relative(block('p7').reference!.excited!, w * 1.5 - (w * w * 2.25) / 40)).toBeLessThan(1e-8);
    // The second zero of Ai, |a2| = 4.087949444130970 (Abramowitz and Stegun Table 10.13).
    expect(relative(block('p8').reference!.excited!, 4.08794944413097)).toBeLessThan(1e-8);
  });

  it('never lets the variational energy fall below the reference, and brackets it by Temple', () => {
    for (const b of blocks.values()) {
      const e0 = b.reference!.energy!;
      // Rayleigh-Ritz: E >= E0; Temple: lower <= E0 (common practice, any variational-methods text).
      expect(b.energy!.value).toBeGreaterThanOrEqual(e0 - 1e-10 * Math.abs(e0));
      if (b.bounds.lower !== null) expect(b.bounds.lower).toBeLessThanOrEqual(e0 + 1e-10 * Math.abs(e0));
    }
  });

  it('reports the virial ratio 1 at the optimum of a dilation-closed family in a power-law potential', () => {
    // Virial theorem 2<T> = k<V> for V ~ x^k at a dilation-stationary optimum (common practice).
    expect(block('p2').virial).toMatchObject({ exponent: 4 });
    expect(block('p2').virial!.ratio).toBeCloseTo(1, 6);
    expect(block('p4').virial).toMatchObject({ exponent: -1 });
    expect(block('p4').virial!.ratio).toBeCloseTo(1, 6);
    expect(block('p7').virial).toBeNull();
  });
});
