import type { DisplayColour } from '~/lib/colour';
import { colourFromXyz, reflectanceToXyz, weightingTable } from './colorimetry';
import { filmStack, type FilmSystemId } from './film-systems';
import type { Illuminant } from './illuminants';
import { reflectanceSpectrum, weightedReflectanceSeries } from './thin-film';
import { interferenceOrders, tintName, withoutBlips, type TintName } from './tint-names';

/** The thickest film the model describes; colours have washed out to grey well before this. */
export const MAX_THICKNESS_NM = 1000;

export interface LadderStep extends DisplayColour {
  thicknessNm: number;
  name: TintName;
}

export interface LadderRange {
  fromNm: number;
  toNm: number;
  stepNm: number;
}

export const DEFAULT_LADDER_RANGE: LadderRange = { fromNm: 0, toNm: 300, stepNm: 5 };

/** Colours of films fromNm, fromNm + stepNm, … (count of them) on a system under an illuminant. */
export function ladderColours(system: FilmSystemId, fromNm: number, stepNm: number, count: number, illuminant: Illuminant = 'D65'): DisplayColour[] {
  const table = weightingTable(illuminant);
  const sums = weightedReflectanceSeries(filmStack(system), [table.x, table.y, table.z], fromNm, stepNm, count);
  const colours: DisplayColour[] = new Array(count);
  for (let t = 0; t < count; t += 1) {
    colours[t] = colourFromXyz({ x: sums[t * 3], y: sums[t * 3 + 1], z: sums[t * 3 + 2] }, illuminant);
  }
  return colours;
}

/** The colour of one film thickness, computed directly. */
export function colourAt(system: FilmSystemId, thicknessNm: number, illuminant: Illuminant = 'D65'): DisplayColour {
  return colourFromXyz(reflectanceToXyz(reflectanceSpectrum(filmStack(system), thicknessNm), illuminant), illuminant);
}

/**
 * A fine D65 ladder of each system from 0 to MAX_THICKNESS_NM, computed once: the basis of the
 * names (orders are counted from zero thickness), the inverse and the planner's look-ups.
 */
export interface ReferenceLadder {
  stepNm: number;
  colours: DisplayColour[];
  names: TintName[];
}

export const REFERENCE_STEP_NM = 0.5;
/** A name must hold for 2 nm (4 steps) between two runs of another name, or it is a blip. */
const MIN_NAME_RUN_STEPS = 4;
const referenceLadders = new Map<FilmSystemId, ReferenceLadder>();

export function referenceLadder(system: FilmSystemId): ReferenceLadder {
  let ladder = referenceLadders.get(system);
  if (!ladder) {
    const count = Math.round(MAX_THICKNESS_NM / REFERENCE_STEP_NM) + 1;
    const colours = ladderColours(system, 0, REFERENCE_STEP_NM, count, 'D65');
    const orders = interferenceOrders(colours.map((colour) => colour.oklab));
    const names = withoutBlips(
      colours.map((colour, i) => tintName(colour.oklab, orders[i])),
      MIN_NAME_RUN_STEPS,
    );
    ladder = { stepNm: REFERENCE_STEP_NM, colours, names };
    referenceLadders.set(system, ladder);
  }
  return ladder;
}

function referenceIndex(ladder: ReferenceLadder, thicknessNm: number): number {
  const i = Math.round(thicknessNm / ladder.stepNm);
  return Math.min(ladder.colours.length - 1, Math.max(0, i));
}

/** The tint band name of a film thickness (named under D65, so a film keeps its name under any light). */
export function tintNameAt(system: FilmSystemId, thicknessNm: number): TintName {
  const ladder = referenceLadder(system);
  return ladder.names[referenceIndex(ladder, thicknessNm)];
}

/**
 * Where the temper colours of a system end: the end of the grey that follows its first blues (the
 * handbooks' last temper colour on steel is light grey, Great Soviet Encyclopedia, "Temper color").
 * Thicker steel films are past the temper range: scale, not a colour the tables name.
 */
export function temperRangeEndNm(system: FilmSystemId): number {
  const ladder = referenceLadder(system);
  let i = ladder.names.indexOf('second-order grey');
  if (i < 0) return MAX_THICKNESS_NM;
  while (i < ladder.names.length && ladder.names[i] === 'second-order grey') i += 1;
  return i * ladder.stepNm;
}

/** The D65 colour of a thickness from the reference ladder (nearest 0.5 nm): fast, for searches. */
export function referenceColourAt(system: FilmSystemId, thicknessNm: number): DisplayColour {
  const ladder = referenceLadder(system);
  return ladder.colours[referenceIndex(ladder, thicknessNm)];
}

/** The tint ladder: colour and name against oxide thickness. */
export function buildLadder(system: FilmSystemId, range: LadderRange = DEFAULT_LADDER_RANGE, illuminant: Illuminant = 'D65'): LadderStep[] {
  const count = Math.floor((range.toNm - range.fromNm) / range.stepNm + 1e-9) + 1;
  const colours = ladderColours(system, range.fromNm, range.stepNm, count, illuminant);
  return colours.map((colour, i) => {
    const thicknessNm = Number((range.fromNm + i * range.stepNm).toFixed(6));
    return { thicknessNm, ...colour, name: tintNameAt(system, thicknessNm) };
  });
}
