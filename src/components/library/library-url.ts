/**
 * The library's view as it lives in the URL, for the island: filters, sort, display and page.
 * The same parameters as the page's plain GET form and `GET /api/coupons`
 * (src/lib/library/query.ts); defaults are left out so a shared link stays short.
 */

export type SortOrder = 'asc' | 'desc';
export type Display = 'table' | 'grid';

export interface LibraryView {
  /** Filter parameters in URL order, blank ones left out (`alloy`, `pairA`, `process`, `tempMin`, `unit`, `photos`, …). */
  filters: [string, string][];
  sort: string;
  order: SortOrder;
  display: Display;
  /** The page size, when the URL names one. */
  limit?: string;
  /** The keyset cursor of the page shown; absent on the first page. */
  cursor?: string;
}

/** Parameters that are not filters. `offset` is an older way of paging the island never writes. */
const controls = new Set(['sort', 'order', 'view', 'limit', 'cursor', 'offset']);

/** The order a sort takes when none is named: the newest first for the date, the lowest first otherwise (as the query schema says). */
export const defaultOrder = (sort: string): SortOrder => (sort === 'date' ? 'desc' : 'asc');

const isOrder = (value: string | null): value is SortOrder => value === 'asc' || value === 'desc';

/** The view a URL's query names; a sort not in `sorts` falls back to the date. */
export function readView(search: string | URLSearchParams, sorts: readonly string[]): LibraryView {
  const params = new URLSearchParams(search);
  const sortParam = params.get('sort') ?? '';
  const sort = sorts.includes(sortParam) ? sortParam : 'date';
  const orderParam = params.get('order');
  const filters: [string, string][] = [];
  for (const [key, raw] of params) {
    const value = raw.trim();
    if (controls.has(key) || value === '' || (key === 'unit' && value === 'C')) continue;
    filters.push([key, value]);
  }
  return {
    filters,
    sort,
    order: isOrder(orderParam) ? orderParam : defaultOrder(sort),
    display: params.get('view') === 'grid' ? 'grid' : 'table',
    limit: params.get('limit')?.trim() || undefined,
    cursor: params.get('cursor')?.trim() || undefined,
  };
}

/** The URL query (no `?`) of a view, defaults left out. */
export function writeView(view: LibraryView): string {
  const params = new URLSearchParams(view.filters);
  if (view.sort !== 'date') params.set('sort', view.sort);
  if (view.order !== defaultOrder(view.sort)) params.set('order', view.order);
  if (view.display === 'grid') params.set('view', 'grid');
  if (view.limit) params.set('limit', view.limit);
  if (view.cursor) params.set('cursor', view.cursor);
  return params.toString();
}

/** The `/library` address of a view. */
export function libraryPath(view: LibraryView): string {
  const query = writeView(view);
  return query ? `/library?${query}` : '/library';
}

/** What the API is asked for a view: its query without the display, which changes nothing in the answer. */
export const apiQuery = (view: LibraryView): string => writeView({ ...view, display: 'table' });

/** The view a filter form's fields name: its filters and sort, the current display and page size, the first page. */
export function viewFromForm(fields: Iterable<[string, string]>, current: LibraryView, sorts: readonly string[]): LibraryView {
  const params = new URLSearchParams();
  for (const [key, value] of fields) if (key !== 'view' && key !== 'limit' && key !== 'cursor') params.append(key, value);
  if (current.display === 'grid') params.set('view', 'grid');
  if (current.limit) params.set('limit', current.limit);
  return readView(params, sorts);
}

/** The view sorted another way, from its first page. */
export const withSort = (view: LibraryView, sort: string, order: SortOrder): LibraryView => ({ ...view, sort, order, cursor: undefined });

/** The view at another page (undefined: the first). */
export const withCursor = (view: LibraryView, cursor: string | undefined): LibraryView => ({ ...view, cursor });

/** The same results shown another way. */
export const withDisplay = (view: LibraryView, display: Display): LibraryView => ({ ...view, display });

/** The temperature unit the view reads in. */
export const unitOf = (view: LibraryView): 'C' | 'F' => (view.filters.some(([key, value]) => key === 'unit' && value === 'F') ? 'F' : 'C');

/**
 * The filter form's field values for a view, every field named, so setting them clears what the
 * view leaves out: `pair=a+b` fills the two pair fields, a default order shows as "usual".
 */
export function formValues(view: LibraryView): Record<string, string> {
  const values: Record<string, string> = { unit: 'C', sort: view.sort, order: view.order === defaultOrder(view.sort) ? '' : view.order };
  for (const [key, value] of view.filters) {
    if (key === 'pair') {
      const [a = '', b = ''] = value.split(/[+ ]/).filter(Boolean);
      Object.assign(values, { pairA: a, pairB: b });
    } else values[key] = value;
  }
  return values;
}

/** The /compare address for chosen coupons, one `ids` parameter each. */
export function compareHref(ids: readonly number[]): string {
  const params = new URLSearchParams(ids.map((id) => ['ids', String(id)]));
  return `/compare?${params}`;
}

/** The heat matrix of the alloy pair a view filters by (`pair=a+b`, or `pairA` and `pairB`); none without two different alloys. */
export function pairMatrixPath(view: LibraryView): string | undefined {
  const { pairA = '', pairB = '' } = formValues(view);
  if (!pairA || !pairB || pairA === pairB) return undefined;
  // The matrix names a pair by its sorted slugs, as layerKeyOf does.
  const key = [pairA, pairB].sort().map(encodeURIComponent).join('+');
  return `/library/pairs/${key}${unitOf(view) === 'F' ? '?unit=F' : ''}`;
}
