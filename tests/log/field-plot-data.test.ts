import { describe, expect, it } from 'vitest';
import { evaluateBlock } from '../../src/log/evaluate-block.ts';
import type { BlockResult } from '../../src/log/result-types.ts';
import { renderBlockPlots as renderPlots } from '../../src/render/field-plots.ts';
import { parseRecord } from '../../src/spec/parse-record.ts';

// The plot data of a trial on a product space: the density picture and the cuts through the potential's minimum.

const FILE = 'content/records/field-plots.md';

function run(block: string): BlockResult {
  const text = ['---', 'title: Field plots', 'author: test', 'date: 2026-01-01', 'tags: []', '---', '', '```variational', block, '```', ''].join('\n');
  return evaluateBlock(FILE, parseRecord(FILE, text).blocks[0]);
}

// Anisotropic oscillator V = x^2/2 + 2 y^2 (omega_x = 1, omega_y = 2, mass 1): the ground state is the product of 1-D
// oscillator ground states, psi0 = (omega_x omega_y)^(1/4) pi^(-1/2) exp(-omega_x x^2/2 - omega_y y^2/2), so its density is
// (sqrt 2 / pi) exp(-x^2 - 2 y^2) (textbook: separable oscillators, e.g. Griffiths §2.3 in each coordinate; from memory).
const exact = (x: number, y: number) => (Math.SQRT2 / Math.PI) * Math.exp(-x * x - 2 * y * y);

describe('plot data of a trial in two Cartesian coordinates', () => {
  const result = run(`id: osc-xy
space: { x: line, y: line }
potential: x^2/2 + 2*y^2
trial: exp(-a*x^2 - b*y^2)
parameters:
  a: { start: 0.3, min: 0.01, max: 5 }
  b: { start: 0.6, min: 0.01, max: 5 }
reference: { solve: false }
report: { plots: [scan, density] }`);
  const field = result.plots?.field;

  it('samples the normalised density in the plane at the closed form', { timeout: 120_000 }, () => {
    expect(result.status, result.message ?? '').toBe('confirmed');
    expect(field).toBeTruthy();
    const { x, y, density } = field!.picture;
    expect(x.length * y.length).toBe(density.length);
    let checked = 0;
    for (let j = 0; j < y.length; j += 7) {
      for (let i = 0; i < x.length; i += 7) {
        expect(density[j * x.length + i]).toBeCloseTo(exact(x[i], y[j]), 6);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(50);
    // The picture reaches well into the tails on both axes (at least to 10 % of the peak).
    expect(exact(x[0], 0) / exact(0, 0)).toBeLessThan(0.1);
    expect(exact(0, y[y.length - 1]) / exact(0, 0)).toBeLessThan(0.1);
  });

  it('cuts along each axis through the potential minimum at the origin, with V and the density there', () => {
    expect(field!.throughKind).toBe('potential minimum');
    expect(field!.through[0]).toBeCloseTo(0, 2);
    expect(field!.through[1]).toBeCloseTo(0, 2);
    expect(field!.cuts.map((c) => c.coordinate)).toEqual(['x', 'y']);
    const [alongX, alongY] = field!.cuts;
    for (const s of alongX.samples.filter((_, k) => k % 20 === 0)) {
      const y0 = field!.through[1];
      expect(s.trial).toBeCloseTo(exact(s.x, y0), 6);
      expect(s.potential!).toBeCloseTo(s.x * s.x / 2 + 2 * y0 * y0, 10);
    }
    for (const s of alongY.samples.filter((_, k) => k % 20 === 0)) expect(s.trial).toBeCloseTo(exact(field!.through[0], s.x), 6);
    expect(field!.dimension).toBe(2);
    expect(result.plots!.scans.map((s) => s.parameter)).toEqual(['a', 'b']);
  });

  it('draws the picture with a grey legend, labelled contours and captions, and a cut per axis', () => {
    const svgs = renderPlots(result, { energy: 'hartree', length: 'bohr', parameters: {} });
    // Two scans, the picture, two cuts.
    expect(svgs).toHaveLength(5);
    const picture = svgs[2];
    expect(picture).toMatch(/<figcaption>Trial density \|ψ\|², its cuts crossing at the potential minimum \(x = 0, y = 0 bohr\)\. Grey bands between contour lines at 5, 20, 40, 60, 80 % of its peak/);
    expect(picture).toContain('trial density |ψ|² (bohr⁻²)');
    // Each level is a filled contour path in its grey.
    for (const grey of ["#ececec", "#565656"]) expect(picture).toMatch(new RegExp(`<g[^>]*fill="${grey}"[^>]*><path d="M`));
    for (const label of ['20%', '60%', '80%']) expect(picture).toContain(`>${label}<`);
    expect(svgs[3]).toContain('Cut along x through the potential minimum (y = ');
    expect(svgs[4]).toContain('Cut along y through the potential minimum (x = ');
    // No grid was asked for: the caption does not promise its circles or a reference line.
    expect(svgs[3]).toContain('trial density |ψ|² (per bohr⁻²), scaled and drawn from the level E.</figcaption>');
  });
});

// An elliptic dot in meV and nm: m* = 0.067 m_e, omega_x = 3.0385e12 /s, omega_y = 7.5963e12 /s. The ground state is
// the product of oscillator ground states with lengths l_k = sqrt(hbar / (m omega_k)), density
// exp(-x^2/l_x^2 - y^2/l_y^2) / (pi l_x l_y) (textbook oscillator, as above). hbar and m_e: CODATA 2018 (NIST).
describe('plot data of a quantity-mode block in its own units', () => {
  const hbar = 1.054571817e-34;
  const m = 0.067 * 9.1093837015e-31;
  const [lx, ly] = [3.0385e12, 7.5963e12].map((w) => Math.sqrt(hbar / (m * w)) * 1e9);
  const exactNm = (x: number, y: number) => Math.exp(-(x * x) / (lx * lx) - (y * y) / (ly * ly)) / (Math.PI * lx * ly);

  it('states lengths in nm and the density in nm^-2', { timeout: 120_000 }, () => {
    const result = run(`id: q3
units: { length: nm, energy: meV }
space: { x: line, y: line }
mass: 0.067 electronMass
constants:
  wx: 3.0385 THz
  wy: 7.5963 THz
potential: mass * (wx^2 x^2 + wy^2 y^2) / 2
trial: exp(-x^2 / bx^2 - y^2 / by^2)
parameters:
  bx: { start: 30 nm, min: 3 nm, max: 300 nm }
  by: { start: 30 nm, min: 3 nm, max: 300 nm }
reference: { solve: false }
report: { plots: [density] }`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    const field = result.plots!.field!;
    const [alongX, alongY] = field.cuts;
    for (const s of alongX.samples.filter((_, k) => k % 16 === 0)) expect(s.trial / exactNm(s.x, field.through[1])).toBeCloseTo(1, 4);
    for (const s of alongY.samples.filter((_, k) => k % 16 === 0)) expect(s.trial / exactNm(field.through[0], s.x)).toBeCloseTo(1, 4);
    // The cut reaches about the dot's size in nm, not in bohr (l_x is about 23 nm).
    expect(alongX.samples[alongX.samples.length - 1].x).toBeGreaterThan(lx);
    const svgs = renderPlots(result, { energy: 'meV', length: 'nm', parameters: {} });
    // Peak 1/(pi l_x l_y), about 7e-4 nm^-2: the legend carries the power of ten.
    expect(svgs[0]).toContain('trial density |ψ|² (10⁻⁴ nm⁻²)');
  });
});

// Plane, m = 1, V = r^2/2: R = r exp(-r^2/2) is exact (E = (2 n_r + |m| + 1) omega = 2), and the density in r,
// r |R|^2 normalised over dr, is 2 r^3 exp(-r^2) since the integral of r^3 exp(-r^2) over r > 0 is 1/2 (elementary).
describe('the density plot on the plane', () => {
  it('draws r|R|² normalised in r and says so', { timeout: 60_000 }, () => {
    const result = run(`id: plane-m1
space: plane
angular-momentum: 1
potential: r^2/2
trial: r*exp(-a*r^2)
parameters:
  a: { start: 0.3, min: 0.05, max: 3 }
reference: { solve: false }
report: { plots: [density] }`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    const density = result.plots!.density!;
    for (const s of density.samples.filter((_, k) => k % 20 === 10)) expect(s.trial).toBeCloseTo(2 * s.x ** 3 * Math.exp(-s.x * s.x), 5);
    const [svg] = renderPlots(result, { energy: 'hartree', length: 'bohr', parameters: {} });
    expect(svg).toContain('trial density r|R|²');
  });
});

describe('grid densities on the cuts', () => {
  // The same anisotropic oscillator with the product-grid reference: the grid ground state at its nodes on each cut
  // must be the closed-form density (sqrt 2 / pi) exp(-x^2 - 2 y^2) there, which also checks which nodes the cut reads.
  it('reads the grid ground state at the nodes on each cut, matching the closed form', { timeout: 300_000 }, () => {
    const result = run(`id: osc-xy-grid
space: { x: line, y: line }
potential: x^2/2 + 2*y^2
trial: exp(-a*x^2 - b*y^2)
parameters:
  a: { start: 0.3, min: 0.01, max: 5 }
  b: { start: 0.6, min: 0.01, max: 5 }
report: { plots: [density] }`);
    expect(result.status, result.message ?? '').toBe('confirmed');
    const field = result.plots!.field!;
    const [alongX, alongY] = field.cuts;
    expect(alongX.grid.length).toBeGreaterThan(10);
    expect(alongY.grid.length).toBeGreaterThan(10);
    for (const g of alongX.grid) expect(g.density).toBeCloseTo(exact(g.x, field.through[1]), 5);
    for (const g of alongY.grid) expect(g.density).toBeCloseTo(exact(field.through[0], g.x), 5);
    const svgs = renderPlots(result, { energy: 'hartree', length: 'bohr', parameters: {} });
    expect(svgs[1]).toContain('Cut along x through the potential minimum, moved onto the nearest grid line (y = ');
    expect(svgs[1]).toContain('open circles: grid ground-state density at its nodes on this line');
  });
});
