import { z } from 'zod';
import { alloySlugs } from '~/lib/alloys';
import { hexToLab, isHexColour } from '~/lib/colour';
import { MAX_BOXED_DELTA_E } from './colour-box';

/** The largest ΔE00 colour search accepts: well inside the range its index box is derived for. */
export const MAX_SEARCH_DELTA_E = 10;

const blank = (value: unknown) => (typeof value === 'string' && value.trim() === '' ? undefined : value);

/** GET /api/swatches/search and the colour-search page: a colour, an optional alloy, a ΔE00 limit. */
export const colourSearchSchema = z
  .object({
    hex: z.string({ error: 'Give a colour as a hex code, e.g. #3a5fa0.' }).trim().refine(isHexColour, { error: 'Give a colour as a hex code, e.g. #3a5fa0.' }),
    alloy: z.preprocess(blank, z.enum(alloySlugs as [string, ...string[]], { error: 'Choose an alloy from the catalogue.' }).optional()),
    maxDeltaE: z.preprocess(
      blank,
      z.coerce
        .number({ error: 'Give the ΔE00 limit as a number.' })
        .gt(0, { error: 'The ΔE00 limit must be above 0.' })
        .max(MAX_SEARCH_DELTA_E, { error: `The ΔE00 limit is at most ${MAX_SEARCH_DELTA_E}.` })
        .default(5),
    ),
    limit: z.preprocess(
      blank,
      z.coerce
        .number({ error: 'Give the number of hits as a number.' })
        .int({ error: 'Give a whole number of hits.' })
        .min(1, { error: 'Ask for 1 to 100 hits.' })
        .max(100, { error: 'Ask for 1 to 100 hits.' })
        .default(20),
    ),
  })
  .transform((query) => {
    const digits = query.hex.replace('#', '').toLowerCase();
    const hex = `#${digits.length === 3 ? [...digits].map((d) => d + d).join('') : digits}`;
    return { ...query, hex, lab: hexToLab(hex)! };
  });

export type ColourSearch = z.output<typeof colourSearchSchema>;

// The box derivation must cover every limit the search accepts.
if (MAX_SEARCH_DELTA_E > MAX_BOXED_DELTA_E) throw new Error('colour search limit beyond its box');
