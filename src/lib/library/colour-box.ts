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
 * The denominators vanish near t = 16 (L: 133); beyond `MAX_BOXED_DELTA_E` the box is the whole
 * space (null). Colour search caps its limit well below.
 */
export const MAX_BOXED_DELTA_E = 15;

export interface LabBox {
  l: [number, number];
  a: [number, number];
  b: [number, number];
}

export function deltaE00Box(centre: Lab, t: number): LabBox | null {
  if (!(t >= 0) || t > MAX_BOXED_DELTA_E) return null;
  const k = 1 + Math.sqrt(3);
  const dL = (t * (1 + 0.015 * Math.abs(centre.l - 50))) / (1 - 0.0075 * t);
  const chromaMax = Math.hypot(1.5 * centre.a, centre.b);
  const dAb = (k * t * (1 + 0.045 * chromaMax)) / (1 - 0.0225 * k * t);
  return {
    l: [centre.l - dL, centre.l + dL],
    a: [centre.a - dAb, centre.a + dAb],
    b: [centre.b - dAb, centre.b + dAb],
  };
}

export const insideBox = (box: LabBox, lab: Lab) =>
  lab.l >= box.l[0] && lab.l <= box.l[1] && lab.a >= box.a[0] && lab.a <= box.a[1] && lab.b >= box.b[0] && lab.b <= box.b[1];
