import { formatDuration, formatNumber } from '~/lib/heat-record-text';
import { celsiusToFahrenheit } from '~/lib/units';

export type TemperatureUnit = 'C' | 'F';

/** A stored °C temperature in the reader's unit, whole degrees ("1004 °F"); blank when none. */
export function formatTemperature(celsius: number | null, unit: TemperatureUnit): string {
  if (celsius === null) return '';
  // Source: NIST SP 811 (2008) appendix B.8: t/°F = 1.8·t/°C + 32.
  return unit === 'F' ? `${Math.round(celsiusToFahrenheit(celsius))} °F` : `${formatNumber(Math.round(celsius * 10) / 10)} °C`;
}

/** The hold, or the voltage for an anodized coupon. */
export function formatHold(coupon: { process: string; holdSeconds: number | null; volts: number | null }): string {
  if (coupon.process === 'anodize') return coupon.volts === null ? '' : `${formatNumber(coupon.volts)} V`;
  return coupon.holdSeconds === null ? '' : formatDuration(coupon.holdSeconds);
}

/** The URL of the library with some parameters changed (undefined or '' removes one). */
export function libraryHref(base: URLSearchParams, changes: Record<string, string | undefined>, path = '/library'): string {
  const params = new URLSearchParams(base);
  for (const [key, value] of Object.entries(changes)) {
    if (value === undefined || value === '') params.delete(key);
    else params.set(key, value);
  }
  for (const [key, value] of [...params.entries()]) if (value === '') params.delete(key);
  const text = params.toString();
  return text ? `${path}?${text}` : path;
}
