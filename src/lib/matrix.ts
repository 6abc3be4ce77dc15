/**
 * Small dense matrices, row-major: the 3×3 changes between colour spaces (src/lib/colour/) and the
 * normal equations of the growth fit (src/lib/tint/fit.ts, sizes 1–3). Pure arithmetic.
 */
export type Vector3 = readonly [number, number, number];
export type Matrix3 = readonly [Vector3, Vector3, Vector3];
type Matrix = readonly (readonly number[])[];

export const IDENTITY: Matrix3 = [
  [1, 0, 0],
  [0, 1, 0],
  [0, 0, 1],
];

/** Matrix × column vector. */
export function applyMatrix(matrix: Matrix3, vector: readonly number[]): [number, number, number];
export function applyMatrix(matrix: Matrix, vector: readonly number[]): number[];
export function applyMatrix(matrix: Matrix, vector: readonly number[]): number[] {
  return matrix.map((row) => row.reduce((sum, value, j) => sum + value * vector[j], 0));
}

/** xᵀ·M·x */
export function quadraticForm(matrix: Matrix, vector: readonly number[]): number {
  return applyMatrix(matrix, vector).reduce((sum, value, i) => sum + value * vector[i], 0);
}

export function multiplyMatrices(left: Matrix3, right: Matrix3): Matrix3 {
  const cell = (row: number, column: number) => left[row][0] * right[0][column] + left[row][1] * right[1][column] + left[row][2] * right[2][column];
  return [
    [cell(0, 0), cell(0, 1), cell(0, 2)],
    [cell(1, 0), cell(1, 1), cell(1, 2)],
    [cell(2, 0), cell(2, 1), cell(2, 2)],
  ];
}

export function diagonal(values: readonly number[]): Matrix3 {
  return [
    [values[0], 0, 0],
    [0, values[1], 0],
    [0, 0, values[2]],
  ];
}

/** The inverse of a square matrix, by Gauss–Jordan elimination with partial pivoting. */
export function invertMatrix(matrix: Matrix3): Matrix3;
export function invertMatrix(matrix: Matrix): number[][];
export function invertMatrix(matrix: Matrix): Matrix {
  const n = matrix.length;
  const a = matrix.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let column = 0; column < n; column += 1) {
    let pivot = column;
    for (let row = column + 1; row < n; row += 1) if (Math.abs(a[row][column]) > Math.abs(a[pivot][column])) pivot = row;
    [a[column], a[pivot]] = [a[pivot], a[column]];
    const scale = a[column][column];
    if (scale === 0) throw new RangeError('The matrix has no inverse');
    for (let j = 0; j < 2 * n; j += 1) a[column][j] /= scale;
    for (let row = 0; row < n; row += 1) {
      if (row === column) continue;
      const factor = a[row][column];
      if (factor === 0) continue;
      for (let j = 0; j < 2 * n; j += 1) a[row][j] -= factor * a[column][j];
    }
  }
  return a.map((row) => row.slice(n));
}

/** The matrix whose columns are `transform` applied to the unit vectors (for a linear transform). */
export function matrixOf(transform: (vector: Vector3) => Vector3): Matrix3 {
  const columns = [transform([1, 0, 0]), transform([0, 1, 0]), transform([0, 0, 1])];
  return [0, 1, 2].map((row) => [columns[0][row], columns[1][row], columns[2][row]]) as unknown as Matrix3;
}
