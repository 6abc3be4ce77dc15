/** Inverse of a small symmetric positive-definite matrix (Gauss–Jordan; sizes 1–3 here). */
export function invertMatrix(matrix: readonly (readonly number[])[]): number[][] {
  const n = matrix.length;
  const a = matrix.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let column = 0; column < n; column += 1) {
    let pivot = column;
    for (let row = column + 1; row < n; row += 1) if (Math.abs(a[row][column]) > Math.abs(a[pivot][column])) pivot = row;
    [a[column], a[pivot]] = [a[pivot], a[column]];
    const scale = a[column][column];
    if (scale === 0) throw new Error('singular matrix');
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

export function multiplyVector(matrix: readonly (readonly number[])[], vector: readonly number[]): number[] {
  return matrix.map((row) => row.reduce((sum, value, j) => sum + value * vector[j], 0));
}

/** xᵀ·M·x */
export function quadraticForm(matrix: readonly (readonly number[])[], vector: readonly number[]): number {
  return multiplyVector(matrix, vector).reduce((sum, value, i) => sum + value * vector[i], 0);
}
