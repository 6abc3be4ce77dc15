import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState, type Updater } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { TemperatureUnit } from '~/lib/library/format';
import type { LibraryRow } from './library-rows';
import { defaultOrder, type SortOrder } from './library-url';
import { atmosphereLabel, CompareBox, couponHref, holdText, layerNames, processLabel, SwatchLinks, temperatureText } from './row-parts';

interface Props {
  rows: LibraryRow[];
  unit: TemperatureUnit;
  /** The sorts the API offers; a column whose id is one of them gets a sort button. */
  sorts: readonly string[];
  sort: string;
  order: SortOrder;
  /** Before hydration sort headers are links (they work without JavaScript); after, buttons. */
  hydrated: boolean;
  sortHref: (sort: string, order: SortOrder) => string;
  onSort: (sort: string, order: SortOrder) => void;
  selected: ReadonlySet<number>;
  onToggle: (id: number) => void;
}

const column = createColumnHelper<LibraryRow>();

/** Column ids that are also API sorts: `date`, `temperature`, `hold`, and `lightness` (of the swatches) where offered. */
const columns = [
  column.display({ id: 'compare', header: 'Compare' }),
  column.accessor('title', { id: 'coupon', header: 'Coupon' }),
  column.display({ id: 'lightness', header: 'Swatches' }),
  column.accessor(processLabel, { id: 'process', header: 'Process' }),
  column.accessor('temperatureC', { id: 'temperature', header: 'Temperature' }),
  column.accessor(holdText, { id: 'hold', header: 'Hold / voltage' }),
  column.accessor(atmosphereLabel, { id: 'atmosphere', header: 'Atmosphere' }),
  column.accessor((row) => row.ownerName ?? '—', { id: 'owner', header: 'Owner' }),
  column.accessor('loggedOn', { id: 'date', header: 'Logged' }),
];

const Blank = () => (
  <span className="text-ash-500">
    <span aria-hidden="true">—</span>
    <span className="sr-only">none</span>
  </span>
);

const ariaSort = { asc: 'ascending', desc: 'descending' } as const;
const headingClass =
  '-mx-1 inline-flex min-h-8 cursor-pointer items-center gap-1 rounded px-1 font-semibold text-ash-700 no-underline hover:bg-ash-100 hover:text-oxide-700';

/** The desk table of library results, through TanStack Table; sorting is the server's (keyset paging). */
export function ResultsTable({ rows, unit, sorts, sort, order, hydrated, sortHref, onSort, selected, onToggle }: Props) {
  const sorting: SortingState = [{ id: sort, desc: order === 'desc' }];
  const sortable = useMemo(
    () => columns.map((def) => ({ ...def, enableSorting: sorts.includes(def.id ?? ''), sortDescFirst: defaultOrder(def.id ?? '') === 'desc' })),
    [sorts],
  );
  // The app builds without the React Compiler, so TanStack Table's mutable instance is safe here.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: rows,
    columns: sortable,
    getCoreRowModel: getCoreRowModel(),
    getRowId: (row) => String(row.id),
    manualSorting: true,
    enableSortingRemoval: false,
    enableMultiSort: false,
    state: { sorting },
    onSortingChange: (updater: Updater<SortingState>) => {
      const [next] = typeof updater === 'function' ? updater(sorting) : updater;
      if (next) onSort(next.id, next.desc ? 'desc' : 'asc');
    },
  });

  const cell = (row: LibraryRow, id: string) => {
    switch (id) {
      case 'compare':
        return <CompareBox row={row} checked={selected.has(row.id)} onToggle={onToggle} />;
      case 'coupon':
        return (
          <>
            <a className="font-medium" href={couponHref(row)}>
              {row.title}
            </a>
            <span className="block text-xs text-ash-700">{layerNames(row)}</span>
          </>
        );
      case 'lightness':
        return <SwatchLinks row={row} size="small" />;
      case 'temperature':
        return temperatureText(row, unit) || <Blank />;
      case 'hold':
        return holdText(row) || <Blank />;
      default:
        return null;
    }
  };
  const cellClass: Record<string, string> = {
    compare: 'w-10 text-center align-middle',
    coupon: 'min-w-44',
    lightness: 'whitespace-nowrap',
    temperature: 'tabular whitespace-nowrap',
    process: 'whitespace-nowrap',
    hold: 'tabular whitespace-nowrap',
    date: 'tabular whitespace-nowrap',
  };

  return (
    <table className="data-table">
      <caption className="sr-only">Coupons matching the filters; sortable columns have a sort button in their heading</caption>
      <thead>
        {table.getHeaderGroups().map((group) => (
          <tr key={group.id}>
            {group.headers.map((header) => {
              const { id } = header.column;
              const label = flexRender(header.column.columnDef.header, header.getContext());
              const sorted = header.column.getIsSorted();
              const next = header.column.getNextSortingOrder() || defaultOrder(id);
              const mark = (
                <span aria-hidden="true" className={sorted ? 'text-oxide-700' : 'text-ash-500'}>
                  {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                </span>
              );
              return (
                <th
                  key={header.id}
                  scope="col"
                  aria-sort={sorted ? ariaSort[sorted] : undefined}
                  className={id === 'compare' ? 'w-10 text-center' : 'whitespace-nowrap'}
                >
                  {!header.column.getCanSort() ? (
                    id === 'compare' ? (
                      <span className="text-xs font-medium">{label}</span>
                    ) : (
                      label
                    )
                  ) : hydrated ? (
                    <button type="button" className={headingClass} onClick={header.column.getToggleSortingHandler()}>
                      {label} {mark}
                    </button>
                  ) : (
                    <a className={headingClass} href={sortHref(id, next)}>
                      {label} {mark}
                    </a>
                  )}
                </th>
              );
            })}
          </tr>
        ))}
      </thead>
      <tbody>
        {table.getRowModel().rows.map((row) => (
          <tr key={row.id} className={selected.has(row.original.id) ? 'bg-oxide-50' : undefined}>
            {row.getVisibleCells().map((visible) => (
              <td key={visible.id} className={cellClass[visible.column.id]}>
                {cell(row.original, visible.column.id) ?? String(visible.getValue() ?? '')}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
