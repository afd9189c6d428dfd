/**
 * Smallest root modulus of a lag polynomial, to keep the order search away from models on the
 * edge of stationarity or invertibility, whose forecasts and intervals are unreliable and whose
 * AR and MA factors nearly cancel (Hyndman & Khandakar, 2008, §3.2, refuse such models too).
 */
import { EigenvalueDecomposition, Matrix } from "ml-matrix";

/**
 * Roots of 1 − c₁x − … − c_m x^m are the reciprocals of the eigenvalues of the companion
 * matrix with first row c, so the smallest root modulus is 1 / (largest eigenvalue modulus).
 * `sign` = −1 reads MA coefficients (1 + θ₁x + …). Infinity for an empty polynomial.
 */
export function smallestRootModulus(coefs: ArrayLike<number>, sign: 1 | -1 = 1): number {
  let m = coefs.length;
  while (m > 0 && coefs[m - 1] === 0) m--;
  if (m === 0) return Infinity;
  if (m === 1) return 1 / Math.abs(coefs[0]);
  const C = Matrix.zeros(m, m);
  for (let j = 0; j < m; j++) C.set(0, j, sign * coefs[j]);
  for (let i = 1; i < m; i++) C.set(i, i - 1, 1);
  const eig = new EigenvalueDecomposition(C);
  let largest = 0;
  const re = eig.realEigenvalues;
  const im = eig.imaginaryEigenvalues;
  for (let i = 0; i < m; i++) largest = Math.max(largest, Math.hypot(re[i], im[i]));
  return largest > 0 ? 1 / largest : Infinity;
}
