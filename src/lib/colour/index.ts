/** The colour core: types, conversions, display colours, ΔE00 and adaptation. Pure; safe for islands and routes alike. */
export { LabSchema, type Lab, type Oklab, type Xyz, type DisplayColour } from './types';
export { SRGB8_TO_LINEAR, LINEAR_RGB_TO_XYZ, XYZ_TO_LINEAR_RGB, D65_WHITE, linearRgbToOklab, oklabToLab, oklabToOklch, oklabToRgb, xyzToLab } from './convert';
export { colourFromXyz65, colourFromLab } from './display';
export { isHexColour, hexToLab, rgbHex } from './hex';
export { deltaE2000 } from './delta-e';
export { BRADFORD, bradfordAdaptation, scalingAdaptation } from './adaptation';
