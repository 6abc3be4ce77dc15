import type { AlloySlug } from './alloys';
import type { TintModel } from './models';

export interface HeatWarning {
  code: string;
  message: string;
  source: string;
}

export const atmospheres = ['air', 'argon', 'other'] as const;
export type Atmosphere = (typeof atmospheres)[number];

const COMMON_PRACTICE = 'Common practice; no published source.';

/** Beta transus temperatures (°C), from memory; confirm against the mill certificate or a handbook. */
const betaTransusC: Partial<Record<AlloySlug, number>> = {
  'ti-grade-1': 890,
  'ti-grade-2': 910,
  'ti-grade-4': 950,
  'ti-grade-5': 995,
  'ti-grade-9': 935,
  'ti-grade-23': 975,
};
/** Warn this far below the transus: furnace and thermocouple error easily reach it. */
const TRANSUS_MARGIN_C = 30;

const FORGE_WELD_MIN_C = 925;
const FORGE_WELD_MAX_C = 1095;
/** Fe–Ti eutectic, from memory of the Fe–Ti phase diagram. */
const FE_TI_EUTECTIC_C = 1085;
/**
 * Alpha case is warned from 600 °C in air: from there oxygen goes into solution in titanium and not
 * only into the film; the thick-scale parabolic oxidation that goes with it is reported from 650 °C
 * (Mohamed et al., Chem. Papers 76:1627, 2022) and rutile-only scale above ~718 °C (Gemelli & Camargo 2007).
 */
const ALPHA_CASE_FROM_C = 600;
/** Knife steels are usually tempered at about 175–230 °C; colouring above that tempers them further. */
const STEEL_TEMPER_FROM_C = 175;

/** Warnings and cautions for a planned heat, each with its source or marked as practice or memory. */
export function heatWarnings(model: TintModel, temperatureC: number, atmosphere: Atmosphere = 'air'): HeatWarning[] {
  const warnings: HeatWarning[] = [];
  const { family, slug } = model.alloy;

  if (family === 'titanium') {
    if (temperatureC >= FORGE_WELD_MIN_C - 25) {
      warnings.push({
        code: 'forge-welding-range',
        message:
          `Forge-welding a titanium laminate is done at about 1700–2000 °F (≈ ${FORGE_WELD_MIN_C}–${FORGE_WELD_MAX_C} °C) ` +
          'in a steel can purged with argon at a low flow (a couple of L/min, against the ~25 L/min of TIG shielding). ' +
          'The tint model does not cover these temperatures.',
        source: COMMON_PRACTICE,
      });
      warnings.push({
        code: 'fe-ti-eutectic',
        message:
          temperatureC >= FE_TI_EUTECTIC_C
            ? `At ${temperatureC} °C titanium touching steel (a can, a fixture) is at or above the iron–titanium eutectic ` +
              `(about ${FE_TI_EUTECTIC_C} °C) and can melt, far below titanium's own melting point (1668 °C); molten titanium reacts violently.`
            : `Titanium touching steel (a can, a fixture) can melt at the iron–titanium eutectic, about ${FE_TI_EUTECTIC_C} °C, ` +
              "far below titanium's own melting point (1668 °C). Overshooting by even 50 °C can liquefy the stack.",
        source: 'From memory of the Fe–Ti phase diagram; confirm against a published diagram.',
      });
    }
    if (temperatureC >= ALPHA_CASE_FROM_C && atmosphere !== 'argon') {
      warnings.push({
        code: 'alpha-case',
        message:
          `Above about ${ALPHA_CASE_FROM_C} °C in air, oxygen diffuses into titanium and long holds grow a hard, brittle ` +
          'oxygen-rich layer (alpha case) under the oxide; it cracks when bent and is usually removed by machining or pickling. ' +
          'Warned from 600 °C because thick-scale oxidation of titanium is reported from 650 °C.',
        source: `${COMMON_PRACTICE} Threshold chosen from Mohamed et al., Chem. Papers 76:1627 (2022), and Gemelli & Camargo, Matéria 12(3) (2007).`,
      });
    }
    const transus = betaTransusC[slug as AlloySlug];
    if (transus !== undefined && temperatureC >= transus - TRANSUS_MARGIN_C) {
      warnings.push({
        code: 'beta-transus',
        message:
          `The beta transus of ${model.alloy.name} is about ${transus} °C; near and above it the microstructure changes ` +
          '(grain growth, loss of ductility after slow cooling).',
        source: 'From memory; confirm against the mill certificate or a handbook.',
      });
    }
  }

  if (family === 'carbon-steel' && temperatureC >= STEEL_TEMPER_FROM_C) {
    warnings.push({
      code: 'tempers-hardened-steel',
      message:
        'Colouring a hardened blade at or above its tempering temperature tempers it further and lowers its hardness; ' +
        'keep the edge cool or colour before the final temper.',
      source: COMMON_PRACTICE,
    });
  }

  if (atmosphere === 'argon') {
    warnings.push({
      code: 'inert-gas',
      message: 'Argon and other inert gases displace oxygen in closed or low spaces: ventilate, and never work in a pit or box full of gas.',
      source: COMMON_PRACTICE,
    });
  }

  warnings.push({
    code: 'hot-work',
    message: 'Hot work needs eye and burn protection. Forges make carbon monoxide; zinc-coated or cadmium-plated parts give toxic fumes.',
    source: COMMON_PRACTICE,
  });
  return warnings;
}

/** Cautions for an anodizing run. */
export function anodizeWarnings(volts: number): HeatWarning[] {
  const warnings: HeatWarning[] = [
    {
      code: 'anodizing-bath',
      message:
        'Anodizing passes direct current through an electrolyte: switch off before touching the work or the bath, ' +
        "wear eye protection, and follow the electrolyte's safety data sheet.",
      source: COMMON_PRACTICE,
    },
  ];
  if (volts > 60) {
    warnings.push({
      code: 'high-voltage',
      message: `At ${volts} V DC a wet hand on the work or the bath can give a dangerous shock: use an insulated setup and one hand.`,
      source: COMMON_PRACTICE,
    });
  }
  return warnings;
}
