import { layersOf } from '../coupons';
import type { Viewer } from '../visibility';
import { heatUnavailableReason, predictLayer } from '~/lib/library/pair-matrix';
import { heatLines, removedNote, type SheetHeat } from '~/lib/sheets/format';
import type { SheetAudience } from '~/lib/sheets/requests';
import { mayChangeSheet, sharedWithClass } from './access';
import { itemsOf, swatchSources, type SheetRow, type SwatchSource } from './records';

/** What a sheet shows: its entries checked against its audience, with notes for its owner. */

export interface SheetPrediction {
  hex: string;
  name: string;
  note: string;
}

export interface SheetSwatchEntry {
  kind: 'swatch';
  id: number;
  swatchId: number | null;
  couponId: number | null;
  hex: string;
  lab: [number, number, number];
  couponTitle: string;
  heat: SheetHeat;
  caption: string;
  hideTemperature: boolean;
  hideHold: boolean;
  hideProcess: boolean;
  hideAlloy: boolean;
  /** The heat record's printed lines, in the sheet's units. */
  lines: string[];
  prediction: SheetPrediction | null;
  /** Only on the owner's view: false when the audience may no longer see the coupon. */
  available: boolean;
  unavailableReason?: 'deleted' | 'not-shared';
  /** Only on the owner's view: the swatch's colour changed since it was put on the sheet. */
  changed: boolean;
}

export type SheetEntry = { kind: 'heading'; id: number; text: string } | SheetSwatchEntry;

export interface SheetView {
  id: number;
  title: string;
  intro: string | null;
  classId: number | null;
  className: string | null;
  ownerName: string | null;
  units: SheetRow['units'];
  pageSize: SheetRow['pageSize'];
  orientation: SheetRow['orientation'];
  status: SheetRow['status'];
  audience: SheetAudience;
  showPrediction: boolean;
  publishedAt: Date | null;
  updatedAt: Date;
  canEdit: boolean;
  entries: SheetEntry[];
  /** For the owner: "2 swatches were removed: …", or null. */
  note: string | null;
}

/** May the sheet's audience see this coupon? Checked against the audience, never the viewer. */
export function audienceMaySee(source: SwatchSource, audience: SheetAudience, sharedCoupons: ReadonlySet<number>): boolean {
  if (source.visibility === 'public') return true;
  if (audience === 'public') return false;
  return source.visibility === 'members' || sharedCoupons.has(source.couponId);
}

/**
 * The heat planner's band for the swatch's own heat, in air, from the reference data (what the
 * planner tells a visitor). The alloy is the one of the layer the swatch was measured on, so each
 * layer of a laminate gets its own; a whole-photo swatch of a laminate names no layer and gets none.
 */
function predictionFor(heat: SheetHeat, source: SwatchSource, couponAlloys: string[]): SheetPrediction | null {
  if (heat.process === 'anodize' || source.atmosphere !== 'air' || heat.temperatureC === null || heat.holdSeconds === null) return null;
  const slug = source.layerAlloy ?? (couponAlloys.length === 1 ? couponAlloys[0] : null);
  if (slug === null || heatUnavailableReason(slug)) return null;
  try {
    const layer = predictLayer(slug, heat.temperatureC, heat.holdSeconds / 60);
    return { hex: layer.hex, name: layer.name, note: layer.extrapolated ? 'model, outside its reference range' : 'model' };
  } catch {
    return null;
  }
}

/** The alloy line of a swatch: the coupon's alloys, or on a laminate the one layer it was measured on. */
function alloysNamed(couponLayers: { alloy: string; alloyName: string }[], layerAlloy: string | null): string[] {
  const layer = couponLayers.length > 1 && layerAlloy ? couponLayers.find((each) => each.alloy === layerAlloy) : undefined;
  return layer ? [`${layer.alloyName} layer`] : couponLayers.map((each) => each.alloyName);
}

export async function sheetView(sheet: SheetRow, viewer: Viewer | null): Promise<SheetView> {
  const owner = mayChangeSheet(viewer, sheet);
  const rows = await itemsOf(sheet.id);
  const swatchIds = rows.flatMap((row) => (row.swatchId === null ? [] : [row.swatchId]));
  const sources = await swatchSources(swatchIds);
  const couponIds = [...new Set([...sources.values()].map((source) => source.couponId))];
  const [shared, layers] = await Promise.all([sharedWithClass(sheet.classId, couponIds), layersOf(couponIds)]);

  const entries: SheetEntry[] = [];
  let removed = 0;
  for (const row of rows) {
    if (row.kind === 'heading') {
      entries.push({ kind: 'heading', id: row.id, text: row.heading ?? '' });
      continue;
    }
    const source = row.swatchId === null ? undefined : sources.get(row.swatchId);
    const available = source !== undefined && audienceMaySee(source, sheet.audience, shared);
    if (!available) {
      removed += 1;
      if (!owner) continue;
    }
    const hidden = { hideTemperature: row.hideTemperature, hideHold: row.hideHold, hideProcess: row.hideProcess, hideAlloy: row.hideAlloy };
    const couponLayers = source ? (layers.get(source.couponId) ?? []) : [];
    const snapshot = row.snapshot;
    const heat: SheetHeat = source
      ? {
          temperatureC: source.temperatureC,
          holdSeconds: source.holdSeconds,
          volts: source.volts,
          process: source.process,
          alloys: alloysNamed(couponLayers, source.layerAlloy),
        }
      : { temperatureC: null, holdSeconds: null, process: snapshot?.process ?? 'oven', alloys: [] };
    entries.push({
      kind: 'swatch',
      id: row.id,
      swatchId: available ? row.swatchId : null,
      couponId: available ? row.couponId : null,
      hex: (available ? source?.hex : snapshot?.hex) ?? '#808080',
      lab: (available ? source?.lab : snapshot?.lab) ?? [50, 0, 0],
      couponTitle: source && available ? source.couponTitle : (snapshot?.couponTitle ?? ''),
      heat,
      caption: row.caption ?? '',
      ...hidden,
      lines: available ? heatLines(heat, hidden, sheet.units) : [],
      prediction:
        available && source && sheet.showPrediction
          ? predictionFor(
              heat,
              source,
              couponLayers.map((layer) => layer.alloy),
            )
          : null,
      available,
      unavailableReason: available ? undefined : source ? 'not-shared' : 'deleted',
      changed: owner && source !== undefined && snapshot !== null && snapshot.hex.toLowerCase() !== source.hex.toLowerCase(),
    });
  }
  return {
    id: sheet.id,
    title: sheet.title,
    intro: sheet.intro,
    classId: sheet.classId,
    className: sheet.className,
    ownerName: sheet.ownerName,
    units: sheet.units,
    pageSize: sheet.pageSize,
    orientation: sheet.orientation,
    status: sheet.status,
    audience: sheet.audience,
    showPrediction: sheet.showPrediction,
    publishedAt: sheet.publishedAt,
    updatedAt: sheet.updatedAt,
    canEdit: owner,
    entries,
    note: owner ? removedNote(removed) : null,
  };
}

/** The entries the audience gets: what the page, print and PDF show. */
export function printedEntries(view: SheetView): SheetEntry[] {
  const shown = view.entries.filter((entry) => entry.kind === 'heading' || entry.available);
  // A heading with no swatch left under it is not printed.
  return shown.filter((entry, index) => entry.kind === 'swatch' || shown[index + 1]?.kind === 'swatch');
}
