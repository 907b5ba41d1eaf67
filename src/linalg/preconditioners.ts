/**
 * Preconditioners for the Krylov solvers: z = M⁻¹ r with M ≈ A cheap to
 * invert. Each is set up once from the CSR form and then applied with no
 * allocation.
 *
 * - Jacobi: M = diag(A).
 * - SSOR(ω): M = (D/ω + L)·(D/ω)⁻¹·(D/ω + U)·ω/(2 − ω), symmetric when A is
 *   (Saad, Y. (2003). Iterative Methods for Sparse Linear Systems, 2nd ed.,
 *   SIAM, §10.2).
 * - IC(0): incomplete Cholesky A ≈ L·Lᵀ on the sparsity of A's lower
 *   triangle, for symmetric positive definite A (Meijerink, J. A. & van der
 *   Vorst, H. A. (1977). Math. Comp. 31, 148–162). It exists for M-matrices,
 *   which every accuracy-2 steady system of quadrille is.
 * - ILU(0): incomplete LU on A's own sparsity, for nonsymmetric A (Saad 2003,
 *   Algorithm 10.4).
 *
 * @module
 */
import { InvalidOptionError, ShapeMismatchError, SingularMatrixError } from '../errors.js';
import { type CsrMatrix, checkCsr } from '../operator/matrix.js';
import type { Operator } from '../operator/operator.js';

/** z = M⁻¹ r for some M ≈ A. */
export interface Preconditioner {
  /** What it is, e.g. `'jacobi'`, for the solver's `method`. */
  readonly name: string;
  /** Whether M is symmetric positive definite (required by conjugate gradients). */
  readonly symmetric: boolean;
  /**
   * Writes z = M⁻¹ r; allocates nothing. `z` must not alias `r`.
   *
   * @param r - the residual
   * @param z - the output
   */
  apply(r: Float64Array, z: Float64Array): void;
}

function csrOf(a: Operator | CsrMatrix): CsrMatrix {
  const m = 'matrix' in a ? a.matrix : a;
  checkCsr(m);
  if (m.rows !== m.cols) throw new ShapeMismatchError(`the matrix is ${m.rows} × ${m.cols}; a preconditioner needs a square matrix`);
  return m;
}

/** Position of the diagonal entry of each row; throws if one is missing or zero. */
function diagonalPositions(m: CsrMatrix): Int32Array {
  const pos = new Int32Array(m.rows).fill(-1);
  for (let r = 0; r < m.rows; r++) {
    for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) if (m.colIdx[p] === r) pos[r] = p;
    if (pos[r] === -1 || m.values[pos[r]!] === 0) {
      throw new SingularMatrixError(r, 0, 'row has no non-zero diagonal entry; this preconditioner needs one in every row');
    }
  }
  return pos;
}

/**
 * Jacobi (diagonal) preconditioner: zᵢ = rᵢ / aᵢᵢ.
 *
 * @param a - the matrix
 * @returns the preconditioner (symmetric positive definite when diag(A) > 0)
 * @example jacobiPreconditioner(diagonal(Float64Array.of(2, 4))).name // 'jacobi'
 */
export function jacobiPreconditioner(a: Operator | CsrMatrix): Preconditioner {
  const m = csrOf(a);
  const pos = diagonalPositions(m);
  const inv = Float64Array.from(pos, (p) => 1 / m.values[p]!);
  const positive = inv.every((v) => v > 0);
  return {
    name: 'jacobi',
    symmetric: positive,
    apply(r, z) {
      for (let i = 0; i < inv.length; i++) z[i] = r[i]! * inv[i]!;
    },
  };
}

/**
 * Symmetric successive over-relaxation: a forward and a backward
 * Gauss–Seidel sweep with relaxation ω (module formula). ω = 1 is symmetric
 * Gauss–Seidel.
 *
 * @param a - the matrix (symmetric for use with conjugate gradients)
 * @param omega - ω in (0, 2) (default 1)
 * @returns the preconditioner
 * @example ssorPreconditioner(diagonal(Float64Array.of(2, 4)), 1.2).name // 'ssor'
 */
export function ssorPreconditioner(a: Operator | CsrMatrix, omega = 1): Preconditioner {
  if (!(omega > 0 && omega < 2)) throw new InvalidOptionError('omega', `${omega} is outside (0, 2), where SSOR is convergent for SPD matrices`);
  const m = csrOf(a);
  const pos = diagonalPositions(m);
  const { rows: n, rowPtr, colIdx, values } = m;
  const d = Float64Array.from(pos, (p) => values[p]! / omega);
  const scale = (2 - omega) / omega;
  return {
    name: 'ssor',
    symmetric: d.every((v) => v > 0),
    apply(r, z) {
      // (D/ω + L) y = r
      for (let i = 0; i < n; i++) {
        let s = r[i]!;
        for (let p = rowPtr[i]!; p < pos[i]!; p++) s -= values[p]! * z[colIdx[p]!]!;
        z[i] = s / d[i]!;
      }
      // y ← (2 − ω)/ω · (D/ω) y
      for (let i = 0; i < n; i++) z[i]! *= scale * d[i]!;
      // (D/ω + U) z = y
      for (let i = n - 1; i >= 0; i--) {
        let s = z[i]!;
        for (let p = pos[i]! + 1; p < rowPtr[i + 1]!; p++) s -= values[p]! * z[colIdx[p]!]!;
        z[i] = s / d[i]!;
      }
    },
  };
}

/**
 * Incomplete Cholesky IC(0): L lower triangular on the pattern of A's lower
 * triangle with (L·Lᵀ)ᵢⱼ = aᵢⱼ wherever aᵢⱼ ≠ 0 (module source).
 *
 * @param a - a symmetric positive definite matrix with sorted rows
 * @returns the preconditioner; throws SingularMatrixError if a pivot is not positive
 * @example incompleteCholesky(diagonal(Float64Array.of(4, 9))).name // 'ic0'
 */
export function incompleteCholesky(a: Operator | CsrMatrix): Preconditioner {
  const m = csrOf(a);
  const n = m.rows;
  // lower triangle, rows sorted, diagonal last
  const lp = new Int32Array(n + 1);
  for (let r = 0; r < n; r++) {
    let c = 0;
    for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) if (m.colIdx[p]! <= r) c++;
    lp[r + 1] = lp[r]! + c;
  }
  const lc = new Int32Array(lp[n]!);
  const lv = new Float64Array(lp[n]!);
  for (let r = 0, w = 0; r < n; r++) {
    for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) {
      if (m.colIdx[p]! <= r) {
        lc[w] = m.colIdx[p]!;
        lv[w++] = m.values[p]!;
      }
    }
    if (lp[r + 1]! === lp[r]! || lc[lp[r + 1]! - 1] !== r) {
      throw new SingularMatrixError(r, 0, 'row has no diagonal entry; IC(0) needs a symmetric positive definite matrix');
    }
  }
  // row-oriented IC(0): l_rj = (a_rj − Σ_k<j l_rk l_jk) / l_jj over the pattern
  const work = new Float64Array(n); // row j of L scattered, by column
  const mark = new Int32Array(n).fill(-1);
  for (let r = 0; r < n; r++) {
    const s = lp[r]!;
    const e = lp[r + 1]!;
    for (let p = s; p < e; p++) {
      const j = lc[p]!;
      let v = lv[p]!;
      // scatter row j of L (already final) and take the dot with row r's earlier entries
      for (let q = lp[j]!; q < lp[j + 1]! - 1; q++) {
        work[lc[q]!] = lv[q]!;
        mark[lc[q]!] = j;
      }
      for (let q = s; q < p; q++) {
        const c = lc[q]!;
        if (mark[c] === j) v -= lv[q]! * work[c]!;
      }
      if (j < r) {
        lv[p] = v / lv[lp[j + 1]! - 1]!;
      } else {
        if (!(v > 0)) {
          throw new SingularMatrixError(r, v, 'IC(0) met a non-positive pivot: the matrix is not an M-matrix or not positive definite; use Jacobi, SSOR or multigrid');
        }
        lv[p] = Math.sqrt(v);
      }
    }
  }
  // Lᵀ in CSR for the backward solve
  const up = new Int32Array(n + 1);
  for (let p = 0; p < lc.length; p++) up[lc[p]! + 1]!++;
  for (let i = 0; i < n; i++) up[i + 1]! += up[i]!;
  const next = up.slice(0, n);
  const uc = new Int32Array(lc.length);
  const uv = new Float64Array(lc.length);
  for (let r = 0; r < n; r++) {
    for (let p = lp[r]!; p < lp[r + 1]!; p++) {
      const q = next[lc[p]!]!++;
      uc[q] = r;
      uv[q] = lv[p]!;
    }
  }
  return {
    name: 'ic0',
    symmetric: true,
    apply(r, z) {
      for (let i = 0; i < n; i++) {
        let s = r[i]!;
        const e = lp[i + 1]! - 1;
        for (let p = lp[i]!; p < e; p++) s -= lv[p]! * z[lc[p]!]!;
        z[i] = s / lv[e]!;
      }
      for (let i = n - 1; i >= 0; i--) {
        const d = up[i]!; // the diagonal is the first entry of row i of Lᵀ
        let s = z[i]!;
        for (let p = d + 1; p < up[i + 1]!; p++) s -= uv[p]! * z[uc[p]!]!;
        z[i] = s / uv[d]!;
      }
    },
  };
}

/**
 * Incomplete LU ILU(0) on A's own sparsity (module source), for
 * nonsymmetric systems with BiCGSTAB.
 *
 * @param a - a square matrix with a non-zero diagonal
 * @returns the preconditioner (not symmetric)
 * @example incompleteLU(diagonal(Float64Array.of(4, 9))).name // 'ilu0'
 */
export function incompleteLU(a: Operator | CsrMatrix): Preconditioner {
  const m = csrOf(a);
  const n = m.rows;
  const { rowPtr, colIdx } = m;
  const v = Float64Array.from(m.values);
  const diag = diagonalPositions(m);
  const where = new Int32Array(n).fill(-1);
  for (let i = 0; i < n; i++) {
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) where[colIdx[p]!] = p;
    for (let p = rowPtr[i]!; p < diag[i]!; p++) {
      const k = colIdx[p]!;
      const lik = v[p]! / v[diag[k]!]!;
      v[p] = lik;
      for (let q = diag[k]! + 1; q < rowPtr[k + 1]!; q++) {
        const w = where[colIdx[q]!]!;
        if (w >= 0) v[w]! -= lik * v[q]!;
      }
    }
    if (v[diag[i]!] === 0 || !Number.isFinite(v[diag[i]!]!)) {
      throw new SingularMatrixError(i, v[diag[i]!]!, 'ILU(0) met a zero pivot; try Jacobi or a direct solve');
    }
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) where[colIdx[p]!] = -1;
  }
  return {
    name: 'ilu0',
    symmetric: false,
    apply(r, z) {
      for (let i = 0; i < n; i++) {
        let s = r[i]!;
        for (let p = rowPtr[i]!; p < diag[i]!; p++) s -= v[p]! * z[colIdx[p]!]!;
        z[i] = s;
      }
      for (let i = n - 1; i >= 0; i--) {
        let s = z[i]!;
        for (let p = diag[i]! + 1; p < rowPtr[i + 1]!; p++) s -= v[p]! * z[colIdx[p]!]!;
        z[i] = s / v[diag[i]!]!;
      }
    },
  };
}
