import type { Xyz } from './colorimetry';

/**
 * Bradford cone-response matrix (Lam 1985, as used in ICC.1 Annex E and CIECAM97s) and its inverse.
 */
const BRADFORD = [
  [0.8951, 0.2664, -0.1614],
  [-0.7502, 1.7135, 0.0367],
  [0.0389, -0.0685, 1.0296],
] as const;
const BRADFORD_INVERSE = invert(BRADFORD);

function invert(m: readonly (readonly number[])[]): number[][] {
  const [[a, b, c], [d, e, f], [g, h, i]] = m;
  const det = a * (e * i - f * h) - b * (d * i - f * g) + c * (d * h - e * g);
  return [
    [(e * i - f * h) / det, (c * h - b * i) / det, (b * f - c * e) / det],
    [(f * g - d * i) / det, (a * i - c * g) / det, (c * d - a * f) / det],
    [(d * h - e * g) / det, (b * g - a * h) / det, (a * e - b * d) / det],
  ];
}

function apply(m: readonly (readonly number[])[], v: readonly number[]): [number, number, number] {
  return [
    m[0][0] * v[0] + m[0][1] * v[1] + m[0][2] * v[2],
    m[1][0] * v[0] + m[1][1] * v[1] + m[1][2] * v[2],
    m[2][0] * v[0] + m[2][1] * v[1] + m[2][2] * v[2],
  ];
}

/** A chromatic adaptation from one white to another (Bradford, full adaptation). */
export function bradfordAdaptation(from: Xyz, to: Xyz): (xyz: Xyz) => Xyz {
  const source = apply(BRADFORD, [from.x, from.y, from.z]);
  const target = apply(BRADFORD, [to.x, to.y, to.z]);
  const gain = [target[0] / source[0], target[1] / source[1], target[2] / source[2]];
  return (xyz) => {
    const cone = apply(BRADFORD, [xyz.x, xyz.y, xyz.z]);
    const [x, y, z] = apply(BRADFORD_INVERSE, [cone[0] * gain[0], cone[1] * gain[1], cone[2] * gain[2]]);
    return { x, y, z };
  };
}

/** Scales each channel so `from` maps exactly onto `to` (used to absorb table-rounding differences). */
export function scaleWhite(from: Xyz, to: Xyz): (xyz: Xyz) => Xyz {
  const gx = to.x / from.x;
  const gy = to.y / from.y;
  const gz = to.z / from.z;
  return (xyz) => ({ x: xyz.x * gx, y: xyz.y * gy, z: xyz.z * gz });
}
