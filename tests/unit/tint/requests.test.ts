import { describe, expect, it } from 'vitest';
import { estimateRequestSchema, ladderRequestSchema, lookUpModel, planPairRequestSchema, predictRequestSchema } from '~/lib/tint/requests';
import { z } from 'zod';

// Route-level validation: the limits come from the issue's API section (temperature 0–1600 °C,
// no negative time, well-formed colours, known alloys); no published source needed.
const firstField = (schema: z.core.$ZodType, body: unknown) => {
  const result = z.safeParse(schema, body);
  return result.success ? null : result.error.issues[0].path.join('.');
};

const routes: { route: string; schema: z.core.$ZodType; bad: [unknown, string][] }[] = [
  {
    route: 'ladder',
    schema: ladderRequestSchema,
    bad: [
      [{}, 'alloy'],
      [{ alloy: 'Ti Grade 2' }, 'alloy'],
      [{ alloy: 'ti-grade-2', fromNm: -5 }, 'fromNm'],
      [{ alloy: 'ti-grade-2', toNm: 5000 }, 'toNm'],
      [{ alloy: 'ti-grade-2', fromNm: 200, toNm: 100 }, 'toNm'],
      [{ alloy: 'ti-grade-2', stepNm: 0 }, 'stepNm'],
      [{ alloy: 'ti-grade-2', fromNm: 0, toNm: 1000, stepNm: 0.1 }, 'stepNm'],
      [{ alloy: 'ti-grade-2', illuminant: 'F2' }, 'illuminant'],
    ],
  },
  {
    route: 'predict',
    schema: predictRequestSchema,
    bad: [
      [{ alloy: 'ti-grade-2' }, 'process'],
      [{ alloy: 'ti-grade-2', process: 'bake', temperatureC: 500, holdMinutes: 10 }, 'process'],
      [{ alloy: 'ti-grade-2', process: 'heat', temperatureC: 1700, holdMinutes: 10 }, 'temperatureC'],
      [{ alloy: 'ti-grade-2', process: 'heat', temperatureC: -10, holdMinutes: 10 }, 'temperatureC'],
      [{ alloy: 'ti-grade-2', process: 'heat', temperatureC: '500', holdMinutes: 10 }, 'temperatureC'],
      [{ alloy: 'ti-grade-2', process: 'heat', temperatureC: 500, holdMinutes: -1 }, 'holdMinutes'],
      [{ alloy: 'ti-grade-2', process: 'heat', temperatureC: 500 }, 'holdMinutes'],
      [{ alloy: 'ti-grade-2', process: 'heat', temperatureC: 500, holdMinutes: 10, atmosphere: 'vacuum' }, 'atmosphere'],
      [{ alloy: 'ti-grade-2', process: 'anodize', volts: -20 }, 'volts'],
      [{ alloy: 'ti-grade-2', process: 'anodize' }, 'volts'],
    ],
  },
  {
    route: 'estimate',
    schema: estimateRequestSchema,
    bad: [
      [{ alloy: 'ti-grade-2' }, 'hex'],
      [{ alloy: 'ti-grade-2', hex: 'blue' }, 'hex'],
      [{ alloy: 'ti-grade-2', hex: '#12345' }, 'hex'],
      [{ alloy: 'ti-grade-2', hex: '#123456', lab: { l: 50, a: 0, b: 0 } }, 'hex'],
      [{ alloy: 'ti-grade-2', lab: { l: 150, a: 0, b: 0 } }, 'lab.l'],
      [{ alloy: 'ti-grade-2', lab: { l: 50, a: 0 } }, 'lab.b'],
    ],
  },
  {
    route: 'plan-pair',
    schema: planPairRequestSchema,
    bad: [
      [{ alloys: ['ti-grade-2'] }, 'alloys'],
      [{ alloys: ['ti-grade-2', 'Steel 1084'] }, 'alloys.1'],
      [{ alloys: ['ti-grade-2', 'steel-1084'], target: ['#123456'] }, 'target'],
      [{ alloys: ['ti-grade-2', 'steel-1084'], target: ['#123456', 'red'] }, 'target.1'],
      [{ alloys: ['ti-grade-2', 'steel-1084'], temperatureC: { min: 500, max: 400 } }, 'temperatureC.max'],
      [{ alloys: ['ti-grade-2', 'steel-1084'], temperatureC: { min: 0, max: 2000 } }, 'temperatureC.max'],
      [{ alloys: ['ti-grade-2', 'steel-1084'], holdMinutes: { min: -5, max: 10 } }, 'holdMinutes.min'],
    ],
  },
];

describe.each(routes)('$route request', ({ schema, bad }) => {
  it.each(bad)('%j fails on %s', (body, field) => {
    expect(firstField(schema, body)).toBe(field);
  });
});

describe('good requests and their defaults', () => {
  it('ladder defaults to 0–300 nm at 5 nm under D65', () => {
    expect(ladderRequestSchema.parse({ alloy: 'ti-grade-2' })).toEqual({ alloy: 'ti-grade-2', fromNm: 0, toNm: 300, stepNm: 5, illuminant: 'D65' });
  });

  it('plan-pair searches beyond the data only when asked, with a yes/no, and takes an atmosphere', () => {
    const base = { alloys: ['ti-grade-2', 'ti-grade-5'] };
    expect(planPairRequestSchema.parse(base).widen).toBeUndefined();
    expect(planPairRequestSchema.parse({ ...base, widen: true, atmosphere: 'argon' })).toMatchObject({ widen: true, atmosphere: 'argon' });
    expect(planPairRequestSchema.safeParse({ ...base, widen: 'yes' }).success).toBe(false);
    expect(planPairRequestSchema.safeParse({ ...base, atmosphere: 'vacuum' }).success).toBe(false);
  });

  it('predict defaults the atmosphere to air', () => {
    expect(predictRequestSchema.parse({ alloy: 'steel-1084', process: 'heat', temperatureC: 260, holdMinutes: 5 })).toMatchObject({ atmosphere: 'air' });
  });

  it.each([{ hex: '#3a6ea5' }, { hex: '3A6EA5' }, { hex: '#abc' }, { lab: { l: 50, a: -20, b: 30 } }])('estimate accepts %j', (colour) => {
    expect(estimateRequestSchema.safeParse({ alloy: 'ti-grade-2', ...colour }).success).toBe(true);
  });
});

describe('looking up the model', () => {
  it.each([
    ['ti-grade-99', ['optics'], 400],
    ['steel-304', ['optics'], 422],
    ['copper-c11000', ['optics'], 422],
    ['zirconium-702', ['optics', 'heat'], 422],
    ['steel-1084', ['optics', 'anodize'], 422],
  ] as const)('%s for %j → %i', (slug, parts, status) => {
    const lookup = lookUpModel(slug, 'alloy', parts);
    expect(lookup.ok).toBe(false);
    if (!lookup.ok) {
      expect(lookup.status).toBe(status);
      expect(lookup.field).toBe('alloy');
      expect(lookup.message).toMatch(/^alloy: /);
    }
  });

  it('finds a modelled alloy', () => {
    expect(lookUpModel('ti-grade-5', 'alloy', ['optics', 'heat', 'anodize']).ok).toBe(true);
  });
});
