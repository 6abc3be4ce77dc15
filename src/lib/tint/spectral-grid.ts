import { CMF_FIRST_NM, CMF_STEP_NM, xBar } from './data/cie-1931-2deg';

/** The model's wavelength grid: 380–780 nm at 5 nm, the tables' sampling (CIE 15 allows 5 nm). */
export const FIRST_NM = CMF_FIRST_NM;
export const STEP_NM = CMF_STEP_NM;
export const WAVELENGTH_COUNT = xBar.length;
export const LAST_NM = FIRST_NM + STEP_NM * (WAVELENGTH_COUNT - 1);

export const wavelengthsNm: readonly number[] = Array.from({ length: WAVELENGTH_COUNT }, (_, i) => FIRST_NM + i * STEP_NM);

/** Index of a grid wavelength, or -1 when it is not on the grid. */
export function gridIndex(nm: number): number {
  const i = (nm - FIRST_NM) / STEP_NM;
  return Number.isInteger(i) && i >= 0 && i < WAVELENGTH_COUNT ? i : -1;
}
