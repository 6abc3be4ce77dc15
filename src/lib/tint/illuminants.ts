import { d65 } from './data/illuminant-d65';
import { wavelengthsNm } from './spectral-grid';

export const illuminants = ['D65', 'A'] as const;
export type Illuminant = (typeof illuminants)[number];

/**
 * CIE standard illuminant A, relative spectral power normalised to 100 at 560 nm:
 * S_A(λ) = 100 · (560/λ)⁵ · (exp(1.435e7 / (2848·560)) − 1) / (exp(1.435e7 / (2848·λ)) − 1), λ in nm.
 * This is the published defining formula of CIE 15:2004 §3.1 (Planck's law with c2 = 1.435e-2 m·K
 * at 2848 K, which equals 2856 K with today's c2 = 1.4388e-2 m·K), so no table is needed.
 */
export function illuminantA(nm: number): number {
  const c = 1.435e7 / 2848;
  return 100 * (560 / nm) ** 5 * (Math.expm1(c / 560) / Math.expm1(c / nm));
}

const spectra: Record<Illuminant, readonly number[]> = {
  D65: d65,
  A: wavelengthsNm.map(illuminantA),
};

/** Relative spectral power of an illuminant on the model's wavelength grid. */
export function illuminantSpectrum(illuminant: Illuminant): readonly number[] {
  return spectra[illuminant];
}
