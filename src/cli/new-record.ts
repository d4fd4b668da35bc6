import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';

/** What `groundwork new` can set up: the space, and atomic units or a pair of length and energy units. */
export interface NewRecordOptions {
  space: 'line' | 'radial';
  units: { length: string; energy: string } | null;
  /** YYYY-MM-DD for the front matter. */
  date: string;
}

/**
 * A record skeleton whose one block is a problem with a known answer (the harmonic oscillator on the line, the
 * Coulomb problem in radial space), so it builds `confirmed` as written and shows every field in use. The
 * unit-carrying variant states its claim in the chosen energy unit, worked out from the atomic-unit answer.
 */
export function recordSkeleton(name: string, options: NewRecordOptions, hartreeIn: (unit: string) => number): string {
  const id = name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'first-block';
  const front = ['---', `title: ${name.replace(/[-_]+/g, ' ')}`, 'author: your name, your group', `date: ${options.date}`, `tags: [${options.space}]`, '---', ''];
  const radial = options.space === 'radial';
  const intro = radial
    ? 'A first block: the Coulomb problem, whose ground level the exponential trial reaches exactly.'
    : 'A first block: the harmonic oscillator, whose ground level the Gaussian trial reaches exactly.';
  const block = options.units ? unitBlock(id, radial, options.units, hartreeIn) : atomicBlock(id, radial);
  return [...front, intro, 'Replace it with your own system; every field is explained in docs/record-format.md.', '', '```variational', ...block, '```', '', 'The figures the build computes are model estimates; decisions rest with the group\'s validated procedures.', ''].join('\n');
}

function atomicBlock(id: string, radial: boolean): string[] {
  return [
    `id: ${id}`,
    '# A short description shown beside the result.',
    `caption: ${radial ? 'exponential trial, decay rate varied' : 'Gaussian trial, width varied'}`,
    '# line, half-line or radial (radial: r from 0, with angular-momentum for l > 0).',
    `space: ${radial ? 'radial' : 'line'}`,
    '# Mass in electron masses; atomic units throughout (hbar = 1, energies in hartree).',
    'mass: 1',
    `potential: ${radial ? '-1/r' : 'x^2/2'}`,
    '# The trial state; every name in it other than the coordinate is a parameter below.',
    `trial: ${radial ? 'exp(-a*r)' : 'exp(-a*x^2)'}`,
    'parameters:',
    '  # Varied between min and max, starting from start; a bare number holds it fixed.',
    `  a: { start: ${radial ? '0.6' : '1'}, min: 0.05, max: 5 }`,
    '# What you expect; the build checks it (tolerance: from the written digits unless given).',
    'claim:',
    `  energy: ${radial ? '-0.5' : '0.5'}`,
    '  tolerance: 1e-6',
  ];
}

function unitBlock(id: string, radial: boolean, units: { length: string; energy: string }, hartreeIn: (unit: string) => number): string[] {
  // The exact levels (closed forms): an effective Rydberg -m*/(2 epsr^2) hartree, and hbar omega / 2 in the trap's own unit.
  const claim = radial ? Number(((-0.067 / (2 * 12.9 ** 2)) * hartreeIn(units.energy)).toPrecision(4)) : 5;
  return [
    `id: ${id}`,
    `caption: ${radial ? 'donor in a semiconductor, Slater-type trial' : 'harmonic trap, Gaussian trial'}`,
    '# Quantity mode: numbers carry units, converted to atomic units with CODATA constants.',
    `units: { length: ${units.length}, energy: ${units.energy} }`,
    `space: ${radial ? 'radial' : 'line'}`,
    '# An effective mass, as in a semiconductor.',
    'mass: 0.067 electronMass',
    'constants:',
    ...(radial ? ['  epsr: 12.9', 'potential: -elementaryCharge^2 / (4 pi electricConstant epsr r)', 'trial: exp(-r / b)', 'parameters:', `  b: { start: 5 ${units.length}, min: 0.5 ${units.length}, max: 50 ${units.length} }`]
      : [`  hw: 10 ${units.energy}   # the trap's level spacing`, 'potential: mass * (hw / hbar)^2 * x^2 / 2', 'trial: exp(-(x / b)^2)', 'parameters:', `  b: { start: 10 ${units.length}, min: 1 ${units.length}, max: 100 ${units.length} }`]),
    '# What you expect, in the block\'s units.',
    'claim:',
    `  energy: ${claim} ${units.energy}`,
    `  tolerance: ${Number((Math.abs(claim) * 1e-3).toPrecision(2))} ${units.energy}`,
  ];
}

/** Where `groundwork new <name>` writes: the name as a path, into content/records when only a bare name is given and that folder exists. */
export function skeletonPath(name: string, cwd: string): string {
  const file = name.endsWith('.md') ? name : `${name}.md`;
  const bare = basename(file) === file;
  return bare && existsSync(join(cwd, 'content', 'records')) ? join(cwd, 'content', 'records', file) : join(cwd, file);
}

/** Writes the skeleton; refuses to overwrite an existing file. Returns the path written. */
export function writeSkeleton(path: string, text: string): void {
  if (existsSync(path)) throw new Error(`${path} already exists; choose another name`);
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, text, { flag: 'wx' });
}
