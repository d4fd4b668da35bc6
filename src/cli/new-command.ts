import { basename } from 'node:path';
import { energyUnit } from '../units/energy-units.ts';
import { recordSkeleton, skeletonPath, writeSkeleton } from './new-record.ts';

/** `groundwork new <name> [--space line|radial] [--units length,energy]`: the path written, or why nothing was. */
export function newCommand(positional: string[], options: { space?: string; units?: string }, cwd: string): { path: string } | { error: string } {
  if (positional.length !== 1) return { error: 'new needs exactly one record name, such as groundwork new well-w5-levels' };
  const space = options.space ?? 'line';
  if (space !== 'line' && space !== 'radial') return { error: `--space must be line or radial, not ${space || '(nothing)'}` };
  let units = null;
  if (options.units !== undefined) {
    const [length, energy, extra] = options.units.split(',').map((u) => u.trim());
    if (!length || !energy || extra !== undefined) return { error: `--units must be a length unit and an energy unit, as in --units nm,meV (not ${options.units || '(nothing)'})` };
    if (!energyUnit(energy)) return { error: `--units: ${energy} is not an energy unit quantity mode knows (such as meV, eV, hartree, K)` };
    units = { length, energy };
  }
  const path = skeletonPath(positional[0], cwd);
  try {
    writeSkeleton(path, recordSkeleton(basename(positional[0]).replace(/\.md$/, ''), { space, units, date: new Date().toISOString().slice(0, 10) }, (unit) => 1 / energyUnit(unit)!.hartrees));
  } catch (error) {
    return { error: (error as Error).message };
  }
  return { path };
}
