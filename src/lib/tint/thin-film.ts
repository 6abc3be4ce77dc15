import type { OpticalConstants } from './data/optical-constants';
import { WAVELENGTH_COUNT, wavelengthsNm } from './spectral-grid';

/** A complex refractive index N = n + i·k (k ≥ 0 absorbs). */
export interface ComplexIndex {
  n: number;
  k: number;
}

/**
 * Normal-incidence Fresnel amplitude coefficient r = (N₁ − N₂)/(N₁ + N₂) between two media, as
 * [re, im]. With N = n + i·k and fields ∝ exp(i(kz − ωt)), a film of thickness d multiplies the
 * round trip by exp(2iδ), δ = 2π·N·d/λ (Born & Wolf, Principles of Optics, §1.6 and §7.6).
 */
function fresnel(a: ComplexIndex, b: ComplexIndex): [number, number] {
  const numRe = a.n - b.n;
  const numIm = a.k - b.k;
  const denRe = a.n + b.n;
  const denIm = a.k + b.k;
  const den = denRe * denRe + denIm * denIm;
  return [(numRe * denRe + numIm * denIm) / den, (numIm * denRe - numRe * denIm) / den];
}

/**
 * Reflectance |r|² of an ambient / film / substrate stack with the film's round-trip factor
 * E = exp(2iδ) = [eRe, eIm]: r = (r01 + r12·E) / (1 + r01·r12·E) (the Airy single-layer formula).
 */
function airy(r01Re: number, r01Im: number, r12Re: number, r12Im: number, eRe: number, eIm: number): number {
  const tRe = r12Re * eRe - r12Im * eIm;
  const tIm = r12Re * eIm + r12Im * eRe;
  const numRe = r01Re + tRe;
  const numIm = r01Im + tIm;
  const denRe = 1 + r01Re * tRe - r01Im * tIm;
  const denIm = r01Re * tIm + r01Im * tRe;
  return (numRe * numRe + numIm * numIm) / (denRe * denRe + denIm * denIm);
}

/** Reflectance at one wavelength of a film of thickness `dNm` (nm) on a substrate, at normal incidence. */
export function filmReflectance(
  wavelengthNm: number,
  dNm: number,
  film: ComplexIndex,
  substrate: ComplexIndex,
  ambient: ComplexIndex = { n: 1, k: 0 },
): number {
  const [r01Re, r01Im] = fresnel(ambient, film);
  const [r12Re, r12Im] = fresnel(film, substrate);
  const scale = (4 * Math.PI * dNm) / wavelengthNm;
  const amplitude = Math.exp(-scale * film.k);
  return airy(r01Re, r01Im, r12Re, r12Im, amplitude * Math.cos(scale * film.n), amplitude * Math.sin(scale * film.n));
}

/**
 * An air / film / metal stack with everything that does not depend on thickness computed once per
 * grid wavelength, so a ladder costs a few multiplications per wavelength and thickness.
 */
export interface FilmStack {
  readonly r01Re: Float64Array;
  readonly r01Im: Float64Array;
  readonly r12Re: Float64Array;
  readonly r12Im: Float64Array;
  /** 4π·n/λ and 4π·k/λ of the film, per nm of thickness. */
  readonly phasePerNm: Float64Array;
  readonly decayPerNm: Float64Array;
}

export function prepareStack(film: OpticalConstants, substrate: OpticalConstants): FilmStack {
  const stack = {
    r01Re: new Float64Array(WAVELENGTH_COUNT),
    r01Im: new Float64Array(WAVELENGTH_COUNT),
    r12Re: new Float64Array(WAVELENGTH_COUNT),
    r12Im: new Float64Array(WAVELENGTH_COUNT),
    phasePerNm: new Float64Array(WAVELENGTH_COUNT),
    decayPerNm: new Float64Array(WAVELENGTH_COUNT),
  };
  const air = { n: 1, k: 0 };
  for (let i = 0; i < WAVELENGTH_COUNT; i += 1) {
    const filmIndex = { n: film.n[i], k: film.k[i] };
    [stack.r01Re[i], stack.r01Im[i]] = fresnel(air, filmIndex);
    [stack.r12Re[i], stack.r12Im[i]] = fresnel(filmIndex, { n: substrate.n[i], k: substrate.k[i] });
    stack.phasePerNm[i] = (4 * Math.PI * filmIndex.n) / wavelengthsNm[i];
    stack.decayPerNm[i] = (4 * Math.PI * filmIndex.k) / wavelengthsNm[i];
  }
  return stack;
}

/** Reflectance spectrum on the grid of the stack with a film `dNm` thick. */
export function reflectanceSpectrum(stack: FilmStack, dNm: number): Float64Array {
  const spectrum = new Float64Array(WAVELENGTH_COUNT);
  for (let i = 0; i < WAVELENGTH_COUNT; i += 1) {
    const amplitude = Math.exp(-stack.decayPerNm[i] * dNm);
    const phase = stack.phasePerNm[i] * dNm;
    spectrum[i] = airy(stack.r01Re[i], stack.r01Im[i], stack.r12Re[i], stack.r12Im[i], amplitude * Math.cos(phase), amplitude * Math.sin(phase));
  }
  return spectrum;
}

/**
 * Weighted sums Σ R(λ)·w(λ) for thicknesses from, from + step, … (count of them), for each of the
 * given weight tables: out[t·tables + j]. Stepping the round-trip factor by one complex multiply
 * per thickness (E(d + Δ) = E(d)·E(Δ)) avoids any trigonometry inside the loop.
 */
export function weightedReflectanceSeries(
  stack: FilmStack,
  weightTables: readonly ArrayLike<number>[],
  fromNm: number,
  stepNm: number,
  count: number,
): Float64Array {
  const tables = weightTables.length;
  const out = new Float64Array(count * tables);
  for (let i = 0; i < WAVELENGTH_COUNT; i += 1) {
    const r01Re = stack.r01Re[i];
    const r01Im = stack.r01Im[i];
    const r12Re = stack.r12Re[i];
    const r12Im = stack.r12Im[i];
    const startAmplitude = Math.exp(-stack.decayPerNm[i] * fromNm);
    let eRe = startAmplitude * Math.cos(stack.phasePerNm[i] * fromNm);
    let eIm = startAmplitude * Math.sin(stack.phasePerNm[i] * fromNm);
    const stepAmplitude = Math.exp(-stack.decayPerNm[i] * stepNm);
    const sRe = stepAmplitude * Math.cos(stack.phasePerNm[i] * stepNm);
    const sIm = stepAmplitude * Math.sin(stack.phasePerNm[i] * stepNm);
    for (let t = 0; t < count; t += 1) {
      const reflectance = airy(r01Re, r01Im, r12Re, r12Im, eRe, eIm);
      for (let j = 0; j < tables; j += 1) out[t * tables + j] += reflectance * weightTables[j][i];
      const nextRe = eRe * sRe - eIm * sIm;
      eIm = eRe * sIm + eIm * sRe;
      eRe = nextRe;
    }
  }
  return out;
}
