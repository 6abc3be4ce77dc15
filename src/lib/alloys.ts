/**
 * The alloy catalogue. Designations are the standard names and UNS numbers (ASTM E527 / SAE J1086
 * Unified Numbering System); 15N20 has no UNS number of its own.
 */
import { alloyFamilies } from '../../db/schema/enums';

export { alloyFamilies };
export type AlloyFamily = (typeof alloyFamilies)[number];

export interface CatalogueAlloy {
  slug: string;
  name: string;
  family: AlloyFamily;
  uns: string | null;
}

export const alloyCatalogue: readonly CatalogueAlloy[] = [
  { slug: 'ti-grade-1', name: 'Titanium Grade 1', family: 'titanium', uns: 'R50250' },
  { slug: 'ti-grade-2', name: 'Titanium Grade 2', family: 'titanium', uns: 'R50400' },
  { slug: 'ti-grade-4', name: 'Titanium Grade 4', family: 'titanium', uns: 'R50700' },
  { slug: 'ti-grade-5', name: 'Ti-6Al-4V (Grade 5)', family: 'titanium', uns: 'R56400' },
  { slug: 'ti-grade-9', name: 'Ti-3Al-2.5V (Grade 9)', family: 'titanium', uns: 'R56320' },
  { slug: 'ti-grade-23', name: 'Ti-6Al-4V ELI (Grade 23)', family: 'titanium', uns: 'R56401' },
  { slug: 'steel-1084', name: '1084 carbon steel', family: 'carbon-steel', uns: 'G10840' },
  { slug: 'steel-1095', name: '1095 carbon steel', family: 'carbon-steel', uns: 'G10950' },
  { slug: 'steel-15n20', name: '15N20 nickel steel', family: 'carbon-steel', uns: null },
  { slug: 'steel-o1', name: 'O1 tool steel', family: 'carbon-steel', uns: 'T31501' },
  { slug: 'steel-w2', name: 'W2 tool steel', family: 'carbon-steel', uns: 'T72302' },
  { slug: 'steel-52100', name: '52100 bearing steel', family: 'carbon-steel', uns: 'G52986' },
  { slug: 'steel-304', name: '304 stainless', family: 'stainless-steel', uns: 'S30400' },
  { slug: 'steel-316', name: '316 stainless', family: 'stainless-steel', uns: 'S31600' },
  { slug: 'steel-416', name: '416 stainless', family: 'stainless-steel', uns: 'S41600' },
  { slug: 'copper-c11000', name: 'C11000 copper (ETP)', family: 'copper', uns: 'C11000' },
  { slug: 'bronze-c51000', name: 'C51000 phosphor bronze', family: 'bronze', uns: 'C51000' },
  { slug: 'brass-c26000', name: 'C26000 cartridge brass', family: 'brass', uns: 'C26000' },
  { slug: 'zirconium-702', name: 'Zirconium 702', family: 'zirconium', uns: 'R60702' },
  { slug: 'niobium', name: 'Niobium (reactor grade)', family: 'niobium', uns: 'R04200' },
];

export const alloySlugs = alloyCatalogue.map((alloy) => alloy.slug);

export function findAlloy(slug: string): CatalogueAlloy | undefined {
  return alloyCatalogue.find((alloy) => alloy.slug === slug);
}

/** The key the library filters laminates by: layer slugs, sorted, joined by '+'. */
export function layerKeyOf(slugs: readonly string[]): string {
  return [...new Set(slugs)].sort().join('+');
}
