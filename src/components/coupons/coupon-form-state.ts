import { couponInputSchema, type CouponInput } from '~/lib/coupons';
import { celsiusToFahrenheit, fahrenheitToCelsius } from '~/lib/units';
import { requestResolver } from '~/components/request-form';

/** What the coupon form holds while typing: numbers as typed text, the temperature in the chosen unit. */
export interface FormState {
  title: string;
  layers: string[];
  surfacePrep: string;
  surfaceGrit: string;
  process: string;
  temperature: string;
  temperatureUnit: 'C' | 'F';
  temperatureMethod: string;
  holdMinutes: string;
  volts: string;
  atmosphere: string;
  argonFlowLpm: string;
  atmosphereNote: string;
  cooling: string;
  notes: string;
  visibility: string;
}

export const emptyForm: FormState = {
  title: '',
  layers: [''],
  surfacePrep: 'ground',
  surfaceGrit: '',
  process: 'oven',
  temperature: '',
  temperatureUnit: 'C',
  temperatureMethod: 'thermocouple',
  holdMinutes: '',
  volts: '',
  atmosphere: 'air',
  argonFlowLpm: '',
  atmosphereNote: '',
  cooling: 'still-air',
  notes: '',
  visibility: 'private',
};

const text = (value: number | null | undefined, digits = 1) => (value === null || value === undefined ? '' : String(Number(value.toFixed(digits))));

/** A number from typed text; empty is null, anything unreadable stays as NaN so the schema names it. */
function numberOf(value: string): number | null {
  const trimmed = value.trim().replace(',', '.');
  if (trimmed === '') return null;
  return Number(trimmed);
}

export function formFromCoupon(coupon: CouponInput): FormState {
  return {
    title: coupon.title ?? '',
    layers: coupon.layers?.length ? [...coupon.layers] : [''],
    surfacePrep: coupon.surfacePrep ?? 'ground',
    surfaceGrit: text(coupon.surfaceGrit, 0),
    process: coupon.process ?? 'oven',
    temperature: text(coupon.temperatureC),
    temperatureUnit: 'C',
    temperatureMethod: coupon.temperatureMethod ?? '',
    holdMinutes: coupon.holdSeconds === null || coupon.holdSeconds === undefined ? '' : text(coupon.holdSeconds / 60, 2),
    volts: text(coupon.volts),
    atmosphere: coupon.atmosphere ?? 'air',
    argonFlowLpm: text(coupon.argonFlowLpm),
    atmosphereNote: coupon.atmosphereNote ?? '',
    cooling: coupon.cooling ?? '',
    notes: coupon.notes ?? '',
    visibility: coupon.visibility ?? 'private',
  };
}

/** The API payload: °C, seconds; fields that don't apply to the process are left out. */
export function payloadOf(form: FormState): Record<string, unknown> {
  const anodize = form.process === 'anodize';
  const temperature = numberOf(form.temperature);
  const temperatureC = temperature === null ? null : form.temperatureUnit === 'F' ? fahrenheitToCelsius(temperature) : temperature;
  const holdMinutes = numberOf(form.holdMinutes);
  return {
    title: form.title,
    layers: form.layers,
    surfacePrep: form.surfacePrep,
    surfaceGrit: form.surfacePrep === 'ground' ? numberOf(form.surfaceGrit) : null,
    process: form.process,
    temperatureC: anodize || temperatureC === null ? null : Math.round(temperatureC * 10) / 10,
    temperatureMethod: anodize ? null : form.temperatureMethod || null,
    holdSeconds: anodize || holdMinutes === null ? null : Math.round(holdMinutes * 60),
    volts: anodize ? numberOf(form.volts) : null,
    atmosphere: form.atmosphere,
    argonFlowLpm: form.atmosphere === 'argon' ? numberOf(form.argonFlowLpm) : null,
    atmosphereNote: form.atmosphereNote,
    cooling: anodize ? null : form.cooling || null,
    notes: form.notes,
    visibility: form.visibility,
  };
}

/** Switches the unit and converts what was typed, so the temperature stays the same heat. */
export function switchUnit(form: FormState, unit: 'C' | 'F'): FormState {
  if (unit === form.temperatureUnit) return form;
  const value = numberOf(form.temperature);
  if (value === null || Number.isNaN(value)) return { ...form, temperatureUnit: unit };
  const converted = unit === 'F' ? celsiusToFahrenheit(value) : fahrenheitToCelsius(value);
  return { ...form, temperatureUnit: unit, temperature: String(Math.round(converted * 10) / 10) };
}

/** Maps a schema error path to the form field that shows it. */
export function fieldOf(path: readonly PropertyKey[]): string {
  const [first] = path;
  const name = String(first ?? 'form');
  return ({ temperatureC: 'temperature', holdSeconds: 'holdMinutes' } as Record<string, string>)[name] ?? name;
}

/** The form checked as the API will check its payload, each message beside the field it is about. */
export const couponResolver = requestResolver({
  schema: couponInputSchema,
  requestOf: payloadOf,
  errorAt: (path, message) => ({ field: fieldOf(path.split('.')), message }),
});
