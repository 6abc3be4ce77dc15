import { describe, expect, it } from 'vitest';
import { couponInputSchema, describeHeat } from '~/lib/coupons';
import { celsiusToFahrenheit, fahrenheitToCelsius } from '~/lib/units';
import { emptyForm, fieldOf, payloadOf, switchUnit, type FormState } from '~/components/coupons/coupon-form-state';

const valid: FormState = {
  ...emptyForm,
  title: 'Grade 5 straw test',
  layers: ['ti-grade-2', 'ti-grade-5'],
  surfaceGrit: '400',
  temperature: '540',
  holdMinutes: '30',
};

const errorsOf = (form: FormState) => {
  const result = couponInputSchema.safeParse(payloadOf(form));
  if (result.success) return {};
  return Object.fromEntries(result.error.issues.map((issue) => [fieldOf(issue.path), issue.message]));
};

describe('temperature units', () => {
  it.each([
    // Source: NIST SP 811 (2008), appendix B.8: t/°C = (t/°F − 32)/1.8. Fixed points: water freezes
    // at 32 °F = 0 °C and boils at 212 °F = 100 °C; −40 is the same on both scales.
    [32, 0],
    [212, 100],
    [-40, -40],
    // Source: Colvin & Juthe (1922) Table 26 temper colours, °F, converted by the same formula.
    [430, 221.111],
    [600, 315.556],
    // Common practice, no published source: forge-welding titanium laminates at 1700–2000 °F.
    [1700, 926.667],
    [2000, 1093.333],
  ])('%d °F is %d °C', (fahrenheit, celsius) => {
    expect(fahrenheitToCelsius(fahrenheit)).toBeCloseTo(celsius, 3);
    expect(celsiusToFahrenheit(celsius)).toBeCloseTo(fahrenheit, 2);
  });

  it('keeps the same heat when the form switches unit', () => {
    const inF = switchUnit({ ...valid, temperature: '540' }, 'F');
    expect(inF.temperature).toBe('1004');
    expect(payloadOf(inF).temperatureC).toBe(540);
    expect(switchUnit(inF, 'C').temperature).toBe('540');
  });

  it('sends °C and seconds to the API whichever unit was typed', () => {
    // Source: NIST SP 811, appendix B.8 — 500 °F = 260 °C.
    const payload = payloadOf({ ...valid, temperature: '500', temperatureUnit: 'F', holdMinutes: '7.5' });
    expect(payload.temperatureC).toBe(260);
    expect(payload.holdSeconds).toBe(450);
  });
});

describe('coupon form validation, one message per field', () => {
  it('accepts a complete heat record', () => {
    expect(errorsOf(valid)).toEqual({});
  });

  it.each<[string, Partial<FormState>, string, string]>([
    ['an empty title', { title: '  ' }, 'title', 'Give the coupon a title.'],
    ['no layers', { layers: [] }, 'layers', 'Add at least one layer.'],
    ['a layer with no alloy chosen', { layers: ['ti-grade-2', ''] }, 'layers', 'Choose an alloy from the list.'],
    ['an unknown alloy', { layers: ['unobtainium'] }, 'layers', 'Choose an alloy from the list.'],
    ['nine layers', { layers: Array(9).fill('steel-1084') }, 'layers', 'A coupon has at most 8 layers.'],
    ['a grit that is not a number', { surfaceGrit: 'fine' }, 'surfaceGrit', 'Grit is a whole number.'],
    ['a grit of 5', { surfaceGrit: '5' }, 'surfaceGrit', 'Grit is between 24 and 10 000.'],
    ['no temperature for a heat', { temperature: '' }, 'temperature', 'Give the temperature.'],
    ['a temperature that is not a number', { temperature: 'hot' }, 'temperature', 'Temperature is a number.'],
    ['a temperature above 1600 °C', { temperature: '1700' }, 'temperature', 'Temperature is between 0 and 1600 °C.'],
    ['a temperature below 0 °C', { temperature: '-5' }, 'temperature', 'Temperature is between 0 and 1600 °C.'],
    ['3000 °F (1649 °C)', { temperature: '3000', temperatureUnit: 'F' }, 'temperature', 'Temperature is between 0 and 1600 °C.'],
    ['no way of measuring', { temperatureMethod: '' }, 'temperatureMethod', 'Say how the temperature was measured.'],
    ['no hold time', { holdMinutes: '' }, 'holdMinutes', 'Give the hold time.'],
    ['a negative hold time', { holdMinutes: '-2' }, 'holdMinutes', 'Hold time cannot be negative.'],
    ['anodizing with no voltage', { process: 'anodize', volts: '' }, 'volts', 'Give the anodizing voltage.'],
    ['anodizing at 500 V', { process: 'anodize', volts: '500' }, 'volts', 'Voltage is between 1 and 300 V.'],
    ['argon with no flow', { atmosphere: 'argon', argonFlowLpm: '' }, 'argonFlowLpm', 'Give the argon flow in L/min.'],
    ['an argon flow of 500 L/min', { atmosphere: 'argon', argonFlowLpm: '500' }, 'argonFlowLpm', 'Flow is between 0 and 100 L/min.'],
    ['an unknown process', { process: 'laser' }, 'process', 'Choose a process.'],
    ['an unknown visibility', { visibility: 'friends' }, 'visibility', 'Choose who can see the coupon.'],
    ['notes of 5001 characters', { notes: 'x'.repeat(5001) }, 'notes', 'Use at most 5000 characters.'],
  ])('%s', (_label, change, field, message) => {
    expect(errorsOf({ ...valid, ...change })[field]).toBe(message);
  });

  it('does not ask for a temperature when anodizing', () => {
    expect(errorsOf({ ...valid, process: 'anodize', volts: '25', temperature: '', holdMinutes: '' })).toEqual({});
  });
});

describe('describing a heat', () => {
  it.each([
    [{ process: 'oven' as const, temperatureC: 540, holdSeconds: 1800, volts: null }, '540 °C · 30 min'],
    [{ process: 'forge' as const, temperatureC: 980, holdSeconds: 5400, volts: null }, '980 °C · 1 h 30 min'],
    [{ process: 'anodize' as const, temperatureC: null, holdSeconds: null, volts: 25 }, '25 V'],
  ])('%o reads %s', (coupon, words) => {
    expect(describeHeat(coupon)).toBe(words);
  });
});
