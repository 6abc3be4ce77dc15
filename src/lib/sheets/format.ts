import { formatDuration, formatNumber, labels } from '../coupons';
import { celsiusToFahrenheit } from '../units';
import type { SheetUnits } from './requests';

/** The printed words of a sheet entry, the same on the page, in print and in the PDF. */

export interface SheetHeat {
  temperatureC: number | null;
  holdSeconds: number | null;
  process: string;
  volts?: number | null;
  alloys: string[];
}

export interface HiddenFields {
  hideTemperature: boolean;
  hideHold: boolean;
  hideProcess: boolean;
  hideAlloy: boolean;
}

export function formatTemperature(celsius: number, units: SheetUnits): string {
  return units === 'f' ? `${Math.round(celsiusToFahrenheit(celsius))} °F` : `${Math.round(celsius)} °C`;
}

export const formatLab = (lab: readonly [number, number, number]) => `L* ${lab[0].toFixed(1)}  a* ${lab[1].toFixed(1)}  b* ${lab[2].toFixed(1)}`;

const processLabel = (process: string) => (labels.process as Record<string, string>)[process] ?? process;

/** The heat record's lines under a swatch, without the fields the instructor hid. */
export function heatLines(heat: SheetHeat, hidden: HiddenFields, units: SheetUnits): string[] {
  const lines: string[] = [];
  const heatParts: string[] = [];
  if (!hidden.hideTemperature && heat.temperatureC !== null) heatParts.push(formatTemperature(heat.temperatureC, units));
  if (!hidden.hideHold && heat.holdSeconds !== null) heatParts.push(formatDuration(heat.holdSeconds));
  if (!hidden.hideTemperature && heat.process === 'anodize' && heat.volts != null) heatParts.push(`${formatNumber(heat.volts)} V`);
  if (heatParts.length) lines.push(heatParts.join(' · '));
  if (!hidden.hideProcess) lines.push(processLabel(heat.process));
  if (!hidden.hideAlloy && heat.alloys.length) lines.push(heat.alloys.join(' / '));
  return lines;
}

/** The note an instructor sees when swatches left the sheet. */
export function removedNote(count: number): string | null {
  if (count === 0) return null;
  return count === 1
    ? '1 swatch was removed: its coupon is no longer shared or was deleted.'
    : `${count} swatches were removed: their coupons are no longer shared or were deleted.`;
}

export const COLOUR_DISCLAIMER =
  'Screen and print colours differ from the metal and from each other: judge oxide colour on the metal, in daylight, against your own coupons.';
