/**
 * Compressed sparse row (CSR) matrix–vector product. No checks, no
 * allocation: the public operator layer validates first.
 *
 * Row i of an n-row matrix holds the entries k = rowPtr[i] … rowPtr[i+1] − 1,
 * entry k being `values[k]` in column `colIdx[k]`. Source: the CSR (Yale)
 * format as defined in Saad, Y. (2003). Iterative Methods for Sparse Linear
 * Systems, 2nd ed. SIAM, §3.4.
 *
 * @module
 */

/**
 * y = A·x for the n-row CSR matrix A:
 *
 * y[i] = Σₖ values[k] · x[colIdx[k]],  k = rowPtr[i] … rowPtr[i+1] − 1,
 *
 * summed in storage order starting from 0 (the order of a plain loop, and of
 * scipy's `csr_matvec`), so the result does not depend on the code path.
 * Element c of x is `x[ox + c·sx]`, element i of y is `y[oy + i·sy]`; strides
 * may be negative. y must not overlap x. Rows without entries give 0; NaN in
 * x or values gives NaN in the rows that reach it.
 *
 * @param n - number of rows
 * @param rowPtr - n + 1 row starts, non-decreasing; read only
 * @param colIdx - column of each entry; read only
 * @param values - value of each entry; read only
 * @param x - input vector; read only
 * @param sx - stride of x
 * @param ox - index of element 0 of x
 * @param y - output vector, all n elements written
 * @param sy - stride of y
 * @param oy - index of element 0 of y
 * @returns `y`
 */
export function csrMatVec(
  n: number, rowPtr: Int32Array, colIdx: Int32Array, values: Float64Array,
  x: Float64Array, sx: number, ox: number,
  y: Float64Array, sy: number, oy: number,
): Float64Array {
  if (sx === 1 && ox === 0) contiguous(n, rowPtr, colIdx, values, x, y, sy, oy);
  else strided(n, rowPtr, colIdx, values, x, sx, ox, y, sy, oy);
  return y;
}

/**
 * Unit-stride x, two rows per iteration. V8 re-checks every typed array once
 * per loop iteration and a loop over a row's few entries pays that per entry,
 * so rows of the lengths finite-difference operators have (3: 1-D, 5: 2-D
 * five-point, 7: 3-D seven-point, 9: 2-D nine-point) are summed in
 * straight-line code when both rows of the pair share the length; any other
 * pair takes the loop. Both paths add in the same order.
 */
function contiguous(
  n: number, rowPtr: Int32Array, colIdx: Int32Array, values: Float64Array,
  x: Float64Array, y: Float64Array, sy: number, oy: number,
): void {
  const sy2 = 2 * sy;
  let start = rowPtr[0];
  let iy = oy;
  let i = 0;
  if ((n & 1) !== 0) {
    // The odd row goes first: code after the hot loop would be compiled (on
    // stack replacement, during the first call) before it ever ran, and would
    // then deoptimise at the end of every later call.
    const end = rowPtr[1];
    let s = 0;
    for (let k = start; k < end; k++) s += values[k] * x[colIdx[k]];
    y[iy] = s;
    start = end;
    iy += sy;
    i = 1;
  }
  for (; i < n; i += 2) {
    const mid = rowPtr[i + 1];
    const end = rowPtr[i + 2];
    const len = (mid - start) | 0;
    let s = 0;
    let t = 0;
    straight: {
      if (((end - mid) | 0) !== len) break straight;
      const a = start;
      const b = mid;
      switch (len) {
        case 3:
          s = 0 + values[a] * x[colIdx[a]] + values[(a + 1) | 0] * x[colIdx[(a + 1) | 0]]
            + values[(a + 2) | 0] * x[colIdx[(a + 2) | 0]];
          t = 0 + values[b] * x[colIdx[b]] + values[(b + 1) | 0] * x[colIdx[(b + 1) | 0]]
            + values[(b + 2) | 0] * x[colIdx[(b + 2) | 0]];
          break;
        case 5:
          s = 0 + values[a] * x[colIdx[a]] + values[(a + 1) | 0] * x[colIdx[(a + 1) | 0]]
            + values[(a + 2) | 0] * x[colIdx[(a + 2) | 0]] + values[(a + 3) | 0] * x[colIdx[(a + 3) | 0]]
            + values[(a + 4) | 0] * x[colIdx[(a + 4) | 0]];
          t = 0 + values[b] * x[colIdx[b]] + values[(b + 1) | 0] * x[colIdx[(b + 1) | 0]]
            + values[(b + 2) | 0] * x[colIdx[(b + 2) | 0]] + values[(b + 3) | 0] * x[colIdx[(b + 3) | 0]]
            + values[(b + 4) | 0] * x[colIdx[(b + 4) | 0]];
          break;
        case 7:
          s = 0 + values[a] * x[colIdx[a]] + values[(a + 1) | 0] * x[colIdx[(a + 1) | 0]]
            + values[(a + 2) | 0] * x[colIdx[(a + 2) | 0]] + values[(a + 3) | 0] * x[colIdx[(a + 3) | 0]]
            + values[(a + 4) | 0] * x[colIdx[(a + 4) | 0]] + values[(a + 5) | 0] * x[colIdx[(a + 5) | 0]]
            + values[(a + 6) | 0] * x[colIdx[(a + 6) | 0]];
          t = 0 + values[b] * x[colIdx[b]] + values[(b + 1) | 0] * x[colIdx[(b + 1) | 0]]
            + values[(b + 2) | 0] * x[colIdx[(b + 2) | 0]] + values[(b + 3) | 0] * x[colIdx[(b + 3) | 0]]
            + values[(b + 4) | 0] * x[colIdx[(b + 4) | 0]] + values[(b + 5) | 0] * x[colIdx[(b + 5) | 0]]
            + values[(b + 6) | 0] * x[colIdx[(b + 6) | 0]];
          break;
        case 9:
          s = 0 + values[a] * x[colIdx[a]] + values[(a + 1) | 0] * x[colIdx[(a + 1) | 0]]
            + values[(a + 2) | 0] * x[colIdx[(a + 2) | 0]] + values[(a + 3) | 0] * x[colIdx[(a + 3) | 0]]
            + values[(a + 4) | 0] * x[colIdx[(a + 4) | 0]] + values[(a + 5) | 0] * x[colIdx[(a + 5) | 0]]
            + values[(a + 6) | 0] * x[colIdx[(a + 6) | 0]] + values[(a + 7) | 0] * x[colIdx[(a + 7) | 0]]
            + values[(a + 8) | 0] * x[colIdx[(a + 8) | 0]];
          t = 0 + values[b] * x[colIdx[b]] + values[(b + 1) | 0] * x[colIdx[(b + 1) | 0]]
            + values[(b + 2) | 0] * x[colIdx[(b + 2) | 0]] + values[(b + 3) | 0] * x[colIdx[(b + 3) | 0]]
            + values[(b + 4) | 0] * x[colIdx[(b + 4) | 0]] + values[(b + 5) | 0] * x[colIdx[(b + 5) | 0]]
            + values[(b + 6) | 0] * x[colIdx[(b + 6) | 0]] + values[(b + 7) | 0] * x[colIdx[(b + 7) | 0]]
            + values[(b + 8) | 0] * x[colIdx[(b + 8) | 0]];
          break;
        default:
          break straight;
      }
      y[iy] = s;
      y[iy + sy] = t;
      start = end;
      iy += sy2;
      continue;
    }
    for (let k = start; k < mid; k++) s += values[k] * x[colIdx[k]];
    for (let k = mid; k < end; k++) t += values[k] * x[colIdx[k]];
    y[iy] = s;
    y[iy + sy] = t;
    start = end;
    iy += sy2;
  }
}

/** Any stride and offset of x: one row at a time, one loop per row. */
function strided(
  n: number, rowPtr: Int32Array, colIdx: Int32Array, values: Float64Array,
  x: Float64Array, sx: number, ox: number,
  y: Float64Array, sy: number, oy: number,
): void {
  let start = rowPtr[0];
  let iy = oy;
  for (let i = 0; i < n; i++) {
    const end = rowPtr[i + 1];
    let s = 0;
    for (let k = start; k < end; k++) s += values[k] * x[ox + colIdx[k] * sx];
    y[iy] = s;
    start = end;
    iy += sy;
  }
}
