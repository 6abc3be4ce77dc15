import { findTintModel, missingModelReason, ModelUnavailableError, predictTint, type Prediction } from '~/lib/tint';
import { measuredOnLadder, plannerRequestOf, type MeasuredOnLadder } from '~/lib/tint/measured-vs-predicted';
import type { CouponRecord } from './coupons';
import { dominantSwatches } from './library/list';
import { libraryFitFor } from './tint-fit';
import type { Viewer } from './visibility';

export interface LayerAgainstModel {
  position: number;
  alloy: string;
  alloyName: string;
  /** Whether the coupon was anodized (a voltage) rather than heated. */
  anodized: boolean;
  /** The strip with the swatch (and the band, when predicted); null without an optical model. */
  view: MeasuredOnLadder | null;
  prediction: Prediction | null;
  /** Why there is no prediction (or no ladder), in plain words. */
  unavailable: string | null;
}

/**
 * Each measured layer of a coupon against the model: its dominant swatch on the alloy's tint
 * ladder and the band the heat planner predicts for the coupon's own heat, as POST
 * /api/tint/predict gives it to this viewer (their library fit when signed in, else the reference).
 * Layers with no measured swatch are left out.
 */
export async function measuredVersusPredicted(coupon: CouponRecord, viewer: Viewer | null): Promise<LayerAgainstModel[]> {
  const swatches = await dominantSwatches(coupon.layerDetails.map((layer) => layer.id));
  const layers: LayerAgainstModel[] = [];
  for (const layer of coupon.layerDetails) {
    const swatch = swatches.get(layer.id);
    if (!swatch) continue;
    const base = { position: layer.position, alloy: layer.alloy, alloyName: layer.alloyName, anodized: coupon.process === 'anodize' };
    const model = findTintModel(layer.alloy);
    const noOptics = model ? missingModelReason(model, 'optics') : `${layer.alloyName} has no tint model yet: library data only.`;
    if (!model || noOptics) {
      layers.push({ ...base, view: null, prediction: null, unavailable: noOptics });
      continue;
    }
    const measured = { hex: swatch.hex, lab: swatch.lab };
    const planned = plannerRequestOf(layer.alloy, coupon);
    let prediction: Prediction | null = null;
    let unavailable: string | null = planned.ok ? null : planned.reason;
    if (planned.ok) {
      const { alloy, ...plan } = planned.request;
      unavailable = missingModelReason(model, plan.process);
      if (!unavailable) {
        try {
          prediction = predictTint(model, plan, await libraryFitFor(alloy, viewer));
        } catch (error) {
          if (!(error instanceof ModelUnavailableError)) throw error;
          unavailable = error.message;
        }
      }
    }
    layers.push({ ...base, view: measuredOnLadder(model, measured, prediction), prediction, unavailable });
  }
  return layers;
}
