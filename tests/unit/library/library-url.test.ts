import { describe, expect, it } from 'vitest';
import { libraryQuerySchema, librarySorts } from '~/lib/library/query';
import {
  apiQuery,
  compareHref,
  formValues,
  libraryPath,
  pairMatrixPath,
  readView,
  unitOf,
  viewFromForm,
  withCursor,
  withDisplay,
  withSort,
  writeView,
} from '~/components/library/library-url';

// The library island's URL ⇄ view helpers. Expected URLs are written out by hand from the URL
// contract of the library (src/lib/library/query.ts and DEVELOPERS.md "The library"): the date
// sort is the default and runs newest first, other sorts lowest first; °C is the default unit;
// `view=grid` is the swatch grid; `cursor` names a page.

const sorts = ['date', 'temperature', 'hold'];

describe('reading and writing the library view', () => {
  it.each([
    // [the URL's query, the island's canonical URL query]
    ['', ''],
    ['process=forge', 'process=forge'],
    // Blank form fields and the default unit, sort and order say nothing.
    ['alloy=&process=torch&unit=C&tempMin=&sort=date&order=desc', 'process=torch'],
    ['sort=temperature&order=asc', 'sort=temperature'],
    ['sort=temperature&order=desc', 'sort=temperature&order=desc'],
    ['sort=date&order=asc', 'order=asc'],
    ['unit=F&tempMin=900&tempMax=1100', 'unit=F&tempMin=900&tempMax=1100'],
    ['pairA=ti-grade-2&pairB=ti-grade-5&view=grid', 'pairA=ti-grade-2&pairB=ti-grade-5&view=grid'],
    ['view=table&photos=1&mine=1', 'photos=1&mine=1'],
    // Paging: the cursor comes last; an offset is an older kind of page link the island drops.
    ['cursor=WyJkYXRlIl0&process=oven&limit=10', 'process=oven&limit=10&cursor=WyJkYXRlIl0'],
    ['offset=50&process=oven', 'process=oven'],
    // A sort the library does not offer reads as the default.
    ['sort=colour', ''],
  ])('%j is written back as %j', (search, expected) => {
    expect(writeView(readView(search, sorts))).toBe(expected);
  });

  it.each([
    'process=forge&sort=hold&order=desc&view=grid&cursor=abc',
    'pair=ti-grade-2%2Bti-grade-5&unit=F&tempMin=1000',
    'alloy=steel-1084&holdMin=5&holdMax=60&photos=1',
    'process=anodize&voltsMin=20&voltsMax=80&sort=date&order=asc',
  ])('asks the API for what the page would show for %j', (search) => {
    // Source: the page and the API share one schema; what the island writes must parse to the
    // same library query as the URL it read, with the display (`view`) the only thing left out.
    const asServer = libraryQuerySchema.parse({ ...Object.fromEntries(new URLSearchParams(search)), view: undefined });
    const asIsland = libraryQuerySchema.parse(Object.fromEntries(new URLSearchParams(apiQuery(readView(search, librarySorts)))));
    expect(asIsland).toEqual(asServer);
  });

  it('offers every sort the library lists', () => {
    for (const sort of librarySorts) expect(readView(`sort=${sort}`, librarySorts).sort).toBe(sort);
  });
});

describe('changing the view', () => {
  const view = readView('process=forge&unit=F&view=grid&limit=10&cursor=abc', sorts);

  it('sorts from the first page, keeping filters and display', () => {
    expect(libraryPath(withSort(view, 'temperature', 'desc'))).toBe('/library?process=forge&unit=F&sort=temperature&order=desc&view=grid&limit=10');
    expect(libraryPath(withSort(view, 'date', 'desc'))).toBe('/library?process=forge&unit=F&view=grid&limit=10');
  });

  it('pages and switches display without touching the filters', () => {
    expect(libraryPath(withCursor(view, 'def'))).toBe('/library?process=forge&unit=F&view=grid&limit=10&cursor=def');
    expect(libraryPath(withCursor(view, undefined))).toBe('/library?process=forge&unit=F&view=grid&limit=10');
    expect(libraryPath(withDisplay(view, 'table'))).toBe('/library?process=forge&unit=F&limit=10&cursor=abc');
    expect(libraryPath(readView('', sorts))).toBe('/library');
  });

  it('leaves the display out of what it asks the API', () => {
    expect(apiQuery(view)).toBe('process=forge&unit=F&limit=10&cursor=abc');
  });

  it('reads the filter form: its fields, the current display and page size, the first page', () => {
    const fields: [string, string][] = [
      ['alloy', ''],
      ['pairA', 'ti-grade-2'],
      ['pairB', 'ti-grade-5'],
      ['process', 'torch'],
      ['tempMin', '500'],
      ['tempMax', ''],
      ['unit', 'C'],
      ['sort', 'hold'],
      ['order', ''],
      ['view', 'table'],
      ['photos', '1'],
    ];
    expect(libraryPath(viewFromForm(fields, view, sorts))).toBe(
      '/library?pairA=ti-grade-2&pairB=ti-grade-5&process=torch&tempMin=500&photos=1&sort=hold&view=grid&limit=10',
    );
  });

  it('gives the form every field, so fields the view leaves out are cleared', () => {
    expect(formValues(readView('pair=ti-grade-2+ti-grade-5&unit=F&sort=temperature&order=desc&photos=1', sorts))).toEqual({
      pairA: 'ti-grade-2',
      pairB: 'ti-grade-5',
      unit: 'F',
      sort: 'temperature',
      order: 'desc',
      photos: '1',
    });
    expect(formValues(readView('', sorts))).toEqual({ unit: 'C', sort: 'date', order: '' });
  });

  it('reads the temperature unit', () => {
    expect(unitOf(readView('unit=F', sorts))).toBe('F');
    expect(unitOf(readView('unit=C', sorts))).toBe('C');
    expect(unitOf(readView('', sorts))).toBe('C');
  });
});

describe('the compare link', () => {
  it('repeats ids, one per chosen coupon, in the order chosen', () => {
    expect(compareHref([12, 7])).toBe('/compare?ids=12&ids=7');
    expect(compareHref([3, 1, 4, 15])).toBe('/compare?ids=3&ids=1&ids=4&ids=15');
  });
});

describe('the heat matrix link of a pair filter', () => {
  // The matrix's URL names a pair by its two slugs in sorted order (/library/pairs/{a}+{b}), whichever order the filter names them.
  it.each([
    ['pairA=ti-grade-5&pairB=ti-grade-2', '/library/pairs/ti-grade-2+ti-grade-5'],
    ['pair=ti-grade-5%2Bti-grade-2', '/library/pairs/ti-grade-2+ti-grade-5'],
    ['pairA=steel-1084&pairB=steel-15n20&unit=F', '/library/pairs/steel-1084+steel-15n20?unit=F'],
    ['pairA=ti-grade-2', undefined],
    ['pairA=ti-grade-2&pairB=ti-grade-2', undefined],
    ['alloy=ti-grade-2', undefined],
  ])('%s → %s', (query, path) => {
    expect(pairMatrixPath(readView(query, sorts))).toBe(path);
  });
});
