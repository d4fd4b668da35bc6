import * as mathjs from 'mathjs';
import { describe, expect, it } from 'vitest';
import { compileBlock } from '../../src/expr/compile-block.ts';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import { HARTREE_JOULES } from '../../src/units/atomic-scale.ts';
import { convertQuantityBlock, type QuantityBlockSource, type QuantityConversion } from '../../src/units/quantity-block.ts';

const FILE = 'content/records/donor.md';
const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
const at = (text: string, line: number) => ({ text, line });

/** A shallow donor in GaAs written in quantity mode; each field on its own line so problems can be located. */
function donor(overrides: Partial<QuantityBlockSource> = {}): QuantityBlockSource {
  return {
    id: 'gaas-donor',
    caption: null,
    line: 10,
    units: { entries: { length: at('nm', 12), energy: at('meV', 12) }, line: 12 },
    space: 'radial',
    box: null,
    angularMomentum: 0,
    mass: at('0.067', 14),
    constants: { epsr: at('12.9', 16) },
    potential: at('-(elementaryCharge^2)/(4 pi electricConstant epsr r)', 17),
    trial: at('exp(-a r)', 18),
    basis: null,
    states: 1,
    varied: [{ name: 'a', start: at('0.05 nm^-1', 20), min: at('0.001 nm^-1', 20), max: at('1 nm^-1', 20), line: 20 }],
    fixed: {},
    reference: { solve: true, energy: null, tolerance: null, source: null },
    claim: null,
    report: { energyUnit: null, plots: [] },
    ...overrides,
  };
}

/** A free electron in a harmonic trap of angular frequency 2 pi x 1 THz. */
function oscillator(overrides: Partial<QuantityBlockSource> = {}): QuantityBlockSource {
  return donor({
    id: 'thz-trap',
    space: 'line',
    mass: at('1 electronMass', 14),
    constants: { omega: at('2 pi THz', 16) },
    potential: at('mass omega^2 x^2 / 2', 17),
    trial: at('exp(-a x^2)', 18),
    varied: [{ name: 'a', start: at('0.05 nm^-2', 20), min: at('0.001 nm^-2', 20), max: at('1 nm^-2', 20), line: 20 }],
    ...overrides,
  });
}

function converted(block: QuantityBlockSource) {
  const result = convertQuantityBlock(FILE, block);
  if (!result.ok) throw new Error(result.problems.map((p) => `${p.field}: ${p.message}`).join('; '));
  return result;
}

function problemsOf(block: QuantityBlockSource) {
  const result: QuantityConversion = convertQuantityBlock(FILE, block);
  if (result.ok) throw new Error('expected the block to be refused');
  return result.problems;
}

// GaAs: conduction-band effective mass m* = 0.067 m_e (Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys.
// 89, 5815 (2001), Table III; from memory) and static dielectric constant eps_r = 12.9 (Ioffe NSM
// archive, "GaAs - Basic parameters"; from memory). In the hydrogenic effective-mass model
// (Yu & Cardona, "Fundamentals of Semiconductors", sec. 4.2; from memory) the donor binding energy is
// Ry* = Ry m*/eps_r^2 and its radius a* = a0 eps_r/m*, with Ry = 13.605693122994 eV (from memory)
// and a0 = 0.0529177210903 nm (NIST CODATA 2018).
const M_STAR = 0.067;
const EPS_R = 12.9;
const RY_STAR_MEV = (13.605693122994e3 * M_STAR) / EPS_R ** 2;
const A_STAR_NM = (0.0529177210903 * EPS_R) / M_STAR;

describe('a hydrogen-like donor (GaAs) in quantity mode', () => {
  const result = converted(donor());

  it('becomes the atomic-unit problem -1/(eps_r r) with mass m*', () => {
    expect(result.spec.units).toBe('atomic');
    expect(result.spec.mass).toBe(M_STAR);
    const compiled = compileBlock(result.spec);
    if (!compiled.ok) throw new Error(JSON.stringify(compiled.problems));
    for (const r of [0.5, 3, 40, 700]) expect(relative(compiled.block.potential(r), -1 / (EPS_R * r))).toBeLessThan(1e-12);
  });

  it('has its exact ground energy -m*/(2 eps_r^2) hartree at the effective Rydberg, about -5.48 meV', () => {
    const exact = -M_STAR / (2 * EPS_R ** 2);
    const meV = exact * result.back.energy.perHartree;
    expect(result.back.energy.unit).toBe('meV');
    expect(relative(-meV, RY_STAR_MEV)).toBeLessThan(1e-10);
    expect(meV).toBeCloseTo(-5.478, 3);
  });

  it('has the effective Bohr radius eps_r/m* bohr, about 10.19 nm, in its length unit', () => {
    expect(result.back.length.unit).toBe('nm');
    expect(relative((EPS_R / M_STAR) * result.back.length.perBohr, A_STAR_NM)).toBeLessThan(1e-10);
  });

  it('reads the parameter range in nm^-1 and reports it back in nm^-1', () => {
    const a = result.spec.varied[0];
    expect(relative(a.start * result.back.parameters.a.perAtomic, 0.05)).toBeLessThan(1e-12);
    expect(result.back.parameters.a.unit).toBe('nm^-1');
  });

  it('lists the constants the conversion rests on, with their source', () => {
    expect(result.constantsUsed.map((c) => c.name).sort()).toEqual(['electricConstant', 'electronMass', 'elementaryCharge', 'reducedPlanckConstant']);
    for (const c of result.constantsUsed) expect(c.source).toBe('CODATA 2018 (via mathjs 15)');
    expect(result.bound).toEqual({ elementaryCharge: expect.closeTo(1, 12), electricConstant: expect.closeTo(1 / (4 * Math.PI), 12) });
  });

  it('evaluates through the atomic-unit engine to the effective Rydberg and Bohr radius', () => {
    const claimed = converted(donor({ claim: { energy: at('-5.478', 22), tolerance: null, parameters: { a: { value: at('0.0981', 23), tolerance: null } } } }));
    const evaluated = evaluateBlock(FILE, { kind: 'spec', spec: claimed.spec, source: 'donor' });
    expect(evaluated.status, evaluated.message ?? '').toBe('confirmed');
    // exp(-r/a*) is the exact ground state, so the variational optimum is the exact energy.
    // The result comes back in the block's units: meV, and a in nm^-1.
    expect(evaluated.energy!.unit).toBe('meV');
    expect(relative(-evaluated.energy!.value, RY_STAR_MEV)).toBeLessThan(1e-8);
    const a = evaluated.parameters.a.value;
    expect(evaluated.parameters.a.unit).toBe('nm^-1');
    expect(relative(1 / a, A_STAR_NM)).toBeLessThan(1e-4);
  });
});

describe('an oscillator with omega written in THz', () => {
  // hbar omega / 2 with omega = 2 pi x 1e12 s^-1, from NIST CODATA 2018 hbar = 1.054571817e-34 J s and
  // 1 meV = 1.602176634e-22 J.
  const expectedMeV = (1.054571817e-34 * 2 * Math.PI * 1e12) / 2 / 1.602176634e-22;

  it('has the exact ground energy hbar omega / 2 in meV', () => {
    const result = converted(oscillator());
    const omega = result.spec.constants.omega;
    expect(relative((omega / 2) * result.back.energy.perHartree, expectedMeV)).toBeLessThan(1e-9);
  });

  it('evaluates through the engine to hbar omega / 2 and confirms a claim written in meV', () => {
    const result = converted(oscillator({ claim: { energy: at('2.0678', 22), tolerance: null, parameters: {} } }));
    const evaluated = evaluateBlock(FILE, { kind: 'spec', spec: result.spec, source: 'trap' });
    expect(evaluated.status, evaluated.message ?? '').toBe('confirmed');
    expect(relative(evaluated.energy!.value, expectedMeV)).toBeLessThan(1e-9);
    // The Gaussian's optimum is a = m omega / (2 hbar) = 0.0271 nm^-2 for a free electron at 1 THz.
    const a = evaluated.parameters.a.value;
    expect(relative(a, (9.1093837015e-31 * 2 * Math.PI * 1e12) / (2 * 1.054571817e-34) / 1e18)).toBeLessThan(1e-4);
  });

  // With f = 1 THz, hbar omega / 2 = h f / 2; the 2019 SI fixes h = 6.62607015e-34 J s,
  // k_B = 1.380649e-23 J/K and c = 299792458 m/s (BIPM, SI Brochure, 9th ed.).
  it.each([
    ['THz', 0.5, ['planckConstant']],
    ['K', (6.62607015e-34 * 1e12) / 2 / 1.380649e-23, ['boltzmann']],
    ['cm^-1', 1e12 / 2 / 2.99792458e10, ['planckConstant', 'speedOfLight']],
    ['eV', expectedMeV / 1000, ['elementaryCharge']],
  ])('reports in %s when report.energy-unit asks for it', (unit, expected, constants) => {
    const result = converted(oscillator({ report: { energyUnit: at(unit, 24), plots: [] } }));
    expect(result.back.energy.unit).toBe(unit);
    expect(relative((result.spec.constants.omega / 2) * result.back.energy.perHartree, expected)).toBeLessThan(1e-9);
    expect(result.constantsUsed.map((c) => c.name)).toEqual(expect.arrayContaining(constants));
  });
});

describe('the conversion agrees with mathjs unit arithmetic', () => {
  it('a potential mixing units and constants has the same value at a point', () => {
    // mathjs evaluates the same text on Unit objects (its eV is avoided: it carries an older figure).
    const text = 'V0 * (1 - exp(-x / (0.5 nm)))^2 + k x^2 / 2 - (elementaryCharge^2)/(4 pi electricConstant epsr sqrt(x^2 + (2 angstrom)^2))';
    const constants = { V0: '3e-21 J', k: '0.02 kg/s^2', epsr: '12.9' };
    const result = converted(
      donor({
        space: 'line',
        constants: Object.fromEntries(Object.entries(constants).map(([name, value]) => [name, at(value, 16)])),
        potential: at(text, 17),
        trial: at('exp(-a x^2)', 18),
        varied: [{ name: 'a', start: at('0.05 nm^-2', 20), min: at('0.001 nm^-2', 20), max: at('1 nm^-2', 20), line: 20 }],
      }),
    );
    const compiled = compileBlock(result.spec);
    if (!compiled.ok) throw new Error(JSON.stringify(compiled.problems));
    const scope = { ...Object.fromEntries(Object.entries(constants).map(([name, value]) => [name, mathjs.evaluate(value)])) };
    for (const xNm of [-4, 0.3, 2.5]) {
      const joules = (mathjs.evaluate(text, { ...scope, x: mathjs.unit(xNm, 'nm') }) as mathjs.Unit).toNumber('J');
      const ours = compiled.block.potential(xNm / result.back.length.perBohr) * HARTREE_JOULES;
      expect(relative(ours, joules)).toBeLessThan(1e-12);
    }
  });
});

describe('values in other units', () => {
  it('reads a claim in cm^-1 or K as an energy, and bare numbers in the block units', () => {
    const result = converted(
      oscillator({
        box: [at('-40', 13), at('40 nm', 13)],
        reference: { solve: false, energy: at('16.6782 cm^-1', 21), tolerance: null, source: 'h f / 2' },
        claim: { energy: at('23.996 K', 22), tolerance: at('0.01 K', 22), parameters: { a: { value: at('0.0271', 23), tolerance: null } } },
      }),
    );
    expect(result.spec.box![1]).toBeCloseTo(-result.spec.box![0], 12);
    expect(result.spec.box![1] * result.back.length.perBohr).toBeCloseTo(40, 12);
    const meV = result.back.energy.perHartree;
    // 1 cm^-1 = h c / (1 meV) and 1 K = k_B / (1 meV), from h, c, k_B and e, exact in the 2019 SI (BIPM, SI Brochure, 9th ed.).
    const wavenumber = (6.62607015e-34 * 299792458 * 100) / 1.602176634e-22;
    const kelvin = 1.380649e-23 / 1.602176634e-22;
    expect(relative(result.spec.reference.energy!.value * meV, 16.6782 * wavenumber)).toBeLessThan(1e-11);
    expect(relative(result.spec.claim!.energy!.value * meV, 23.996 * kelvin)).toBeLessThan(1e-11);
    expect(relative(result.spec.claim!.energy!.tolerance * meV, 0.01 * kelvin)).toBeLessThan(1e-11);
    // A written published value is good to a whole unit of its last digit (spec/written-precision.ts).
    expect(relative(result.spec.reference.energy!.tolerance * meV, 0.0001 * wavenumber)).toBeLessThan(1e-11);
    // A bare claimed parameter is in the unit of its range (nm^-2), good to half its last digit.
    expect(result.spec.claim!.parameters.a.value * result.back.parameters.a.perAtomic).toBeCloseTo(0.0271, 12);
    expect(result.spec.claim!.parameters.a.tolerance * result.back.parameters.a.perAtomic).toBeCloseTo(0.00005, 12);
  });

  it('a bare claimed energy is in the block energy unit, with the tolerance its digits imply', () => {
    const result = converted(donor({ claim: { energy: at('-5.48', 22), tolerance: null, parameters: {} } }));
    expect(result.spec.claim!.energy!.value * result.back.energy.perHartree).toBeCloseTo(-5.48, 12);
    expect(result.spec.claim!.energy!.tolerance * result.back.energy.perHartree).toBeCloseTo(0.005, 12);
  });
});

describe('blocks whose dimensions disagree are refused, naming the term and the field', () => {
  it('a potential that is a length', () => {
    const [problem] = problemsOf(oscillator({ potential: at('x^2 / (1 nm)', 17) }));
    expect(problem).toMatchObject({ file: FILE, line: 17, block: 'thz-trap', field: 'potential' });
    expect(problem.message).toBe('the potential must be an energy, but x ^ 2 / (1 nm) is a length');
  });

  it('exp of a length', () => {
    const [problem] = problemsOf(oscillator({ trial: at('exp(-x)', 18) }));
    expect(problem).toMatchObject({ file: FILE, line: 18, block: 'thz-trap', field: 'trial' });
    expect(problem.message).toBe('exp(-x) needs a dimensionless argument, but -x is a length');
  });

  it('a mass given in nm', () => {
    const [problem] = problemsOf(donor({ mass: at('0.067 nm', 14) }));
    expect(problem).toMatchObject({ file: FILE, line: 14, block: 'gaas-donor', field: 'mass' });
    expect(problem.message).toBe('mass must be a mass, but 0.067 nm is a length');
  });

  it('e for the elementary charge gets a hint', () => {
    const [problem] = problemsOf(donor({ potential: at('-e^2/(4 pi electricConstant epsr r)', 17) }));
    expect(problem.field).toBe('potential');
    expect(problem.message).toContain('the elementary charge is elementaryCharge');
  });

  it('rydberg in the potential gets a hint: in an expression it is the constant R_inf, not the energy', () => {
    const [problem] = problemsOf(oscillator({ potential: at('-1 rydberg * (x / (1 nm))^2', 17) }));
    expect(problem.field).toBe('potential');
    expect(problem.message).toMatch(/must be an energy.*the Rydberg energy is 0\.5 hartree/);
  });

  it('reports every problem of a block at once, each in its own field', () => {
    const problems = problemsOf(
      donor({
        units: { entries: { length: at('meV', 12), energy: at('kcal', 12), time: at('ps', 12) }, line: 12 },
        varied: [{ name: 'a', start: at('0.05 nm^-1', 20), min: at('0.001 nm', 20), max: at('1 nm^-1', 20), line: 20 }],
        potential: at('-(elementaryCharge^2)/(4 pi electricConstant epsr r) + r', 17),
      }),
    );
    expect(problems.map((p) => p.field).sort()).toEqual(['parameters.a', 'potential', 'units.energy', 'units.length', 'units.time']);
    const energy = problems.find((p) => p.field === 'units.energy')!;
    expect(energy.line).toBe(12);
    expect(energy.message).toMatch(/^kcal is not a unit quantity mode knows; write an energy unit .*cm\^-1/);
  });

  it('a start outside its range and a non-positive mass', () => {
    const problems = problemsOf(
      donor({ mass: at('-0.067 electronMass', 14), varied: [{ name: 'a', start: at('2 nm^-1', 20), min: at('0.001 nm^-1', 20), max: at('1 nm^-1', 20), line: 21 }] }),
    );
    expect(problems.map((p) => [p.field, p.line])).toEqual([
      ['mass', 14],
      ['parameters.a.start', 20],
    ]);
  });
});

describe('a mass that depends on the coordinate in quantity mode', () => {
  it('passes the expression on with its line and binds the units it names to their atomic values', () => {
    const result = converted(oscillator({ mass: at('x < 0 nm ? 0.067 electronMass : 0.092 electronMass', 14), potential: at('0.5 meV nm^-2 x^2', 17) }));
    expect(result.spec.mass).toEqual({ text: 'x < 0 nm ? 0.067 electronMass : 0.092 electronMass', line: 14 });
    // 1 nm = 18.897261246 bohr (NIST CODATA 2018 Bohr radius 5.29177210903e-11 m); electronMass is the atomic unit of mass.
    expect(relative(result.bound.nm, 1 / 0.0529177210903)).toBeLessThan(1e-9);
    expect(result.bound.electronMass).toBe(1);
  });

  it('refuses one that is not a mass, one that depends on a varied parameter, and the name mass elsewhere', () => {
    const potential = at('0.5 meV nm^-2 x^2', 17);
    const length = problemsOf(oscillator({ mass: at('x < 0 nm ? 0.067 nm : 0.092 nm', 14), potential }));
    expect(length[0]).toMatchObject({ field: 'mass', line: 14 });
    expect(length[0].message).toMatch(/the mass must be a mass \(or a number of electron masses\), but .* is a length/);
    const varied = problemsOf(oscillator({ mass: at('x < 0 nm ? 0.067 electronMass : 0.092 electronMass * a * (1 nm^2)', 14), potential }));
    expect(varied[0].message).toMatch(/may not depend on the varied parameter a/);
    // The oscillator's potential uses the name mass, which has no single value once the mass depends on x.
    const named = problemsOf(oscillator({ mass: at('x < 0 nm ? 0.067 electronMass : 0.092 electronMass', 14) }));
    expect(named[0]).toMatchObject({ field: 'potential', line: 17 });
    expect(named[0].message).toMatch(/the name mass has no single value/);
  });
});
