/**
 * The linear solve inside an implicit step, set up once per step size.
 *
 * - 1-D, tridiagonal: Thomas algorithm, factored once.
 * - 1-D otherwise: banded LU, factored once.
 * - 2-D, constant coefficients, values on both edges of an axis with an
 *   even cell count with no prime factor above 5 and values or fluxes on
 *   the other two (3-D: such y and z, values or fluxes on the x faces;
 *   accuracy 2, no advection or convection): the
 *   sine-transform direct solver, refined against the matrix to the
 *   tolerance (`sine-transform.ts`).
 * - symmetric 2-D / 3-D: conjugate gradients preconditioned by a multigrid
 *   V-cycle on uniform grids (IC(0) on stretched ones), warm-started from
 *   the previous level.
 * - nonsymmetric 2-D / 3-D (advection, accuracy 4 and 6 closures):
 *   BiCGSTAB with ILU(0), warm-started.
 *
 * @module
 */
import { InvalidOptionError } from '../errors.js';
import type { Grid } from '../grid/index.js';
import { factorBanded, solveBanded } from '../linalg/banded.js';
import { bicgstab, conjugateGradient, createKrylovWorkspace } from '../linalg/krylov.js';
import { createMultigrid } from '../linalg/multigrid.js';
import { incompleteCholesky, incompleteLU, type Preconditioner } from '../linalg/preconditioners.js';
import { thomasSolve, factorTridiagonal, type TridiagonalFactors } from '../linalg/thomas.js';
import { coordinateSpread, createSineTransformSolver, sineStencil } from '../linalg/sine-transform.js';
import type { CsrMatrix } from '../operator/matrix.js';
import { makeOperator } from '../operator/operator.js';

/**
 * Which solver an implicit step uses: 'auto' (module doc), 'direct',
 * 'sine-transform' (constant-coefficient 2-D plates and 3-D blocks with
 * values across an axis, or y and z, whose cell counts are even with no
 * prime factor above 5, and values or fluxes elsewhere), 'cg' or
 * 'bicgstab'.
 */
export type StepSolver = 'auto' | 'direct' | 'sine-transform' | 'cg' | 'bicgstab';

/** A prepared solve K x = b. @internal */
export interface PreparedSolve {
  /** Name for reports. */
  readonly name: string;
  /** Solves into x (x holds the warm start on entry); returns the iterations used. */
  solve(b: Float64Array, x: Float64Array): number;
  /** For 'thomas': K's three diagonals (sub[0], sup[n−1] zero) and their factors, for fused steps. */
  readonly tridiagonal?: { readonly sub: Float64Array; readonly diag: Float64Array; readonly sup: Float64Array; readonly factors: TridiagonalFactors };
}

function tridiagonal(m: CsrMatrix): boolean {
  for (let r = 0; r < m.rows; r++) {
    for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) if (Math.abs(m.colIdx[p]! - r) > 1) return false;
  }
  return true;
}

/**
 * Prepares the solve of K x = b for repeated right-hand sides.
 *
 * @internal
 */
export function prepareSolve(
  g: Grid, k: CsrMatrix, symmetric: boolean, prescribed: Uint8Array,
  options: { solver: StepSolver; tolerance: number; maxIterations?: number },
): PreparedSolve {
  const n = k.rows;
  let method = options.solver;
  const sine = (method === 'auto' || method === 'sine-transform') && symmetric && g.dimension >= 2 && g.axes.every((a) => a.uniform)
    ? sineStencil(g.shape, k, prescribed, coordinateSpread(g.axes)) : undefined;
  if (method === 'sine-transform') {
    if (sine === undefined) {
      throw new InvalidOptionError('solver', 'the sine-transform solver needs a uniform grid, constant coefficients, accuracy 2, no advection, a value on both faces of an axis with an even number of cells with no prime factor above 5 (2ᵏ, 10, 12, 100, …; y and z in 3-D), and a value or a flux on the other faces (no convection); use auto or cg');
    }
  }
  if (method === 'auto') method = g.dimension === 1 ? 'direct' : sine !== undefined ? 'sine-transform' : symmetric ? 'cg' : 'bicgstab';
  if (method === 'sine-transform') {
    const st = createSineTransformSolver(g.shape, k, sine!, options.tolerance);
    return { name: 'sine-transform', solve: (b, x) => st.solve(b, x).solves };
  }
  if (method === 'cg' && !symmetric) {
    throw new InvalidOptionError('solver', 'conjugate gradients need a symmetric step matrix; advection and the accuracy 4 and 6 closures make it nonsymmetric, use bicgstab or direct');
  }
  if (method === 'direct') {
    if (tridiagonal(k)) {
      const sub = new Float64Array(n);
      const diag = new Float64Array(n);
      const sup = new Float64Array(n);
      for (let r = 0; r < n; r++) {
        for (let p = k.rowPtr[r]!; p < k.rowPtr[r + 1]!; p++) {
          const c = k.colIdx[p]!;
          if (c === r - 1) sub[r] = k.values[p]!;
          else if (c === r) diag[r] = k.values[p]!;
          else sup[r] = k.values[p]!;
        }
      }
      const f = factorTridiagonal(sub, diag, sup);
      const a = f.sub as Float64Array;
      const inv = f.inversePivots as Float64Array;
      const ratio = f.ratios as Float64Array;
      return { name: 'thomas', solve: (b, x) => (thomasSolve(n, a, inv, ratio, b, x), 0), tridiagonal: { sub, diag, sup, factors: f } };
    }
    const lu = factorBanded(k);
    return { name: 'banded-lu', solve: (b, x) => (solveBanded(lu, b, x), 0) };
  }
  const op = makeOperator({ rows: n, cols: n, symmetric, build: () => k });
  const ws = createKrylovWorkspace(n);
  let M: Preconditioner;
  if (method === 'cg') {
    if (g.axes.every((a) => a.uniform)) {
      const mg = createMultigrid(g, k, { prescribed });
      M = { name: 'multigrid', symmetric: true, apply: (r, z) => mg.precondition(r, z) };
    } else {
      M = incompleteCholesky(k);
    }
    const o = { tolerance: options.tolerance, maxIterations: options.maxIterations, preconditioner: M, workspace: ws };
    return { name: `cg+${M.name}`, solve: (b, x) => conjugateGradient(op, b, { ...o, x0: x, out: x }).iterations };
  }
  M = incompleteLU(k);
  const o = { tolerance: options.tolerance, maxIterations: options.maxIterations, preconditioner: M, workspace: ws };
  return { name: `bicgstab+${M.name}`, solve: (b, x) => bicgstab(op, b, { ...o, x0: x, out: x }).iterations };
}
