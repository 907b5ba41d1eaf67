/**
 * Smoothing and residual kernels of multigrid on a CSR matrix: forward and
 * backward Gauss–Seidel, damped Jacobi, r = b − Ax. No checks, no allocation:
 * the multigrid set-up validates the matrix once and builds the
 * {@link LevelMatrix} these loops read.
 *
 * Gauss–Seidel row i: xᵢ ← (bᵢ − Σ_{j≠i} aᵢⱼ xⱼ) / aᵢᵢ, rows in ascending
 * order (forward) or descending order (backward); a forward sweep followed
 * by a backward one is symmetric Gauss–Seidel. Damped Jacobi:
 * x ← x + ω D⁻¹ (b − Ax). Source: Saad, Y. (2003). Iterative Methods for
 * Sparse Linear Systems, 2nd ed., SIAM, §4.1.
 *
 * Rows that are one stencil shifted (constant coefficients away from the
 * boundary: the five-point rows of W2 and the nine-point rows of their
 * Galerkin coarse operators) are found once ({@link findStencilRuns}) and
 * swept by the straight-line loops of `stencil-runs.ts`, which read no
 * matrix storage; the remaining rows go through the CSR loops below. Both
 * paths compute the same row formula (the summation order differs, so the
 * results agree to round-off).
 *
 * @module
 * @internal
 */
import type { CsrMatrix } from '../../operator/matrix.js';
import {
  backward27, backward3, backward5, backward7, backward9,
  forward27, forward3, forward5, forward7, forward9,
  forwardZero27, forwardZero3, forwardZero5, forwardZero7, forwardZero9,
  residual27, residual3, residual5, residual7, residual9,
  upper27, upper3, upper5, upper7, upper9,
} from './stencil-runs.js';

/** A square CSR matrix with what the smoothers need: diagonal positions, 1/aᵢᵢ, stencil runs. @internal */
export interface LevelMatrix {
  /** Order n. */
  readonly n: number;
  /** CSR row starts. */
  readonly rowPtr: Int32Array;
  /** CSR columns, ascending within a row. */
  readonly colIdx: Int32Array;
  /** CSR values. */
  readonly values: Float64Array;
  /** Position of the diagonal entry of each row in colIdx / values. */
  readonly diagPtr: Int32Array;
  /** 1 / aᵢᵢ. */
  readonly invDiag: Float64Array;
  /** Number of stencil runs (0: every row goes through CSR). */
  readonly runCount: number;
  /** First row of each run. */
  readonly runStart: Int32Array;
  /** One past the last row of each run. */
  readonly runEnd: Int32Array;
  /** Column offsets of the run stencil, ascending; `offsets[diagonal] = 0`. */
  readonly offsets: Int32Array;
  /** Weights of the run stencil. */
  readonly weights: Float64Array;
  /** Index of the diagonal in `offsets`. */
  readonly diagonal: number;
  /** 1 / weights[diagonal]. */
  readonly dinv: number;
  /** Straight-line kernel size (3, 5, 7, 9, 27), or 0 for the generic stencil loop. */
  readonly kind: number;
  /** Whether every run row equals the stencil exactly (else to within `tol`). */
  readonly exact: boolean;
  /** Largest difference per entry between a run row and the stencil: the `tolerance` of {@link levelMatrix} times max|w|. */
  readonly tol: number;
}

/**
 * Finds each row's diagonal: writes its position into `diagPtr` and 1/aᵢᵢ
 * into `invDiag`.
 *
 * @returns the first row whose diagonal is missing, zero or not finite, or −1
 */
export function findDiagonal(a: CsrMatrix, diagPtr: Int32Array, invDiag: Float64Array): number {
  const { rows, rowPtr, colIdx, values } = a;
  for (let i = 0; i < rows; i++) {
    let dp = -1;
    const e = rowPtr[i + 1];
    for (let p = rowPtr[i]; p < e; p++) {
      if (colIdx[p] === i) {
        dp = p;
        break;
      }
    }
    if (dp < 0) return i;
    const d = values[dp];
    if (!(d !== 0 && Number.isFinite(d))) return i;
    diagPtr[i] = dp;
    invDiag[i] = 1 / d;
  }
  return -1;
}

/** 0: row i is not the pattern (i + off[k], w[k]); 1: it is, to within tol per entry; 2: it is exactly. */
function matches(a: CsrMatrix, i: number, off: Int32Array, w: Float64Array, m: number, tol: number): number {
  const s = a.rowPtr[i];
  if (a.rowPtr[i + 1] - s !== m) return 0;
  let exact = 2;
  for (let k = 0; k < m; k++) {
    if (a.colIdx[s + k] - i !== off[k]) return 0;
    const d = a.values[s + k] - w[k];
    if (d !== 0) {
      if (!(Math.abs(d) <= tol)) return 0;
      exact = 1;
    }
  }
  return exact;
}

/**
 * Builds the {@link LevelMatrix} of `a`: diagonal (already found) and the
 * runs of rows equal to one shifted stencil. The stencil is taken from a
 * row near the middle (an interior node on a grid); a row matches when its
 * columns are the stencil's and each value is within `tolerance`·max|w| of
 * the stencil's (a spacing that is not a binary fraction, 1/1022 say, gives
 * interior rows that differ in the last bits — about ε·cells relative, as
 * the spacings come from differences of coordinates; the sweeps then use the
 * stencil's values, a perturbation of A by a few ulps that changes the
 * smoother, not the problem: the true residual is computed from A itself).
 * Runs are kept only if they cover at least a quarter of the rows, so a
 * variable-coefficient matrix is swept by CSR alone. Cost O(nnz).
 */
export function levelMatrix(a: CsrMatrix, diagPtr: Int32Array, invDiag: Float64Array, tolerance = 16 * Number.EPSILON, useRuns = true): LevelMatrix {
  const n = a.rows;
  const none = {
    n, rowPtr: a.rowPtr, colIdx: a.colIdx, values: a.values, diagPtr, invDiag,
    runCount: 0, runStart: new Int32Array(0), runEnd: new Int32Array(0),
    offsets: new Int32Array(0), weights: new Float64Array(0), diagonal: 0, dinv: 0, kind: 0, exact: true, tol: 0,
  };
  if (!useRuns || n < 3) return none;
  // candidate reference rows: the middle first, then the quarter points
  for (const i0 of [n >> 1, n >> 2, (3 * n) >> 2, (n >> 1) + 1]) {
    const s = a.rowPtr[i0];
    const m = a.rowPtr[i0 + 1] - s;
    if (m < 2) continue;
    const off = new Int32Array(m);
    const w = new Float64Array(m);
    let d = -1;
    for (let k = 0; k < m; k++) {
      off[k] = a.colIdx[s + k] - i0;
      w[k] = a.values[s + k];
      if (off[k] === 0) d = k;
    }
    if (d < 0) continue;
    let big = 0;
    for (let k = 0; k < m; k++) big = Math.max(big, Math.abs(w[k]));
    const tol = tolerance * big;
    const flag = new Uint8Array(n);
    let count = 0;
    let runs = 0;
    let exact = true;
    for (let i = 0; i < n; i++) {
      const hit = matches(a, i, off, w, m, tol);
      if (hit > 0) {
        flag[i] = 1;
        count++;
        if (hit === 1) exact = false;
        if (i === 0 || flag[i - 1] === 0) runs++;
      }
    }
    if (4 * count < n) continue;
    const runStart = new Int32Array(runs);
    const runEnd = new Int32Array(runs);
    let q = 0;
    for (let i = 0; i < n; i++) {
      if (flag[i] === 1 && (i === 0 || flag[i - 1] === 0)) runStart[q] = i;
      if (flag[i] === 1 && (i === n - 1 || flag[i + 1] === 0)) runEnd[q++] = i + 1;
    }
    // the straight-line loops need a grid-like stencil: odd size, diagonal in the middle, ±1 beside it
    const straight = (m === 3 || m === 5 || m === 7 || m === 9 || m === 27)
      && d === (m - 1) / 2 && off[d - 1] === -1 && off[d + 1] === 1;
    return {
      ...none, runCount: runs, runStart, runEnd, offsets: off, weights: w, diagonal: d,
      dinv: 1 / w[d], kind: straight ? m : 0, exact, tol,
    };
  }
  return none;
}

// ---------------------------------------------------------------- CSR rows

function csrForward(a: LevelMatrix, lo: number, hi: number, b: Float64Array, x: Float64Array): void {
  const { rowPtr, colIdx, values, diagPtr, invDiag } = a;
  for (let i = lo; i < hi; i++) {
    let s = b[i];
    const dp = diagPtr[i];
    for (let p = rowPtr[i]; p < dp; p++) s -= values[p] * x[colIdx[p]];
    const e = rowPtr[i + 1];
    for (let p = dp + 1; p < e; p++) s -= values[p] * x[colIdx[p]];
    x[i] = s * invDiag[i];
  }
}

function csrForwardZero(a: LevelMatrix, lo: number, hi: number, b: Float64Array, x: Float64Array): void {
  const { rowPtr, colIdx, values, diagPtr, invDiag } = a;
  for (let i = lo; i < hi; i++) {
    let s = b[i];
    const dp = diagPtr[i];
    for (let p = rowPtr[i]; p < dp; p++) s -= values[p] * x[colIdx[p]];
    x[i] = s * invDiag[i];
  }
}

function csrBackward(a: LevelMatrix, lo: number, hi: number, b: Float64Array, x: Float64Array): void {
  const { rowPtr, colIdx, values, diagPtr, invDiag } = a;
  for (let i = hi - 1; i >= lo; i--) {
    let s = b[i];
    const dp = diagPtr[i];
    for (let p = rowPtr[i]; p < dp; p++) s -= values[p] * x[colIdx[p]];
    const e = rowPtr[i + 1];
    for (let p = dp + 1; p < e; p++) s -= values[p] * x[colIdx[p]];
    x[i] = s * invDiag[i];
  }
}

function csrResidual(a: LevelMatrix, lo: number, hi: number, b: Float64Array, x: Float64Array, r: Float64Array): void {
  const { rowPtr, colIdx, values } = a;
  for (let i = lo; i < hi; i++) {
    let s = b[i];
    const e = rowPtr[i + 1];
    for (let p = rowPtr[i]; p < e; p++) s -= values[p] * x[colIdx[p]];
    r[i] = s;
  }
}

// ------------------------------------------------- stencil rows, any size

function anyForward(a: LevelMatrix, s0: number, e0: number, b: Float64Array, x: Float64Array, zero: boolean): void {
  const { offsets: off, weights: w, diagonal: d, dinv } = a;
  const m = zero ? d : off.length;
  for (let i = s0; i < e0; i++) {
    let s = b[i];
    for (let k = 0; k < m; k++) if (k !== d) s -= w[k] * x[i + off[k]];
    x[i] = s * dinv;
  }
}

function anyBackward(a: LevelMatrix, s0: number, e0: number, b: Float64Array, x: Float64Array): void {
  const { offsets: off, weights: w, diagonal: d, dinv } = a;
  const m = off.length;
  for (let i = e0 - 1; i >= s0; i--) {
    let s = b[i];
    for (let k = 0; k < m; k++) if (k !== d) s -= w[k] * x[i + off[k]];
    x[i] = s * dinv;
  }
}

function anyResidual(a: LevelMatrix, s0: number, e0: number, b: Float64Array, x: Float64Array, r: Float64Array): void {
  const { offsets: off, weights: w } = a;
  const m = off.length;
  for (let i = s0; i < e0; i++) {
    let s = b[i];
    for (let k = 0; k < m; k++) s -= w[k] * x[i + off[k]];
    r[i] = s;
  }
}

// ------------------------------------------------------------- sweeps

/** The first run that ends after row lo (runCount if none): binary search over the run ends. */
function firstRun(runEnd: Int32Array, count: number, lo: number): number {
  let a = 0;
  let b = count;
  while (a < b) {
    const m = (a + b) >> 1;
    if (runEnd[m] <= lo) a = m + 1;
    else b = m;
  }
  return a;
}

/**
 * One forward Gauss–Seidel sweep over rows lo … hi − 1 (default: all).
 * `zero`: x is taken as 0 from row lo on (only the entries left of the
 * diagonal are summed, about half the work, and x need not be cleared).
 * Rows below lo must be final: a sweep in blocks of rows is one sweep.
 */
export function gaussSeidelForward(a: LevelMatrix, b: Float64Array, x: Float64Array, zero: boolean, lo = 0, hi = a.n): void {
  const { runCount, runStart, runEnd, offsets: off, weights: w, dinv, kind } = a;
  let i = lo;
  for (let q = firstRun(runEnd, runCount, lo); q < runCount; q++) {
    if (runStart[q] >= hi) break;
    const s0 = runStart[q] > i ? runStart[q] : i;
    const e0 = runEnd[q] < hi ? runEnd[q] : hi;
    if (zero) csrForwardZero(a, i, s0, b, x);
    else csrForward(a, i, s0, b, x);
    if (zero) {
      switch (kind) {
        case 5: forwardZero5(s0, e0, off, w, dinv, b, x); break;
        case 9: forwardZero9(s0, e0, off, w, dinv, b, x); break;
        case 7: forwardZero7(s0, e0, off, w, dinv, b, x); break;
        case 27: forwardZero27(s0, e0, off, w, dinv, b, x); break;
        case 3: forwardZero3(s0, e0, off, w, dinv, b, x); break;
        default: anyForward(a, s0, e0, b, x, true);
      }
    } else {
      switch (kind) {
        case 5: forward5(s0, e0, off, w, dinv, b, x); break;
        case 9: forward9(s0, e0, off, w, dinv, b, x); break;
        case 7: forward7(s0, e0, off, w, dinv, b, x); break;
        case 27: forward27(s0, e0, off, w, dinv, b, x); break;
        case 3: forward3(s0, e0, off, w, dinv, b, x); break;
        default: anyForward(a, s0, e0, b, x, false);
      }
    }
    i = e0;
  }
  if (zero) csrForwardZero(a, i, hi, b, x);
  else csrForward(a, i, hi, b, x);
}

/**
 * One backward Gauss–Seidel sweep over rows hi − 1 … lo (default: all),
 * last row first. Rows from hi on must be final.
 */
export function gaussSeidelBackward(a: LevelMatrix, b: Float64Array, x: Float64Array, lo = 0, hi = a.n): void {
  const { runCount, runStart, runEnd, offsets: off, weights: w, dinv, kind } = a;
  let i = hi;
  // the last run that starts before hi
  let q = firstRun(runEnd, runCount, hi - 1);
  if (q === runCount || runStart[q] >= hi) q--;
  for (; q >= 0; q--) {
    if (runEnd[q] <= lo) break;
    const s0 = runStart[q] > lo ? runStart[q] : lo;
    const e0 = runEnd[q] < i ? runEnd[q] : i;
    csrBackward(a, e0, i, b, x);
    switch (kind) {
      case 5: backward5(s0, e0, off, w, dinv, b, x); break;
      case 9: backward9(s0, e0, off, w, dinv, b, x); break;
      case 7: backward7(s0, e0, off, w, dinv, b, x); break;
      case 27: backward27(s0, e0, off, w, dinv, b, x); break;
      case 3: backward3(s0, e0, off, w, dinv, b, x); break;
      default: anyBackward(a, s0, e0, b, x);
    }
    i = s0;
  }
  csrBackward(a, lo, i, b, x);
}

/** r = b − A x with A's own values: through the stencil runs when they hold A exactly, else through CSR for every row. */
export function exactResidual(a: LevelMatrix, b: Float64Array, x: Float64Array, r: Float64Array): void {
  if (a.exact) residual(a, b, x, r);
  else csrResidual(a, 0, a.n, b, x, r);
}

/** r = b − A x, stencil runs included. `r` must not be `x`. */
export function residual(a: LevelMatrix, b: Float64Array, x: Float64Array, r: Float64Array): void {
  const { runCount, runStart, runEnd, offsets: off, weights: w, kind } = a;
  let i = 0;
  for (let q = 0; q < runCount; q++) {
    const s0 = runStart[q];
    const e0 = runEnd[q];
    csrResidual(a, i, s0, b, x, r);
    switch (kind) {
      case 5: residual5(s0, e0, off, w, b, x, r); break;
      case 9: residual9(s0, e0, off, w, b, x, r); break;
      case 7: residual7(s0, e0, off, w, b, x, r); break;
      case 27: residual27(s0, e0, off, w, b, x, r); break;
      case 3: residual3(s0, e0, off, w, b, x, r); break;
      default: anyResidual(a, s0, e0, b, x, r);
    }
    i = e0;
  }
  csrResidual(a, i, a.n, b, x, r);
}

function csrUpper(a: LevelMatrix, lo: number, hi: number, x: Float64Array, r: Float64Array): void {
  const { rowPtr, colIdx, values, diagPtr } = a;
  for (let i = lo; i < hi; i++) {
    let s = 0;
    const e = rowPtr[i + 1];
    for (let p = diagPtr[i] + 1; p < e; p++) s -= values[p] * x[colIdx[p]];
    r[i] = s;
  }
}

function anyUpper(a: LevelMatrix, s0: number, e0: number, x: Float64Array, r: Float64Array): void {
  const { offsets: off, weights: w, diagonal: d } = a;
  const m = off.length;
  for (let i = s0; i < e0; i++) {
    let s = 0;
    for (let k = d + 1; k < m; k++) s -= w[k] * x[i + off[k]];
    r[i] = s;
  }
}

/**
 * r = −U x over rows lo … hi − 1 (default: all), U the strictly upper
 * triangle: the residual b − Ax right after one zero-start forward sweep,
 * for which (L + D)x = b holds (to round-off), at half the cost of
 * {@link residual}.
 */
export function upperResidual(a: LevelMatrix, x: Float64Array, r: Float64Array, lo = 0, hi = a.n): void {
  const { runCount, runStart, runEnd, offsets: off, weights: w, kind } = a;
  let i = lo;
  for (let q = firstRun(runEnd, runCount, lo); q < runCount; q++) {
    if (runStart[q] >= hi) break;
    const s0 = runStart[q] > i ? runStart[q] : i;
    const e0 = runEnd[q] < hi ? runEnd[q] : hi;
    csrUpper(a, i, s0, x, r);
    switch (kind) {
      case 5: upper5(s0, e0, off, w, x, r); break;
      case 9: upper9(s0, e0, off, w, x, r); break;
      case 7: upper7(s0, e0, off, w, x, r); break;
      case 27: upper27(s0, e0, off, w, x, r); break;
      case 3: upper3(s0, e0, off, w, x, r); break;
      default: anyUpper(a, s0, e0, x, r);
    }
    i = e0;
  }
  csrUpper(a, i, hi, x, r);
}

/** Damped Jacobi from x = 0: x = ω D⁻¹ b. */
export function jacobiZero(n: number, omega: number, invDiag: Float64Array, b: Float64Array, x: Float64Array): void {
  for (let i = 0; i < n; i++) x[i] = omega * invDiag[i] * b[i];
}

/** Damped Jacobi update with the residual r = b − A x: x += ω D⁻¹ r. */
export function jacobiUpdate(n: number, omega: number, invDiag: Float64Array, r: Float64Array, x: Float64Array): void {
  for (let i = 0; i < n; i++) x[i] += omega * invDiag[i] * r[i];
}
