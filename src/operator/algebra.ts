/**
 * Operator algebra: sums, scaling, products, transposes, identities,
 * diagonals and Kronecker products, each with its CSR form and a
 * matrix-free apply that allocates nothing per call.
 *
 * The Kronecker product builds tensor-product operators: on an nx × ny grid
 * (x slowest), ∂²/∂x² ⊗ I_ny + I_nx ⊗ ∂²/∂y² is the 2-D Laplacian. Source:
 * Van Loan, C. F. (2000). The ubiquitous Kronecker product. J. Comput. Appl.
 * Math. 123, 85–100.
 *
 * @module
 */
import { checkAllFinite, checkFinite } from '../check.js';
import { ShapeMismatchError, TooFewNodesError } from '../errors.js';
import { type CsrMatrix, csrTranspose } from './matrix.js';
import { type Operator, makeOperator } from './operator.js';

function checkSameSize(what: string, a: Operator, b: Operator): void {
  if (a.rows !== b.rows || a.cols !== b.cols) {
    throw new ShapeMismatchError(`${what}: ${a.rows} × ${a.cols} and ${b.rows} × ${b.cols} differ; give operators of one size`);
  }
}

function addCsr(a: CsrMatrix, b: CsrMatrix, sa: number, sb: number): CsrMatrix {
  const rows = a.rows;
  const ptr = new Int32Array(rows + 1);
  const cap = a.values.length + b.values.length;
  const col = new Int32Array(cap);
  const val = new Float64Array(cap);
  let w = 0;
  for (let r = 0; r < rows; r++) {
    let p = a.rowPtr[r]!;
    let q = b.rowPtr[r]!;
    const pe = a.rowPtr[r + 1]!;
    const qe = b.rowPtr[r + 1]!;
    while (p < pe || q < qe) {
      const cp = p < pe ? a.colIdx[p]! : 0x7fffffff;
      const cq = q < qe ? b.colIdx[q]! : 0x7fffffff;
      if (cp === cq) {
        col[w] = cp;
        val[w++] = sa * a.values[p++]! + sb * b.values[q++]!;
      } else if (cp < cq) {
        col[w] = cp;
        val[w++] = sa * a.values[p++]!;
      } else {
        col[w] = cq;
        val[w++] = sb * b.values[q++]!;
      }
    }
    ptr[r + 1] = w;
  }
  return { rows, cols: a.cols, rowPtr: ptr, colIdx: col.slice(0, w), values: val.slice(0, w) };
}

/**
 * A + B (and further terms): (A + B)x = Ax + Bx.
 *
 * @param first - the first term
 * @param rest - more terms of the same size
 * @returns the sum; symmetric when every term is
 * @example sum(identity(2), identity(2)).apply(Float64Array.of(1, 2)) // [2, 4]
 */
export function sum(first: Operator, ...rest: Operator[]): Operator {
  for (const t of rest) checkSameSize('sum', first, t);
  const terms = [first, ...rest];
  if (terms.length === 1) return first;
  const tmp = new Float64Array(first.rows);
  return makeOperator({
    rows: first.rows,
    cols: first.cols,
    shape: first.shape,
    symmetric: terms.every((t) => t.symmetric),
    build: () => terms.slice(1).reduce((acc, t) => addCsr(acc, t.matrix, 1, 1), first.matrix),
    kernel: (x, y) => {
      first.kernel(x, y);
      for (let k = 1; k < terms.length; k++) {
        terms[k]!.kernel(x, tmp);
        for (let i = 0; i < y.length; i++) y[i]! += tmp[i]!;
      }
    },
  });
}

/**
 * s·A.
 *
 * @param a - the operator
 * @param s - a finite factor
 * @returns the scaled operator; symmetric when `a` is
 * @example scale(identity(2), 3).apply(Float64Array.of(1, 2)) // [3, 6]
 */
export function scale(a: Operator, s: number): Operator {
  checkFinite('scale factor', s);
  return makeOperator({
    rows: a.rows,
    cols: a.cols,
    shape: a.shape,
    symmetric: a.symmetric,
    build: () => {
      const m = a.matrix;
      return { ...m, rowPtr: m.rowPtr, colIdx: m.colIdx, values: m.values.map((v) => s * v) };
    },
    kernel: (x, y) => {
      a.kernel(x, y);
      for (let i = 0; i < y.length; i++) y[i]! *= s;
    },
  });
}

/**
 * The product A·B, applied as A(Bx). CSR by Gustavson's row-by-row
 * algorithm with a dense accumulator (Gustavson, F. G. (1978). Two fast
 * algorithms for sparse matrices. ACM TOMS 4(3), 250–269).
 *
 * @param a - applied second
 * @param b - applied first; b.rows must equal a.cols
 * @returns the product (not marked symmetric, whatever its factors)
 * @example compose(scale(identity(2), 2), diagonal(Float64Array.of(1, 3))).apply(Float64Array.of(1, 1)) // [2, 6]
 */
export function compose(a: Operator, b: Operator): Operator {
  if (a.cols !== b.rows) {
    throw new ShapeMismatchError(`compose: A is ${a.rows} × ${a.cols} but B is ${b.rows} × ${b.cols}; A·B needs A's columns = B's rows`);
  }
  const tmp = new Float64Array(b.rows);
  return makeOperator({
    rows: a.rows,
    cols: b.cols,
    shape: a.shape,
    symmetric: false,
    build: () => multiplyCsr(a.matrix, b.matrix),
    kernel: (x, y) => {
      b.kernel(x, tmp);
      a.kernel(tmp, y);
    },
  });
}

function multiplyCsr(a: CsrMatrix, b: CsrMatrix): CsrMatrix {
  const acc = new Float64Array(b.cols);
  const mark = new Int32Array(b.cols).fill(-1);
  const ptr = new Int32Array(a.rows + 1);
  let col = new Int32Array(Math.max(16, a.values.length + b.values.length));
  let val = new Float64Array(col.length);
  const rowCols: number[] = [];
  let w = 0;
  for (let r = 0; r < a.rows; r++) {
    rowCols.length = 0;
    for (let p = a.rowPtr[r]!; p < a.rowPtr[r + 1]!; p++) {
      const k = a.colIdx[p]!;
      const av = a.values[p]!;
      for (let q = b.rowPtr[k]!; q < b.rowPtr[k + 1]!; q++) {
        const c = b.colIdx[q]!;
        if (mark[c] !== r) {
          mark[c] = r;
          acc[c] = 0;
          rowCols.push(c);
        }
        acc[c]! += av * b.values[q]!;
      }
    }
    rowCols.sort((x, y) => x - y);
    if (w + rowCols.length > col.length) {
      const cap = Math.max(col.length * 2, w + rowCols.length);
      const nc = new Int32Array(cap);
      nc.set(col);
      const nv = new Float64Array(cap);
      nv.set(val);
      col = nc;
      val = nv;
    }
    for (const c of rowCols) {
      col[w] = c;
      val[w++] = acc[c]!;
    }
    ptr[r + 1] = w;
  }
  return { rows: a.rows, cols: b.cols, rowPtr: ptr, colIdx: col.slice(0, w), values: val.slice(0, w) };
}

/**
 * Aᵀ. Applied through the CSR form of A (a transposed product), so it
 * needs no second copy of the matrix.
 *
 * @param a - the operator
 * @returns the transpose; symmetric when `a` is
 * @example transpose(fromCsr({ rows: 1, cols: 2, rowPtr: Int32Array.of(0, 2), colIdx: Int32Array.of(0, 1), values: Float64Array.of(1, 2) })).rows // 2
 */
export function transpose(a: Operator): Operator {
  if (a.symmetric) return a;
  return makeOperator({
    rows: a.cols,
    cols: a.rows,
    symmetric: false,
    build: () => csrTranspose(a.matrix),
    kernel: (x, y) => {
      const m = a.matrix;
      y.fill(0);
      for (let r = 0; r < m.rows; r++) {
        const xr = x[r]!;
        for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) y[m.colIdx[p]!]! += m.values[p]! * xr;
      }
    },
  });
}

/**
 * The n × n identity.
 *
 * @param n - size ≥ 1
 * @param shape - field shape of outputs (product n); default [n]
 * @returns I
 * @example identity(3).matrix.values // [1, 1, 1]
 */
export function identity(n: number, shape?: readonly number[]): Operator {
  return diagonal(new Float64Array(checkSize(n)).fill(1), shape);
}

function checkSize(n: number): number {
  if (!(Number.isSafeInteger(n) && n >= 1)) throw new TooFewNodesError(Number.isFinite(n) ? n : 0, 1, 'an operator');
  return n;
}

/**
 * diag(d): (diag(d)x)ᵢ = dᵢ xᵢ.
 *
 * @param d - the diagonal (copied), finite
 * @param shape - field shape of outputs (product d.length); default [d.length]
 * @returns the diagonal operator (symmetric)
 * @example diagonal(Float64Array.of(2, 3)).apply(Float64Array.of(1, 1)) // [2, 3]
 */
export function diagonal(d: ArrayLike<number>, shape?: readonly number[]): Operator {
  checkSize(d.length);
  checkAllFinite('diagonal', d);
  const diag = Float64Array.from(d);
  const n = diag.length;
  if (shape !== undefined && shape.reduce((p, c) => p * c, 1) !== n) {
    throw new ShapeMismatchError(`shape [${shape.join(', ')}] does not hold ${n} entries`);
  }
  return makeOperator({
    rows: n,
    cols: n,
    shape: shape ?? [n],
    symmetric: true,
    build: () => ({
      rows: n,
      cols: n,
      rowPtr: Int32Array.from({ length: n + 1 }, (_, i) => i),
      colIdx: Int32Array.from({ length: n }, (_, i) => i),
      values: diag.slice(),
    }),
    kernel: (x, y) => {
      for (let i = 0; i < n; i++) y[i] = diag[i]! * x[i]!;
    },
  });
}

/**
 * The Kronecker product A ⊗ B: entry (i·p + k, j·q + l) is aᵢⱼ·bₖₗ for B of
 * size p × q. With x slowest, A acts along the slower index. Applied
 * matrix-free as B along the fast index, then A along the slow one.
 *
 * @param a - the slow-index factor
 * @param b - the fast-index factor
 * @returns A ⊗ B; symmetric when both factors are; output shape [...a.shape, ...b.shape]
 * @example kronecker(identity(2), diagonal(Float64Array.of(1, 2))).matrix.values // [1, 2, 1, 2]
 */
export function kronecker(a: Operator, b: Operator): Operator {
  const rows = a.rows * b.rows;
  const cols = a.cols * b.cols;
  const mid = new Float64Array(a.cols * b.rows);
  const colIn = new Float64Array(a.cols);
  const colOut = new Float64Array(a.rows);
  return makeOperator({
    rows,
    cols,
    shape: [...a.shape, ...b.shape],
    symmetric: a.symmetric && b.symmetric,
    build: () => kronCsr(a.matrix, b.matrix),
    kernel: (x, y) => {
      // mid[j, :] = B x[j, :]
      const p = b.rows;
      const q = b.cols;
      for (let j = 0; j < a.cols; j++) b.kernel(x.subarray(j * q, (j + 1) * q), mid.subarray(j * p, (j + 1) * p));
      // y[:, k] = A mid[:, k]
      for (let k = 0; k < p; k++) {
        for (let j = 0; j < a.cols; j++) colIn[j] = mid[j * p + k]!;
        a.kernel(colIn, colOut);
        for (let i = 0; i < a.rows; i++) y[i * p + k] = colOut[i]!;
      }
    },
  });
}

function kronCsr(a: CsrMatrix, b: CsrMatrix): CsrMatrix {
  const rows = a.rows * b.rows;
  const nnz = a.values.length * b.values.length;
  const ptr = new Int32Array(rows + 1);
  const col = new Int32Array(nnz);
  const val = new Float64Array(nnz);
  let w = 0;
  for (let i = 0; i < a.rows; i++) {
    for (let k = 0; k < b.rows; k++) {
      for (let p = a.rowPtr[i]!; p < a.rowPtr[i + 1]!; p++) {
        const j = a.colIdx[p]!;
        const av = a.values[p]!;
        for (let q = b.rowPtr[k]!; q < b.rowPtr[k + 1]!; q++) {
          col[w] = j * b.cols + b.colIdx[q]!;
          val[w++] = av * b.values[q]!;
        }
      }
      ptr[i * b.rows + k + 1] = w;
    }
  }
  return { rows, cols: a.cols * b.cols, rowPtr: ptr, colIdx: col, values: val };
}
