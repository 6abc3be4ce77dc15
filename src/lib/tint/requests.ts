import { z } from 'zod';
import { hexToLab, type Lab } from '~/lib/colour';
import { illuminants } from './illuminants';
import { MAX_THICKNESS_NM } from './ladder';
import { findTintModel, missingModelReason, type ModelPart, type TintModel } from './models';
import { alloySlugSchema, hexSchema } from './planner-requests';

/** Request bodies of the tint routes, validated with zod; each error names its field. */

// The heat planner's, which its islands check in the browser too, are written in zod/mini.
export * from './planner-requests';

const MAX_LADDER_STEPS = 5001;

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

export const labSchema = z.object({
  l: z.number().min(0).max(100),
  a: z.number().min(-200).max(200),
  b: z.number().min(-200).max(200),
});

export const estimateRequestSchema = z
  .object({ alloy: alloySlugSchema, hex: z.optional(hexSchema), lab: labSchema.optional() })
  .refine((request) => (request.hex === undefined) !== (request.lab === undefined), {
    path: ['hex'],
    error: 'give exactly one of hex or lab',
  });
export type EstimateRequest = z.infer<typeof estimateRequestSchema>;

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
