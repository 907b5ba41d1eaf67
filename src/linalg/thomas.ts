/**
 * Tridiagonal systems by the Thomas algorithm (Gaussian elimination without
 * pivoting on a tridiagonal matrix), factored once and solved many times.
 *
 * For rows i = 0 … n−1: aᵢ·xᵢ₋₁ + bᵢ·xᵢ + cᵢ·xᵢ₊₁ = dᵢ (a₀ and cₙ₋₁ unused).
 * Forward elimination gives the pivots βᵢ = bᵢ − aᵢ·cᵢ₋₁/βᵢ₋₁; then
 * yᵢ = (dᵢ − aᵢ·yᵢ₋₁)/βᵢ and xᵢ = yᵢ − (cᵢ/βᵢ)·xᵢ₊₁. 8n flops per solve.
 * Stable without pivoting when the matrix is diagonally dominant or
 * symmetric positive definite (Higham, N. J. (2002). Accuracy and Stability
 * of Numerical Algorithms, 2nd ed., SIAM, §9.5); otherwise a pivot may
 * vanish, which the factorisation detects and reports.
 *
 * @module
 */
import { checkAllFinite } from '../check.js';
import { ShapeMismatchError, SingularMatrixError } from '../errors.js';

/** A factored tridiagonal matrix, ready for repeated solves. */
export interface TridiagonalFactors {
  /** Order n. */
  readonly n: number;
  /** Sub-diagonal aᵢ (index 0 unused). */
  readonly sub: Readonly<Float64Array>;
  /** 1/βᵢ, the inverted pivots. */
  readonly inversePivots: Readonly<Float64Array>;
  /** cᵢ/βᵢ, the scaled super-diagonal. */
  readonly ratios: Readonly<Float64Array>;
}

/**
 * Factors the tridiagonal matrix with sub-diagonal `sub`, diagonal `diag`
 * and super-diagonal `sup` (all of length n; `sub[0]` and `sup[n−1]` are
 * ignored). A pivot |βᵢ| ≤ 8ε·(|aᵢ| + |bᵢ| + |cᵢ|) is taken as zero.
 *
 * @param sub - aᵢ
 * @param diag - bᵢ
 * @param sup - cᵢ
 * @returns the factors
 * @example solveTridiagonal(factorTridiagonal(Float64Array.of(0, -1, -1), Float64Array.of(2, 2, 2), Float64Array.of(-1, -1, 0)), Float64Array.of(1, 0, 1)) // [1, 1, 1]
 */
export function factorTridiagonal(sub: ArrayLike<number>, diag: ArrayLike<number>, sup: ArrayLike<number>): TridiagonalFactors {
  const n = diag.length;
  if (sub.length !== n || sup.length !== n) {
    throw new ShapeMismatchError(`diagonals have lengths ${sub.length}, ${n}, ${sup.length}; give three arrays of length n (sub[0] and sup[n−1] unused)`);
  }
  checkAllFinite('diag', diag);
  // sub[0] and sup[n−1] are not used
  checkAllFinite('sub', sub, 1);
  checkAllFinite('sup', sup, 0, Math.max(0, n - 1));
  const a = new Float64Array(n);
  const inv = new Float64Array(n);
  const ratio = new Float64Array(n);
  let prevRatio = 0;
  for (let i = 0; i < n; i++) {
    const ai = i > 0 ? (sub[i] as number) : 0;
    const ci = i < n - 1 ? (sup[i] as number) : 0;
    const beta = (diag[i] as number) - ai * prevRatio;
    const scale = Math.abs(ai) + Math.abs(diag[i] as number) + Math.abs(ci);
    if (!(Math.abs(beta) > 8 * Number.EPSILON * scale)) {
      throw new SingularMatrixError(i, beta, 'the tridiagonal matrix needs pivoting or is singular; check the boundary rows, or use the banded LU with pivoting');
    }
    a[i] = ai;
    inv[i] = 1 / beta;
    ratio[i] = ci / beta;
    prevRatio = ratio[i]!;
  }
  return { n, sub: a, inversePivots: inv, ratios: ratio };
}

/**
 * Solves with factors from {@link factorTridiagonal}; `out` may be `rhs`
 * itself (in place). Allocates nothing when `out` is given.
 *
 * @param f - the factors
 * @param rhs - the right-hand side d, length n
 * @param out - where to write x; a new array if absent
 * @returns `out`, or the new array
 */
export function solveTridiagonal(f: TridiagonalFactors, rhs: ArrayLike<number>, out?: Float64Array): Float64Array {
  const n = f.n;
  if (rhs.length !== n) throw new ShapeMismatchError(`rhs has ${rhs.length} entries but the matrix has order ${n}`);
  const x = out ?? new Float64Array(n);
  if (x.length !== n) throw new ShapeMismatchError(`out has ${x.length} entries but the matrix has order ${n}`);
  checkAllFinite('rhs', rhs);
  thomasSolve(n, f.sub as Float64Array, f.inversePivots as Float64Array, f.ratios as Float64Array, rhs, x);
  return x;
}

/** The solve kernel: no checks, no allocation; `x` may alias `d`. @internal */
export function thomasSolve(n: number, a: Float64Array, inv: Float64Array, ratio: Float64Array, d: ArrayLike<number>, x: Float64Array): void {
  let y = 0;
  for (let i = 0; i < n; i++) {
    y = ((d[i] as number) - a[i] * y) * inv[i];
    x[i] = y;
  }
  for (let i = n - 2; i >= 0; i--) x[i] -= ratio[i] * x[i + 1];
}
