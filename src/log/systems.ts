import { basename } from 'node:path';
import type { BlockResult, Hamiltonian, RecordResult } from './result-types.ts';

/**
 * Blocks of the whole log grouped by the physical system they are about: equal Hamiltonians (same space, walls,
 * angular momentum, and mass and potential agreeing at every sample point) or the same `system:` name.
 */

/** Two samples agree within this fraction of the larger (plus 1e-12 hartree): far above the rounding of a unit conversion, far below any physical difference. */
const SAMPLE_TOLERANCE = 1e-6;
/** An upper bound may sit below another block's lower bound by this fraction of their size before the two are called incompatible (both are computed to about 1e-8). */
const CONFLICT_TOLERANCE = 1e-6;

export interface SystemMember {
  file: string;
  title: string | null;
  author: string | null;
  date: string | null;
  block: string;
  caption: string | null;
  /** The trial typeset, or the number of basis functions. */
  method: { trialTex: string } | { basisSize: number } | null;
  status: BlockResult['status'];
  /** Hartree, whatever unit the block states its numbers in. */
  energy: number | null;
  upper: number | null;
  lower: number | null;
  /** The level the block's numbers stand for: "ground", "level 2", "odd level 0". */
  level: string;
}

export interface Bracket {
  level: string;
  upper: { value: number; member: number } | null;
  lower: { value: number; member: number } | null;
  /** upper - lower, when both are known. */
  width: number | null;
  /** The grid reference (hartree), and any published values with their sources. */
  reference: number | null;
  published: Array<{ energy: number; source: string }>;
}

/** One block's upper bound below another's lower bound: at least one of the two results is wrong. */
export interface Conflict {
  level: string;
  upperMember: number;
  lowerMember: number;
  upper: number;
  lower: number;
}

export interface LogSystem {
  /** Page name: the `system:` name, else the first block's record and id. */
  slug: string;
  name: string | null;
  members: SystemMember[];
  brackets: Bracket[];
  conflicts: Conflict[];
}

type Located = { record: RecordResult; block: BlockResult; hamiltonian: Hamiltonian };

/** A block's Hamiltonian in atomic units, whatever units its result states it in. */
function atomic(block: BlockResult, h: Hamiltonian): Hamiltonian {
  if (!block.quantity) return h;
  const { perBohr } = block.quantity.length;
  const { perHartree } = block.quantity.energy;
  return { ...h, box: h.box && [h.box[0] / perBohr, h.box[1] / perBohr], potential: h.potential.map((v) => (v === null ? null : v / perHartree)) };
}

const close = (a: number | null, b: number | null) => (a === null || b === null ? a === b : Math.abs(a - b) <= SAMPLE_TOLERANCE * Math.max(Math.abs(a), Math.abs(b)) + 1e-12);
const closeAll = (a: Array<number | null>, b: Array<number | null>) => a.length === b.length && a.every((value, i) => close(value, b[i]));

/** Whether two blocks have the same Hamiltonian, as far as sampling it can tell. */
export function sameHamiltonian(a: Hamiltonian, b: Hamiltonian): boolean {
  const walls = a.box === null || b.box === null ? a.box === b.box : close(a.box[0], b.box[0]) && close(a.box[1], b.box[1]);
  return a.space === b.space && a.angularMomentum === b.angularMomentum && walls && closeAll(a.mass, b.mass) && closeAll(a.potential, b.potential);
}

/** Hartree from a value stated in the block's units. */
function hartree(block: BlockResult, value: number | null | undefined): number | null {
  if (value === null || value === undefined) return null;
  return block.quantity ? value / block.quantity.energy.perHartree : value;
}

function levelOf(block: BlockResult): string {
  const level = block.reference?.level ?? { index: 0, symmetry: null };
  if (level.symmetry) return `${level.symmetry} level ${level.index}`;
  return level.index === 0 ? 'ground' : `level ${level.index}`;
}

const recordSlug = (file: string) => basename(file).replace(/\.md$/, '');

/** The page name of a system: kept to letters, digits and - so it is a safe path. */
const slugOf = (text: string) => text.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');

/**
 * Groups the blocks of a log into systems (union-find over equal Hamiltonians and shared names). Only systems
 * of two blocks or more, or named ones, are returned: a lone unnamed block is its own record's business.
 */
export function findSystems(records: RecordResult[]): LogSystem[] {
  const located: Located[] = records.flatMap((record) => record.blocks.flatMap((block) => (block.hamiltonian ? [{ record, block, hamiltonian: atomic(block, block.hamiltonian) }] : [])));
  const parent = located.map((_, i) => i);
  const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i])));
  const join = (i: number, j: number) => {
    parent[find(i)] = find(j);
  };
  // Blocks are compared only within the same space, angular momentum and walls, and the same name joins outright.
  const buckets = new Map<string, number[]>();
  const named = new Map<string, number>();
  located.forEach(({ hamiltonian: h }, i) => {
    const key = `${h.space}|${h.angularMomentum}|${h.box === null ? '' : h.box.map((w) => w.toPrecision(6)).join(',')}`;
    const bucket = buckets.get(key) ?? [];
    for (const j of bucket) if (find(i) !== find(j) && sameHamiltonian(h, located[j].hamiltonian)) join(i, j);
    bucket.push(i);
    buckets.set(key, bucket);
    if (h.system !== null) {
      const first = named.get(h.system);
      if (first === undefined) named.set(h.system, i);
      else join(i, first);
    }
  });
  const groups = new Map<number, Located[]>();
  located.forEach((entry, i) => groups.set(find(i), [...(groups.get(find(i)) ?? []), entry]));
  const systems: LogSystem[] = [];
  const used = new Set<string>();
  for (const group of groups.values()) {
    const names = [...new Set(group.flatMap((g) => (g.hamiltonian.system ? [g.hamiltonian.system] : [])))].sort();
    if (group.length < 2 && names.length === 0) continue;
    const members = group.map(memberOf).sort((a, b) => (a.date ?? '').localeCompare(b.date ?? '') || a.file.localeCompare(b.file) || a.block.localeCompare(b.block));
    let slug = slugOf(names[0] ?? `${recordSlug(members[0].file)}-${members[0].block}`);
    for (let n = 2; used.has(slug); n++) slug = `${slug.replace(/-\d+$/, '')}-${n}`;
    used.add(slug);
    const levels = [...new Set(members.map((m) => m.level))];
    systems.push({
      slug,
      name: names.length > 0 ? names.join(' / ') : null,
      members,
      brackets: levels.map((level) => bracketOf(level, members, group)),
      conflicts: levels.flatMap((level) => conflictsOf(level, members)),
    });
  }
  return systems.sort((a, b) => a.slug.localeCompare(b.slug));
}

function memberOf({ record, block }: Located): SystemMember {
  const inputs = block.inputs;
  return {
    file: record.file,
    title: record.frontMatter.title,
    author: record.frontMatter.author,
    date: record.frontMatter.date,
    block: block.id,
    caption: block.caption,
    method: inputs?.trialTex ? { trialTex: inputs.trialTex } : inputs?.basisTex ? { basisSize: inputs.basisTex.length } : null,
    status: block.status,
    energy: hartree(block, block.energy?.value),
    upper: block.status === 'invalid' ? null : hartree(block, block.bounds.upper),
    lower: block.status === 'invalid' ? null : hartree(block, block.bounds.lower),
    level: levelOf(block),
  };
}

function bracketOf(level: string, members: SystemMember[], group: Located[]): Bracket {
  let upper: Bracket['upper'] = null;
  let lower: Bracket['lower'] = null;
  members.forEach((m, member) => {
    if (m.level !== level) return;
    if (m.upper !== null && (upper === null || m.upper < upper.value)) upper = { value: m.upper, member };
    if (m.lower !== null && (lower === null || m.lower > lower.value)) lower = { value: m.lower, member };
  });
  const blocks = group.filter((g) => levelOf(g.block) === level && g.block.status !== 'invalid').map((g) => g.block);
  const gridBlock = blocks.find((b) => b.reference?.method === 'grid');
  const published = new Map<string, { energy: number; source: string }>();
  for (const b of blocks) {
    const p = b.reference?.published;
    if (p) published.set(`${p.source}|${hartree(b, p.energy)}`, { energy: hartree(b, p.energy)!, source: p.source });
  }
  const u = upper as Bracket['upper'];
  const l = lower as Bracket['lower'];
  return {
    level,
    upper: u,
    lower: l,
    width: u && l ? u.value - l.value : null,
    reference: gridBlock ? hartree(gridBlock, gridBlock.reference!.energy) : null,
    published: [...published.values()],
  };
}

function conflictsOf(level: string, members: SystemMember[]): Conflict[] {
  const found: Conflict[] = [];
  members.forEach((a, i) =>
    members.forEach((b, j) => {
      if (i === j || a.level !== level || b.level !== level || a.upper === null || b.lower === null) return;
      const slack = CONFLICT_TOLERANCE * Math.max(Math.abs(a.upper), Math.abs(b.lower)) + 1e-12;
      if (a.upper < b.lower - slack) found.push({ level, upperMember: i, lowerMember: j, upper: a.upper, lower: b.lower });
    }),
  );
  return found;
}

/** For each block (by record file and block id), the system it belongs to. */
export function systemIndex(systems: LogSystem[]): Map<string, LogSystem> {
  const index = new Map<string, LogSystem>();
  for (const system of systems) for (const m of system.members) index.set(memberKey(m.file, m.block), system);
  return index;
}

export const memberKey = (file: string, block: string) => `${file}\0${block}`;
