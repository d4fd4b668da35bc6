/** The statuses of RECORD-FORMAT.md, in the order in which they win when several apply. */
export const STATUS_ORDER = ['invalid', 'below-reference', 'unsettled', 'disputed', 'confirmed'] as const;
export type Status = (typeof STATUS_ORDER)[number];

export interface Check {
  name: string;
  pass: boolean;
  detail: string;
  /**
   * The number the check compared and its limit, for scripts (the detail says the same in words): passes when
   * `value` `relation` `limit`. `quantity` says what they are measured in (an energy, a parameter's unit, a pure number).
   */
  measure?: Measure;
}

export interface Measure {
  value: number;
  limit: number;
  relation: '>=' | '<=';
  quantity: 'energy' | 'ratio' | { parameter: string };
}

/** A check and the status its failure gives the block. */
export interface GradedCheck extends Check {
  failure: Exclude<Status, 'confirmed'>;
  /** The block field a failure points at, when it is not the trial (or basis) itself. */
  field?: 'potential' | 'mass' | 'symmetry';
}

export function gradedCheck(name: string, pass: boolean, detail: string, failure: GradedCheck['failure'], field?: GradedCheck['field']): GradedCheck {
  return field ? { name, pass, detail, failure, field } : { name, pass, detail, failure };
}

/** The same check with the number it compared and its limit beside the words. */
export function measured(check: GradedCheck, measure: Measure): GradedCheck {
  return { ...check, measure };
}

/** The first status in STATUS_ORDER that a failing check calls for, and the reasons for it. */
export function statusOf(checks: readonly GradedCheck[]): { status: Status; message: string | null } {
  for (const status of STATUS_ORDER) {
    const failing = checks.filter((c) => !c.pass && c.failure === status);
    if (failing.length > 0) return { status, message: failing.map((c) => c.detail).join('; ') };
  }
  return { status: 'confirmed', message: null };
}
