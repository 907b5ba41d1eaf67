/**
 * Compressed sparse row (CSR) matrices: the explicit form of every operator.
 *
 * Row r holds the column indices `colIdx[rowPtr[r] … rowPtr[r+1]−1]`, strictly
 * ascending, and their values at the same positions. This is the classical
 * CSR (Yale) layout; see Saad, Y. (2003). Iterative Methods for Sparse Linear
 * Systems, 2nd ed., SIAM, §3.4.
 *
 * @module
 */
import { ShapeMismatchError } from '../errors.js';
import { csrMatVec } from './base/csr.js';
import { csrRunsMatVec, findCsrRuns } from './base/csr-runs.js';

/** A sparse matrix in compressed sparse row form. */
export interface CsrMatrix {
  /** Number of rows. */
  readonly rows: number;
  /** Number of columns. */
  readonly cols: number;
  /** Row starts, length rows + 1; rowPtr[rows] is the number of stored entries. */
  readonly rowPtr: Int32Array;
  /** Column of each stored entry, ascending within a row. */
  readonly colIdx: Int32Array;
  /** Value of each stored entry. */
  readonly values: Float64Array;
}

/**
 * Row-by-row CSR assembly: `add(col, v)` any number of times, then
 * `endRow()`. Entries of a row are sorted and duplicates summed at `endRow`.
 * Storage grows geometrically; `finish()` trims it. Internal.
 *
 * @internal
 */
export class CsrBuilder {
  private ptr: Int32Array;
  private col: Int32Array;
  private val: Float64Array;
  private nnz = 0;
  private row = 0;
  private rowStart = 0;

  constructor(readonly rows: number, readonly cols: number, nnzGuess = rows * 5) {
    this.ptr = new Int32Array(rows + 1);
    const cap = Math.max(16, nnzGuess);
    this.col = new Int32Array(cap);
    this.val = new Float64Array(cap);
  }

  /** Adds v at (current row, c); repeated columns are summed. */
  add(c: number, v: number): void {
    if (this.nnz === this.col.length) {
      const cap = this.col.length * 2;
      const nc = new Int32Array(cap);
      nc.set(this.col);
      const nv = new Float64Array(cap);
      nv.set(this.val);
      this.col = nc;
      this.val = nv;
    }
    this.col[this.nnz] = c;
    this.val[this.nnz] = v;
    this.nnz++;
  }

  /** Closes the current row: sorts its entries by column and sums duplicates. */
  endRow(): void {
    const s = this.rowStart;
    const e = this.nnz;
    const col = this.col;
    const val = this.val;
    // insertion sort: rows hold a handful of entries
    for (let a = s + 1; a < e; a++) {
      const c = col[a];
      const v = val[a];
      let b = a - 1;
      while (b >= s && col[b] > c) {
        col[b + 1] = col[b];
        val[b + 1] = val[b];
        b--;
      }
      col[b + 1] = c;
      val[b + 1] = v;
    }
    let w = s;
    for (let a = s; a < e; a++) {
      if (w > s && col[w - 1] === col[a]) val[w - 1] += val[a];
      else {
        col[w] = col[a];
        val[w] = val[a];
        w++;
      }
    }
    this.nnz = w;
    this.row++;
    this.ptr[this.row] = w;
    this.rowStart = w;
  }

  /**
   * The finished matrix; every row must have been closed. Storage at least
   * 7/8 full is handed over as views (no copy, so assembly peaks at its
   * arrays plus at most 1/7 of them); emptier storage is trimmed by a copy.
   */
  finish(): CsrMatrix {
    const full = 8 * this.nnz >= 7 * this.col.length;
    return {
      rows: this.rows,
      cols: this.cols,
      rowPtr: this.ptr,
      colIdx: full ? this.col.subarray(0, this.nnz) : this.col.slice(0, this.nnz),
      values: full ? this.val.subarray(0, this.nnz) : this.val.slice(0, this.nnz),
    };
  }
}

/** y = A x over plain arrays, by the tuned strided kernel (unit strides). No checks. @internal */
export function csrMultiply(a: CsrMatrix, x: Float64Array, y: Float64Array): Float64Array {
  return csrMatVec(a.rows, a.rowPtr, a.colIdx, a.values, x, 1, 0, y, 1, 0);
}

/**
 * The repeated product y = A x of one matrix whose arrays no longer change:
 * the first call goes through the CSR arrays; the second inspects the matrix
 * for stencil runs (`findCsrRuns`, O(nnz), once) and, when runs cover at
 * least half the rows, that call and every later one use them. Bit-for-bit
 * the plain CSR product either way. No checks; y must not overlap x.
 *
 * @internal
 */
export function csrKernel(a: CsrMatrix): (x: Float64Array, y: Float64Array) => Float64Array {
  const { rows, rowPtr, colIdx, values } = a;
  let calls = 0;
  let product = (x: Float64Array, y: Float64Array): Float64Array => {
    if (++calls >= 2) {
      const runs = findCsrRuns(rows, rowPtr, colIdx, values);
      product = 2 * runs.covered >= rows
        ? (u, v) => csrRunsMatVec(runs, rows, rowPtr, colIdx, values, u, v)
        : (u, v) => csrMatVec(rows, rowPtr, colIdx, values, u, 1, 0, v, 1, 0);
      return product(x, y);
    }
    return csrMatVec(rows, rowPtr, colIdx, values, x, 1, 0, y, 1, 0);
  };
  return (x, y) => product(x, y);
}

/**
 * The transpose Aᵀ, by one counting pass over the columns (O(nnz)).
 *
 * @param a - the matrix
 * @returns a new CSR matrix with rows and columns exchanged
 */
export function csrTranspose(a: CsrMatrix): CsrMatrix {
  const { rows, cols, rowPtr, colIdx, values } = a;
  const nnz = rowPtr[rows]!;
  const ptr = new Int32Array(cols + 1);
  for (let p = 0; p < nnz; p++) ptr[colIdx[p]! + 1]!++;
  for (let c = 0; c < cols; c++) ptr[c + 1]! += ptr[c]!;
  const next = ptr.slice(0, cols);
  const ci = new Int32Array(nnz);
  const cv = new Float64Array(nnz);
  for (let r = 0; r < rows; r++) {
    for (let p = rowPtr[r]!; p < rowPtr[r + 1]!; p++) {
      const c = colIdx[p]!;
      const q = next[c]!++;
      ci[q] = r;
      cv[q] = values[p]!;
    }
  }
  return { rows: cols, cols: rows, rowPtr: ptr, colIdx: ci, values: cv };
}

/**
 * Whether A equals its transpose to within `tol`·max|aᵢⱼ| entry by entry
 * (`tol = 0`: exactly). Square matrices only.
 *
 * @param a - the matrix
 * @param tol - relative tolerance (default 0)
 * @returns true if |aᵢⱼ − aⱼᵢ| ≤ tol·max|a| for all i, j
 */
export function csrIsSymmetric(a: CsrMatrix, tol = 0): boolean {
  if (a.rows !== a.cols) return false;
  const t = csrTranspose(a);
  let big = 0;
  for (let p = 0; p < a.values.length; p++) big = Math.max(big, Math.abs(a.values[p]!));
  const lim = tol * big;
  // compare the two sparsity patterns row by row, treating a missing entry as 0
  for (let r = 0; r < a.rows; r++) {
    let p = a.rowPtr[r]!;
    let q = t.rowPtr[r]!;
    const pe = a.rowPtr[r + 1]!;
    const qe = t.rowPtr[r + 1]!;
    while (p < pe || q < qe) {
      const cp = p < pe ? a.colIdx[p]! : Infinity;
      const cq = q < qe ? t.colIdx[q]! : Infinity;
      let d: number;
      if (cp === cq) d = a.values[p++]! - t.values[q++]!;
      else if (cp < cq) d = a.values[p++]!;
      else d = t.values[q++]!;
      if (!(Math.abs(d) <= lim)) return false;
    }
  }
  return true;
}

/**
 * Checks that a CSR structure is consistent: lengths, monotone row pointers,
 * column indices in range and strictly ascending within each row.
 *
 * @internal
 */
export function checkCsr(a: CsrMatrix): void {
  const { rows, cols, rowPtr, colIdx, values } = a;
  if (!(Number.isSafeInteger(rows) && rows >= 0 && Number.isSafeInteger(cols) && cols >= 0)) {
    throw new ShapeMismatchError(`matrix size ${rows} × ${cols} is not valid; give whole numbers ≥ 0`);
  }
  if (rowPtr.length !== rows + 1 || rowPtr[0] !== 0) {
    throw new ShapeMismatchError(`rowPtr has length ${rowPtr.length} (first ${rowPtr[0]}); a ${rows}-row matrix needs ${rows + 1} entries starting at 0`);
  }
  const nnz = rowPtr[rows]!;
  if (colIdx.length !== nnz || values.length !== nnz) {
    throw new ShapeMismatchError(`rowPtr says ${nnz} entries but colIdx has ${colIdx.length} and values ${values.length}`);
  }
  for (let r = 0; r < rows; r++) {
    const s = rowPtr[r]!;
    const e = rowPtr[r + 1]!;
    if (e < s) throw new ShapeMismatchError(`rowPtr decreases at row ${r} (${s} → ${e}); row pointers must not decrease`);
    for (let p = s; p < e; p++) {
      const c = colIdx[p]!;
      if (!(c >= 0 && c < cols)) throw new ShapeMismatchError(`colIdx[${p}] = ${c} in row ${r} is outside 0…${cols - 1}`);
      if (p > s && !(c > colIdx[p - 1]!)) {
        throw new ShapeMismatchError(`row ${r} has columns out of order or repeated at colIdx[${p}] = ${c}; sort them ascending, once each`);
      }
    }
  }
}
