/**
 * The alloy catalogue as the tint model sees it. The catalogue itself (slug, name, family, UNS) lives
 * in src/lib/alloys.ts, which the seed imports; this module re-exports it and names the slugs the
 * model registry must cover (a unit test checks the two lists agree).
 */
import { alloyCatalogue, alloyFamilies, findAlloy, type AlloyFamily, type CatalogueAlloy } from '~/lib/alloys';

export { alloyCatalogue as alloys, alloyFamilies, findAlloy, type AlloyFamily, type CatalogueAlloy as Alloy };

export const modelledSlugs = [
  'ti-grade-1',
  'ti-grade-2',
  'ti-grade-4',
  'ti-grade-5',
  'ti-grade-9',
  'ti-grade-23',
  'steel-1084',
  'steel-1095',
  'steel-15n20',
  'steel-o1',
  'steel-w2',
  'steel-52100',
  'steel-304',
  'steel-316',
  'steel-416',
  'copper-c11000',
  'bronze-c51000',
  'brass-c26000',
  'zirconium-702',
  'niobium',
] as const;
export type AlloySlug = (typeof modelledSlugs)[number];

export function isAlloySlug(slug: string): slug is AlloySlug {
  return (modelledSlugs as readonly string[]).includes(slug);
}
