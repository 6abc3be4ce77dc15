import * as z from 'zod/mini';
import { atmospheres, coolings, processes, surfacePreparations, temperatureMethods, visibilities } from '../../db/schema/enums';
import { alloySlugs } from './alloys';
import { formatDuration, formatNumber, labels } from './heat-record-text';
import { plainText, type Lines } from './text';

/** The heat record of a coupon: vocabularies, labels, and the one schema forms and routes share. */

export { atmospheres, coolings, processes, surfacePreparations, temperatureMethods, visibilities };
export { formatDuration, formatNumber, labels };

export type Visibility = (typeof visibilities)[number];
export type Process = (typeof processes)[number];

export const MAX_LAYERS = 8;
export const MAX_TEMPERATURE_C = 1600;

const nullable = <T extends z.core.SomeType>(schema: T) =>
  z.pipe(
    z.optional(z.nullable(schema)),
    z.transform((value) => value ?? null),
  );
const number = (message: string, min: number, max: number, rangeMessage: string, integer?: string) =>
  nullable(
    z
      .number({ error: message })
      .check(...(integer ? [z.int({ error: integer })] : []), z.gte(min, { error: rangeMessage }), z.lte(max, { error: rangeMessage })),
  );
const optionalText = (max: number, message: string, lines: Lines) =>
  z.pipe(
    z.optional(z.nullable(z.string().check(z.trim(), z.maxLength(max, { error: message }), plainText(lines)))),
    z.transform((value) => (value ? value : null)),
  );
const choice = <T extends readonly [string, ...string[]]>(values: T, message: string) => z.enum(values, { error: message });

/**
 * A coupon as sent by the form and the API (°C, seconds, L/min). Written with zod's small build
 * (zod/mini) because the form island ships it to the browser.
 */
export const couponInputSchema = z
  .object({
    title: z
      .string({ error: 'Give the coupon a title.' })
      .check(z.trim(), z.minLength(1, { error: 'Give the coupon a title.' }), z.maxLength(160, { error: 'Use at most 160 characters.' }), plainText()),
    layers: z
      .array(choice(alloySlugs as [string, ...string[]], 'Choose an alloy from the list.'), { error: 'Add at least one layer.' })
      .check(z.minLength(1, { error: 'Add at least one layer.' }), z.maxLength(MAX_LAYERS, { error: `A coupon has at most ${MAX_LAYERS} layers.` })),
    surfacePrep: choice(surfacePreparations, 'Choose how the surface was prepared.'),
    surfaceGrit: number('Grit is a whole number.', 24, 10_000, 'Grit is between 24 and 10 000.', 'Grit is a whole number.'),
    process: choice(processes, 'Choose a process.'),
    temperatureC: number('Temperature is a number.', 0, MAX_TEMPERATURE_C, 'Temperature is between 0 and 1600 °C.'),
    temperatureMethod: nullable(choice(temperatureMethods, 'Choose how the temperature was measured.')),
    holdSeconds: nullable(
      z
        .number({ error: 'Hold time is a number.' })
        .check(
          z.int({ error: 'Hold time is whole seconds.' }),
          z.gte(0, { error: 'Hold time cannot be negative.' }),
          z.lte(7 * 24 * 3600, { error: 'Hold time is at most a week.' }),
        ),
    ),
    volts: number('Voltage is a number.', 1, 300, 'Voltage is between 1 and 300 V.'),
    atmosphere: choice(atmospheres, 'Choose the atmosphere.'),
    argonFlowLpm: number('Flow is a number.', 0, 100, 'Flow is between 0 and 100 L/min.'),
    atmosphereNote: optionalText(255, 'Use at most 255 characters.', 'single'),
    cooling: nullable(choice(coolings, 'Choose how it cooled.')),
    notes: optionalText(5000, 'Use at most 5000 characters.', 'multi'),
    visibility: choice(visibilities, 'Choose who can see the coupon.'),
  })
  .check(
    z.superRefine((coupon, context) => {
      const need = (path: string, message: string) => context.addIssue({ code: 'custom', path: [path], message });
      if (coupon.process === 'anodize') {
        if (coupon.volts === null) need('volts', 'Give the anodizing voltage.');
      } else {
        if (coupon.temperatureC === null) need('temperatureC', 'Give the temperature.');
        if (coupon.temperatureMethod === null) need('temperatureMethod', 'Say how the temperature was measured.');
        if (coupon.holdSeconds === null) need('holdSeconds', 'Give the hold time.');
      }
      if (coupon.atmosphere === 'argon' && coupon.argonFlowLpm === null) need('argonFlowLpm', 'Give the argon flow in L/min.');
    }),
  );

export type CouponInput = z.input<typeof couponInputSchema>;
export type Coupon = z.output<typeof couponInputSchema>;

/** "540 °C · 30 min" or "25 V": the heat in a few words. */
export function describeHeat(coupon: Pick<Coupon, 'process' | 'temperatureC' | 'holdSeconds' | 'volts'>): string {
  if (coupon.process === 'anodize') return coupon.volts === null ? 'anodized' : `${formatNumber(coupon.volts)} V`;
  const parts: string[] = [];
  if (coupon.temperatureC !== null) parts.push(`${formatNumber(coupon.temperatureC)} °C`);
  if (coupon.holdSeconds !== null) parts.push(formatDuration(coupon.holdSeconds));
  return parts.join(' · ');
}
