import { describe, expect, it } from 'vitest';
import { ENERGY_UNIT_EXAMPLES, energyUnit, readEnergyUnit } from '../../src/units/energy-units.ts';
import { convertQuantityBlock, type QuantityBlockSource } from '../../src/units/quantity-block.ts';
import { resolvePhysicalName } from '../../src/units/physical-names.ts';

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
const at = (text: string, line: number) => ({ text, line });
/** Hartrees per unit of `name`. */
const size = (name: string) => energyUnit(name)!.hartrees;
// Our hartree is built from m_e, e, hbar and eps0 (atomic-scale.ts); those derived values agree with NIST's own
// derived figures to about 1e-11, the rounding of the published digits.
const CODATA = 2e-11;

describe('energy units as input: NIST CODATA 2018 energy equivalents', () => {
  // NIST CODATA 2018, "hartree-hertz relationship": 1 E_h = 6.579683920502e15 Hz (E = h f).
  it.each([
    ['Hz', 6.579683920502e15],
    ['kHz', 6.579683920502e12],
    ['MHz', 6.579683920502e9],
    ['GHz', 6.579683920502e6],
    ['THz', 6.579683920502e3],
  ])('1 hartree in %s (hartree-hertz relationship)', (name, perHartree) => {
    expect(relative(1 / size(name), perHartree)).toBeLessThan(CODATA);
  });

  // NIST CODATA 2018, "hartree-kelvin relationship": 1 E_h = 3.1577502480407e5 K (E = k_B T).
  it.each([
    ['K', 3.1577502480407e5],
    ['mK', 3.1577502480407e8],
    ['uK', 3.1577502480407e11],
  ])('1 hartree in %s (hartree-kelvin relationship)', (name, perHartree) => {
    expect(relative(1 / size(name), perHartree)).toBeLessThan(CODATA);
  });

  // NIST CODATA 2018, "hartree-inverse meter relationship": 1 E_h = 2.1947463136320e7 m^-1 (E = h c / lambda).
  it.each([
    ['m^-1', 2.194746313632e7],
    ['cm^-1', 2.194746313632e5],
  ])('1 hartree in %s (hartree-inverse meter relationship)', (name, perHartree) => {
    expect(relative(1 / size(name), perHartree)).toBeLessThan(CODATA);
  });

  // NIST CODATA 2018, "hartree-electron volt relationship": 1 E_h = 27.211386245988 eV.
  it.each([
    ['eV', 27.211386245988],
    ['meV', 27.211386245988e3],
    ['ueV', 27.211386245988e6],
    ['neV', 27.211386245988e9],
  ])('1 hartree in %s (hartree-electron volt relationship)', (name, perHartree) => {
    expect(relative(1 / size(name), perHartree)).toBeLessThan(CODATA);
  });

  it('the hartree is the atomic unit and the Rydberg energy half of it (CODATA: R_inf h c = E_h / 2)', () => {
    expect(size('hartree')).toBe(1);
    expect(size('rydberg')).toBe(0.5);
  });

  it('the bohr is the atomic unit of length: 1 bohr = 0.529177210903e-10 m (NIST CODATA 2018, Bohr radius)', () => {
    const bohr = resolvePhysicalName('bohr');
    expect(bohr?.ok && bohr.name.atomic).toBe(1);
    const metre = resolvePhysicalName('m');
    expect(metre?.ok && relative(1 / metre.name.atomic, 0.529177210903e-10)).toBeLessThan(CODATA);
    const hartree = resolvePhysicalName('hartree');
    expect(hartree?.ok && hartree.name.atomic).toBe(1);
  });

  it('says why a name is refused: not a unit, a unit of something else, not a single unit', () => {
    const refusal = (name: string) => {
      const reading = readEnergyUnit(name);
      return reading.ok ? 'accepted' : reading.message;
    };
    expect(refusal('furlong')).toMatch(/^furlong is not a unit quantity mode knows; write an energy unit/);
    expect(refusal('nm')).toMatch(/^nm is a unit of length, not of energy/);
    expect(refusal('electronMass')).toMatch(/^electronMass is not a single unit/);
    expect(refusal('pi meV')).toMatch(/^pi meV is not a single unit/);
    expect(refusal('2 meV')).toMatch(/^2 meV is not a unit quantity mode knows/);
  });
});

/** A free electron in a harmonic trap (the oscillator of quantity-block.test.ts) whose energy unit and claim vary. */
function trap(energy: string, claim: string | null, report: string | null = null): QuantityBlockSource {
  return {
    id: 'trap',
    caption: null,
    line: 10,
    units: { entries: { length: at('nm', 12), energy: at(energy, 12) }, line: 12 },
    space: 'line',
    box: null,
    angularMomentum: 0,
    mass: at('1 electronMass', 14),
    constants: { omega: at('2 pi THz', 16) },
    potential: at('mass omega^2 x^2 / 2', 17),
    trial: at('exp(-a x^2)', 18),
    basis: null,
    states: 1,
    varied: [{ name: 'a', start: at('0.05 nm^-2', 20), min: at('0.001 nm^-2', 20), max: at('1 nm^-2', 20), line: 20 }],
    fixed: {},
    reference: { solve: true, energy: null, tolerance: null, source: null },
    claim: claim === null ? null : { energy: at(claim, 22), tolerance: null, parameters: {} },
    report: { energyUnit: report === null ? null : at(report, 24), plots: [] },
  };
}

describe('round trips: every example unit as the block unit, as a written quantity and as the report unit', () => {
  it.each(ENERGY_UNIT_EXAMPLES.map((name) => [name]))('%s', (name) => {
    // A bare claimed energy is in the block's unit; stated back in that unit it is the number written.
    const asBlock = convertQuantityBlock('r.md', trap(name, '1.234'));
    if (!asBlock.ok) throw new Error(asBlock.problems.map((p) => p.message).join('; '));
    expect(relative(asBlock.spec.claim!.energy!.value * asBlock.back.energy.perHartree, 1.234)).toBeLessThan(1e-14);
    // Written with its unit in a meV block, and reported in that unit.
    const written = convertQuantityBlock('r.md', trap('meV', `1.234 ${name}`, name));
    if (!written.ok) throw new Error(written.problems.map((p) => p.message).join('; '));
    expect(written.back.energy.unit).toBe(name);
    expect(relative(written.spec.claim!.energy!.value * written.back.energy.perHartree, 1.234)).toBeLessThan(1e-14);
    // The written precision carries over: half a unit of the last digit, in that unit.
    expect(relative(written.spec.claim!.energy!.tolerance * written.back.energy.perHartree, 0.0005)).toBeLessThan(1e-12);
  });

  it('a refused energy unit names its field and line, and so does a refused report unit', () => {
    const refused = convertQuantityBlock('r.md', trap('furlong', null, 'nm'));
    expect(refused.ok).toBe(false);
    if (refused.ok) return;
    expect(refused.problems.map((p) => [p.field, p.line])).toEqual([
      ['units.energy', 12],
      ['report.energy-unit', 24],
    ]);
    expect(refused.problems[0].message).toContain('furlong is not a unit');
    expect(refused.problems[1].message).toContain('nm is a unit of length, not of energy');
  });

  it('a claimed energy in K or MHz is an energy through k_B or h, not a temperature or frequency refused', () => {
    for (const claim of ['23.996 K', '500000 MHz', '16.678 cm^-1']) {
      const result = convertQuantityBlock('r.md', trap('meV', claim));
      expect(result.ok, claim).toBe(true);
    }
  });
});

describe('lengths as input', () => {
  it('bohr is a length unit for the block, for a wall and for a constant; nm walls are a0-scaled (NIST CODATA 2018: a0 = 0.0529177210903 nm)', () => {
    const block = trap('meV', null);
    const result = convertQuantityBlock('r.md', {
      ...block,
      units: { entries: { length: at('bohr', 12), energy: at('hartree', 12) }, line: 12 },
      box: [at('-20 bohr', 13), at('1.0583544218 nm', 13)],
      constants: { ...block.constants, w: at('3 bohr', 16) },
    });
    if (!result.ok) throw new Error(result.problems.map((p) => p.message).join('; '));
    expect(result.back.length).toEqual({ unit: 'bohr', perBohr: 1 });
    expect(result.spec.box![0]).toBe(-20);
    expect(relative(result.spec.box![1], 20)).toBeLessThan(1e-10);
    expect(result.spec.constants.w).toBe(3);
    expect(result.back.constants.w).toEqual({ unit: 'bohr', perAtomic: 1 });
  });
});
