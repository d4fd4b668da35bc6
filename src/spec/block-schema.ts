import { z } from 'zod';

/** The shape of a spec block (RECORD-FORMAT.md), checked before any meaning is given to it. */

const finite = z.number({ invalid_type_error: 'must be a number' }).finite('must be a finite number');
// YAML reads `potential: 0` as a number; a number is an expression too.
const expression = z
  .union([z.string(), z.number().finite()], {
    errorMap: (_issue, ctx) => ({ message: ctx.data === undefined ? 'is required' : 'must be an expression written as text' }),
  })
  .transform(String)
  .pipe(z.string().min(1, 'must not be empty'));

const range = z
  .object({ start: finite, min: finite, max: finite }, { invalid_type_error: 'must be a number (held fixed) or { start, min, max } (varied)' })
  .strict()
  .superRefine((r, ctx) => {
    if (!(r.min < r.max)) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['max'], message: `max (${r.max}) must be larger than min (${r.min})` });
    else if (r.start < r.min || r.start > r.max) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['start'], message: `start (${r.start}) must lie within [${r.min}, ${r.max}]` });
  });

const claimedValue = z.union([finite, z.object({ value: finite, tolerance: finite.positive('must be positive') }).strict()], {
  errorMap: () => ({ message: 'must be a number or { value, tolerance }' }),
});

/** Names every expression may use besides its own declarations; records may not redeclare them. */
export const RESERVED_NAMES = ['x', 'r', 'pi', 'e', 'mass', 'hbar'] as const;

export const NAME = /^[A-Za-z][A-Za-z0-9_]*$/;
const name = z.string().regex(NAME, 'must be a name of letters, digits and _ starting with a letter');

export const blockSchema = z
  .object({
    id: z.string({ required_error: 'every block needs an id', invalid_type_error: 'must be text' }).regex(/^[A-Za-z0-9][A-Za-z0-9_-]*$/, 'must be a slug: letters, digits, - and _'),
    caption: z.string().optional(),
    units: z.union([z.literal('atomic'), z.record(z.string())], { errorMap: () => ({ message: 'must be atomic or a map such as { length: nm, energy: meV }' }) }).optional(),
    space: z.enum(['line', 'half-line', 'radial'], { errorMap: () => ({ message: 'must be one of line, half-line, radial' }) }).optional(),
    box: z.tuple([finite, finite], { errorMap: () => ({ message: 'must be [a, b] with two numbers' }) }).optional(),
    'angular-momentum': z.number().int('must be an integer').min(0, 'must be 0 or more').optional(),
    mass: finite.positive('must be positive').optional(),
    constants: z.record(name, finite).optional(),
    potential: expression,
    trial: expression.optional(),
    basis: z.array(expression).optional(),
    states: z.number().int().positive().optional(),
    parameters: z.record(name, z.union([finite, range])).optional(),
    reference: z
      .object({ solve: z.boolean().optional(), energy: finite.optional(), tolerance: finite.positive('must be positive').optional(), source: z.string().min(1).optional() })
      .strict()
      .optional(),
    claim: z
      .object({ energy: finite.optional(), tolerance: finite.positive('must be positive').optional(), parameters: z.record(name, claimedValue).optional() })
      .strict()
      .optional(),
    report: z
      .object({ 'energy-unit': z.string().optional(), plots: z.array(z.enum(['scan', 'density'])).optional() })
      .strict()
      .optional(),
  })
  .strict();

export type RawBlock = z.infer<typeof blockSchema>;
