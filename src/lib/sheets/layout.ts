import { pageDimensions } from './page-sizes';
import type { Orientation, PageSizeName } from './requests';

/**
 * Where each entry of a sheet goes on printed pages. Every page has margins and a footer (the
 * safety caution and the colour note); the first page also holds the title block. Swatch cells
 * fill rows left to right; a heading starts a new row and never ends a page alone.
 */

export const SHEET_GEOMETRY = {
  margin: 36,
  footerHeight: 64,
  titleBlockHeight: 150,
  cellWidth: 160,
  cellHeight: 118,
  gap: 12,
  headingHeight: 28,
} as const;

export type Geometry = typeof SHEET_GEOMETRY;

export type LayoutEntry<T> = { kind: 'heading'; text: string } | { kind: 'swatch'; item: T };

export type PlacedEntry<T> = { kind: 'heading'; text: string; x: number; y: number; width: number } | { kind: 'swatch'; item: T; x: number; y: number };

export interface PageLayout<T> {
  width: number;
  height: number;
  entries: PlacedEntry<T>[];
}

export interface Grid {
  width: number;
  height: number;
  columns: number;
  /** Top and bottom of the area swatches may use on the first and on later pages. */
  firstTop: number;
  top: number;
  bottom: number;
}

export function gridFor(size: PageSizeName, orientation: Orientation, geometry: Geometry = SHEET_GEOMETRY): Grid {
  const { width, height } = pageDimensions(size, orientation);
  const usable = width - 2 * geometry.margin;
  const columns = Math.max(1, Math.floor((usable + geometry.gap) / (geometry.cellWidth + geometry.gap)));
  return {
    width,
    height,
    columns,
    top: geometry.margin,
    firstTop: geometry.margin + geometry.titleBlockHeight,
    bottom: height - geometry.margin - geometry.footerHeight,
  };
}

/** How many swatch cells a page with no headings holds (first page: under the title block). */
export function pageCapacity(grid: Grid, first: boolean, geometry: Geometry = SHEET_GEOMETRY): number {
  const top = first ? grid.firstTop : grid.top;
  const rows = Math.floor((grid.bottom - top + geometry.gap) / (geometry.cellHeight + geometry.gap));
  return Math.max(0, rows) * grid.columns;
}

export function layoutSheet<T>(
  entries: readonly LayoutEntry<T>[],
  size: PageSizeName,
  orientation: Orientation,
  geometry: Geometry = SHEET_GEOMETRY,
): PageLayout<T>[] {
  const grid = gridFor(size, orientation, geometry);
  const left = geometry.margin;
  const rowStep = geometry.cellHeight + geometry.gap;
  const pages: PageLayout<T>[] = [{ width: grid.width, height: grid.height, entries: [] }];
  let y = grid.firstTop;
  let column = 0;
  const newPage = () => {
    pages.push({ width: grid.width, height: grid.height, entries: [] });
    y = grid.top;
    column = 0;
  };
  const current = () => pages[pages.length - 1];
  const endRow = () => {
    if (column > 0) y += rowStep;
    column = 0;
  };
  entries.forEach((entry, index) => {
    if (entry.kind === 'heading') {
      endRow();
      // Keep a heading with at least one row of its swatches (when one follows).
      const followedBySwatch = entries[index + 1]?.kind === 'swatch';
      const needed = geometry.headingHeight + (followedBySwatch ? geometry.cellHeight : 0);
      if (y + needed > grid.bottom && current().entries.length > 0) newPage();
      current().entries.push({ kind: 'heading', text: entry.text, x: left, y, width: grid.width - 2 * geometry.margin });
      y += geometry.headingHeight;
      return;
    }
    if (column === 0 && y + geometry.cellHeight > grid.bottom) newPage();
    current().entries.push({ kind: 'swatch', item: entry.item, x: left + column * (geometry.cellWidth + geometry.gap), y });
    column += 1;
    if (column === grid.columns) endRow();
  });
  return pages;
}
