import { z } from 'zod';
import { MAX_LAYERS } from './coupons';
import { plainText } from './text';
import { GREY_CARD_REFLECTANCE, isPhotoContentType, MAX_UPLOAD_BYTES, outsideMessage, TOO_BIG, UNACCEPTED_TYPE, type RegionInput } from './photos';

/** The requests of the upload path and the region editor, one zod schema each (routes and tests share them). */

export { TOO_BIG, UNACCEPTED_TYPE };

export const uploadRequestSchema = z.object({
  filename: z
    .string({ error: 'Give the file name.' })
    .trim()
    .min(1, { error: 'Give the file name.' })
    .max(255, { error: 'The file name is too long (at most 255 characters).' })
    .check(plainText()),
  contentType: z.string({ error: 'Give the content type of the photo.' }).trim().toLowerCase().max(100),
  size: z
    .number({ error: 'Give the size of the photo in bytes.' })
    .int({ error: 'The size is a whole number of bytes.' })
    .min(1, { error: 'The file is empty.' }),
});
export type UploadRequest = z.infer<typeof uploadRequestSchema>;

/** Status and message for an upload that is well formed but not accepted, or null. */
export function refuseUpload(request: UploadRequest): { status: number; message: string; field: string } | null {
  if (!isPhotoContentType(request.contentType)) return { status: 415, message: UNACCEPTED_TYPE, field: 'contentType' };
  if (request.size > MAX_UPLOAD_BYTES) return { status: 413, message: TOO_BIG, field: 'size' };
  return null;
}

const rectangle = {
  x: z.int({ error: 'x is a whole number of pixels.' }).min(0, { error: 'x cannot be negative.' }),
  y: z.int({ error: 'y is a whole number of pixels.' }).min(0, { error: 'y cannot be negative.' }),
  width: z.int({ error: 'width is a whole number of pixels.' }).min(1, { error: 'width is at least 1 pixel.' }),
  height: z.int({ error: 'height is a whole number of pixels.' }).min(1, { error: 'height is at least 1 pixel.' }),
};

const regionSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('layer'), layerId: z.int({ error: 'Choose the layer this region shows.' }).positive(), ...rectangle }),
    z.object({
      kind: z.literal('grey'),
      ...rectangle,
      reflectance: z
        .number({ error: 'The grey card reflectance is a number (percent).' })
        .min(GREY_CARD_REFLECTANCE.min, { error: `The grey card reflectance is at least ${GREY_CARD_REFLECTANCE.min} %.` })
        .max(GREY_CARD_REFLECTANCE.max, { error: `The grey card reflectance is at most ${GREY_CARD_REFLECTANCE.max} %.` })
        .optional(),
    }),
  ],
  { error: "A region's kind is 'layer' or 'grey'." },
);

/** One rectangle per layer, and at most one grey card. */
export const regionsSchema = z
  .array(regionSchema, { error: 'regions is a list of rectangles.' })
  .max(MAX_LAYERS + 1, { error: `At most ${MAX_LAYERS + 1} regions: one per layer and one grey card.` })
  .superRefine((regions, context) => {
    const seen = new Set<number>();
    let greys = 0;
    regions.forEach((region, index) => {
      if (region.kind === 'grey' && ++greys > 1) {
        context.addIssue({ code: 'custom', path: [index, 'kind'], message: 'Mark at most one grey card.' });
      }
      if (region.kind === 'layer') {
        if (seen.has(region.layerId)) context.addIssue({ code: 'custom', path: [index, 'layerId'], message: 'Mark each layer once.' });
        seen.add(region.layerId);
      }
    });
  }) satisfies z.ZodType<RegionInput[]>;

export const attachRequestSchema = z.object({
  key: z.string({ error: 'Give the key of the upload.' }).min(1, { error: 'Give the key of the upload.' }).max(512),
  regions: regionsSchema.optional(),
});
export type AttachRequest = z.infer<typeof attachRequestSchema>;

export const regionsRequestSchema = z.object({ regions: regionsSchema });

/**
 * Checks regions against the photo and the coupon: each layer region names one of the coupon's
 * layers and every rectangle lies inside the photo. Gives the field and message of the first fault.
 */
export function checkRegions(regions: RegionInput[], layerIds: number[], size: { width: number; height: number }): { field: string; message: string } | null {
  for (const [index, region] of regions.entries()) {
    if (region.kind === 'layer' && !layerIds.includes(region.layerId)) {
      return { field: `regions.${index}.layerId`, message: `regions.${index}.layerId: that layer is not part of this coupon.` };
    }
    const outside = outsideMessage(region, size);
    if (outside) return { field: `regions.${index}`, message: `regions.${index}: ${outside}` };
  }
  return null;
}
