/**
 * Geometric multigrid for node-centred grids in one, two and three
 * dimensions: V- and W-cycles, full multigrid, symmetric Gauss–Seidel or
 * damped Jacobi smoothing, Galerkin coarse operators, a banded LU solve on
 * the coarsest level. Use it alone ({@link Multigrid.solve}) or as the
 * preconditioner of conjugate gradients ({@link Multigrid.precondition}).
 *
 * Hierarchy. Level 0 is the given grid and matrix. Each coarser level keeps
 * every other node of each coarsened axis: a non-periodic axis of an even
 * number of cells keeps its even-indexed nodes (cells halved), a periodic
 * axis of an even node count likewise. Every axis with more than one node
 * is coarsened at once while all of them halve this way and the level has
 * more than `coarsestSize` unknowns. When one does not (an odd cell count,
 * a single cell), the level is solved directly if its banded LU is cheap —
 * under 2·10⁷ flops and 64 MiB, e.g. 45 × 45 cells (2 116 unknowns, a few
 * ms) or any 1-D grid; otherwise coarsening goes on, an odd axis keeping
 * its even nodes and its last node (one coarse cell then spans a single
 * fine cell), so an awkward size still gets a full hierarchy: 1022² cells
 * converge like 1024², at the same cost per cycle. Node positions are
 * tracked level by level (indices on uniform axes, coordinates on
 * stretched ones) and the interpolation weights are those of linear
 * interpolation in space.
 *
 * Transfers and coarse operators. P (fine × coarse) is the tensor product
 * of 1-D linear interpolations: a coarse node passes its value with weight
 * 1 to the fine node at its place and with the linear weights (½ on a
 * uniform axis) to the fine nodes between it and its coarse neighbours —
 * bilinear in 2-D, trilinear in 3-D. Restriction is R = Pᵀ, and the coarse
 * matrix is A_c = Pᵀ A P (Galerkin), one sparse triple product per level.
 * Galerkin operators inherit variable and jumping coefficients, flux and
 * convection faces and stretched cells from A, and stay symmetric positive
 * definite when A is. Prescribed nodes (identity rows, see
 * {@link MultigridOptions.prescribed}): P's rows at prescribed fine nodes
 * and its columns at coarse nodes on prescribed fine nodes are zero, and
 * those coarse nodes get identity rows, so every correction vanishes there.
 * P is never stored: the cycles apply it line by line from its 1-D tables.
 *
 * Cycle (correction scheme, Brandt 1977): ν₁ pre-smoothing sweeps, r = b −
 * Ax, restrict r, solve the coarse correction equation by one (V) or two
 * (W) cycles on the next level from zero, interpolate and add, ν₂
 * post-smoothing sweeps; exact on the coarsest level. Gauss–Seidel
 * pre-smoothing runs forward and post-smoothing backward, so with ν₁ = ν₂
 * the cycle is a symmetric positive definite linear map M ≈ A⁻¹ when A is
 * SPD: a valid CG preconditioner. Damped Jacobi uses ω = 2d/(2d + 1) in d
 * dimensions (2/3, 4/5, 6/7: the damping that best smooths the 3-, 5- and
 * 7-point Laplacian by local Fourier analysis) and is symmetric with
 * ν₁ = ν₂ too. Full multigrid restricts the residual to every level,
 * solves on the coarsest, and interpolates up with one cycle per level; it
 * reaches the discretisation error in one pass (tested).
 *
 * Cost. One V(1,1)-cycle reads and writes the fine unknowns about 8 times
 * (a zero-start forward sweep and its residual −Ux cost half a sweep each,
 * then the two transfers and a backward sweep) plus 1/3 (2-D) or 1/7 (3-D)
 * of that again on the coarse levels: about 22 ms on W2's 1024² cells here,
 * W-cycles 2 × that in 2-D. Cycles to a fixed tolerance do not grow with
 * the grid: 10 V(1,1)-cycles or 7–8 CG iterations to 1e-8 from 32² to
 * 1024² cells, 12–13 cycles in 3-D. Rows equal to one shifted stencil
 * (constant coefficients away from the boundary, to within the few ulps
 * that rounded coordinates leave) are smoothed by straight-line loops that
 * read no matrix storage, 2–3 × faster than CSR rows; the true residual of
 * `solve` is always A's own. Memory: about 90 bytes per fine unknown (the
 * coarse matrices, 1/x-diagonals, three vectors per level), 16 more once
 * `solve` has run; the given matrix is not copied.
 *
 * Limits. Point smoothers lose grid independence on strongly anisotropic
 * problems (very stretched cells, k much larger along one axis) and slow
 * down across large jumps of k that linear interpolation does not follow
 * (a 100× layer: 19 → 43 cycles alone from 64² to 256² cells, 9 → 15 CG
 * iterations); prefer the cycle as a CG preconditioner there. A singular system (flux faces only, or
 * periodic axes without a value or convection face) fails on the coarsest
 * LU with SingularMatrixError. Gauss–Seidel needs rows it can smooth: the
 * one-sided flux rows of accuracy 4 and 6 make the cycle diverge (reported
 * as such by `solve`); use BiCGSTAB with ILU(0) for those systems.
 *
 * Sources: Brandt, A. (1977). Multi-level adaptive solutions to boundary-
 * value problems. Math. Comp. 31(138), 333–390. Trottenberg, U., Oosterlee,
 * C. W. & Schüller, A. (2001). Multigrid, Academic Press. Briggs, W. L.,
 * Henson, V. E. & McCormick, S. F. (2000). A Multigrid Tutorial, 2nd ed.,
 * SIAM. Gustavson, F. G. (1978). Two fast algorithms for sparse matrices.
 * ACM Trans. Math. Softw. 4(3), 250–269.
 *
 * @module
 */
import { InvalidOptionError, NotConvergedError, ShapeMismatchError, ZeroDiagonalError } from '../errors.js';
import type { Grid } from '../grid/grid.js';
import { type CsrMatrix, checkCsr } from '../operator/matrix.js';
import { type Operator, checkVectorFinite } from '../operator/operator.js';
import { type BandedLU, factorBanded, solveBanded } from './banded.js';
import {
  type AxisLevel, type LinePlan, axisTransfer, canCoarsen, canHalve, linePlan, regularRows,
} from './base/coarsen.js';
import { galerkinProduct } from './base/galerkin.js';
import {
  type LevelMatrix, exactResidual, findDiagonal, gaussSeidelBackward, gaussSeidelForward, jacobiUpdate, jacobiZero, levelMatrix,
  residual, upperResidual,
} from './base/smooth.js';
import { combineLines, contractLine, expandLine } from './base/transfer.js';
import { type IterativeOptions, type SolveResult, checkIterative, norm2 } from './result.js';

/** How {@link createMultigrid} builds and runs its cycles. */
export interface MultigridOptions {
  /** `'V'` (default): one coarse cycle per level; `'W'`: two, more robust, about 1.5 × (2-D) the work per cycle. */
  readonly cycle?: 'V' | 'W';
  /** Smoothing sweeps before the coarse correction, ν₁ (default 1). */
  readonly preSmooth?: number;
  /** Smoothing sweeps after the coarse correction, ν₂ (default 1); ν₁ = ν₂ keeps the cycle symmetric. */
  readonly postSmooth?: number;
  /**
   * `'gauss-seidel'` (default): forward sweeps before, backward sweeps after
   * the coarse correction (symmetric Gauss–Seidel over a cycle);
   * `'jacobi'`: damped Jacobi, ω = 2/3, 4/5, 6/7 in 1, 2, 3 dimensions.
   */
  readonly smoother?: 'gauss-seidel' | 'jacobi';
  /**
   * Solve directly (banded LU) once a level has at most this many unknowns
   * (default 1000). A level whose axes cannot all be halved is also solved
   * directly when its LU is cheap (module doc); a huge value that would make
   * the coarsest LU need more than 512 MiB is refused.
   */
  readonly coarsestSize?: number;
  /**
   * 1 at nodes whose rows are identity (constraint) rows, e.g. the
   * `prescribed` mask of a Discretization; every correction is 0 there.
   * Default: the rows with no nonzero entry off the diagonal.
   */
  readonly prescribed?: Readonly<Uint8Array>;
}

/** A multigrid hierarchy, built once, applied many times. */
export interface Multigrid {
  /** Number of grid levels, the given grid included (1: the grid could not be coarsened and is solved directly). */
  readonly levels: number;
  /** Unknowns per level, finest first. */
  readonly sizes: readonly number[];
  /**
   * One cycle from z = 0 on A z = r: z ≈ A⁻¹ r. With the Gauss–Seidel (or
   * Jacobi) smoother and preSmooth = postSmooth this is a fixed symmetric
   * positive definite linear map when A is SPD, usable as a CG
   * preconditioner. Allocates nothing; `r` is not changed.
   *
   * @param r - the right-hand side (a residual), one entry per unknown
   * @param z - where to write the approximation; must not be `r`
   * @throws ShapeMismatchError if a length differs from the unknowns, or `z` is `r`
   */
  precondition(r: Float64Array, z: Float64Array): void;
  /**
   * Multigrid as a solver: cycles x ← x + M(b − Ax) until
   * ‖b − Ax‖₂ / ‖b‖₂ ≤ tolerance (default 1e-8, at most 100 cycles), the
   * residual computed with A itself; `fullMultigrid` starts with one
   * full-multigrid pass, which reaches the discretisation error by itself
   * and counts as one iteration. Allocates the solution and the history per
   * call, a residual and a correction vector on the first call (kept); the
   * cycles allocate nothing.
   *
   * @param b - right-hand side, one entry per unknown; not changed
   * @param options - tolerance, maxIterations, starting guess `x0` (default 0), `fullMultigrid` (default false)
   * @returns the solution with iterations, final relative residual and history
   * @throws NotConvergedError (code `NOT_CONVERGED`, with the history) if the tolerance is not met within maxIterations;
   *   ShapeMismatchError, NonFiniteValueError, InvalidOptionError for bad input
   */
  solve(b: Float64Array, options?: IterativeOptions & { x0?: Float64Array; fullMultigrid?: boolean }): SolveResult;
}

/** What one level holds. Level 0's x and b are the caller's arrays of the current call. */
interface Level {
  readonly n: number;
  readonly a: CsrMatrix;
  readonly m: LevelMatrix;
  readonly axes: readonly AxisLevel[];
  readonly mask: Uint8Array;
  x: Float64Array;
  b: Float64Array;
  readonly r: Float64Array;
  /** Prescribed nodes of this level, and room to keep their values during an interpolation. */
  readonly fixed: Int32Array;
  readonly saved: Float64Array;
  /** How the transfers to and from the next coarser level run, line by line. */
  plan: LinePlan | undefined;
  /** Lower and upper bandwidth of A: row i couples to rows i − kl … i + ku. */
  readonly kl: number;
  readonly ku: number;
}

const LU_FLOPS = 2e7;
const LU_BYTES = 64 * 2 ** 20;
const LU_BYTES_MAX = 512 * 2 ** 20;

/** Lower and upper bandwidth of a CSR matrix. */
function bandwidths(a: CsrMatrix): { kl: number; ku: number } {
  let kl = 0;
  let ku = 0;
  for (let r = 0; r < a.rows; r++) {
    const s = a.rowPtr[r];
    const e = a.rowPtr[r + 1];
    if (e > s) {
      kl = Math.max(kl, r - a.colIdx[s]);
      ku = Math.max(ku, a.colIdx[e - 1] - r);
    }
  }
  return { kl, ku };
}

function luCost(a: CsrMatrix): { flops: number; bytes: number; kl: number; ku: number } {
  const { kl, ku } = bandwidths(a);
  return { flops: a.rows * kl * (kl + ku + 1), bytes: (2 * kl + ku + 1) * a.rows * 8, kl, ku };
}

function wholeAtLeast(name: string, v: number, min: number, hint: string): number {
  if (!(Number.isSafeInteger(v) && v >= min)) throw new InvalidOptionError(name, `${v} is not a whole number ≥ ${min}; ${hint}`);
  return v;
}

function levelOf(a: CsrMatrix, axes: readonly AxisLevel[], mask: Uint8Array, what: string, tolerance: number, x?: Float64Array): Level {
  const n = a.rows;
  const diagPtr = new Int32Array(n);
  const invDiag = new Float64Array(n);
  const bad = findDiagonal(a, diagPtr, invDiag);
  if (bad >= 0) {
    let v = 0;
    for (let p = a.rowPtr[bad]; p < a.rowPtr[bad + 1]; p++) if (a.colIdx[p] === bad) v = a.values[p];
    throw new ZeroDiagonalError(bad, v, what);
  }
  const empty = new Float64Array(0);
  let count = 0;
  for (let i = 0; i < n; i++) count += mask[i];
  const fixed = new Int32Array(count);
  for (let i = 0, q = 0; i < n; i++) if (mask[i] === 1) fixed[q++] = i;
  return {
    n, a, m: levelMatrix(a, diagPtr, invDiag, tolerance), axes, mask,
    x: x ?? new Float64Array(n), b: x === undefined ? new Float64Array(n) : empty, r: new Float64Array(n),
    fixed, saved: new Float64Array(count), plan: undefined, ...bandwidths(a),
  };
}

/**
 * Builds a geometric multigrid hierarchy for A on the grid `g` (module doc:
 * coarsening, transfers, Galerkin coarse operators, cycles, cost, limits).
 *
 * A's unknowns are the grid's nodes in field order (node (i, j, k) at
 * (i·ny + j)·nz + k, x slowest). Stretched axes are supported: the
 * interpolation is linear in the coordinates and the coarse operators are
 * Galerkin, so cell sizes are respected, but strongly stretched cells make
 * point smoothing slow (see the limits); periodic axes coarsen while their
 * node count is even.
 *
 * Set-up cost: O(nnz(A)) per level. The triple product computes each
 * coarse row only where the row is not a shifted copy of a regular one
 * (boundary layers, variable coefficients) and copies the rest, so a
 * constant-coefficient problem sets up in a few passes over A: 0.2–0.4 s
 * for W2's 1024² cells here (about 0.6 s for the first call in a fresh
 * process, before the JIT has compiled the loops), 0.8–1.7 s for 128³.
 *
 * @param g - the grid of the unknowns
 * @param a - the square matrix: an Operator, or a CSR matrix (its structure is checked); not copied, do not change it afterwards
 * @param options - cycle, smoothing, coarsest size, prescribed nodes
 * @returns the hierarchy
 * @throws ShapeMismatchError if A is not square or its order is not the grid's node count;
 *   ZeroDiagonalError if a row (of A or a coarse level) has no nonzero diagonal;
 *   InvalidOptionError for a bad option; NonFiniteValueError for NaN or ∞ in A;
 *   SingularMatrixError if the coarsest level is singular (a pure-flux problem)
 * @example
 * ```ts
 * const g = grid({ x: { from: 0, to: 1, cells: 64 }, y: { from: 0, to: 1, cells: 64 } });
 * const d = discretize(g, { boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }] });
 * const { matrix, rhs } = d.system({ source: 1 });
 * const mg = createMultigrid(g, matrix, { prescribed: d.prescribed });
 * mg.sizes // [4225, 1089, 289]
 * mg.solve(rhs).iterations // 10 (V(1,1)-cycles to ‖b − Ax‖/‖b‖ ≤ 1e-8)
 * ```
 */
export function createMultigrid(g: Grid, a: Operator | CsrMatrix, options: Readonly<MultigridOptions> = {}): Multigrid {
  const csr: CsrMatrix = 'matrix' in a ? a.matrix : a;
  // an Operator's CSR form is assembled (or checked, by fromCsr) by quadrille itself
  if (!('matrix' in a)) checkCsr(csr);
  if (csr.rows !== csr.cols) {
    throw new ShapeMismatchError(`the matrix is ${csr.rows} × ${csr.cols}; multigrid needs a square matrix, one row and column per grid node`);
  }
  if (csr.rows !== g.size) {
    throw new ShapeMismatchError(`the matrix has ${csr.rows} rows but the grid has ${g.size} nodes (shape [${g.shape.join(', ')}]); give one unknown per node, x slowest`);
  }
  checkVectorFinite('matrix values', csr.values);
  const cycle = options.cycle ?? 'V';
  if (cycle !== 'V' && cycle !== 'W') throw new InvalidOptionError('cycle', `${String(cycle)} is not 'V' or 'W'`);
  const smoother = options.smoother ?? 'gauss-seidel';
  if (smoother !== 'gauss-seidel' && smoother !== 'jacobi') {
    throw new InvalidOptionError('smoother', `${String(smoother)} is not 'gauss-seidel' or 'jacobi'`);
  }
  const pre = wholeAtLeast('preSmooth', options.preSmooth ?? 1, 0, 'give the sweeps before the coarse correction, e.g. 1');
  const post = wholeAtLeast('postSmooth', options.postSmooth ?? 1, 0, 'give the sweeps after the coarse correction, e.g. 1');
  if (pre + post === 0) throw new InvalidOptionError('preSmooth', 'preSmooth and postSmooth are both 0; a cycle needs at least one smoothing sweep');
  const coarsestSize = wholeAtLeast('coarsestSize', options.coarsestSize ?? 1000, 1, 'e.g. 1000');
  const n = csr.rows;
  let mask: Uint8Array;
  if (options.prescribed !== undefined) {
    const given = options.prescribed;
    if (!(given instanceof Uint8Array) || given.length !== n) {
      throw new ShapeMismatchError(`prescribed must be a Uint8Array of ${n} entries (one per node), got ${given instanceof Uint8Array ? given.length : typeof given}`);
    }
    for (let i = 0; i < n; i++) {
      if (given[i] > 1) throw new InvalidOptionError('prescribed', `entry ${i} is ${given[i]}; use 1 for a prescribed node, 0 otherwise`);
    }
    mask = Uint8Array.from(given);
  } else {
    mask = new Uint8Array(n);
    for (let i = 0; i < n; i++) {
      let off = false;
      for (let p = csr.rowPtr[i]; p < csr.rowPtr[i + 1]; p++) if (csr.colIdx[p] !== i && csr.values[p] !== 0) off = true;
      if (!off) mask[i] = 1;
    }
  }

  // three axes, the missing ones of 1-D and 2-D grids as single nodes
  const axes0: AxisLevel[] = [];
  for (let d = 0; d < 3; d++) {
    const ax = g.axes[d];
    if (ax === undefined) {
      axes0.push({ count: 1, periodic: false, pos: new Float64Array(1), period: 1 });
    } else if (ax.uniform) {
      axes0.push({ count: ax.count, periodic: ax.periodic, pos: Float64Array.from({ length: ax.count }, (_, i) => i), period: ax.cells });
    } else {
      axes0.push({ count: ax.count, periodic: ax.periodic, pos: Float64Array.from(ax.coordinates), period: ax.to - ax.from });
    }
  }

  // rows of one stencil agree to about ε·max|x|/h: spacings are differences of rounded coordinates
  let spread = 1;
  for (const ax of g.axes) {
    let hmin = Infinity;
    for (let i = 0; i < ax.widths.length; i++) hmin = Math.min(hmin, ax.widths[i]);
    spread = Math.max(spread, Math.max(Math.abs(ax.from), Math.abs(ax.to)) / hmin);
  }
  const tolerance = 16 * Number.EPSILON * spread;
  const lv: Level[] = [levelOf(csr, axes0, mask, 'the matrix', tolerance, new Float64Array(0))];
  let lineLen = 0;
  for (;;) {
    const cur = lv[lv.length - 1];
    if (cur.n <= coarsestSize) break;
    const active = cur.axes.filter((ax) => ax.count > 1);
    let plan: boolean[];
    if (active.every(canHalve)) {
      plan = cur.axes.map((ax) => ax.count > 1);
    } else {
      const c = luCost(cur.a);
      if (c.flops <= LU_FLOPS && c.bytes <= LU_BYTES) break;
      plan = cur.axes.map(canCoarsen);
      if (!plan.some((p) => p)) break;
    }
    const t = cur.axes.map((ax, d) => axisTransfer(ax, plan[d]));
    const caxes = t.map((x) => x.coarse);
    const N1 = caxes[1].count;
    const N2 = caxes[2].count;
    const nc = caxes[0].count * N1 * N2;
    const cmask = new Uint8Array(nc);
    const [f0, f1, f2] = [t[0].fineOf, t[1].fineOf, t[2].fineOf];
    const n1 = cur.axes[1].count;
    const n2 = cur.axes[2].count;
    for (let I = 0; I < caxes[0].count; I++) {
      for (let J = 0; J < N1; J++) {
        for (let K = 0; K < N2; K++) cmask[(I * N1 + J) * N2 + K] = cur.mask[(f0[I] * n1 + f1[J]) * n2 + f2[K]];
      }
    }
    const ac = galerkinProduct(cur.a, t, cur.mask, cmask, regularRows(cur.m, cur.axes, cur.fixed, t, cmask));
    cur.plan = linePlan(t);
    lineLen = Math.max(lineLen, cur.plan.fineLen);
    lv.push(levelOf(ac, caxes, cmask, `the coarse matrix of level ${lv.length}`, tolerance));
  }
  // one fine line's worth of sums for the transfers
  const buf = new Float64Array(lineLen);
  const last = lv.length - 1;
  const cost = luCost(lv[last].a);
  if (cost.bytes > LU_BYTES_MAX) {
    throw new InvalidOptionError(
      'coarsestSize',
      `the coarsest level has ${lv[last].n} unknowns and bandwidth ${Math.max(cost.kl, cost.ku)}; its banded LU would need ` +
        `${(cost.bytes / 2 ** 20).toFixed(0)} MiB; lower coarsestSize (default 1000)`,
    );
  }
  const lu: BandedLU = factorBanded(lv[last].a);
  const omega = (2 * g.dimension) / (2 * g.dimension + 1);
  const gs = smoother === 'gauss-seidel';
  const w = cycle === 'W';

  /** b_{l+1} = Pᵀ src, src a vector of level l (its prescribed entries are cleared first: P's rows there are zero). */
  function restrictFrom(l: number, src: Float64Array): void {
    const L = lv[l];
    const C = lv[l + 1];
    const fx = L.fixed;
    for (let q = 0; q < fx.length; q++) src[fx[q]] = 0;
    const p = L.plan as LinePlan;
    const t = p.line;
    const { fineLen, coarseLen, downStart, downLine, downW, uniform } = p;
    const dst = C.b;
    for (let c = 0; c < p.coarseLines; c++) {
      const q0 = downStart[c];
      const k = downStart[c + 1] - q0;
      if (k === 1 && downW[q0] === 1) {
        contractLine(fineLen, coarseLen, t.fa, t.wa, t.fb, t.wb, t.fc, t.wc, uniform, src, downLine[q0] * fineLen, dst, c * coarseLen);
      } else {
        combineLines(k, q0, downLine, downW, fineLen, src, buf);
        contractLine(fineLen, coarseLen, t.fa, t.wa, t.fb, t.wb, t.fc, t.wc, uniform, buf, 0, dst, c * coarseLen);
      }
    }
    const cx = C.fixed;
    for (let q = 0; q < cx.length; q++) dst[cx[q]] = 0;
  }

  /** x_l (+)= P x_{l+1}, leaving level l's prescribed entries as they were (add) or 0 (not add). */
  function interpolateTo(l: number, add: boolean): void {
    const L = lv[l];
    const C = lv[l + 1];
    const fx = L.fixed;
    const keep = L.saved;
    const x = L.x;
    for (let q = 0; q < fx.length; q++) keep[q] = add ? x[fx[q]] : 0;
    const p = L.plan as LinePlan;
    const t = p.line;
    const { fineLen, coarseLen, upStart, upLine, upW, uniform } = p;
    const src = C.x;
    for (let f = 0; f < p.fineLines; f++) {
      const q0 = upStart[f];
      const k = upStart[f + 1] - q0;
      if (k === 1 && upW[q0] === 1) {
        expandLine(fineLen, coarseLen, t.c0, t.w0, t.c1, t.w1, uniform, src, upLine[q0] * coarseLen, x, f * fineLen, add);
      } else {
        combineLines(k, q0, upLine, upW, coarseLen, src, buf);
        expandLine(fineLen, coarseLen, t.c0, t.w0, t.c1, t.w1, uniform, buf, 0, x, f * fineLen, add);
      }
    }
    for (let q = 0; q < fx.length; q++) x[fx[q]] = keep[q];
  }

  /** b_{l+1}'s coarse line c = Pᵀ restricted from the fine lines of src (prescribed entries already cleared). */
  function contract(p: LinePlan, c: number, src: Float64Array, dst: Float64Array): void {
    const t = p.line;
    const { fineLen, coarseLen, downStart, downLine, downW, uniform } = p;
    const q0 = downStart[c];
    const k = downStart[c + 1] - q0;
    if (k === 1 && downW[q0] === 1) {
      contractLine(fineLen, coarseLen, t.fa, t.wa, t.fb, t.wb, t.fc, t.wc, uniform, src, downLine[q0] * fineLen, dst, c * coarseLen);
    } else {
      combineLines(k, q0, downLine, downW, fineLen, src, buf);
      contractLine(fineLen, coarseLen, t.fa, t.wa, t.fb, t.wb, t.fc, t.wc, uniform, buf, 0, dst, c * coarseLen);
    }
  }

  /**
   * One zero-start forward sweep, its residual −Ux and the restriction of
   * that residual, in one pass over level l by blocks of one line: a row's
   * residual is taken as soon as the sweep has passed its last upper
   * neighbour (ku rows on), and a coarse line as soon as its fine lines
   * have their residuals, while those values are still in cache.
   */
  function forwardZeroResidualRestrict(l: number): void {
    const L = lv[l];
    const C = lv[l + 1];
    const p = L.plan as LinePlan;
    const n = L.n;
    const ku = L.ku;
    const r = L.r;
    const fx = L.fixed;
    const last = p.downLast;
    const block = Math.max(64, p.fineLen);
    let done = 0;
    let fq = 0;
    let c = 0;
    for (let lo = 0; lo < n; lo += block) {
      const hi = Math.min(n, lo + block);
      gaussSeidelForward(L.m, L.b, L.x, true, lo, hi);
      const upto = hi === n ? n : hi - ku;
      if (upto <= done) continue;
      upperResidual(L.m, L.x, r, done, upto);
      done = upto;
      // P's rows at prescribed nodes are zero
      while (fq < fx.length && fx[fq] < upto) r[fx[fq++]] = 0;
      const lines = Math.floor(upto / p.fineLen);
      while (c < p.coarseLines && last[c] < lines) contract(p, c++, r, C.b);
    }
    const cx = C.fixed;
    for (let q = 0; q < cx.length; q++) C.b[cx[q]] = 0;
  }

  /**
   * x_l += P x_{l+1} and one backward sweep in one pass over level l, line
   * by line from the last: a row is swept as soon as the interpolation has
   * reached its lowest neighbour (kl rows back).
   */
  function interpolateAndBackward(l: number): void {
    const L = lv[l];
    const C = lv[l + 1];
    const fx = L.fixed;
    const keep = L.saved;
    const x = L.x;
    for (let q = 0; q < fx.length; q++) keep[q] = x[fx[q]];
    const p = L.plan as LinePlan;
    const t = p.line;
    const { fineLen, coarseLen, upStart, upLine, upW, uniform } = p;
    const src = C.x;
    const kl = L.kl;
    let fq = fx.length - 1;
    let swept = L.n;
    for (let f = p.fineLines - 1; f >= 0; f--) {
      const q0 = upStart[f];
      const k = upStart[f + 1] - q0;
      const row = f * fineLen;
      if (k === 1 && upW[q0] === 1) {
        expandLine(fineLen, coarseLen, t.c0, t.w0, t.c1, t.w1, uniform, src, upLine[q0] * coarseLen, x, row, true);
      } else {
        combineLines(k, q0, upLine, upW, coarseLen, src, buf);
        expandLine(fineLen, coarseLen, t.c0, t.w0, t.c1, t.w1, uniform, buf, 0, x, row, true);
      }
      // prescribed values back before the sweep reaches them
      while (fq >= 0 && fx[fq] >= row) {
        x[fx[fq]] = keep[fq];
        fq--;
      }
      const from = f === 0 ? 0 : Math.min(swept, row + kl);
      if (from < swept) {
        gaussSeidelBackward(L.m, L.b, x, from, swept);
        swept = from;
      }
    }
  }

  function smoothPre(L: Level, zero: boolean): void {
    if (pre === 0) {
      if (zero) L.x.fill(0);
      return;
    }
    for (let s = 0; s < pre; s++) {
      const z = zero && s === 0;
      if (gs) gaussSeidelForward(L.m, L.b, L.x, z);
      else if (z) jacobiZero(L.n, omega, L.m.invDiag, L.b, L.x);
      else {
        residual(L.m, L.b, L.x, L.r);
        jacobiUpdate(L.n, omega, L.m.invDiag, L.r, L.x);
      }
    }
  }

  function smoothPost(L: Level): void {
    for (let s = 0; s < post; s++) {
      if (gs) gaussSeidelBackward(L.m, L.b, L.x);
      else {
        residual(L.m, L.b, L.x, L.r);
        jacobiUpdate(L.n, omega, L.m.invDiag, L.r, L.x);
      }
    }
  }

  /** One cycle on level l for A_l x_l = b_l; `zero`: x_l is taken as 0 on entry. */
  function run(l: number, zero: boolean): void {
    const L = lv[l];
    if (l === last) {
      solveBanded(lu, L.b, L.x);
      return;
    }
    if (gs && zero && pre === 1) {
      // after a single zero-start Gauss–Seidel sweep, (L + D)x = b: the residual is −Ux, half a pass
      forwardZeroResidualRestrict(l);
    } else {
      smoothPre(L, zero);
      residual(L.m, L.b, L.x, L.r);
      restrictFrom(l, L.r);
    }
    run(l + 1, true);
    if (w && l + 1 < last) run(l + 1, false);
    if (gs && post > 0) {
      interpolateAndBackward(l);
      for (let s = 1; s < post; s++) gaussSeidelBackward(L.m, L.b, L.x);
    } else {
      interpolateTo(l, true);
      smoothPost(L);
    }
  }

  /** Full multigrid for A z = r on level 0 (lv[0].b = r, lv[0].x = z): restrict r to every level, solve the coarsest, cycle once per level on the way up. */
  function fullMultigrid(): void {
    if (last === 0) {
      solveBanded(lu, lv[0].b, lv[0].x);
      return;
    }
    restrictFrom(0, lv[0].b);
    for (let l = 1; l < last; l++) restrictFrom(l, lv[l].b);
    solveBanded(lu, lv[last].b, lv[last].x);
    for (let l = last - 1; l >= 0; l--) {
      interpolateTo(l, false);
      run(l, false);
    }
  }

  // the stand-alone solve's residual and correction, made on its first call
  let rr: Float64Array | undefined;
  let zz: Float64Array | undefined;

  const sizes = Object.freeze(lv.map((L) => L.n));
  const name = `multigrid-${cycle}`;

  const mg: Multigrid = {
    levels: lv.length,
    sizes,
    precondition(r: Float64Array, z: Float64Array): void {
      if (r.length !== n || z.length !== n) {
        throw new ShapeMismatchError(`precondition got r of ${r.length} and z of ${z.length} entries; both need ${n}, one per unknown`);
      }
      if (r === z) throw new ShapeMismatchError('precondition needs z to be a different array from r');
      lv[0].b = r;
      lv[0].x = z;
      run(0, true);
    },
    solve(b: Float64Array, opts: IterativeOptions & { x0?: Float64Array; fullMultigrid?: boolean } = {}): SolveResult {
      const { tol, maxIt } = checkIterative(opts, 100);
      if (!(b instanceof Float64Array) || b.length !== n) {
        throw new ShapeMismatchError(`b has ${b instanceof Float64Array ? b.length : 'no'} entries; it needs ${n}, one per unknown`);
      }
      checkVectorFinite('b', b);
      const x = new Float64Array(n);
      if (opts.x0 !== undefined) {
        if (!(opts.x0 instanceof Float64Array) || opts.x0.length !== n) {
          throw new ShapeMismatchError(`x0 needs ${n} entries, one per unknown`);
        }
        checkVectorFinite('x0', opts.x0);
        x.set(opts.x0);
      }
      const history = new Float64Array(maxIt + 1);
      const fmg = opts.fullMultigrid === true;
      const method = fmg ? `${name}+fmg` : name;
      const t0 = performance.now();
      const bn = norm2(b);
      if (bn === 0) {
        x.fill(0);
        return { solution: x, iterations: 0, residual: 0, history: history.slice(0, 1), method, seconds: (performance.now() - t0) / 1000 };
      }
      rr ??= new Float64Array(n);
      zz ??= new Float64Array(n);
      const r = rr;
      const z = zz;
      const L0 = lv[0];
      // correction form x ← x + M(b − Ax): the residual is A's own, so x converges to A⁻¹b exactly
      exactResidual(L0.m, b, x, r);
      let rel = norm2(r) / bn;
      history[0] = rel;
      let it = 0;
      while (rel > tol && it < maxIt) {
        // restrictFrom clears r's prescribed entries in place: work on the level-0 copy, not on b
        L0.b = r;
        L0.x = z;
        if (fmg && it === 0) fullMultigrid();
        else run(0, true);
        for (let i = 0; i < n; i++) x[i] += z[i];
        it++;
        exactResidual(L0.m, b, x, r);
        rel = norm2(r) / bn;
        history[it] = rel;
        // growth by 10⁴ over the start: the cycle amplifies the error, more cycles will not help
        if (!(rel <= 1e4 * history[0])) break;
      }
      const seconds = (performance.now() - t0) / 1000;
      if (!(rel <= tol)) {
        const why = rel <= 1e4 * history[0]
          ? 'raise maxIterations, loosen the tolerance, or use the cycle as a CG preconditioner (jumping coefficients and stretched cells slow it down)'
          : 'the cycle diverges: the matrix is not positive definite or not diagonally dominant enough for the smoother ' +
            '(the one-sided flux rows of accuracy 4 and 6, for instance); use bicgstab with an ILU(0) preconditioner';
        throw new NotConvergedError(method, it, rel, tol, history.slice(0, it + 1), why);
      }
      return { solution: x, iterations: it, residual: rel, history: history.slice(0, it + 1), method, seconds };
    },
  };
  return Object.freeze(mg);
}
