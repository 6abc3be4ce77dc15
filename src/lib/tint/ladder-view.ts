import type { Lab } from '~/lib/colour';
import type { Illuminant } from './illuminants';
import { buildLadder } from './ladder';
import type { TintModel } from './models';
import { roundLab } from './predict';
import type { TintName } from './tint-names';

/**
 * What the tint ladder page draws, computed on the server and passed as plain props: a colour
 * strip against oxide thickness, its named bands, tick marks and a table of steps.
 */

export interface LadderBand {
  name: TintName;
  fromNm: number;
  toNm: number;
  /** The colour in the middle of the band. */
  hex: string;
  leftPercent: number;
  widthPercent: number;
  /** Whether the strip has room for the name; every band is listed by name anyway. */
  labelled: boolean;
}

export interface LadderTick {
  thicknessNm: number;
  percent: number;
  labelled: boolean;
}

export interface LadderTableStep {
  thicknessNm: number;
  hex: string;
  lab: Lab;
  name: TintName;
  outOfGamut: boolean;
}

export interface LadderView {
  alloy: string;
  illuminant: Illuminant;
  toNm: number;
  /** A CSS linear-gradient of the strip, left (0 nm) to right (toNm). */
  gradient: string;
  bands: LadderBand[];
  ticks: LadderTick[];
  steps: LadderTableStep[];
}

export interface LadderViewOptions {
  toNm?: number;
  /** Colour stops of the strip every this many nm. */
  drawStepNm?: number;
  /** Rows of the table every this many nm. */
  tableStepNm?: number;
  tickStepNm?: number;
  labelledTickStepNm?: number;
  /** A band narrower than this share of the strip (%) gets no name on it. */
  minLabelledBandPercent?: number;
  /** Names on the strip are at least this far apart (% of its width), so they do not overlap. */
  minLabelGapPercent?: number;
}

const DEFAULTS: Required<LadderViewOptions> = {
  toNm: 600,
  drawStepNm: 2,
  tableStepNm: 10,
  tickStepNm: 50,
  labelledTickStepNm: 100,
  minLabelledBandPercent: 1,
  minLabelGapPercent: 2.2,
};

const percentOf = (nm: number, toNm: number) => Number(((nm / toNm) * 100).toFixed(3));

/** The tint ladder of an alloy from 0 nm, ready to draw. The model must have optics. */
export function ladderView(model: TintModel, illuminant: Illuminant, options: LadderViewOptions = {}): LadderView {
  const settings = { ...DEFAULTS, ...options };
  const { toNm } = settings;
  const system = model.optics;
  if (!system) throw new Error(`${model.alloy.name} has no optical film model`);
  const ladder = buildLadder(system, { fromNm: 0, toNm, stepNm: 1 }, illuminant);
  const at = (nm: number) => ladder[Math.min(ladder.length - 1, Math.round(nm))];

  const stops: string[] = [];
  for (let nm = 0; nm <= toNm; nm += settings.drawStepNm) stops.push(`${at(nm).hex} ${percentOf(nm, toNm)}%`);

  const bands: LadderBand[] = [];
  for (const step of ladder) {
    const last = bands.at(-1);
    if (last && last.name === step.name) last.toNm = step.thicknessNm;
    else bands.push({ name: step.name, fromNm: step.thicknessNm, toNm: step.thicknessNm, hex: '', leftPercent: 0, widthPercent: 0, labelled: false });
  }
  let lastLabelCentre = -Infinity;
  for (const band of bands) {
    const end = Math.min(toNm, band.toNm + 1);
    band.hex = at((band.fromNm + band.toNm) / 2).hex;
    band.leftPercent = percentOf(band.fromNm, toNm);
    band.widthPercent = Number((percentOf(end, toNm) - band.leftPercent).toFixed(3));
    const centre = band.leftPercent + band.widthPercent / 2;
    band.labelled = band.widthPercent >= settings.minLabelledBandPercent && centre - lastLabelCentre >= settings.minLabelGapPercent;
    if (band.labelled) lastLabelCentre = centre;
  }

  const ticks: LadderTick[] = [];
  for (let nm = 0; nm <= toNm; nm += settings.tickStepNm) {
    ticks.push({ thicknessNm: nm, percent: percentOf(nm, toNm), labelled: nm % settings.labelledTickStepNm === 0 });
  }

  const steps: LadderTableStep[] = [];
  for (let nm = 0; nm <= toNm; nm += settings.tableStepNm) {
    const step = at(nm);
    steps.push({ thicknessNm: step.thicknessNm, hex: step.hex, lab: roundLab(step.lab, 1), name: step.name, outOfGamut: step.outOfGamut });
  }

  return { alloy: model.alloy.slug, illuminant, toNm, gradient: `linear-gradient(to right, ${stops.join(', ')})`, bands, ticks, steps };
}
