import { describe, expect, it } from 'vitest';
import { libraryQuerySchema } from '~/lib/library/query';
import { libraryPickQuery, libraryPicks, noLibraryFilters } from '~/lib/sheets/library-picks';

describe('the sheet builder’s library picker', () => {
  it('asks the library for coupons with photos, filtered as the /library form would be', () => {
    const query = libraryPickQuery({ ...noLibraryFilters, pairA: 'steel-1084', pairB: 'steel-15n20', process: 'oven', tempMin: ' 200 ', tempMax: '320' });
    const parsed = libraryQuerySchema.parse(Object.fromEntries(new URLSearchParams(query)));
    expect(parsed).toMatchObject({ pairA: 'steel-1084', pairB: 'steel-15n20', process: 'oven', tempMin: 200, tempMax: 320, photos: '1', limit: 40 });
    expect(parsed.alloy).toBeUndefined();
  });

  it('sends no filter for an empty field, and both halves of a pair even when one is missing (the library names it)', () => {
    expect(libraryPickQuery(noLibraryFilters)).toBe('photos=1&unit=C&limit=40');
    const half = libraryQuerySchema.safeParse(Object.fromEntries(new URLSearchParams(libraryPickQuery({ ...noLibraryFilters, pairA: 'ti-grade-2' }))));
    expect(half.success).toBe(false);
    expect(half.error?.issues[0].path).toEqual(['pairB']);
  });

  it('offers one swatch per measured layer, naming the layer’s alloy only on a laminate', () => {
    const picks = libraryPicks([
      {
        title: 'Billet offcut',
        temperatureC: 280,
        holdSeconds: 600,
        dominantSwatches: [
          { swatchId: 7, position: 0, alloy: 'steel-1084', hex: '#02457f' },
          { swatchId: 8, position: 1, alloy: 'steel-15n20', hex: '#390256' },
        ],
      },
      { title: 'Grade 2 sheet', temperatureC: null, holdSeconds: null, dominantSwatches: [{ swatchId: 9, position: 0, alloy: 'ti-grade-2', hex: '#bdab88' }] },
      { title: 'Not photographed', temperatureC: 300, holdSeconds: 60, dominantSwatches: [] },
      {
        title: 'Ladder, 320 °C, 10 min',
        temperatureC: 320,
        holdSeconds: 600,
        dominantSwatches: [{ swatchId: 10, position: 0, alloy: 'steel-o1', hex: '#96b1ba' }],
      },
    ]);
    expect(picks).toEqual([
      { swatchId: 7, hex: '#02457f', couponTitle: 'Billet offcut · 1084 carbon steel (280 °C, 10 min)' },
      { swatchId: 8, hex: '#390256', couponTitle: 'Billet offcut · 15N20 nickel steel (280 °C, 10 min)' },
      { swatchId: 9, hex: '#bdab88', couponTitle: 'Grade 2 sheet' },
      // The heat is in the title already.
      { swatchId: 10, hex: '#96b1ba', couponTitle: 'Ladder, 320 °C, 10 min' },
    ]);
  });
});
