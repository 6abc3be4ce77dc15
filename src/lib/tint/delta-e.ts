import type { Lab } from './colour';

const DEG = Math.PI / 180;
const POW25_7 = 25 ** 7;

/**
 * CIEDE2000 colour difference of two CIELAB colours (kL = kC = kH = 1), following the
 * implementation notes of Sharma, Wu & Dalal, Color Res. Appl. 30(1):21–30 (2005), eqs. 1–22.
 * Written out here (no allocation) because the inverse and the planner call it many times.
 */
export function deltaE2000(first: Lab, second: Lab): number {
  const { l: l1, a: a1, b: b1 } = first;
  const { l: l2, a: a2, b: b2 } = second;
  const c1 = Math.hypot(a1, b1);
  const c2 = Math.hypot(a2, b2);
  const cMean7 = ((c1 + c2) / 2) ** 7;
  const g = 0.5 * (1 - Math.sqrt(cMean7 / (cMean7 + POW25_7)));
  const a1p = (1 + g) * a1;
  const a2p = (1 + g) * a2;
  const c1p = Math.hypot(a1p, b1);
  const c2p = Math.hypot(a2p, b2);
  const h1p = hueAngle(b1, a1p);
  const h2p = hueAngle(b2, a2p);

  const dLp = l2 - l1;
  const dCp = c2p - c1p;
  let dhp = 0;
  if (c1p * c2p !== 0) {
    dhp = h2p - h1p;
    if (dhp > 180) dhp -= 360;
    else if (dhp < -180) dhp += 360;
  }
  const dHp = 2 * Math.sqrt(c1p * c2p) * Math.sin((dhp / 2) * DEG);

  const lMean = (l1 + l2) / 2;
  const cMeanP = (c1p + c2p) / 2;
  let hMeanP = h1p + h2p;
  if (c1p * c2p !== 0) {
    if (Math.abs(h1p - h2p) <= 180) hMeanP = (h1p + h2p) / 2;
    else hMeanP = h1p + h2p < 360 ? (h1p + h2p + 360) / 2 : (h1p + h2p - 360) / 2;
  }

  const t =
    1 -
    0.17 * Math.cos((hMeanP - 30) * DEG) +
    0.24 * Math.cos(2 * hMeanP * DEG) +
    0.32 * Math.cos((3 * hMeanP + 6) * DEG) -
    0.2 * Math.cos((4 * hMeanP - 63) * DEG);
  const dTheta = 30 * Math.exp(-(((hMeanP - 275) / 25) ** 2));
  const cMeanP7 = cMeanP ** 7;
  const rc = 2 * Math.sqrt(cMeanP7 / (cMeanP7 + POW25_7));
  const lOffset = (lMean - 50) ** 2;
  const sl = 1 + (0.015 * lOffset) / Math.sqrt(20 + lOffset);
  const sc = 1 + 0.045 * cMeanP;
  const sh = 1 + 0.015 * cMeanP * t;
  const rt = -Math.sin(2 * dTheta * DEG) * rc;

  const dl = dLp / sl;
  const dc = dCp / sc;
  const dh = dHp / sh;
  return Math.sqrt(dl * dl + dc * dc + dh * dh + rt * dc * dh);
}

function hueAngle(b: number, aPrime: number): number {
  if (b === 0 && aPrime === 0) return 0;
  const h = Math.atan2(b, aPrime) / DEG;
  return h < 0 ? h + 360 : h;
}

/** CIE 1976 ΔE*ab: Euclidean distance in CIELAB (used as a cheap first pass before ΔE00). */
export function deltaE1976(first: Lab, second: Lab): number {
  return Math.hypot(first.l - second.l, first.a - second.a, first.b - second.b);
}
