/** 3×3 matrices as row-major tuples, for colour-space changes. */
export type Vector3 = readonly [number, number, number];
export type Matrix3 = readonly [Vector3, Vector3, Vector3];

export const IDENTITY: Matrix3 = [
  [1, 0, 0],
  [0, 1, 0],
  [0, 0, 1],
];

export function applyMatrix(matrix: Matrix3, vector: Vector3): [number, number, number] {
  return [0, 1, 2].map((row) => matrix[row][0] * vector[0] + matrix[row][1] * vector[1] + matrix[row][2] * vector[2]) as [number, number, number];
}

export function multiplyMatrices(left: Matrix3, right: Matrix3): Matrix3 {
  const cell = (row: number, column: number) => left[row][0] * right[0][column] + left[row][1] * right[1][column] + left[row][2] * right[2][column];
  return [
    [cell(0, 0), cell(0, 1), cell(0, 2)],
    [cell(1, 0), cell(1, 1), cell(1, 2)],
    [cell(2, 0), cell(2, 1), cell(2, 2)],
  ];
}

export function diagonal(values: Vector3): Matrix3 {
  return [
    [values[0], 0, 0],
    [0, values[1], 0],
    [0, 0, values[2]],
  ];
}

export function invertMatrix(m: Matrix3): Matrix3 {
  const [[a, b, c], [d, e, f], [g, h, i]] = m;
  const cofactor00 = e * i - f * h;
  const cofactor01 = f * g - d * i;
  const cofactor02 = d * h - e * g;
  const determinant = a * cofactor00 + b * cofactor01 + c * cofactor02;
  if (determinant === 0) throw new RangeError('The matrix has no inverse');
  const k = 1 / determinant;
  return [
    [cofactor00 * k, (c * h - b * i) * k, (b * f - c * e) * k],
    [cofactor01 * k, (a * i - c * g) * k, (c * d - a * f) * k],
    [cofactor02 * k, (b * g - a * h) * k, (a * e - b * d) * k],
  ];
}

/** The matrix whose columns are `transform` applied to the unit vectors (for a linear transform). */
export function matrixOf(transform: (vector: Vector3) => Vector3): Matrix3 {
  const columns = [transform([1, 0, 0]), transform([0, 1, 0]), transform([0, 0, 1])];
  return [0, 1, 2].map((row) => [columns[0][row], columns[1][row], columns[2][row]]) as unknown as Matrix3;
}
