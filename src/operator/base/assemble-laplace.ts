/**
 * CSR assembly of the 2-D five-point operator on the interior unknowns of a
 * rectangle with prescribed (Dirichlet) values on its edge. No checks: the
 * caller sizes the arrays with {@link laplace5Nnz} first.
 *
 * Unknown (i, j), 0 ≤ i < nx, 0 ≤ j < ny, is row and column i·ny + j (x
 * slowest). Row (i, j) holds cx at (i ± 1, j), cy at (i, j ± 1) and c0 on the
 * diagonal, columns ascending; a neighbour on the edge is left out, which is
 * the zero Dirichlet condition eliminated (for non-zero edge values the
 * caller moves cx·g or cy·g to the right-hand side). With cx = 1/dx²,
 * cy = 1/dy², c0 = −2(cx + cy) this is the matrix of the five-point Δ,
 * symmetric and negative definite; negate the coefficients for −Δ.
 * Source: LeVeque, R. J. (2007). Finite Difference Methods for Ordinary and
 * Partial Differential Equations. SIAM, §3.3 (the five-point matrix and how
 * the ordering of the unknowns shapes it).
 *
 * @module
 */

/**
 * Entries of the five-point matrix on nx × ny interior unknowns:
 * 5·nx·ny − 2nx − 2ny (0 when either count is 0).
 *
 * @param nx - interior unknowns along x
 * @param ny - interior unknowns along y
 * @returns the number of stored entries
 */
export function laplace5Nnz(nx: number, ny: number): number {
  if (nx <= 0 || ny <= 0) return 0;
  return 5 * nx * ny - 2 * nx - 2 * ny;
}

/**
 * Fills `rowPtr` (nx·ny + 1 entries), `colIdx` and `values`
 * ({@link laplace5Nnz} entries each) with the five-point matrix in one pass,
 * allocating nothing. Column indices within each row ascend, as sorted CSR
 * requires.
 *
 * @param nx - interior unknowns along x (slowest)
 * @param ny - interior unknowns along y (fastest)
 * @param cx - entry of the two x neighbours (1/dx² for Δ, 1/m²)
 * @param cy - entry of the two y neighbours (1/dy² for Δ, 1/m²)
 * @param c0 - diagonal entry (−2(cx + cy) for Δ)
 * @param rowPtr - out: row starts, length ≥ nx·ny + 1
 * @param colIdx - out: column of each entry
 * @param values - out: value of each entry
 * @returns the number of entries written, rowPtr[nx·ny]
 */
export function assembleLaplace5(
  nx: number, ny: number, cx: number, cy: number, c0: number,
  rowPtr: Int32Array, colIdx: Int32Array, values: Float64Array,
): number {
  const wx = +cx;
  const wy = +cy;
  const wc = +c0;
  let p = 0;
  let r = 0;
  rowPtr[0] = 0;
  if (nx <= 0 || ny <= 0) return 0;
  for (let i = 0; i < nx; i++) {
    const up = i > 0;
    const down = i < nx - 1;
    for (let j = 0; j < ny; j++) {
      if (up) {
        colIdx[p] = r - ny;
        values[p] = wx;
        p++;
      }
      if (j > 0) {
        colIdx[p] = r - 1;
        values[p] = wy;
        p++;
      }
      colIdx[p] = r;
      values[p] = wc;
      p++;
      if (j < ny - 1) {
        colIdx[p] = r + 1;
        values[p] = wy;
        p++;
      }
      if (down) {
        colIdx[p] = r + ny;
        values[p] = wx;
        p++;
      }
      r++;
      rowPtr[r] = p;
    }
  }
  return p;
}
