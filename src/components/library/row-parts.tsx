import { labels } from '~/lib/heat-record-text';
import { formatHold, formatTemperature, type TemperatureUnit } from '~/lib/library/format';
import type { LibraryRow } from './library-rows';

/** Small pieces the library's table, cards and swatch grid share. */

export const couponHref = (row: LibraryRow) => `/coupons/${row.id}`;
export const layerNames = (row: LibraryRow) => row.layers.map((layer) => layer.alloyName).join(' / ');
export const processLabel = (row: LibraryRow) => labels.process[row.process as keyof typeof labels.process] ?? row.process;
export const atmosphereLabel = (row: LibraryRow) => labels.atmosphere[row.atmosphere as keyof typeof labels.atmosphere] ?? row.atmosphere;
export const temperatureText = (row: LibraryRow, unit: TemperatureUnit) => formatTemperature(row.temperatureC, unit);
export const holdText = (row: LibraryRow) => formatHold(row);

const searchHref = (hex: string, alloy: string) => `/library/search?hex=${encodeURIComponent(hex)}&alloy=${encodeURIComponent(alloy)}`;

/** The dominant swatch of each layer, each a link to "find coupons like this swatch". */
export function SwatchLinks({ row, size }: { row: LibraryRow; size: 'small' | 'large' }) {
  const chip = size === 'large' ? 'block h-10 w-10' : 'inline-block h-7 w-7';
  if (row.swatches.length === 0)
    return size === 'large' ? (
      <span className="block h-10 w-10 rounded border border-dashed border-ash-300 bg-ash-100" title="no photo yet" />
    ) : (
      <span className="text-xs text-ash-600">none yet</span>
    );
  return (
    <>
      {row.swatches.map((swatch) => (
        <a
          key={swatch.position}
          className={size === 'large' ? 'block' : 'mr-1 inline-block align-middle'}
          href={searchHref(swatch.hex, swatch.alloy)}
          title={`${swatch.hex} on layer ${swatch.position + 1}: find coupons like this swatch`}
        >
          <span className={`${chip} rounded border border-ash-300`} style={{ background: swatch.hex }} />
          <span className="sr-only">
            {swatch.hex}, layer {swatch.position + 1}: find coupons like this swatch
          </span>
        </a>
      ))}
    </>
  );
}

/** The "compare" tick for one coupon: a plain form field (`ids`) that works without JavaScript. */
export function CompareBox({ row, checked, onToggle }: { row: LibraryRow; checked: boolean; onToggle: (id: number) => void }) {
  return (
    <input
      type="checkbox"
      name="ids"
      value={row.id}
      checked={checked}
      onChange={() => onToggle(row.id)}
      className="h-5 w-5 shrink-0 cursor-pointer accent-oxide-700"
      aria-label={`Compare ${row.title}`}
    />
  );
}
