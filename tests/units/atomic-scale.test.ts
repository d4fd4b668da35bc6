import * as mathjs from 'mathjs';
import { describe, expect, it } from 'vitest';
import { BOHR_METRES, CONSTANT_SOURCE, HARTREE_JOULES, toAtomic } from '../../src/units/atomic-scale.ts';
import { ENERGY, LENGTH, MASS } from '../../src/units/dimension.ts';
import { ENERGY_UNIT_EXAMPLES, energyUnit } from '../../src/units/energy-units.ts';
import { constantUse, resolvePhysicalName } from '../../src/units/physical-names.ts';

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

// NIST, "CODATA Internationally recommended 2018 values of the fundamental physical constants"
// (physics.nist.gov/constants): the figures as NIST prints them, with their relative standard
// uncertainty where the value is not exact in the 2019 SI.
const NIST_2018 = {
  electronMass: { value: 9.1093837015e-31, unit: 'kg', uncertainty: 3.0e-10 },
  elementaryCharge: { value: 1.602176634e-19, unit: 'C', uncertainty: 0 },
  reducedPlanckConstant: { value: 1.054571817e-34, unit: 'J s', uncertainty: 0 },
  electricConstant: { value: 8.8541878128e-12, unit: 'F / m', uncertainty: 1.5e-10 },
  hartreeEnergy: { value: 4.3597447222071e-18, unit: 'J', uncertainty: 1.9e-12 },
  bohrRadius: { value: 5.29177210903e-11, unit: 'm', uncertainty: 1.5e-10 },
  planckConstant: { value: 6.62607015e-34, unit: 'J s', uncertainty: 0 },
  boltzmann: { value: 1.380649e-23, unit: 'J / K', uncertainty: 0 },
  speedOfLight: { value: 299792458, unit: 'm / s', uncertainty: 0 },
};

describe('mathjs physical constants against NIST CODATA 2018', () => {
  it.each(Object.entries(NIST_2018))('%s', (name, nist) => {
    const use = constantUse(name);
    expect(use.unit).toBe(nist.unit);
    expect(use.source).toBe(CONSTANT_SOURCE);
    // NIST prints hbar truncated to ten digits (it is h / 2 pi, exact); every other figure is printed in full.
    const digits = name === 'reducedPlanckConstant' ? 1e-9 : 1e-15;
    expect(relative(use.value, nist.value)).toBeLessThan(digits);
  });

  it('the atomic scale built from m_e, e, hbar and eps0 reproduces the CODATA 2018 bohr radius and hartree energy', () => {
    // The four defining constants are adjusted together, so the derived units agree with NIST's
    // figures to well within NIST's stated uncertainties (1.5e-10 and 1.9e-12 relative).
    expect(relative(BOHR_METRES, NIST_2018.bohrRadius.value)).toBeLessThan(NIST_2018.bohrRadius.uncertainty);
    expect(relative(HARTREE_JOULES, NIST_2018.hartreeEnergy.value)).toBeLessThan(5 * NIST_2018.hartreeEnergy.uncertainty);
  });

  it('puts the defining constants at one in atomic units (hbar = m_e = e = 4 pi eps0 = 1)', () => {
    // The definition of Hartree atomic units (CODATA 2018, "atomic units").
    for (const [name, expected] of [['electronMass', 1], ['elementaryCharge', 1], ['reducedPlanckConstant', 1], ['electricConstant', 1 / (4 * Math.PI)], ['bohrRadius', 1], ['hartreeEnergy', 1]] as const) {
      const resolved = resolvePhysicalName(name);
      if (!resolved?.ok) throw new Error(`${name} did not resolve`);
      expect(resolved.name.atomic, name).toBeCloseTo(expected, 9);
    }
  });

  it('converts SI values by their dimension', () => {
    // a0 = 0.0529177210903 nm and m_e = 9.1093837015e-31 kg (NIST CODATA 2018).
    expect(toAtomic(1e-9, LENGTH)).toBeCloseTo(1 / 0.0529177210903, 8);
    expect(toAtomic(2 * 9.1093837015e-31, MASS)).toBeCloseTo(2, 9);
    expect(relative(toAtomic(NIST_2018.hartreeEnergy.value, ENERGY), 1)).toBeLessThan(1e-11);
  });
});

describe('mathjs units in quantity mode', () => {
  it('sizes eV with the exact elementary charge, not the CODATA 2010 figure mathjs carries for its eV unit', () => {
    // 2019 SI: 1 eV = 1.602176634e-19 J exactly (NIST CODATA 2018, "electron volt").
    expect(mathjs.unit(1, 'eV').value).toBe(1.602176565e-19);
    const meV = resolvePhysicalName('meV');
    if (!meV?.ok) throw new Error('meV did not resolve');
    expect(relative(meV.name.atomic * HARTREE_JOULES, 1.602176634e-22)).toBeLessThan(1e-12);
    expect(meV.name.relies).toContain('elementaryCharge');
  });

  it('refuses units without a place in a Hamiltonian and temperature scales with an offset', () => {
    // mathjs unit definitions: degC has an offset, mol is amount of substance, b is a bit.
    for (const [name, words] of [['degC', 'offset'], ['mol', 'amount of substance'], ['b', 'information']] as const) {
      const resolved = resolvePhysicalName(name);
      expect(resolved?.ok, name).toBe(false);
      if (resolved && !resolved.ok) expect(resolved.message).toContain(words);
    }
    expect(resolvePhysicalName('notAUnit')).toBeNull();
    // Names on Object.prototype are not constants.
    expect(resolvePhysicalName('constructor')).toBeNull();
  });
});

describe('energy units for reporting', () => {
  // NIST CODATA 2018 energy equivalents (from memory of the NIST table "Energy conversion factors"):
  // 1 eV = 8065.543937 cm^-1 = 11604.51812 K = 241.7989242 THz (exact in the 2019 SI),
  // 1 hartree = 27.211386245988 eV, 1 Ry = R_inf h c = 13.605693122994 eV.
  const eV = energyUnit('eV')!;
  const per = (name: string) => eV.hartrees / energyUnit(name)!.hartrees;

  it.each([
    ['meV', 1000, 1e-15],
    ['cm^-1', 8065.543937, 1e-10],
    ['K', 11604.51812, 1e-9],
    ['THz', 241.7989242, 1e-9],
  ])('1 eV in %s', (name, expected, tolerance) => {
    expect(relative(per(name), expected)).toBeLessThan(tolerance);
  });

  it('hartree and rydberg', () => {
    expect(relative(1 / eV.hartrees, 27.211386245988)).toBeLessThan(1e-11);
    expect(relative(energyUnit('rydberg')!.hartrees / eV.hartrees, 13.605693122994)).toBeLessThan(1e-11);
  });

  it('names the constants each unit rests on, and refuses what is not an energy, frequency, temperature or wavenumber', () => {
    for (const name of ENERGY_UNIT_EXAMPLES) expect(energyUnit(name), name).not.toBeNull();
    expect(energyUnit('cm^-1')!.constants).toEqual(expect.arrayContaining(['planckConstant', 'speedOfLight']));
    expect(energyUnit('K')!.constants).toContain('boltzmann');
    expect(energyUnit('MHz')!.constants).toContain('planckConstant');
    expect(energyUnit('kcal')).toBeNull();
    expect(energyUnit('nm')).toBeNull();
    expect(energyUnit('electronMass')).toBeNull();
    expect(energyUnit('meV + 1')).toBeNull();
  });
});
