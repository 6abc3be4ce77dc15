import type { AlloyFamily } from './alloys';
import { tintModels } from './models';

/** The alloys the tint ladder and the heat planner offer, as plain props for pages and islands. */

export const familyLabels: Record<AlloyFamily, string> = {
  titanium: 'Titanium',
  'carbon-steel': 'Carbon and tool steels',
  'stainless-steel': 'Stainless steels',
  copper: 'Copper',
  bronze: 'Bronze',
  brass: 'Brass',
  zirconium: 'Zirconium',
  niobium: 'Niobium',
};

export interface AlloyOption {
  slug: string;
  name: string;
  family: string;
  /** A heat-growth model: the planner can predict a heat. */
  heat: boolean;
  /** An anodizing growth rate: the planner can predict an anodizing run. */
  anodize: boolean;
}

export interface AlloyOptionGroup {
  label: string;
  alloys: AlloyOption[];
}

function groupByFamily(options: AlloyOption[]): AlloyOptionGroup[] {
  const groups = new Map<string, AlloyOption[]>();
  for (const option of options) groups.set(option.family, [...(groups.get(option.family) ?? []), option]);
  return [...groups].map(([family, alloys]) => ({ label: familyLabels[family as AlloyFamily] ?? family, alloys }));
}

const options = (filter: (option: AlloyOption) => boolean) =>
  groupByFamily(
    tintModels
      .filter((model) => model.optics)
      .map((model) => ({
        slug: model.alloy.slug,
        name: model.alloy.name,
        family: model.alloy.family,
        heat: Boolean(model.heat),
        anodize: Boolean(model.anodize),
      }))
      .filter(filter),
  );

/** Alloys with an optical film model: the ones a tint ladder can be drawn for. */
export const ladderAlloyOptions = (): AlloyOptionGroup[] => options(() => true);

/** Alloys the heat planner can predict for (a heat or an anodizing model besides the optics). */
export const plannerAlloyOptions = (): AlloyOptionGroup[] => options((option) => option.heat || option.anodize);
