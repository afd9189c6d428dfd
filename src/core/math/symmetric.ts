/** Dense symmetric positive-definite matrices, row-major k×k. */

/** Inverse of a symmetric positive-definite k×k matrix by Cholesky; RangeError when singular. */
export function symmetricInverse(A: Float64Array, k: number): Float64Array {
  const L = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let s = A[i * k + j];
      for (let m = 0; m < j; m++) s -= L[i * k + m] * L[j * k + m];
      if (i === j) {
        if (!(s > 1e-12 * Math.max(1, Math.abs(A[i * k + i])))) {
          throw new RangeError("the matrix is not positive definite (a pivot below 1e-12 of its diagonal)");
        }
        L[i * k + i] = Math.sqrt(s);
      } else {
        L[i * k + j] = s / L[j * k + j];
      }
    }
  }
  // inv = L⁻ᵀ L⁻¹: invert L column by column.
  const Li = new Float64Array(k * k);
  for (let c = 0; c < k; c++) {
    for (let i = c; i < k; i++) {
      let s = i === c ? 1 : 0;
      for (let m = c; m < i; m++) s -= L[i * k + m] * Li[m * k + c];
      Li[i * k + c] = s / L[i * k + i];
    }
  }
  const inv = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (let m = i; m < k; m++) s += Li[m * k + i] * Li[m * k + j];
      inv[i * k + j] = s;
      inv[j * k + i] = s;
    }
  }
  return inv;
}
