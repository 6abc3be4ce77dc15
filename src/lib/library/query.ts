import { z } from 'zod';
import { atmospheres, processes, surfacePreparations } from '../../../db/schema/enums';
import { alloySlugs, layerKeyOf } from '~/lib/alloys';
import { MAX_TEMPERATURE_C } from '~/lib/coupons';
import { fahrenheitToCelsius } from '~/lib/units';

/**
 * The library's query, as it lives in the URL: filters, sort, paging. One schema for the
 * /library page's plain GET form and for GET /api/coupons. Temperatures are typed in the
 * caller's unit (`unit=C|F`) and come out in °C; holds are typed in minutes and come out in
 * seconds. An empty form field means "no filter".
 */

export const librarySorts = ['date', 'temperature', 'hold', 'lightness'] as const;
export type LibrarySort = (typeof librarySorts)[number];
export type SortOrder = 'asc' | 'desc';

const blank = (value: unknown) => (typeof value === 'string' && value.trim() === '' ? undefined : value);
const optional = <T extends z.ZodType>(schema: T) => z.preprocess(blank, schema.optional());
const slug = z.enum(alloySlugs as [string, ...string[]], { error: 'Choose an alloy from the catalogue.' });
const range = (max: number, what: string) =>
  optional(
    z.coerce
      .number({ error: `Give ${what} as a number.` })
      .min(-1000)
      .max(max),
  );
const flag = optional(z.enum(['1', 'true', 'on'], { error: 'Use 1 to turn this on.' }));

export const libraryQuerySchema = z
  .object({
    alloy: optional(slug),
    pair: optional(
      z
        .string()
        .max(100)
        .transform((value) =>
          value
            .split(/[+ ]/)
            .map((part) => part.trim())
            .filter(Boolean),
        )
        .pipe(z.tuple([slug, slug], { error: 'Give two alloys as a+b.' })),
    ),
    pairA: optional(slug),
    pairB: optional(slug),
    process: optional(z.enum(processes, { error: 'Choose a process from the list.' })),
    unit: z.preprocess(blank, z.enum(['C', 'F'], { error: 'Use C or F.' }).default('C')),
    tempMin: range(3000, 'the lowest temperature'),
    tempMax: range(3000, 'the highest temperature'),
    holdMin: optional(z.coerce.number({ error: 'Give the shortest hold in minutes.' }).min(0).max(100_000)),
    holdMax: optional(z.coerce.number({ error: 'Give the longest hold in minutes.' }).min(0).max(100_000)),
    voltsMin: optional(z.coerce.number({ error: 'Give the lowest voltage as a number.' }).min(0).max(1000)),
    voltsMax: optional(z.coerce.number({ error: 'Give the highest voltage as a number.' }).min(0).max(1000)),
    atmosphere: optional(z.enum(atmospheres, { error: 'Choose an atmosphere from the list.' })),
    prep: optional(z.enum(surfacePreparations, { error: 'Choose a surface preparation from the list.' })),
    photos: flag,
    mine: flag,
    sort: z.preprocess(blank, z.enum(librarySorts, { error: 'Sort by date, temperature, hold or lightness.' }).default('date')),
    order: optional(z.enum(['asc', 'desc'], { error: 'Use asc or desc.' })),
    view: z.preprocess(blank, z.enum(['table', 'grid'], { error: 'Use table or grid.' }).default('table')),
    cursor: optional(z.string().max(500)),
    limit: z.preprocess(blank, z.coerce.number({ error: 'Give the page size as a number.' }).int().min(1).max(100).default(25)),
    offset: z.preprocess(blank, z.coerce.number().int().min(0).max(1_000_000).default(0)),
  })
  .superRefine((query, context) => {
    const pairs: [keyof typeof query, keyof typeof query][] = [
      ['tempMin', 'tempMax'],
      ['holdMin', 'holdMax'],
      ['voltsMin', 'voltsMax'],
    ];
    for (const [low, high] of pairs) {
      const [a, b] = [query[low], query[high]];
      if (typeof a === 'number' && typeof b === 'number' && a > b)
        context.addIssue({ code: 'custom', path: [high], message: 'The upper end is below the lower end.' });
    }
    if (Boolean(query.pairA) !== Boolean(query.pairB))
      context.addIssue({ code: 'custom', path: [query.pairA ? 'pairB' : 'pairA'], message: 'Choose both alloys of the pair.' });
    if (query.cursor && query.offset > 0) context.addIssue({ code: 'custom', path: ['offset'], message: 'Page with the cursor or the offset, not both.' });
  })
  .transform((query) => {
    const toC = (value: number | undefined) => (value === undefined ? undefined : query.unit === 'F' ? fahrenheitToCelsius(value) : value);
    return {
      ...query,
      pairKey: query.pair ? layerKeyOf(query.pair) : query.pairA && query.pairB ? layerKeyOf([query.pairA, query.pairB]) : undefined,
      // Source: NIST SP 811 (2008) appendix B.8: t/°C = (t/°F − 32)/1.8.
      tempMinC: toC(query.tempMin),
      tempMaxC: toC(query.tempMax),
      holdMinSeconds: query.holdMin === undefined ? undefined : Math.round(query.holdMin * 60),
      holdMaxSeconds: query.holdMax === undefined ? undefined : Math.round(query.holdMax * 60),
      order: (query.order ?? (query.sort === 'date' ? 'desc' : 'asc')) as SortOrder,
      hasPhotos: Boolean(query.photos),
      mineOnly: Boolean(query.mine),
    };
  });

export type LibraryQuery = z.output<typeof libraryQuerySchema>;
export { MAX_TEMPERATURE_C };

/** A keyset cursor: where the last page ended, as the sort key's value and the row's id. */
export interface LibraryCursor {
  sort: LibrarySort;
  order: SortOrder;
  /** The sort column's value at the last row (ms since epoch for the date, L* for lightness); null when the row had none. */
  value: number | null;
  id: number;
}

const cursorSchema = z.object({
  sort: z.enum(librarySorts),
  order: z.enum(['asc', 'desc']),
  value: z.number().finite().nullable(),
  id: z.number().int().positive(),
});

/** An opaque cursor string (base64url JSON). */
export function encodeCursor(cursor: LibraryCursor): string {
  return Buffer.from(JSON.stringify([cursor.sort, cursor.order, cursor.value, cursor.id])).toString('base64url');
}

/** The cursor a string names, or undefined when it is not one of ours or not for this sort. */
export function decodeCursor(text: string, sort: LibrarySort, order: SortOrder): LibraryCursor | undefined {
  try {
    const [s, o, value, id] = JSON.parse(Buffer.from(text, 'base64url').toString('utf8'));
    const parsed = cursorSchema.safeParse({ sort: s, order: o, value, id });
    if (!parsed.success || parsed.data.sort !== sort || parsed.data.order !== order) return undefined;
    return parsed.data;
  } catch {
    return undefined;
  }
}
