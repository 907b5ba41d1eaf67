/**
 * Banded LU factorisation with partial pivoting, for wide 1-D stencils and
 * small 2-D systems (the band of an n × n-node 2-D grid is about n wide).
 *
 * The algorithm and the band storage are those of LAPACK's xGBTF2 / xGBTRS:
 * A(i, j) is kept at row kv + i − j of column j of a (2kl + ku + 1) × n
 * array, kv = kl + ku, so that row interchanges fit into the kl extra rows.
 * Cost: O(n·kl·(kl + ku)) to factor, O(n·(2kl + ku)) per solve. Backward
 * stable in practice (growth factor ≤ 2^(2kl+ku) in the worst case). Source:
 * Golub, G. H. & Van Loan, C. F. (2013). Matrix Computations, 4th ed., Johns
 * Hopkins, §4.3; Anderson, E. et al. (1999). LAPACK Users' Guide, 3rd ed.
 *
 * @module
 */
import { InvalidOptionError, ShapeMismatchError, SingularMatrixError } from '../errors.js';
import { checkCsr, type CsrMatrix } from '../operator/matrix.js';
import type { Operator } from '../operator/operator.js';
import { checkVectorFinite } from '../operator/operator.js';

/** A banded LU factorisation, ready for repeated solves. */
export interface BandedLU {
  /** Order n. */
  readonly n: number;
  /** Lower bandwidth kl. */
  readonly lower: number;
  /** Upper bandwidth ku of A (U has kl + ku). */
  readonly upper: number;
  /** Band storage of L and U, column-major, (2kl + ku + 1) rows. */
  readonly band: Readonly<Float64Array>;
  /** Row interchanged with row j at step j. */
  readonly pivots: Readonly<Int32Array>;
}

/**
 * Factors a square sparse matrix as P·A = L·U inside its band. A pivot
 * of magnitude ≤ n·ε·max|aᵢⱼ| is treated as zero (the matrix is singular to
 * working precision, condition number ≳ 1/(nε)) and reported.
 *
 * @param a - the matrix (an Operator or a CSR matrix)
 * @param options - `maxBytes`: refuse a band larger than this (default 2 GiB)
 * @returns the factors
 * @example solveBanded(factorBanded(identity(2)), Float64Array.of(3, 4)) // [3, 4]
 */
export function factorBanded(a: Operator | CsrMatrix, options: Readonly<{ maxBytes?: number }> = {}): BandedLU {
  const m: CsrMatrix = 'matrix' in a ? a.matrix : a;
  checkCsr(m);
  if (m.rows !== m.cols) throw new ShapeMismatchError(`the matrix is ${m.rows} × ${m.cols}; a factorisation needs a square matrix`);
  checkVectorFinite('matrix values', m.values);
  const n = m.rows;
  let kl = 0;
  let ku = 0;
  for (let r = 0; r < n; r++) {
    for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) {
      const c = m.colIdx[p]!;
      if (r - c > kl) kl = r - c;
      if (c - r > ku) ku = c - r;
    }
  }
  const ld = 2 * kl + ku + 1;
  const bytes = ld * n * 8;
  const limit = options.maxBytes ?? 2 ** 31;
  if (bytes > limit) {
    throw new InvalidOptionError('maxBytes', `the band needs ${(bytes / 2 ** 20).toFixed(0)} MiB (bandwidths ${kl}/${ku}); use an iterative solver or raise maxBytes`);
  }
  const kv = kl + ku;
  const ab = new Float64Array(ld * n);
  for (let r = 0; r < n; r++) {
    for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) {
      const c = m.colIdx[p]!;
      ab[c * ld + kv + r - c] = m.values[p]!;
    }
  }
  const ipiv = new Int32Array(n);
  let big = 0;
  for (let p = 0; p < m.values.length; p++) big = Math.max(big, Math.abs(m.values[p]!));
  // a pivot below n·ε·max|aᵢⱼ| is round-off of a zero: the matrix is singular to working precision
  gbtf2(n, kl, ku, ab, ld, ipiv, n * Number.EPSILON * big);
  return { n, lower: kl, upper: ku, band: ab, pivots: ipiv };
}

/** Unblocked banded LU (xGBTF2). Throws SingularMatrixError on a pivot ≤ tiny. @internal */
function gbtf2(n: number, kl: number, ku: number, ab: Float64Array, ld: number, ipiv: Int32Array, tiny: number): void {
  const kv = ku + kl;
  let ju = 0;
  for (let j = 0; j < n; j++) {
    const km = Math.min(kl, n - 1 - j);
    const col = j * ld;
    let jp = 0;
    let best = Math.abs(ab[col + kv]!);
    for (let t = 1; t <= km; t++) {
      const v = Math.abs(ab[col + kv + t]!);
      if (v > best) {
        best = v;
        jp = t;
      }
    }
    ipiv[j] = j + jp;
    if (!(best > tiny)) {
      throw new SingularMatrixError(j, ab[col + kv + jp]!, 'the system has no unique solution (a pure-flux problem needs a value fixed somewhere, or a row is missing)');
    }
    ju = Math.max(ju, Math.min(j + ku + jp, n - 1));
    if (jp !== 0) {
      // swap rows j and j + jp in columns j … ju
      for (let c = j; c <= ju; c++) {
        const o = c * ld + kv - c;
        const t = ab[o + j]!;
        ab[o + j] = ab[o + j + jp]!;
        ab[o + j + jp] = t;
      }
    }
    if (km > 0) {
      const inv = 1 / ab[col + kv]!;
      for (let t = 1; t <= km; t++) ab[col + kv + t]! *= inv;
      for (let c = j + 1; c <= ju; c++) {
        const o = c * ld + kv - c;
        const ajc = ab[o + j]!;
        if (ajc === 0) continue;
        for (let t = 1; t <= km; t++) ab[o + j + t]! -= ab[col + kv + t]! * ajc;
      }
    }
  }
}

/**
 * Solves A x = b with factors from {@link factorBanded}. `out` may be `rhs`.
 *
 * @param lu - the factors
 * @param rhs - b, length n
 * @param out - where to write x; a new array if absent
 * @returns `out`, or the new array
 */
export function solveBanded(lu: BandedLU, rhs: ArrayLike<number>, out?: Float64Array): Float64Array {
  const { n, lower: kl, upper: ku } = lu;
  if (rhs.length !== n) throw new ShapeMismatchError(`rhs has ${rhs.length} entries but the matrix has order ${n}`);
  const x = out ?? new Float64Array(n);
  if (x.length !== n) throw new ShapeMismatchError(`out has ${x.length} entries but the matrix has order ${n}`);
  if (x !== rhs) for (let i = 0; i < n; i++) x[i] = rhs[i] as number;
  checkVectorFinite('rhs', x);
  const ab = lu.band as Float64Array;
  const ipiv = lu.pivots as Int32Array;
  const ld = 2 * kl + ku + 1;
  const kv = kl + ku;
  for (let j = 0; j < n - 1; j++) {
    const km = Math.min(kl, n - 1 - j);
    const l = ipiv[j]!;
    if (l !== j) {
      const t = x[l]!;
      x[l] = x[j]!;
      x[j] = t;
    }
    const xj = x[j]!;
    const col = j * ld + kv;
    for (let t = 1; t <= km; t++) x[j + t]! -= ab[col + t]! * xj;
  }
  for (let j = n - 1; j >= 0; j--) {
    const o = j * ld + kv - j;
    x[j]! /= ab[o + j]!;
    const xj = x[j]!;
    for (let i = Math.max(0, j - kv); i < j; i++) x[i]! -= ab[o + i]! * xj;
  }
  return x;
}
