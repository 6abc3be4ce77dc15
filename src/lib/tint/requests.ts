import { z } from 'zod';
import { hexToLab, isHexColour, type Lab } from '../colour';
import { illuminants } from './illuminants';
import { MAX_THICKNESS_NM } from './ladder';
import { findTintModel, missingModelReason, type ModelPart, type TintModel } from './models';
import { atmospheres } from './warnings';

/** Request bodies of the tint routes, validated with zod; each error names its field. */

const MAX_LADDER_STEPS = 5001;
const MAX_HOLD_MINUTES = 7 * 24 * 60;

export const alloySlugSchema = z
  .string({ error: 'must be an alloy slug' })
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, { error: 'must be a lowercase alloy slug such as ti-grade-2' })
  .max(64);

const thicknessSchema = z.number().min(0).max(MAX_THICKNESS_NM);

export const ladderRequestSchema = z
  .object({
    alloy: alloySlugSchema,
    fromNm: thicknessSchema.default(0),
    toNm: thicknessSchema.default(300),
    stepNm: z.number().min(0.1).max(100).default(5),
    illuminant: z.enum(illuminants).default('D65'),
  })
  .refine((request) => request.toNm >= request.fromNm, { path: ['toNm'], error: 'must not be below fromNm' })
  .refine((request) => (request.toNm - request.fromNm) / request.stepNm + 1 <= MAX_LADDER_STEPS, {
    path: ['stepNm'],
    error: `too small for the range: at most ${MAX_LADDER_STEPS} steps`,
  });
export type LadderRequest = z.infer<typeof ladderRequestSchema>;

const temperatureSchema = z
  .number({ error: 'must be a number of °C' })
  .min(0, { error: 'must be between 0 and 1600 °C' })
  .max(1600, { error: 'must be between 0 and 1600 °C' });
const holdSchema = z
  .number({ error: 'must be a number of minutes' })
  .positive({ error: 'must be more than 0 minutes' })
  .max(MAX_HOLD_MINUTES, { error: `must be at most ${MAX_HOLD_MINUTES} minutes (a week)` });
const voltsSchema = z
  .number({ error: 'must be a number of volts' })
  .positive({ error: 'must be more than 0 V' })
  .max(150, { error: 'must be at most 150 V' });

export const predictRequestSchema = z.discriminatedUnion(
  'process',
  [
    z.object({
      alloy: alloySlugSchema,
      process: z.literal('heat'),
      temperatureC: temperatureSchema,
      holdMinutes: holdSchema,
      atmosphere: z.enum(atmospheres).default('air'),
    }),
    z.object({ alloy: alloySlugSchema, process: z.literal('anodize'), volts: voltsSchema }),
  ],
  { error: 'must be "heat" or "anodize"' },
);
export type PredictRequest = z.infer<typeof predictRequestSchema>;

export const hexSchema = z.string({ error: 'must be a colour such as #3a6ea5' }).max(7, { error: 'must be a colour such as #3a6ea5' }).refine(isHexColour, {
  error: 'must be a colour such as #3a6ea5',
});

export const labSchema = z.object({
  l: z.number().min(0).max(100),
  a: z.number().min(-200).max(200),
  b: z.number().min(-200).max(200),
});

export const estimateRequestSchema = z
  .object({ alloy: alloySlugSchema, hex: hexSchema.optional(), lab: labSchema.optional() })
  .refine((request) => (request.hex === undefined) !== (request.lab === undefined), {
    path: ['hex'],
    error: 'give exactly one of hex or lab',
  });
export type EstimateRequest = z.infer<typeof estimateRequestSchema>;

function rangeSchema(value: z.ZodNumber) {
  return z
    .object({ min: value, max: value })
    .refine((range) => range.max >= range.min, { path: ['max'], error: 'must not be below min' });
}

export const planPairRequestSchema = z.object({
  alloys: z.tuple([alloySlugSchema, alloySlugSchema], { error: 'must be two alloy slugs' }),
  target: z.tuple([hexSchema, hexSchema], { error: 'must be two colours' }).optional(),
  temperatureC: rangeSchema(temperatureSchema).optional(),
  holdMinutes: rangeSchema(holdSchema).optional(),
});
export type PlanPairRequest = z.infer<typeof planPairRequestSchema>;

/** The measured colour of an estimate request as CIELAB (D65). */
export function requestLab(request: EstimateRequest): Lab {
  return request.lab ?? hexToLab(request.hex!)!;
}

export type ModelLookup = { ok: true; model: TintModel } | { ok: false; status: 400 | 422; message: string; field: string };

/**
 * The model for a requested slug, or why not: 400 for a slug that is not in the catalogue,
 * 422 for an alloy whose family has no model for the question ("library data only").
 */
export function lookUpModel(slug: string, field: string, parts: readonly ModelPart[]): ModelLookup {
  const model = findTintModel(slug);
  if (!model) return { ok: false, status: 400, message: `${field}: unknown alloy "${slug}"`, field };
  for (const part of parts) {
    const reason = missingModelReason(model, part);
    if (reason) return { ok: false, status: 422, message: `${field}: ${reason}`, field };
  }
  return { ok: true, model };
}
