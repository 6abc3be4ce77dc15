import type { Orientation, PageSizeName } from './requests';

/** Paper sizes in PostScript points (1/72 inch), portrait. */
export const PAGE_SIZES: Record<PageSizeName, { width: number; height: number; standard: string }> = {
  // ISO 216 A4 is 210 × 297 mm: 595.28 × 841.89 pt, written to the page as 595 × 842.
  a4: { width: 595, height: 842, standard: 'ISO 216' },
  // ANSI/ASME Y14.1 "A" (US Letter) is 8.5 × 11 in: 612 × 792 pt.
  letter: { width: 612, height: 792, standard: 'ANSI/ASME Y14.1' },
};

/** Width and height of a page in points; landscape swaps them. */
export function pageDimensions(size: PageSizeName, orientation: Orientation): { width: number; height: number } {
  const { width, height } = PAGE_SIZES[size];
  return orientation === 'landscape' ? { width: height, height: width } : { width, height };
}
