// The demo's test series (invented data): the guild's ladder days, where members heat coupons cut
// from one billet or bar at a grid of temperatures and holds and photograph every one, so the
// library's alloy-pair views have measured cells to show — and the gaps nobody has tested yet.
import type { DemoCoupon } from './coupons';

type NewCoupon = DemoCoupon['coupon'];

interface Series {
  layers: string[];
  /** What the coupons are called, before their heat. */
  name: string;
  process: 'oven' | 'torch';
  temperatureMethod: NonNullable<NewCoupon['temperatureMethod']>;
  surfacePrep: NewCoupon['surfacePrep'];
  surfaceGrit: number | null;
  temperaturesC: number[];
  holdsMinutes: number[];
  /**
   * One row per temperature, one mark per hold: 'P' a public coupon, 'M' a members-only one,
   * '.' not tested yet (a gap in the library's matrix).
   */
  grid: string[];
  notes: string[];
}

/** Holds that fall one in each of the library matrix's hold columns (≤ 5, 5–15, 15–30, 30–60, 60–120 min). */
const holdLadder = [4, 10, 20, 45, 90];

const seriesList: Series[] = [
  {
    layers: ['ti-grade-2', 'ti-grade-5'],
    name: 'Gr 2 / Gr 5 laminate offcut',
    process: 'oven',
    temperatureMethod: 'thermocouple',
    surfacePrep: 'ground',
    surfaceGrit: 400,
    temperaturesC: [450, 500, 550, 600, 650, 700],
    holdsMinutes: holdLadder,
    grid: ['.PPM.', 'PP.P.', 'PMP.P', 'PPP.P', '.PPP.', 'P.PM.'],
    notes: [
      'Cut from the spring billet; oven at temperature half an hour before loading, thermocouple on the rack.',
      'The grade 5 layers lag a colour behind the grade 2, as on every coupon of this billet.',
      'Pulled at time and cooled on firebrick; photographed the next morning beside the grey card.',
      'Degreased in acetone and handled with gloves from grinding to oven.',
      'Ladder day coupon: one heat per coupon, same billet, same grind.',
    ],
  },
  {
    layers: ['ti-grade-1', 'ti-grade-5'],
    name: 'Gr 1 / Gr 5 laminate offcut',
    process: 'oven',
    temperatureMethod: 'thermocouple',
    surfacePrep: 'ground',
    surfaceGrit: 600,
    temperaturesC: [500, 550, 600, 650],
    holdsMinutes: [10, 20, 45],
    grid: ['P..', '.P.', 'P.M', '.P.'],
    notes: ['Softer grade 1 smears on the grinder: lighter passes.', 'Grade 1 colours ahead of the grade 5, more than grade 2 does.'],
  },
  {
    layers: ['ti-grade-2', 'ti-grade-23'],
    name: 'Gr 2 / Gr 23 laminate offcut',
    process: 'oven',
    temperatureMethod: 'oven-setpoint',
    surfacePrep: 'blasted',
    surfaceGrit: null,
    temperaturesC: [550, 600, 650],
    holdsMinutes: [10, 45],
    grid: ['P.', '.P', 'MP'],
    notes: ['Bead-blasted before the heat: the colours come out softer than on a ground face.', 'Oven set point only; no thermocouple this time.'],
  },
  {
    layers: ['ti-grade-2'],
    name: 'Grade 2 sheet',
    process: 'oven',
    temperatureMethod: 'thermocouple',
    surfacePrep: 'ground',
    surfaceGrit: 400,
    temperaturesC: [500, 550, 600, 650, 700],
    holdsMinutes: [20, 45],
    grid: ['P.', '.M', '..', '.P', 'P.'],
    notes: ['From the 1 mm sheet offcuts in the scrap bin.'],
  },
  {
    layers: ['ti-grade-5'],
    name: 'Grade 5 bar',
    process: 'oven',
    temperatureMethod: 'thermocouple',
    surfacePrep: 'ground',
    surfaceGrit: 400,
    temperaturesC: [550, 600, 650, 700],
    holdsMinutes: [30],
    grid: ['P', '.', 'M', 'P'],
    notes: ['Slices of 12 mm round bar, faced on the belt grinder.'],
  },
  {
    layers: ['steel-1084', 'steel-15n20'],
    name: '1084 / 15N20 damascus offcut',
    process: 'oven',
    temperatureMethod: 'thermocouple',
    surfacePrep: 'polished',
    surfaceGrit: null,
    temperaturesC: [200, 220, 240, 260, 280, 300, 320, 340],
    holdsMinutes: [10, 30, 60],
    grid: ['P..', '.P.', 'P.M', '.P.', 'P.P', '.P.', 'P.M', '.P.'],
    notes: [
      'Hardened and polished before the temper; the 15N20 layers stay a step lighter.',
      'Offcut from the ladder-pattern billet; kitchen oven checked with a thermocouple.',
      'Temper colour only: the hardness was not tested.',
    ],
  },
  {
    layers: ['copper-c11000', 'bronze-c51000'],
    name: 'Copper / bronze mokume offcut',
    process: 'torch',
    temperatureMethod: 'pyrometer',
    surfacePrep: 'polished',
    surfaceGrit: null,
    temperaturesC: [200, 250, 300, 350],
    holdsMinutes: [5, 15],
    grid: ['PP', '.P', 'M.', '.P'],
    notes: ['Soft torch flame from underneath, temperature read with a pyrometer.', 'The bronze lags the copper and stays golden longer.'],
  },
];

/** The newest series coupon's date; earlier ones are a day apart before it. */
const LAST_DAY = Date.UTC(2026, 9, 28, 16);
const DAY = 24 * 3600 * 1000;

const heatText = (temperatureC: number, holdMinutes: number) => `${temperatureC} °C, ${holdMinutes} min`;

/**
 * Every series coupon, each tested temperature of a series by another member, dated one a day
 * with the series taking turns (ladder days run side by side, as in a real guild).
 */
export function seriesCoupons(ownerEmails: string[]): DemoCoupon[] {
  const perSeries = seriesList.map((series, seriesIndex) =>
    series.temperaturesC.flatMap((temperatureC, row) =>
      series.holdsMinutes.flatMap((holdMinutes, column) => {
        const mark = series.grid[row][column];
        if (mark === '.') return [];
        const ownerEmail = ownerEmails[(seriesIndex + row) % ownerEmails.length];
        const coupon: NewCoupon = {
          title: `${series.name}, ${heatText(temperatureC, holdMinutes)}`,
          surfacePrep: series.surfacePrep,
          surfaceGrit: series.surfaceGrit,
          process: series.process,
          temperatureC,
          temperatureMethod: series.temperatureMethod,
          holdSeconds: holdMinutes * 60,
          volts: null,
          atmosphere: 'air',
          argonFlowLpm: null,
          atmosphereNote: null,
          cooling: 'still-air',
          notes: series.notes[(row + column) % series.notes.length],
          visibility: mark === 'M' ? 'members' : 'public',
        };
        return [{ ownerEmail, layers: series.layers, coupon }];
      }),
    ),
  );
  const longest = Math.max(...perSeries.map((coupons) => coupons.length));
  const inTurn = Array.from({ length: longest }, (_, turn) => perSeries.flatMap((coupons) => coupons[turn] ?? [])).flat();
  return inTurn.map((demo, index) => ({ ...demo, coupon: { ...demo.coupon, createdAt: new Date(LAST_DAY - (inTurn.length - 1 - index) * DAY) } }));
}
