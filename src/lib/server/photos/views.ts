import { asc, eq, inArray } from 'drizzle-orm';
import { alloys, couponLayers, photos, regions, swatches } from '../../../../db/schema';
import { nearestTint } from '~/lib/photo-tints';
import type { PhotoView, SwatchGroup, SwatchView } from '~/lib/photos';
import { db } from '~/lib/server/db';
import type { PhotoRecord } from './records';
import { viewUrl } from './store';

/**
 * A coupon's photos as pages and the API show them: regions, swatches grouped per layer with the
 * nearest tint of the layer's alloy, and short-lived URLs to the display copy and thumbnail.
 */

const swatchView = (row: typeof swatches.$inferSelect): SwatchView => ({
  hex: row.hex,
  lab: { l: row.labL, a: row.labA, b: row.labB },
  oklab: { l: row.oklabL, a: row.oklabA, b: row.oklabB },
  share: row.share,
  spread: row.spread,
});

/** A coupon's photos, oldest first, with regions, swatches per layer and short-lived URLs to show them. */
export async function photoViews(couponId: number): Promise<PhotoView[]> {
  const rows = await db().select().from(photos).where(eq(photos.couponId, couponId)).orderBy(asc(photos.createdAt), asc(photos.id));
  if (rows.length === 0) return [];
  const ids = rows.map((row) => row.id);
  const regionRows = await db().select().from(regions).where(inArray(regions.photoId, ids)).orderBy(asc(regions.id));
  const swatchRows = await db().select().from(swatches).where(inArray(swatches.photoId, ids)).orderBy(asc(swatches.id));
  const layerRows = await db()
    .select({ id: couponLayers.id, alloy: alloys.slug })
    .from(couponLayers)
    .innerJoin(alloys, eq(alloys.id, couponLayers.alloyId))
    .where(eq(couponLayers.couponId, couponId));
  const alloyOf = new Map(layerRows.map((layer) => [layer.id, layer.alloy]));
  return Promise.all(
    rows.map(async (row) => {
      const own = regionRows.filter((region) => region.photoId === row.id);
      const groups = new Map<string, SwatchGroup>();
      for (const swatch of swatchRows.filter((candidate) => candidate.photoId === row.id)) {
        const groupKey = String(swatch.regionId);
        const group: SwatchGroup = groups.get(groupKey) ?? { regionId: swatch.regionId, layerId: swatch.layerId, mean: null, swatches: [], tint: null };
        if (swatch.isMean) group.mean = swatchView(swatch);
        else group.swatches[swatch.rank - 1] = swatchView(swatch);
        groups.set(groupKey, group);
      }
      const whiteBalanced = own.some((region) => region.kind === 'grey');
      return {
        id: row.id,
        couponId: row.couponId,
        width: row.width,
        height: row.height,
        contentType: row.contentType,
        byteSize: row.byteSize,
        takenAt: row.takenAt?.toISOString() ?? null,
        camera: row.camera,
        lens: row.lens,
        exposure: row.exposure,
        whiteBalance: row.whiteBalance,
        createdAt: row.createdAt.toISOString(),
        displayUrl: await viewUrl(row.displayKey),
        thumbUrl: await viewUrl(row.thumbKey),
        regions: own.map(({ id, kind, layerId, x, y, width, height, reflectance }) => ({ id, kind, layerId, x, y, width, height, reflectance })),
        whiteBalanced,
        groups: [...groups.values()].map((group) => {
          const alloy = group.layerId === null ? undefined : alloyOf.get(group.layerId);
          // The film is read from the dominant cluster: a mean blends in shadow, scale and glints.
          const dominant = group.swatches.find(Boolean);
          const tint = alloy && dominant ? nearestTint(alloy, dominant.lab, whiteBalanced ? 'absolute' : 'down-weighted') : null;
          return { ...group, swatches: group.swatches.filter(Boolean), tint };
        }),
      };
    }),
  );
}

/** One photo as the API answers it; undefined when it (or its coupon) was deleted meanwhile. */
export async function photoView(photo: PhotoRecord): Promise<PhotoView | undefined> {
  return (await photoViews(photo.couponId)).find((view) => view.id === photo.id);
}
