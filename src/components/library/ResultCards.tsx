import type { TemperatureUnit } from '~/lib/library/format';
import type { LibraryRow } from './library-rows';
import { atmosphereLabel, CompareBox, couponHref, holdText, layerNames, processLabel, SwatchLinks, temperatureText } from './row-parts';

interface Props {
  rows: LibraryRow[];
  unit: TemperatureUnit;
  selected: ReadonlySet<number>;
  onToggle: (id: number) => void;
}

const joined = (parts: string[]) => parts.filter(Boolean).join(' · ');

/** The phone's list of results: one card per coupon, swatches down the side. */
export function ResultCards({ rows, unit, selected, onToggle }: Props) {
  return (
    <ul className="grid gap-3" aria-label="Coupons">
      {rows.map((row) => (
        <li key={row.id} className={`card flex gap-3 p-3 ${selected.has(row.id) ? 'border-oxide-600' : ''}`}>
          <div className="flex shrink-0 flex-col gap-1">
            <SwatchLinks row={row} size="large" />
          </div>
          <div className="min-w-0 flex-1 space-y-1 text-sm">
            <a className="font-medium" href={couponHref(row)}>
              {row.title}
            </a>
            <p className="text-ash-700">{layerNames(row)}</p>
            <p className="tabular">{joined([processLabel(row), temperatureText(row, unit), holdText(row), atmosphereLabel(row)])}</p>
            <p className="text-xs text-ash-600">
              {row.ownerName ?? '—'} · {row.loggedOn}
            </p>
          </div>
          <label className="-m-1 flex min-h-11 min-w-11 shrink-0 cursor-pointer items-start justify-center p-2">
            <CompareBox row={row} checked={selected.has(row.id)} onToggle={onToggle} />
          </label>
        </li>
      ))}
    </ul>
  );
}

/** The swatch grid: each coupon as its layers' dominant colours. */
export function ResultGrid({ rows, unit, selected, onToggle }: Props) {
  return (
    <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-5" aria-label="Coupons as swatches">
      {rows.map((row) => (
        <li key={row.id} className={`card flex flex-col gap-2 p-3 ${selected.has(row.id) ? 'border-oxide-600' : ''}`}>
          <div className="flex h-20 overflow-hidden rounded-md border border-ash-200" aria-hidden="true">
            {row.swatches.length ? (
              row.swatches.map((swatch) => <span key={swatch.position} className="flex-1" style={{ background: swatch.hex }} />)
            ) : (
              <span className="flex flex-1 items-center justify-center bg-ash-100 text-xs text-ash-600">no photo yet</span>
            )}
          </div>
          {row.swatches.length > 0 && (
            <p className="-mt-1 font-mono text-xs text-ash-600">
              {row.swatches.map((swatch) => (
                <span key={swatch.position} className="mr-2 inline-block">
                  {swatch.hex}
                  <span className="sr-only">, layer {swatch.position + 1}</span>
                </span>
              ))}
            </p>
          )}
          <div className="flex items-start justify-between gap-2">
            <a className="text-sm font-medium leading-snug" href={couponHref(row)}>
              {row.title}
            </a>
            <label className="-m-2 flex min-h-11 min-w-11 shrink-0 cursor-pointer items-start justify-center p-2">
              <CompareBox row={row} checked={selected.has(row.id)} onToggle={onToggle} />
            </label>
          </div>
          <p className="text-xs text-ash-700">{layerNames(row)}</p>
          <p className="tabular text-xs">{joined([temperatureText(row, unit), holdText(row)])}</p>
        </li>
      ))}
    </ul>
  );
}
