import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

/**
 * Writes a synthetic log for the benchmark: records of an invented lab whose blocks follow the kinds
 * of the demo log and the benchmark set (oscillators, anharmonic wells, boxes, half-line walls,
 * hydrogen-like radial problems; one- and two-parameter trials), with their constants varied so that
 * no two blocks are alike. Usage: tsx scripts/make-synthetic-log.ts <folder> [blocks, default 200]
 */

interface Template {
  kind: string;
  tags: string[];
  /** The block's YAML (without the id line) for the n-th variation of this kind. */
  yaml: (n: number) => string;
}

const range = (name: string, start: number, min: number, max: number) => `  ${name}: { start: ${start}, min: ${min}, max: ${max} }`;

const TEMPLATES: Template[] = [
  {
    kind: 'oscillator',
    tags: ['trap', 'line'],
    // A Gaussian contains the exact ground state of k x^2 / 2, whose level is sqrt(k/m) / 2 (hbar = 1).
    yaml: (n) => {
      const k = 0.5 + 0.25 * n;
      const m = 1 + 0.1 * (n % 4);
      return [`mass: ${m}`, 'constants:', `  k: ${k}`, 'potential: k*x^2/2', 'trial: exp(-a*x^2)', 'parameters:', range('a', 0.3, 0.01, 10), 'claim:', `  energy: ${Math.sqrt(k / m) / 2}`, '  tolerance: 1e-6'].join('\n');
    },
  },
  {
    kind: 'anharmonic-1p',
    tags: ['trap', 'anharmonic'],
    yaml: (n) => ['mass: 1', 'constants:', `  g: ${0.02 + 0.02 * n}`, 'potential: x^2/2 + g*x^4', 'trial: exp(-a*x^2)', 'parameters:', range('a', 0.5, 0.01, 10)].join('\n'),
  },
  {
    kind: 'anharmonic-2p',
    tags: ['trap', 'anharmonic'],
    yaml: (n) => ['mass: 1', 'constants:', `  g: ${0.05 + 0.03 * n}`, 'potential: x^2/2 + g*x^4', 'trial: exp(-a*x^2) * (1 + c*x^2)', 'parameters:', range('a', 0.5, 0.01, 10), range('c', 0, -1, 1)].join('\n'),
  },
  {
    kind: 'box-tilted',
    tags: ['quantum-well', 'box', 'field'],
    yaml: (n) => ['box: [0, 1]', 'mass: 1', 'constants:', `  F: ${2 + n}`, 'potential: F*x', 'trial: x*(1 - x)*exp(-b*x)', 'parameters:', range('b', 0, -5, 5)].join('\n'),
  },
  {
    kind: 'box-wide',
    tags: ['quantum-well', 'box'],
    yaml: (n) => {
      const width = 1 + 0.1 * n;
      return [`box: [0, ${width}]`, 'mass: 1', 'constants:', `  L: ${width}`, `  F: ${1 + 0.5 * n}`, 'potential: F*x', 'trial: x*(L - x)*(1 + c*x*(L - x))', 'parameters:', range('c', 0, -2, 2)].join('\n');
    },
  },
  {
    kind: 'half-line-1p',
    tags: ['interface', 'half-line'],
    yaml: (n) => ['space: half-line', 'mass: 0.5', 'constants:', `  F: ${0.5 + 0.25 * n}`, 'potential: F*x', 'trial: x*exp(-a*x)', 'parameters:', range('a', 1, 0.05, 10)].join('\n'),
  },
  {
    kind: 'half-line-2p',
    tags: ['interface', 'half-line'],
    yaml: (n) => ['space: half-line', 'mass: 0.5', 'constants:', `  F: ${0.5 + 0.25 * n}`, 'potential: F*x', 'trial: x*exp(-a*x - b*x^2)', 'parameters:', range('a', 1, 0, 10), range('b', 0.1, 0, 5)].join('\n'),
  },
  {
    kind: 'radial-slater',
    tags: ['donor', 'radial', 'coulomb'],
    // exp(-a r) contains the exact 1s state of -Z/r, whose level is -Z^2 / 2 hartree.
    yaml: (n) => {
      const z = 1 + 0.1 * n;
      return ['space: radial', 'mass: 1', 'constants:', `  Z: ${z}`, 'potential: -Z/r', 'trial: exp(-a*r)', 'parameters:', range('a', 0.6, 0.05, 10), 'claim:', `  energy: ${-(z * z) / 2}`, '  tolerance: 1e-6'].join('\n');
    },
  },
  {
    kind: 'radial-gauss',
    tags: ['donor', 'radial', 'coulomb'],
    yaml: (n) => ['space: radial', 'mass: 1', 'constants:', `  Z: ${1 + 0.1 * n}`, 'potential: -Z/r', 'trial: exp(-a*r^2)', 'parameters:', range('a', 1, 0.01, 20)].join('\n'),
  },
  {
    kind: 'radial-p',
    tags: ['donor', 'radial', 'coulomb'],
    yaml: (n) => ['space: radial', 'angular-momentum: 1', 'mass: 1', 'constants:', `  Z: ${1 + 0.1 * n}`, 'potential: -Z/r', 'trial: r*exp(-a*r)', 'parameters:', range('a', 1, 0.01, 10)].join('\n'),
  },
];

const TEAMS = ['trap modelling desk', 'heterostructure team', 'impurity group', 'well design bench'];
const BLOCKS_PER_RECORD = 4;

/** The records of a synthetic log of `blocks` blocks, as file name -> Markdown text. */
export function syntheticLog(blocks: number): Map<string, string> {
  const files = new Map<string, string>();
  for (let first = 0, record = 1; first < blocks; first += BLOCKS_PER_RECORD, record++) {
    const parts: string[] = [];
    const tags = new Set<string>(['synthetic']);
    for (let i = first; i < Math.min(blocks, first + BLOCKS_PER_RECORD); i++) {
      const template = TEMPLATES[i % TEMPLATES.length];
      const n = Math.floor(i / TEMPLATES.length);
      template.tags.forEach((t) => tags.add(t));
      parts.push(`Variation ${n + 1} of the ${template.kind} case.\n\n\`\`\`variational\nid: ${template.kind}-${n + 1}\n${template.yaml(n)}\n\`\`\`\n`);
    }
    const name = `s${String(record).padStart(3, '0')}.md`;
    const front = ['---', `title: Synthetic set S-${String(record).padStart(3, '0')}`, `author: ${TEAMS[record % TEAMS.length]}, Quillon Hollow device lab`, 'date: 2026-12-01', `tags: [${[...tags].join(', ')}]`, '---', ''];
    files.set(name, [...front, 'Generated for the build benchmark.', '', ...parts].join('\n'));
  }
  return files;
}

/** Writes the synthetic log into `folder` (created if needed); returns the file paths. */
export function writeSyntheticLog(folder: string, blocks: number): string[] {
  mkdirSync(folder, { recursive: true });
  return [...syntheticLog(blocks)].map(([name, text]) => {
    const path = join(folder, name);
    writeFileSync(path, text);
    return path;
  });
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const [folder, count] = process.argv.slice(2);
  if (!folder) {
    process.stderr.write('usage: tsx scripts/make-synthetic-log.ts <folder> [blocks]\n');
    process.exit(2);
  }
  const blocks = count === undefined ? 200 : Number(count);
  const files = writeSyntheticLog(folder, blocks);
  process.stderr.write(`wrote ${blocks} blocks in ${files.length} records to ${folder}\n`);
}
