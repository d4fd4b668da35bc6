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

// In quantity mode a number may carry a unit ("0.067 electronMass"); in atomic units parse-block refuses such text.
// `{ value, uncertainty }` is written in the record format but not built yet: say so rather than "must be a number".
const UNCERTAIN = 'uncertain inputs ({ value, uncertainty }) are not supported yet; write the value alone';
const numberMessage = (data: unknown, positive: boolean) =>
  data === undefined ? 'is required' : isUncertain(data) ? UNCERTAIN : typeof data !== 'number' ? 'must be a number' : !Number.isFinite(data) ? 'must be a finite number' : positive ? 'must be positive' : 'must be a number';
function isUncertain(data: unknown): boolean {
  return typeof data === 'object' && data !== null && Object.hasOwn(data, 'uncertainty');
}
// Text in a numeric field is a quantity such as "2 nm": branded so that code which needs plain numbers cannot miss it.
const quantityText = z.string().min(1, 'must not be empty').brand<'QuantityText'>();
export type QuantityText = z.infer<typeof quantityText>;
const quantity = z.union([finite, quantityText], { errorMap: (_issue, ctx) => ({ message: numberMessage(ctx.data, false) }) });
const positiveQuantity = z.union([finite.positive('must be positive'), quantityText], {
  errorMap: (_issue, ctx) => ({ message: numberMessage(ctx.data, true) }),
});

const rangeFields = z.object({ start: quantity, min: quantity, max: quantity }, { invalid_type_error: 'must be a number (held fixed) or { start, min, max } (varied)' }).strict();
const range = rangeFields.superRefine((r, ctx) => {
  // Quantities with units are compared once converted (units/quantity-block.ts).
  if (typeof r.start !== 'number' || typeof r.min !== 'number' || typeof r.max !== 'number') return;
  if (!(r.min < r.max)) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['max'], message: `max (${r.max}) must be larger than min (${r.min})` });
  else if (r.start < r.min || r.start > r.max) ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['start'], message: `start (${r.start}) must lie within [${r.min}, ${r.max}]` });
});

const claimedFields = z.object({ value: quantity, tolerance: positiveQuantity }).strict();
const claimedValue = z.union([quantity, claimedFields], {
  errorMap: () => ({ message: 'must be a number or { value, tolerance }' }),
});

/** Names every expression may use besides its own declarations; records may not redeclare them. */
export const RESERVED_NAMES = ['x', 'r', 'pi', 'e', 'mass', 'hbar'] as const;

export const NAME = /^[A-Za-z][A-Za-z0-9_]*$/;
const name = z.string().regex(NAME, 'must be a name of letters, digits and _ starting with a letter');

const coordinateRange = z.union([z.enum(['line', 'half-line']), z.tuple([finite, finite])], {
  errorMap: () => ({ message: 'each coordinate must be line, half-line or [a, b]' }),
});
const referenceFields = z
  .object(
    { solve: z.boolean({ invalid_type_error: 'must be true or false' }).optional(), energy: quantity.optional(), tolerance: positiveQuantity.optional(), source: z.string({ invalid_type_error: 'must be text (a citation)' }).min(1).optional() },
    { invalid_type_error: 'must be a map such as { solve: false } or { energy, source }' },
  )
  .strict();
const claimFields = z
  .object({ energy: quantity.optional(), tolerance: positiveQuantity.optional(), parameters: z.record(name, claimedValue).optional() }, { invalid_type_error: 'must be a map such as { energy, tolerance, parameters }' })
  .strict();
const reportFields = z.object({ 'energy-unit': z.string().optional(), plots: z.array(z.enum(['scan', 'density'])).optional() }).strict();

export const blockSchema = z
  .object({
    id: z.string({ required_error: 'every block needs an id', invalid_type_error: 'must be text' }).regex(/^[A-Za-z0-9][A-Za-z0-9_-]*$/, 'must be a slug: letters, digits, - and _'),
    caption: z.string().optional(),
    system: z.string({ invalid_type_error: 'must be text: the name of the physical system, shared by the blocks about it' }).regex(/^[A-Za-z0-9][A-Za-z0-9_-]*$/, 'must be a slug: letters, digits, - and _').optional(),
    units: z.union([z.literal('atomic'), z.record(z.string())], { errorMap: () => ({ message: 'must be atomic or a map such as { length: nm, energy: meV }' }) }).optional(),
    space: z
      .union([z.enum(['line', 'half-line', 'radial', 'plane', 'axial']), z.record(name, coordinateRange)], {
        errorMap: () => ({ message: 'must be one of line, half-line, radial, plane, axial, or a map of 2 or 3 coordinates such as { x: line, y: [0, 2] }' }),
      })
      .optional(),
    box: z.tuple([quantity, quantity], { errorMap: () => ({ message: 'must be [a, b] with two numbers' }) }).optional(),
    'angular-momentum': z.number({ invalid_type_error: 'must be a whole number (l = 0, 1, 2, ... on radial; m = 0, +-1, +-2, ... on plane)' }).int('must be an integer').optional(),
    mass: z
      .union([positiveQuantity, z.record(name, positiveQuantity).refine((masses) => !isUncertain(masses), { message: UNCERTAIN })], {
        errorMap: (_issue, ctx) => ({ message: typeof ctx.data === 'object' && !isUncertain(ctx.data) ? 'must be a map of positive masses per coordinate' : numberMessage(ctx.data, true) }),
      })
      .optional(),
    constants: z.record(name, quantity).optional(),
    potential: expression,
    trial: expression.optional(),
    basis: z.array(expression).optional(),
    symmetry: z.enum(['even', 'odd'], { errorMap: () => ({ message: 'must be even or odd' }) }).optional(),
    level: z.number({ invalid_type_error: 'must be a whole number 0, 1, 2, ...' }).int('must be a whole number 0, 1, 2, ...').min(0, 'must be 0 or more').optional(),
    states: z.number({ invalid_type_error: 'must be a whole number' }).int('must be a whole number').positive('must be 1 or more').max(50, 'at most 50 levels').optional(),
    parameters: z.record(name, z.union([quantity, range])).optional(),
    reference: referenceFields.optional(),
    claim: claimFields.optional(),
    report: reportFields.optional(),
  })
  .strict();

export type RawBlock = z.infer<typeof blockSchema>;

/** The fields a map at this path of a block may hold, for suggesting the one a misspelt key meant. */
export function knownFields(path: readonly (string | number)[]): string[] {
  const [head, , third] = path;
  const shape =
    path.length === 0 ? blockSchema.shape
    : path.length === 1 && head === 'reference' ? referenceFields.shape
    : path.length === 1 && head === 'claim' ? claimFields.shape
    : path.length === 1 && head === 'report' ? reportFields.shape
    : path.length === 2 && head === 'parameters' ? rangeFields.shape
    : path.length === 3 && head === 'claim' && path[1] === 'parameters' && third !== undefined ? claimedFields.shape
    : {};
  return Object.keys(shape);
}
