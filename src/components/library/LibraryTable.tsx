import { keepPreviousData, QueryClient, QueryClientProvider, useQuery } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo, useRef, useState, useSyncExternalStore, type MouseEvent, type ReactNode, type SubmitEventHandler } from 'react';
import { fieldLabel, FILTER_FORM_ID, filterForm, markRefused, readFields, writeFields } from './filter-form';
import { fetchLibraryPage, LibraryLoadError, type LibraryResults } from './library-rows';
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
  type LibraryView,
  type SortOrder,
} from './library-url';
import { ResultCards, ResultGrid } from './ResultCards';
import { ResultsTable } from './ResultsTable';

interface Props {
  /** The page's URL query (no `?`) the first results were loaded for. */
  initialSearch: string;
  initialPage: LibraryResults;
  /** The sorts the library offers (`librarySorts`). */
  sorts: readonly string[];
}

const COMPARE_MIN = 2;
const COMPARE_MAX = 4;

const neverChanges = () => () => {};
/** False while the server renders and hydrates, true once the island runs in the browser. */
const useHydrated = () =>
  useSyncExternalStore(
    neverChanges,
    () => true,
    () => false,
  );

const retryLostConnections = (failures: number, error: Error) =>
  error instanceof LibraryLoadError && (error.status === 0 || error.status >= 500) && failures < 2;

/**
 * The library's results, upgraded: the server renders this island with the page's first results
 * (so the page shows its data with no JavaScript, and every link and the compare form work
 * without it); once running it takes over the filter form, sorting, paging and the display,
 * loading pages from `GET /api/coupons` through TanStack Query and keeping the view in the URL.
 */
export default function LibraryTable(props: Props) {
  const [client] = useState(() => {
    const queryClient = new QueryClient({
      defaultOptions: { queries: { staleTime: 60_000, refetchOnWindowFocus: false, retry: retryLostConnections } },
    });
    queryClient.setQueryData(['library', apiQuery(readView(props.initialSearch, props.sorts))], props.initialPage);
    return queryClient;
  });
  return (
    <QueryClientProvider client={client}>
      <LibraryResultsView {...props} />
    </QueryClientProvider>
  );
}

/** A plain left click on a link: the island follows it itself; any other (new tab, modifier) is the browser's. */
const plainClick = (event: MouseEvent) => !(event.button !== 0 || event.metaKey || event.ctrlKey || event.shiftKey || event.altKey);

function LibraryResultsView({ initialSearch, sorts }: Props) {
  const hydrated = useHydrated();
  const [search, setSearch] = useState(() => writeView(readView(initialSearch, sorts)));
  const view = useMemo(() => readView(search, sorts), [search, sorts]);
  const [selected, setSelected] = useState<number[]>([]);
  const results = useRef<HTMLDivElement>(null);

  const query = apiQuery(view);
  const answer = useQuery({ queryKey: ['library', query], queryFn: () => fetchLibraryPage(query), placeholderData: keepPreviousData });

  /** Shows another view: into the URL (a new history entry), the filter form and the results. */
  const show = useCallback(
    (next: LibraryView, { toResults = false } = {}) => {
      const text = writeView(next);
      if (text !== search) {
        history.pushState(null, '', libraryPath(next));
        setSearch(text);
      }
      const form = filterForm();
      if (form) writeFields(form, formValues(next));
      if (toResults && results.current) {
        results.current.focus({ preventScroll: true });
        if (results.current.getBoundingClientRect().top < 0) results.current.scrollIntoView({ block: 'start' });
      }
    },
    [search],
  );

  // The back and forward buttons: the URL is the view.
  useEffect(() => {
    const restore = () => {
      const restored = readView(location.search, sorts);
      setSearch(writeView(restored));
      const form = filterForm();
      if (form) writeFields(form, formValues(restored));
    };
    addEventListener('popstate', restore);
    return () => removeEventListener('popstate', restore);
  }, [sorts]);

  // The filter form: a changed field or a submit shows its view without leaving the page.
  useEffect(() => {
    const form = filterForm();
    if (!form) return;
    const apply = (event: Event) => {
      event.preventDefault();
      show(viewFromForm(readFields(form), view, sorts));
    };
    const clear = (event: globalThis.MouseEvent) => {
      const link = (event.target as Element).closest('[data-clear-filters]');
      if (!link || event.button !== 0 || event.metaKey || event.ctrlKey || event.shiftKey || event.altKey) return;
      event.preventDefault();
      show(withDisplay(readView('', sorts), view.display));
    };
    form.addEventListener('submit', apply);
    form.addEventListener('change', apply);
    form.addEventListener('click', clear);
    return () => {
      form.removeEventListener('submit', apply);
      form.removeEventListener('change', apply);
      form.removeEventListener('click', clear);
    };
  }, [show, view, sorts]);

  const follow =
    (next: LibraryView, toResults = false) =>
    (event: MouseEvent) => {
      if (!plainClick(event)) return;
      event.preventDefault();
      show(next, { toResults });
    };
  const toggle = useCallback((id: number) => setSelected((now) => (now.includes(id) ? now.filter((other) => other !== id) : [...now, id])), []);
  const selectedSet = useMemo(() => new Set(selected), [selected]);
  const canCompare = selected.length >= COMPARE_MIN && selected.length <= COMPARE_MAX;
  const compare: SubmitEventHandler<HTMLFormElement> = (event) => {
    if (!hydrated) return;
    event.preventDefault();
    if (canCompare) location.assign(compareHref(selected));
  };

  const unit = unitOf(view);
  const page = answer.data;
  const loading = answer.isFetching;
  const stale = answer.isPlaceholderData;
  const firstPage = withCursor(view, undefined);
  const exportHref = (format: string) => {
    const params = new URLSearchParams(apiQuery(firstPage));
    params.set('format', format);
    return `/api/library/export?${params}`;
  };

  // The field the API refused, marked in the filter form and named by its label in the message.
  const refused = answer.isError && !stale && answer.error instanceof LibraryLoadError ? answer.error : undefined;
  useEffect(() => {
    const form = filterForm();
    if (form) markRefused(form, refused?.field);
  }, [refused]);
  const form = refused?.field ? filterForm() : null;
  const label = form && refused?.field ? fieldLabel(form, refused.field) : undefined;
  const failure = refused?.field && label ? refused.message.replace(`${refused.field}: `, `${label}: `) : answer.error?.message;

  let body: ReactNode;
  if (answer.isError && !stale) body = <LoadFailed message={failure ?? ''} busy={loading} retry={() => answer.refetch()} href={libraryPath(view)} />;
  else if (!page) body = <Loading />;
  else if (page.rows.length === 0) body = <NothingFound clear={follow(withDisplay(readView('', sorts), view.display))} />;
  else if (view.display === 'grid') body = <ResultGrid rows={page.rows} unit={unit} selected={selectedSet} onToggle={toggle} />;
  else
    body = (
      <>
        <div className="md:hidden">
          <ResultCards rows={page.rows} unit={unit} selected={selectedSet} onToggle={toggle} />
        </div>
        <div className="hidden overflow-x-auto rounded-lg border border-ash-200 bg-white md:block">
          <ResultsTable
            rows={page.rows}
            unit={unit}
            sorts={sorts}
            sort={view.sort}
            order={view.order}
            hydrated={hydrated}
            sortHref={(sort: string, order: SortOrder) => libraryPath(withSort(view, sort, order))}
            onSort={(sort: string, order: SortOrder) => show(withSort(view, sort, order))}
            selected={selectedSet}
            onToggle={toggle}
          />
        </div>
      </>
    );

  const total = page?.total;
  const status =
    answer.isError && !stale
      ? 'No results to show'
      : total === undefined
        ? 'Loading coupons…'
        : page?.totalExact === false
          ? `More than ${total} coupons match`
          : `${total} ${total === 1 ? 'coupon matches' : 'coupons match'}`;
  const matrixHref = answer.isError && !stale ? undefined : pairMatrixPath(view);
  const showCompare = !hydrated || selected.length > 0 || (page !== undefined && page.rows.length > 0 && !(answer.isError && !stale));
  const compareHint = !hydrated
    ? `Tick ${COMPARE_MIN} to ${COMPARE_MAX} coupons to compare them.`
    : selected.length > COMPARE_MAX
      ? `Compare takes at most ${COMPARE_MAX}: untick ${selected.length - COMPARE_MAX}.`
      : selected.length < COMPARE_MIN
        ? `Tick ${COMPARE_MIN} to ${COMPARE_MAX} coupons to compare them.`
        : 'Ticks are kept while you page and filter.';

  return (
    <form method="get" action="/compare" onSubmit={compare} className="space-y-3" aria-label="Library results" data-results-for={FILTER_FORM_ID}>
      <div className="flex flex-wrap items-center justify-between gap-x-4 gap-y-2">
        <div className="space-y-0.5">
          <p role="status" className="text-sm font-medium text-ash-800">
            {status}
            {loading && stale && <span className="sr-only"> (loading new results)</span>}
          </p>
          {matrixHref && (
            <p className="text-sm">
              <a href={matrixHref}>See this pair as a heat matrix</a>
            </p>
          )}
        </div>
        <nav className="flex gap-2 text-sm" aria-label="View">
          {(['table', 'grid'] as const).map((display) => (
            <a
              key={display}
              className="btn min-h-9 px-3 py-1 aria-[current=page]:bg-ash-800 aria-[current=page]:text-white"
              aria-current={view.display === display ? 'page' : undefined}
              href={libraryPath(withDisplay(view, display))}
              onClick={follow(withDisplay(view, display))}
            >
              {display === 'table' ? 'Table' : 'Swatch grid'}
            </a>
          ))}
        </nav>
      </div>
      {showCompare && (
        <div
          className={`flex flex-wrap items-center gap-x-3 gap-y-1 rounded-lg border border-ash-200 bg-white px-3 py-2 text-sm ${hydrated && selected.length > 0 ? 'sticky top-2 z-10 shadow-md' : ''}`}
        >
          <button className={`btn min-h-9 px-3 py-1 ${canCompare ? 'btn-primary' : ''}`} type="submit" disabled={hydrated && !canCompare}>
            {hydrated ? `Compare selected (${selected.length})` : 'Compare selected'}
          </button>
          <span className="text-ash-700" aria-live="polite">
            {compareHint}
          </span>
          {hydrated && selected.length > 0 && (
            <button type="button" className="ml-auto text-temper-700 underline underline-offset-2 hover:text-oxide-700" onClick={() => setSelected([])}>
              Clear ticks
            </button>
          )}
        </div>
      )}
      <div ref={results} tabIndex={-1} className="relative focus:outline-none" aria-busy={loading}>
        <div className={`absolute inset-x-0 -top-2 h-1 overflow-hidden rounded-full ${loading ? 'bg-oxide-100' : ''}`} aria-hidden="true">
          {loading && <div className="h-full w-1/3 animate-pulse rounded-full bg-oxide-600" />}
        </div>
        <div className={stale ? 'opacity-60 transition-opacity' : 'transition-opacity'}>{body}</div>
      </div>
      <nav className="flex flex-wrap items-center gap-3 text-sm" aria-label="Pages">
        {view.cursor && (
          <a href={libraryPath(firstPage)} onClick={follow(firstPage, true)}>
            ← First page
          </a>
        )}
        {page?.nextCursor && (
          <a className="btn min-h-9 px-3 py-1" href={libraryPath(withCursor(view, page.nextCursor))} onClick={follow(withCursor(view, page.nextCursor), true)}>
            Next page →
          </a>
        )}
        <span className="ml-auto flex gap-3">
          <a href={exportHref('csv')}>Download CSV</a>
          <a href={exportHref('json')}>JSON</a>
        </span>
      </nav>
    </form>
  );
}

function Loading() {
  return (
    <div className="space-y-2" aria-hidden="true">
      {[0, 1, 2].map((key) => (
        <div key={key} className="h-14 animate-pulse rounded-lg bg-ash-100" />
      ))}
    </div>
  );
}

function NothingFound({ clear }: { clear: (event: MouseEvent) => void }) {
  return (
    <div className="card flex flex-col items-start gap-3 sm:flex-row sm:items-center">
      <div className="flex h-12 w-24 shrink-0 overflow-hidden rounded-md border border-dashed border-ash-300" aria-hidden="true">
        <span className="flex-1 bg-ash-100" />
        <span className="flex-1 bg-ash-50" />
        <span className="flex-1 bg-ash-100" />
      </div>
      <div className="space-y-1">
        <p className="font-medium">No coupon matches these filters.</p>
        <p className="text-sm text-ash-700">
          Widen the temperature or hold range, choose another alloy, or{' '}
          <a href="/library" onClick={clear}>
            clear the filters
          </a>
          .
        </p>
      </div>
    </div>
  );
}

function LoadFailed({ message, busy, retry, href }: { message: string; busy: boolean; retry: () => void; href: string }) {
  return (
    <div className="alert alert-error flex flex-col items-start gap-2" role="alert">
      <p className="font-medium">The library could not show these coupons.</p>
      <p className="text-sm">{message}</p>
      <div className="flex flex-wrap items-center gap-3">
        <button type="button" className="btn min-h-9 px-3 py-1" onClick={retry} disabled={busy}>
          {busy ? 'Trying again…' : 'Try again'}
        </button>
        <a className="text-sm" href={href}>
          Reload the page
        </a>
      </div>
    </div>
  );
}
