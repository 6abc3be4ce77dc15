import type { coupons } from '../../db/schema';
import { findAlloy } from '~/lib/alloys';
import { seededChoices } from './random';

type NewCoupon = Omit<typeof coupons.$inferInsert, 'ownerId' | 'layerKey'>;

export interface DemoCoupon {
  ownerEmail: string;
  layers: string[];
  coupon: NewCoupon;
}

interface Recipe {
  layers: string[][];
  process: NewCoupon['process'][];
  temperatureC: [number, number];
  holdMinutes: [number, number];
  volts?: [number, number];
  atmospheres: NewCoupon['atmosphere'][];
  label: string;
}

/** Invented but plausible heats per family, so the demo library has something to browse. */
const recipes: Recipe[] = [
  {
    label: 'Ti heat tint',
    layers: [['ti-grade-2'], ['ti-grade-5'], ['ti-grade-2', 'ti-grade-5'], ['ti-grade-9', 'ti-grade-2']],
    process: ['oven', 'torch'],
    temperatureC: [420, 760],
    holdMinutes: [5, 90],
    atmospheres: ['air'],
  },
  {
    label: 'Ti laminate',
    layers: [
      ['ti-grade-2', 'ti-grade-5'],
      ['ti-grade-1', 'ti-grade-5'],
      ['ti-grade-2', 'ti-grade-23'],
    ],
    process: ['forge'],
    temperatureC: [930, 1010],
    holdMinutes: [10, 45],
    atmospheres: ['argon'],
  },
  {
    label: 'Ti anodized',
    layers: [['ti-grade-2'], ['ti-grade-5'], ['niobium']],
    process: ['anodize'],
    temperatureC: [0, 0],
    holdMinutes: [0, 0],
    volts: [10, 95],
    atmospheres: ['other'],
  },
  {
    label: 'Temper colour',
    layers: [['steel-1084'], ['steel-1095'], ['steel-o1'], ['steel-w2'], ['steel-52100'], ['steel-1084', 'steel-15n20']],
    process: ['oven', 'torch'],
    temperatureC: [200, 340],
    holdMinutes: [5, 60],
    atmospheres: ['air'],
  },
  {
    label: 'Stainless heat tint',
    layers: [['steel-304'], ['steel-316'], ['steel-416']],
    process: ['torch', 'oven'],
    temperatureC: [300, 800],
    holdMinutes: [2, 30],
    atmospheres: ['air', 'argon'],
  },
  {
    label: 'Copper alloy colour',
    layers: [['copper-c11000'], ['bronze-c51000'], ['brass-c26000']],
    process: ['torch', 'oven'],
    temperatureC: [150, 420],
    holdMinutes: [1, 30],
    atmospheres: ['air'],
  },
  { label: 'Zirconium tint', layers: [['zirconium-702']], process: ['oven'], temperatureC: [400, 700], holdMinutes: [10, 60], atmospheres: ['air'] },
];

const preps: NewCoupon['surfacePrep'][] = ['ground', 'ground', 'blasted', 'etched', 'polished'];
const grits = [220, 400, 600, 800, 1200];
const methods: NonNullable<NewCoupon['temperatureMethod']>[] = ['thermocouple', 'pyrometer', 'oven-setpoint', 'estimated'];
const visibilities: NewCoupon['visibility'][] = ['public', 'members', 'private'];
const notes = [
  'Degreased with acetone before the heat.',
  'Colour uneven near the edge where the coupon touched the rack.',
  'Second run of this recipe; matches the first closely.',
  'Surface finished by hand, last pass lengthwise.',
  'Photographed the same day beside the grey card.',
  null,
  null,
];

/** About two hundred coupons spread over every owner, every visibility and every family. */
export function demoCoupons(ownerEmails: string[], count = 200): DemoCoupon[] {
  const random = seededChoices(20261201);
  const result: DemoCoupon[] = [];
  for (let index = 0; index < count; index += 1) {
    const recipe = recipes[index % recipes.length];
    const ownerEmail = ownerEmails[index % ownerEmails.length];
    const visibility = visibilities[Math.floor(index / ownerEmails.length) % visibilities.length];
    const layers = random.pick(recipe.layers);
    const process = random.pick(recipe.process);
    const anodize = process === 'anodize';
    const temperatureC = anodize ? null : Math.round(random.between(...recipe.temperatureC) / 5) * 5;
    const holdMinutes = anodize ? null : Math.round(random.between(...recipe.holdMinutes));
    const volts = anodize && recipe.volts ? Math.round(random.between(...recipe.volts)) : null;
    const atmosphere = random.pick(recipe.atmospheres);
    const surfacePrep = random.pick(preps);
    const heat = anodize ? `${volts} V` : `${temperatureC} °C, ${holdMinutes} min`;
    result.push({
      ownerEmail,
      layers,
      coupon: {
        title: `${recipe.label}: ${layers.map((slug) => findAlloy(slug)?.name ?? slug).join(' / ')}, ${heat}`,
        surfacePrep,
        surfaceGrit: surfacePrep === 'ground' ? random.pick(grits) : null,
        process,
        temperatureC,
        temperatureMethod: anodize ? null : random.pick(methods),
        holdSeconds: holdMinutes === null ? null : holdMinutes * 60,
        volts,
        atmosphere,
        argonFlowLpm: atmosphere === 'argon' ? Math.round(random.between(1, 4) * 2) / 2 : null,
        atmosphereNote: anodize ? 'Trisodium phosphate electrolyte' : null,
        cooling: anodize ? null : random.pick(['still-air', 'still-air', 'in-furnace', 'water-quench'] as const),
        notes: random.pick(notes),
        visibility,
        createdAt: new Date(Date.UTC(2026, 0, 5) + index * 36 * 3600 * 1000),
      },
    });
  }
  return result;
}
