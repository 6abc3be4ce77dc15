import { describe, expect, it } from 'vitest';
import { layoutSheet, type LayoutEntry } from '~/lib/sheets/layout';
import { PAGE_SIZES, pageDimensions } from '~/lib/sheets/page-sizes';

const POINTS_PER_INCH = 72;
const MM_PER_INCH = 25.4;

describe('paper sizes in points', () => {
  it('A4 is ISO 216: 210 × 297 mm', () => {
    // Source: ISO 216 (A4 = 210 × 297 mm); 1 pt = 1/72 in, 1 in = 25.4 mm.
    expect(PAGE_SIZES.a4.width).toBe(Math.round((210 / MM_PER_INCH) * POINTS_PER_INCH)); // 595.28 → 595
    expect(PAGE_SIZES.a4.height).toBe(Math.round((297 / MM_PER_INCH) * POINTS_PER_INCH)); // 841.89 → 842
    expect(PAGE_SIZES.a4.standard).toBe('ISO 216');
  });

  it('Letter is ANSI/ASME Y14.1 size A: 8.5 × 11 in', () => {
    // Source: ANSI/ASME Y14.1, sheet size A = 8.5 × 11 in.
    expect(PAGE_SIZES.letter).toMatchObject({ width: 8.5 * POINTS_PER_INCH, height: 11 * POINTS_PER_INCH, standard: 'ANSI/ASME Y14.1' });
  });

  it('landscape swaps width and height', () => {
    expect(pageDimensions('a4', 'landscape')).toEqual({ width: 842, height: 595 });
    expect(pageDimensions('letter', 'landscape')).toEqual({ width: 792, height: 612 });
  });
});

const swatches = (count: number, from = 0): LayoutEntry<number>[] => Array.from({ length: count }, (_, i) => ({ kind: 'swatch', item: from + i }));
const counts = (pages: ReturnType<typeof layoutSheet<number>>) => pages.map((page) => page.entries.filter((entry) => entry.kind === 'swatch').length);

describe('pagination', () => {
  // Capacities worked out by hand from the printed design (36 pt margins, 64 pt footer, a 150 pt
  // title block on page 1, 160 × 118 pt cells, 12 pt gaps):
  //   A4 portrait: 3 columns (504 ≤ 523 pt); page 1 has 556 pt → 4 rows; later pages 706 pt → 5 rows.
  //   Letter portrait: 3 columns (504 ≤ 540); page 1 has 506 pt → 3 rows (4 need 508); later 656 → 5 rows.
  //   A4 landscape: 842 − 72 = 770 → 4 columns (676; 5 need 848); page 1: 595 − 136 − 150 = 309 → 2 rows; later 459 → 3 rows.
  it('fills A4 portrait 12, then 15 a page', () => {
    expect(counts(layoutSheet(swatches(40), 'a4', 'portrait'))).toEqual([12, 15, 13]);
  });

  it('fills Letter portrait 9, then 15 a page', () => {
    expect(counts(layoutSheet(swatches(40), 'letter', 'portrait'))).toEqual([9, 15, 15, 1]);
  });

  it('fills A4 landscape 8, then 12 a page', () => {
    expect(counts(layoutSheet(swatches(40), 'a4', 'landscape'))).toEqual([8, 12, 12, 8]);
  });

  it('keeps the order, and every cell inside the page', () => {
    const entries: LayoutEntry<number>[] = [{ kind: 'heading', text: 'Straw' }, ...swatches(7), { kind: 'heading', text: 'Blue' }, ...swatches(30, 7)];
    const pages = layoutSheet(entries, 'a4', 'portrait');
    const flat = pages.flatMap((page) => page.entries.map((entry) => (entry.kind === 'heading' ? entry.text : entry.item)));
    expect(flat).toEqual(entries.map((entry) => (entry.kind === 'heading' ? entry.text : entry.item)));
    for (const page of pages)
      for (const entry of page.entries) {
        expect(entry.x).toBeGreaterThanOrEqual(36);
        if (entry.kind === 'swatch') expect(entry.x + 160).toBeLessThanOrEqual(595 - 36);
        if (entry.kind === 'swatch') expect(entry.y + 118).toBeLessThanOrEqual(842 - 36 - 64);
      }
  });

  it('starts a heading on a new row at the left margin and never leaves it alone at the foot of a page', () => {
    const entries: LayoutEntry<number>[] = [...swatches(13), { kind: 'heading', text: 'Purple' }, ...swatches(3, 13)];
    const pages = layoutSheet(entries, 'a4', 'portrait');
    // 12 fill page 1; the 13th opens page 2 at row 1; the heading goes under it at the margin.
    const heading = pages[1].entries.find((entry) => entry.kind === 'heading')!;
    expect(heading.x).toBe(36);
    for (const page of pages) expect(page.entries.at(-1)?.kind).not.toBe('heading');
    const sheetFull: LayoutEntry<number>[] = [...swatches(12), { kind: 'heading', text: 'Late' }, ...swatches(1, 12)];
    const full = layoutSheet(sheetFull, 'a4', 'portrait');
    expect(full[0].entries.at(-1)?.kind).toBe('swatch');
    expect(full[1].entries[0]).toMatchObject({ kind: 'heading', text: 'Late' });
  });
});
