import { describe, expect, it } from 'vitest';
import { zodResolver } from '@hookform/resolvers/zod';
import type { FieldValues, Resolver, ResolverOptions } from 'react-hook-form';
import { z } from 'zod';
import { couponResolver, emptyForm, payloadOf, type FormState } from '~/components/coupons/coupon-form-state';
import { heatResolver, pairResolver, planPairRequestOf, type HeatForm, type PairForm } from '~/components/tint/planner-forms';
import { couponInputSchema } from '~/lib/coupons';
import { describeZodError } from '~/lib/server/http';
import { plannerAlloyOptions } from '~/lib/tint/alloy-options';
import { planPairRequestSchema, predictRequestSchema } from '~/lib/tint/planner-requests';

// The forms' checks through React Hook Form's zod resolver, with the routes' own schemas: each
// message lands beside the field that shows it, worded as the schema (and so the API) words it.

const options: ResolverOptions<FieldValues> = { fields: {}, names: [], shouldUseNativeValidation: false, criteriaMode: 'firstError' };
const check = <Form extends FieldValues, Body>(resolver: Resolver<Form, unknown, Body>, form: NoInfer<Form>) =>
  resolver(form, undefined, options as ResolverOptions<Form>);

describe('the coupon form (zod/mini schema)', () => {
  const valid: FormState = { ...emptyForm, title: 'Grade 5 straw test', layers: ['ti-grade-5'], surfaceGrit: '400', temperature: '540', holdMinutes: '30' };

  it('accepts the zod/mini schema in the zod resolver', async () => {
    // zod/mini schemas carry the same parse methods the resolver calls (zod 4 docs, "Zod Mini").
    const resolver = zodResolver(couponInputSchema) as unknown as Resolver<FieldValues>;
    const result = await resolver({ title: '' }, undefined, options);
    expect(Object.keys(result.errors)).toContain('title');
  });

  it('hands the submit the API payload as built: °C and seconds', async () => {
    // Source: NIST SP 811 (2008), appendix B.8 — 1004 °F = 540 °C.
    const result = await check(couponResolver, { ...valid, temperature: '1004', temperatureUnit: 'F' });
    expect(result.errors).toEqual({});
    expect(result.values).toEqual(payloadOf({ ...valid, temperature: '1004', temperatureUnit: 'F' }));
    expect(result.values).toMatchObject({ temperatureC: 540, holdSeconds: 1800 });
  });

  it('puts each message beside its field: temperature and hold time, not °C and seconds', async () => {
    const result = await check(couponResolver, { ...valid, title: ' ', layers: ['ti-grade-2', ''], temperature: '1700', holdMinutes: '-2' });
    // The messages are the coupon schema's own (src/lib/coupons.ts), one per field.
    expect(Object.fromEntries(Object.entries(result.errors).map(([field, error]) => [field, error?.message]))).toEqual({
      title: 'Give the coupon a title.',
      layers: 'Choose an alloy from the list.',
      temperature: 'Temperature is between 0 and 1600 °C.',
      holdMinutes: 'Hold time cannot be negative.',
    });
  });
});

describe('the heat planner', () => {
  const alloys = plannerAlloyOptions().flatMap((group) => group.alloys);
  const resolver = heatResolver(alloys);
  const form: HeatForm = { alloy: 'ti-grade-5', process: 'heat', temperature: '600', unit: 'C', holdMinutes: '60', atmosphere: 'air', volts: '20' };

  it('shows one error, beside its field and in the alert, worded as the predict route answers it', async () => {
    const faulty = { ...form, temperature: '1700', holdMinutes: '' };
    const result = await check(resolver, faulty);
    // What the route would answer for the same body: its 400 names the first failing field.
    const body = { alloy: 'ti-grade-5', process: 'heat', temperatureC: 1700, holdMinutes: null, atmosphere: 'air' };
    const api = describeZodError(z.safeParse(predictRequestSchema, body).error!);
    expect(api).toEqual({ field: 'temperatureC', message: 'temperatureC: must be between 0 and 1600 °C' });
    expect(result.errors).toEqual({
      temperature: { type: 'too_big', message: api.message },
      root: { type: 'too_big', message: api.message },
    });
  });

  it('sends °C: 1112 °F is 600 °C', async () => {
    // Source: NIST SP 811 (2008), appendix B.8: °C = (°F − 32)/1.8.
    const result = await check(resolver, { ...form, temperature: '1112', unit: 'F' });
    expect(result.values).toEqual({ alloy: 'ti-grade-5', process: 'heat', temperatureC: 600, holdMinutes: 60, atmosphere: 'air' });
  });

  it('asks for an anodizing run when the alloy has no heat-growth model', async () => {
    const anodizeOnly = alloys.find((alloy) => alloy.anodize && !alloy.heat);
    expect(anodizeOnly).toBeDefined();
    const result = await check(resolver, { ...form, alloy: anodizeOnly!.slug });
    expect(result.values).toEqual({ alloy: anodizeOnly!.slug, process: 'anodize', volts: 20 });
  });
});

describe('the laminate pair planner', () => {
  const form: PairForm = {
    alloys: ['ti-grade-2', 'ti-grade-5'],
    goal: 'contrast',
    targets: ['#c9a23a', '#2f5fa8'],
    unit: 'C',
    temperature: ['', ''],
    hold: ['', ''],
  };

  it('leaves blank ranges to the planner and sends the wanted colours only when aiming for them', async () => {
    expect((await check(pairResolver, form)).values).toEqual({
      alloys: ['ti-grade-2', 'ti-grade-5'],
      target: undefined,
      temperatureC: undefined,
      holdMinutes: undefined,
    });
    expect((await check(pairResolver, { ...form, goal: 'target' })).values).toMatchObject({ target: ['#c9a23a', '#2f5fa8'] });
  });

  it.each<[string, Partial<PairForm>, string, string]>([
    ['a range that runs backwards', { temperature: ['900', '100'] }, 'temperature', 'temperatureC.max: must not be below min'],
    ['a half-filled range', { hold: ['', '30'] }, 'hold', 'holdMinutes.min: must be a number of minutes'],
    // Source: NIST SP 811 — 3000 °F is 1649 °C, above the 1600 °C the routes take.
    ['3000 °F', { unit: 'F', temperature: ['500', '3000'] }, 'temperature', 'temperatureC.max: must be between 0 and 1600 °C'],
    ['a wanted colour that is not one', { goal: 'target', targets: ['#c9a23a', 'blue'] }, 'targets.1', 'target.1: must be a colour such as #3a6ea5'],
  ])('shows %s beside its field, as the plan-pair route words it', async (_case, change, field, message) => {
    const result = await check(pairResolver, { ...form, ...change });
    const shown = field.split('.').reduce<unknown>((errors, key) => (errors as Record<string, unknown> | undefined)?.[key], result.errors) as {
      message?: string;
    };
    expect(shown?.message).toBe(message);
    expect(result.errors.root?.message).toBe(message);
    // The same words the route answers for the same body.
    const api = describeZodError(z.safeParse(planPairRequestSchema, planPairRequestOf({ ...form, ...change })).error!);
    expect(api.message).toBe(message);
  });
});
