import * as z from 'zod/mini';
import { sheetAudiences, sheetOrientations, sheetPageSizes, sheetStatuses, sheetUnits } from '../../../db/schema/enums';
import { plainText } from '../text';

/** The request bodies of /api/sheets, shared by the routes and the sheet builder. */

export { sheetAudiences, sheetOrientations, sheetPageSizes, sheetStatuses, sheetUnits };
export type SheetStatus = (typeof sheetStatuses)[number];
export type SheetAudience = (typeof sheetAudiences)[number];
export type SheetUnits = (typeof sheetUnits)[number];
export type PageSizeName = (typeof sheetPageSizes)[number];
export type Orientation = (typeof sheetOrientations)[number];

export const MAX_SHEET_ITEMS = 200;
export const MAX_TITLE_LENGTH = 160;
export const MAX_INTRO_LENGTH = 600;
export const MAX_CAPTION_LENGTH = 280;
export const MAX_HEADING_LENGTH = 160;

const id = z.int().check(z.minimum(1), z.maximum(2 ** 31 - 1));
const title = z.string().check(z.trim(), z.minLength(1, 'Give the sheet a title.'), z.maxLength(MAX_TITLE_LENGTH), plainText());
const intro = z.string().check(z.trim(), z.maxLength(MAX_INTRO_LENGTH, `Keep the introduction within ${MAX_INTRO_LENGTH} characters.`), plainText('multi'));

const headingItem = z.object({
  kind: z.literal('heading'),
  text: z.string().check(z.trim(), z.minLength(1, 'A heading needs words.'), z.maxLength(MAX_HEADING_LENGTH), plainText()),
});

/** A swatch entry: a new `swatchId`, or an existing entry's `itemId` (kept as it is, even if its coupon is gone). */
const swatchItem = z
  .object({
    kind: z.literal('swatch'),
    swatchId: z.optional(id),
    itemId: z.optional(id),
    caption: z._default(z.string().check(z.trim(), z.maxLength(MAX_CAPTION_LENGTH), plainText()), ''),
    hideTemperature: z._default(z.boolean(), false),
    hideHold: z._default(z.boolean(), false),
    hideProcess: z._default(z.boolean(), false),
    hideAlloy: z._default(z.boolean(), false),
  })
  .check(
    z.refine((item) => (item.swatchId === undefined) !== (item.itemId === undefined), {
      message: 'Name either swatchId or itemId.',
      path: ['swatchId'],
    }),
  );

export const sheetItemSchema = z.discriminatedUnion('kind', [headingItem, swatchItem]);
export type SheetItemInput = z.output<typeof sheetItemSchema>;

const settings = {
  intro: z.optional(intro),
  classId: z.optional(z.nullable(id)),
  units: z.optional(z.enum(sheetUnits)),
  pageSize: z.optional(z.enum(sheetPageSizes)),
  orientation: z.optional(z.enum(sheetOrientations)),
  audience: z.optional(z.enum(sheetAudiences)),
  showPrediction: z.optional(z.boolean()),
};

export const createSheetSchema = z.strictObject({ title, ...settings });
export type CreateSheetInput = z.output<typeof createSheetSchema>;

/** A change to a sheet; `items`, when sent, is the whole ordered list and replaces the old one. */
export const updateSheetSchema = z.strictObject({
  title: z.optional(title),
  ...settings,
  status: z.optional(z.enum(sheetStatuses)),
  items: z.optional(z.array(sheetItemSchema).check(z.maxLength(MAX_SHEET_ITEMS, `A sheet holds at most ${MAX_SHEET_ITEMS} entries.`))),
});
export type UpdateSheetInput = z.output<typeof updateSheetSchema>;

export const pdfQuerySchema = z.object({ size: z.optional(z.enum(sheetPageSizes, 'size must be a4 or letter.')) });
