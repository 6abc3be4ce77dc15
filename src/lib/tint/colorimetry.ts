import { bradfordAdaptation, colourFromXyz65, D65_WHITE, scalingAdaptation, type DisplayColour, type Xyz } from '~/lib/colour';
import { applyMatrix, multiplyMatrices, type Matrix3 } from '~/lib/matrix';
import { xBar, yBar, zBar } from './data/cie-1931-2deg';
import { illuminantSpectrum, type Illuminant } from './illuminants';
import { WAVELENGTH_COUNT } from './spectral-grid';

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

const asVector = ({ x, y, z }: Xyz) => [x, y, z];

/**
 * From the tables' XYZ (Y = 100 white) to XYZ against sRGB's D65 white (Y = 1). The 5 nm tables'
 * D65 white (95.043, 100, 108.880) is not quite sRGB's (95.046, 100, 108.906, from x = 0.3127,
 * y = 0.3290); a per-channel scale maps one onto the other so a perfect reflector is exactly
 * L* = 100, a* = b* = 0 and #ffffff. Under illuminant A the colour is shown as an eye fully
 * adapted to that warm light sees it (Bradford adaptation from A's white to D65's), then scaled alike.
 */
const tablesToSrgbWhite = scalingAdaptation(asVector(whitePoint('D65')), D65_WHITE);
const toSrgbWhite: Record<Illuminant, Matrix3> = {
  D65: tablesToSrgbWhite,
  A: multiplyMatrices(tablesToSrgbWhite, bradfordAdaptation(asVector(whitePoint('A')), asVector(whitePoint('D65')))),
};

/** The display colour of tristimulus values (Y = 100 white) seen under the given illuminant. */
export function colourFromXyz(xyz: Xyz, illuminant: Illuminant): DisplayColour {
  const [x, y, z] = applyMatrix(toSrgbWhite[illuminant], asVector(xyz));
  return colourFromXyz65({ x, y, z });
}
