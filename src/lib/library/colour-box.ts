import type { Lab } from '~/lib/colour';

/**
 * A box in CIELAB that contains every colour within a CIEDE2000 distance `t` of `centre`, so
 * the database can narrow colour search by an index on (L*, a*, b*) before the exact ΔE00.
 *
 * Derivation (kL = kC = kH = 1; notation of Sharma, Wu & Dalal 2005, eqs. 1–22). Write
 * x = ΔC'/SC and y = ΔH'/SH. Then ΔE00² = (ΔL'/SL)² + x² + y² + RT·x·y, and
 * |RT| = |sin(2Δθ)|·RC ≤ sin 60°·2 = √3 because Δθ ≤ 30° and RC ≤ 2. With |x·y| ≤ (x² + y²)/2,
 *   x² + y² + RT·x·y ≥ (1 − √3/2)(x² + y²) ≥ 0,
 * so ΔE00 ≤ t gives both
 *   (1) |ΔL'| ≤ t·SL, and
 *   (2) √(x² + y²) ≤ t/√(1 − √3/2) = (1 + √3)·t.
 *
 * Lightness: L' = L*, and SL = 1 + 0.015(L̄ − 50)²/√(20 + (L̄ − 50)²) ≤ 1 + 0.015·|L̄ − 50|
 * with L̄ = the mean of both L*, so |L̄ − 50| ≤ |L1 − 50| + |ΔL|/2. Put into (1):
 *   |ΔL*| ≤ t·(1 + 0.015·|L1 − 50|) / (1 − 0.0075·t).
 *
 * Chroma plane: ΔC'² + ΔH'² is the squared Euclidean distance d' between the two colours in the
 * (a', b) plane (ΔH' = 2√(C1'C2')·sin(Δh'/2), and the law of cosines). SH = 1 + 0.015·C̄'·T with
 * T ≤ 1 + 0.17 + 0.24 + 0.32 + 0.20 = 1.93, so SH < SC = 1 + 0.045·C̄', and (2) gives
 * d' ≤ SC·(1 + √3)·t. By the triangle inequality C2' ≤ C1' + d', so C̄' ≤ C1' + d'/2, and with
 * k = 1 + √3:  d' ≤ k·t·(1 + 0.045·C1') / (1 − 0.0225·k·t).
 * Both colours share one G (it depends on the pair's mean chroma), a' = (1 + G)·a with G ≥ 0,
 * so |Δa*| = |Δa'|/(1 + G) ≤ d' and |Δb*| = |Δb'| ≤ d'. C1' is unknown before the pair is, but
 * G ≤ 0.5 bounds it: C1' ≤ √((1.5·a1)² + b1²).
 *
 * Tighter where the cross term is small. |RT| = |sin(2Δθ)|·RC with RC = 2√(C̄'^7/(C̄'^7 + 25^7))
 * rising with C̄' ≤ C1' + d'/2, and Δθ = 30°·exp(−((h̄' − 275°)/25°)²) falling with the distance
 * of the mean hue h̄' from 275°. h̄' is the middle of the shorter arc between the two hues, so it
 * lies within 90° of h1' (when C1' > 0), and within asin(d'/C1')/2 of it when d' < C1' (the second
 * colour is then seen from the origin within asin(d'/C1') of the first). h1' itself lies between
 * its values at G = 0 and G = 0.5 (atan2(b, s·a) is monotonic in s > 0). With R ≥ |RT| so bounded,
 * x² + y² + RT·x·y ≥ (1 − R/2)(x² + y²) ≥ (1 − R/2)·d'²/SC², and ΔE00 ≤ t gives
 *   d' ≤ t·(1 + 0.045·C1') / (√(1 − R/2) − 0.0225·t),
 * R = √3 being the bound above. Each bound on d' gives a bound on R and so a new bound on d', every
 * one of them true; the box takes the smallest after a few rounds.
 *
 * The denominators vanish near t = 16 (L: 133); beyond `MAX_BOXED_DELTA_E` the box is the whole
 * space (null). Colour search caps its limit well below.
 */
export const MAX_BOXED_DELTA_E = 15;

export interface LabBox {
  l: [number, number];
  a: [number, number];
  b: [number, number];
}

const degrees = (radians: number) => (radians * 180) / Math.PI;
const hueOf = (a: number, b: number) => (degrees(Math.atan2(b, a)) + 360) % 360;
/** The shorter way round between two hues, in degrees (0–180). */
const hueDistance = (x: number, y: number) => 180 - Math.abs(180 - Math.abs(x - y));

/** The largest |sin 2Δθ| for a mean hue within `halfWidth` degrees of the arc from h0 to h1 (the shorter way). */
function rotationBound(h0: number, h1: number, halfWidth: number): number {
  const arcWidth = hueDistance(h0, h1);
  const middle = (h0 + (((h1 - h0 + 540) % 360) - 180) / 2 + 360) % 360;
  const distance = Math.max(0, hueDistance(middle, 275) - arcWidth / 2 - halfWidth);
  const deltaTheta = 30 * Math.exp(-((distance / 25) ** 2));
  return Math.sin((2 * deltaTheta * Math.PI) / 180);
}

/** RC at the largest mean chroma C̄' can have. */
const rcBound = (chroma: number) => (Number.isFinite(chroma) ? 2 * Math.sqrt(chroma ** 7 / (chroma ** 7 + 25 ** 7)) : 2);

/** The largest Euclidean distance in the (a', b) plane of a colour within ΔE00 `t` of `centre`. */
export function chromaPlaneRadius(centre: Lab, t: number): number {
  const chromaMax = Math.hypot(1.5 * centre.a, centre.b);
  const chromaMin = Math.hypot(centre.a, centre.b);
  const hueAtG0 = hueOf(centre.a, centre.b);
  const hueAtG05 = hueOf(1.5 * centre.a, centre.b);
  let radius = Infinity;
  for (let round = 0; round < 12; round += 1) {
    const halfWidth = radius < chromaMin ? degrees(Math.asin(radius / chromaMin)) / 2 : 90;
    const rotation = chromaMin > 0 ? rotationBound(hueAtG0, hueAtG05, halfWidth) : Math.sin(Math.PI / 3);
    const crossBound = rotation * rcBound(chromaMax + radius / 2);
    const denominator = Math.sqrt(1 - crossBound / 2) - 0.0225 * t;
    if (denominator <= 0) break;
    const next = (t * (1 + 0.045 * chromaMax)) / denominator;
    if (next >= radius) break;
    radius = next;
  }
  // A hair wider, against rounding in the arithmetic above.
  return radius * (1 + 1e-9) + 1e-9;
}

export function deltaE00Box(centre: Lab, t: number): LabBox | null {
  if (!(t >= 0) || t > MAX_BOXED_DELTA_E) return null;
  const dL = ((t * (1 + 0.015 * Math.abs(centre.l - 50))) / (1 - 0.0075 * t)) * (1 + 1e-9) + 1e-9;
  const dAb = chromaPlaneRadius(centre, t);
  if (!Number.isFinite(dAb)) return null;
  return {
    l: [centre.l - dL, centre.l + dL],
    a: [centre.a - dAb, centre.a + dAb],
    b: [centre.b - dAb, centre.b + dAb],
  };
}

export const insideBox = (box: LabBox, lab: Lab) =>
  lab.l >= box.l[0] && lab.l <= box.l[1] && lab.a >= box.a[0] && lab.a <= box.a[1] && lab.b >= box.b[0] && lab.b <= box.b[1];

/** The steps of the swatches' colour cells, as their generated columns lab_l_cell and lab_a_cell compute them. */
export const LAB_CELL = { l: 2, a: 4 } as const;

/** Colour search reads the index as one range of b* per (L*, a*) cell up to this many cells, else per L* cell. */
export const MAX_CELL_RANGES = 600;

const cellsOf = (range: [number, number], step: number) => {
  const first = Math.floor(range[0] / step);
  return Array.from({ length: Math.floor(range[1] / step) - first + 1 }, (_, k) => first + k);
};

/**
 * The colour cells a box touches: every colour inside it has floor(L* ÷ 2) among `l` and
 * floor(a* ÷ 4) among `a` (floor is monotonic, and halving or quartering a double is exact).
 */
export function boxCells(box: LabBox): { l: number[]; a: number[] } {
  return { l: cellsOf(box.l, LAB_CELL.l), a: cellsOf(box.a, LAB_CELL.a) };
}
