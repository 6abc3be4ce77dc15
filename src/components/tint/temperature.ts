import { celsiusToFahrenheit, fahrenheitToCelsius } from '~/lib/units';
import type { TemperatureUnit } from '~/components/ui/UnitSwitch';

/** A typed temperature in °C for the API (°C = (°F − 32)·5/9, NIST SP 811); blank stays blank. */
export function toCelsius(value: string, unit: TemperatureUnit): number | null {
  if (value.trim() === '') return null;
  const number = Number(value);
  if (!Number.isFinite(number)) return null;
  return unit === 'F' ? Number(fahrenheitToCelsius(number).toFixed(1)) : number;
}

/** The same temperature typed in the other unit, rounded to a whole degree. */
export function convertTyped(value: string, from: TemperatureUnit, to: TemperatureUnit): string {
  if (from === to || value.trim() === '' || !Number.isFinite(Number(value))) return value;
  const number = Number(value);
  return String(Math.round(to === 'F' ? celsiusToFahrenheit(number) : fahrenheitToCelsius(number)));
}

/** "600 °C (1112 °F)". */
export const bothUnits = (celsius: number) => `${Math.round(celsius)} °C (${Math.round(celsiusToFahrenheit(celsius))} °F)`;
