import { xBar, yBar, zBar } from './data/cie-1931-2deg';
import { illuminantSpectrum, type Illuminant } from './illuminants';
import { WAVELENGTH_COUNT } from './spectral-grid';

export interface Xyz {
  x: number;
  y: number;
  z: number;
}

/** Per-wavelength weights S(λ)·x̄/ȳ/z̄(λ), scaled so a perfect reflector has Y = 100. */
export interface WeightingTable {
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly z: Float64Array;
}

function buildWeights(illuminant: Illuminant): WeightingTable {
  const power = illuminantSpectrum(illuminant);
  let norm = 0;
  for (let i = 0; i < WAVELENGTH_COUNT; i += 1) norm += power[i] * yBar[i];
  const scale = 100 / norm;
  const table = {
    x: new Float64Array(WAVELENGTH_COUNT),
    y: new Float64Array(WAVELENGTH_COUNT),
    z: new Float64Array(WAVELENGTH_COUNT),
  };
  for (let i = 0; i < WAVELENGTH_COUNT; i += 1) {
    table.x[i] = power[i] * xBar[i] * scale;
    table.y[i] = power[i] * yBar[i] * scale;
    table.z[i] = power[i] * zBar[i] * scale;
  }
  return table;
}

const weights: Record<Illuminant, WeightingTable> = { D65: buildWeights('D65'), A: buildWeights('A') };

export function weightingTable(illuminant: Illuminant): WeightingTable {
  return weights[illuminant];
}

/** Tristimulus values (Y = 100 for a perfect reflector) of a reflectance spectrum on the grid. */
export function reflectanceToXyz(reflectance: ArrayLike<number>, illuminant: Illuminant): Xyz {
  const table = weights[illuminant];
  let x = 0;
  let y = 0;
  let z = 0;
  for (let i = 0; i < WAVELENGTH_COUNT; i += 1) {
    x += reflectance[i] * table.x[i];
    y += reflectance[i] * table.y[i];
    z += reflectance[i] * table.z[i];
  }
  return { x, y, z };
}

/** The white point of an illuminant from the tables: the XYZ of a perfect reflector. */
export function whitePoint(illuminant: Illuminant): Xyz {
  return reflectanceToXyz(new Float64Array(WAVELENGTH_COUNT).fill(1), illuminant);
}
