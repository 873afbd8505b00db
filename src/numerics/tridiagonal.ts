/**
 * Thomas algorithm for a tridiagonal system
 *
 *     a[i]·x[i−1] + b[i]·x[i] + c[i]·x[i+1] = d[i],   i = 0 … n−1   (a[0] and c[n−1] unused)
 *
 * Gaussian elimination without pivoting, O(n) (L.H. Thomas 1949 — common practice; citation from
 * memory). Stable when the matrix is diagonally dominant,
 * which the conduction matrices here always are (b ≥ |a| + |c| since the capacity term is > 0).
 * Allocation-free: `scratch` (length ≥ n) holds the modified super-diagonal. Returns `x`.
 */
export function solveTridiagonal(
  n: number,
  a: Float64Array,
  b: Float64Array,
  c: Float64Array,
  d: Float64Array,
  x: Float64Array,
  scratch: Float64Array,
): Float64Array {
  let beta = b[0];
  scratch[0] = c[0] / beta;
  x[0] = d[0] / beta;
  for (let i = 1; i < n; i++) {
    const ai = a[i];
    beta = b[i] - ai * scratch[i - 1];
    scratch[i] = c[i] / beta;
    x[i] = (d[i] - ai * x[i - 1]) / beta;
  }
  for (let i = n - 2; i >= 0; i--) x[i] -= scratch[i] * x[i + 1];
  return x;
}
