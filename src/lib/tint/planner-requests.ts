import * as z from 'zod/mini';
import { isHexColour } from '~/lib/colour/hex-pattern';
import { atmospheres } from './warnings';

/**
 * Request bodies of the heat planner's routes (predict, plan-pair). Written with zod's small build
 * (zod/mini) because the planner islands check their forms with them in the browser; each error
 * names its field.
 */

const MAX_HOLD_MINUTES = 7 * 24 * 60;

export const alloySlugSchema = z
  .string({ error: 'must be an alloy slug' })
  .check(
    z.regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, { error: 'must be a lowercase alloy slug such as ti-grade-2' }),
    z.maxLength(64, { error: 'Too big: expected string to have <=64 characters' }),
  );

export const hexSchema = z
  .string({ error: 'must be a colour such as #3a6ea5' })
  .check(z.maxLength(7, { error: 'must be a colour such as #3a6ea5' }), z.refine(isHexColour, { error: 'must be a colour such as #3a6ea5' }));

const temperatureSchema = z
  .number({ error: 'must be a number of °C' })
  .check(z.gte(0, { error: 'must be between 0 and 1600 °C' }), z.lte(1600, { error: 'must be between 0 and 1600 °C' }));
const holdSchema = z
  .number({ error: 'must be a number of minutes' })
  .check(z.positive({ error: 'must be more than 0 minutes' }), z.lte(MAX_HOLD_MINUTES, { error: `must be at most ${MAX_HOLD_MINUTES} minutes (a week)` }));
const voltsSchema = z
  .number({ error: 'must be a number of volts' })
  .check(z.positive({ error: 'must be more than 0 V' }), z.lte(150, { error: 'must be at most 150 V' }));

export const predictRequestSchema = z.discriminatedUnion(
  'process',
  [
    z.object({
      alloy: alloySlugSchema,
      process: z.literal('heat'),
      temperatureC: temperatureSchema,
      holdMinutes: holdSchema,
      atmosphere: z._default(z.enum(atmospheres), 'air'),
    }),
    z.object({ alloy: alloySlugSchema, process: z.literal('anodize'), volts: voltsSchema }),
  ],
  { error: 'must be "heat" or "anodize"' },
);
export type PredictRequest = z.infer<typeof predictRequestSchema>;

function rangeSchema(value: z.ZodMiniNumber) {
  return z.object({ min: value, max: value }).check(z.refine((range) => range.max >= range.min, { path: ['max'], error: 'must not be below min' }));
}

export const planPairRequestSchema = z.object({
  alloys: z.tuple([alloySlugSchema, alloySlugSchema], { error: 'must be two alloy slugs' }),
  target: z.optional(z.tuple([hexSchema, hexSchema], { error: 'must be two colours' })),
  temperatureC: z.optional(rangeSchema(temperatureSchema)),
  holdMinutes: z.optional(rangeSchema(holdSchema)),
  /** Air unless given. */
  atmosphere: z.optional(z.enum(atmospheres)),
  /** Search beyond the temperatures both alloys' data cover; off unless asked for. */
  widen: z.optional(z.boolean({ error: 'must be true or false' })),
});
export type PlanPairRequest = z.infer<typeof planPairRequestSchema>;
