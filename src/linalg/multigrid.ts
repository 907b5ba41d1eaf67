/**
 * Geometric multigrid for node-centred grids in one, two and three
 * dimensions: V- and W-cycles, full multigrid, symmetric Gauss–Seidel or
 * damped Jacobi smoothing, Galerkin coarse operators, a banded LU solve on
 * the coarsest level. Use it alone ({@link Multigrid.solve}) or as the
 * preconditioner of conjugate gradients ({@link Multigrid.precondition}).
 *
 * Hierarchy. Level 0 is the given grid and matrix. Each coarser level keeps
 * every other node of each coarsened axis: a non-periodic axis of an even
 * number of cells keeps the even-indexed nodes (cells halved), a periodic
 * axis of an even node count likewise. Every non-trivial axis is coarsened
 * at once while all of them can be halved this way and the level has more
 * than `coarsestSize` unknowns. When one cannot (an odd cell count, a single
 * cell), that level is solved directly if its banded LU is cheap (under
 * about 10⁸ flops and 64 MiB: 45 × 45 cells, 2 116 unknowns, factor in a few
 * ms); otherwise coarsening goes on with an odd axis keeping its even nodes
 * and its last node (one coarse cell then spans a single fine cell), so an
 * awkward size still gets a full hierarchy. Axis positions are tracked
 * level by level: node indices on uniform axes, coordinates on stretched
 * ones, so the interpolation weights are those of linear interpolation in
 * space.
 *
 * Transfers and coarse operators. P (fine × coarse) is the tensor product
 * of the 1-D linear interpolations: a coarse node passes its value to the
 * fine node at its place with weight 1 and to the fine nodes between it and
 * its coarse neighbours with the linear weights (½ on a uniform axis), so
 * bilinear in 2-D, trilinear in 3-D. Restriction is R = Pᵀ and the coarse
 * matrix is A_c = Pᵀ A P (Galerkin), built by one sparse triple product.
 * Galerkin operators inherit variable and jumping coefficients, flux and
 * convection faces and stretched cells from A, and keep A symmetric
 * positive definite if it is. Prescribed nodes (identity rows, see
 * {@link MultigridOptions.prescribed}): P's rows at prescribed fine nodes
 * and its columns at coarse nodes on prescribed fine nodes are zero, and
 * those coarse nodes get identity rows, so every correction vanishes there.
 *
 * Cycle (correction scheme, Brandt 1977): ν₁ pre-smoothing sweeps, r = b −
 * Ax, restrict r, solve the coarse correction equation by one (V) or two
 * (W) cycles on the next level from zero, interpolate and add, ν₂
 * post-smoothing sweeps; exact on the coarsest level. Gauss–Seidel
 * pre-smoothing runs forward and post-smoothing backward, so with ν₁ = ν₂
 * the cycle is a symmetric positive definite operator M ≈ A⁻¹ when A is
 * SPD: a valid CG preconditioner. Damped Jacobi uses ω = 2d/(2d + 1) in d
 * dimensions (2/3, 4/5, 6/7: the damping that best smooths the standard
 * 3-, 5- and 7-point Laplacian, by local Fourier analysis) and is symmetric
 * with ν₁ = ν₂ too. Full multigrid restricts the residual to every level,
 * solves on the coarsest, and interpolates up with one cycle per level.
 *
 * Cost. A V(1,1)-cycle costs about 2d + 4 passes over the fine unknowns
 * times 4/3 (2-D) or 8/7 (3-D) for the coarse levels: on W2 (1024² cells)
 * about 25 ms here, and the number of cycles to a fixed tolerance does not
 * grow with the grid (grid-independent convergence). Set-up: one triple
 * product per level, O(nnz(A)); memory about 1.5 × that of A (P, Pᵀ, the
 * coarse matrices, four vectors per level). Rows equal to one shifted
 * stencil (constant coefficients away from boundaries) are smoothed by
 * straight-line loops that read no matrix storage, about 2–3 × faster than
 * the CSR rows.
 *
 * Limits. Point smoothers lose their grid independence on strongly
 * anisotropic problems (very stretched cells, k much larger along one axis):
 * cycle counts then grow with the aspect ratio; use the cycle as a CG
 * preconditioner there. A singular system (only flux faces, or periodic
 * axes with no value or convection face) fails on the coarsest LU with
 * SingularMatrixError; fix a value somewhere. Nonsymmetric A works in the
 * stand-alone solve when it is diagonally dominant enough for the smoother,
 * but the preconditioner is then not symmetric.
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
import { InvalidOptionError, NonFiniteValueError, NotConvergedError, ShapeMismatchError, ZeroDiagonalError } from '../errors.js';
import type { Grid } from '../grid/grid.js';
import { type CsrMatrix, checkCsr, csrTranspose } from '../operator/matrix.js';
import { type Operator, checkVectorFinite } from '../operator/operator.js';
import { type BandedLU, factorBanded, solveBanded } from './banded.js';
import { galerkinProduct } from './base/galerkin.js';
import {
  type LevelMatrix, findDiagonal, gaussSeidelBackward, gaussSeidelForward, jacobiUpdate, jacobiZero, levelMatrix, residual,
  upperResidual,
} from './base/smooth.js';
import { interpolateAxis, restrictAxis } from './base/transfer.js';
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
  /** Solve directly (banded LU) once a level has at most this many unknowns (default 1000). */
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
   * ‖b − Ax‖₂ / ‖b‖₂ ≤ tolerance (default 1e-8, at most 100 cycles);
   * `fullMultigrid` starts with one full-multigrid pass, which usually
   * reaches discretisation accuracy by itself and counts as one iteration.
   * Allocates the solution and the history once; the cycles allocate nothing.
   *
   * @param b - right-hand side, one entry per unknown; not changed
   * @param options - tolerance, maxIterations, starting guess `x0` (default 0), `fullMultigrid` (default false)
   * @returns the solution with iterations, final relative residual and history
   * @throws NotConvergedError (code `NOT_CONVERGED`, with the history) if the tolerance is not met within maxIterations;
   *   ShapeMismatchError, NonFiniteValueError, InvalidOptionError for bad input
   */
  solve(b: Float64Array, options?: IterativeOptions & { x0?: Float64Array; fullMultigrid?: boolean }): SolveResult;
}

/** One axis on one level: stored node count, periodicity, node positions. */
interface AxisLevel {
  readonly count: number;
  readonly periodic: boolean;
  /** Node indices of level 0 on uniform axes, coordinates on stretched ones. */
  readonly pos: Float64Array;
  /** Length of the period in the units of `pos` (periodic axes). */
  readonly period: number;
}

/** 1-D interpolation from a coarse axis to a fine one. */
interface AxisTransfer {
  readonly coarse: AxisLevel;
  /** First coarse node of each fine node, and its weight. */
  readonly c0: Int32Array;
  readonly w0: Float64Array;
  /** Second coarse node and its weight (w1 = 0 and c1 = c0 when there is none); c1 > c0 otherwise. */
  readonly c1: Int32Array;
  readonly w1: Float64Array;
  /** Fine index of each coarse node. */
  readonly fineOf: Int32Array;
  /** Whether the axis is coarsened (false: the identity). */
  readonly coarsened: boolean;
  /** Transposed table: the fine nodes fa, fb, fc of each coarse node and their weights (zero-padded). */
  readonly fa: Int32Array;
  readonly wa: Float64Array;
  readonly fb: Int32Array;
  readonly wb: Float64Array;
  readonly fc: Int32Array;
  readonly wc: Float64Array;
}

/** One 1-D pass of a grid transfer over an array seen as (outer, n along the axis, inner). */
interface Pass {
  readonly outer: number;
  readonly fine: number;
  readonly coarse: number;
  readonly inner: number;
  readonly t: AxisTransfer;
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
  /** Passes of the restriction to the next coarser level (slowest axis first) and of the interpolation from it (fastest first). */
  down: readonly Pass[];
  up: readonly Pass[];
}

const LU_FLOPS = 1e8;
const LU_BYTES = 64 * 2 ** 20;
const LU_BYTES_MAX = 512 * 2 ** 20;

function canHalve(a: AxisLevel): boolean {
  return a.periodic ? a.count >= 4 && a.count % 2 === 0 : a.count >= 3 && (a.count - 1) % 2 === 0;
}

function canCoarsen(a: AxisLevel): boolean {
  return a.periodic ? a.count >= 3 : a.count >= 3;
}

/** Adds the transposed table (each coarse node's fine nodes) to a 1-D interpolation. */
function withTranspose(
  coarse: AxisLevel, c0: Int32Array, w0: Float64Array, c1: Int32Array, w1: Float64Array, fineOf: Int32Array, coarsened: boolean,
): AxisTransfer {
  const nc = coarse.count;
  const fa = new Int32Array(nc);
  const wa = new Float64Array(nc);
  const fb = new Int32Array(nc);
  const wb = new Float64Array(nc);
  const fc = new Int32Array(nc);
  const wc = new Float64Array(nc);
  const used = new Uint8Array(nc);
  const put = (I: number, f: number, w: number): void => {
    if (used[I] === 0) { fa[I] = f; wa[I] = w; fb[I] = f; fc[I] = f; } else if (used[I] === 1) { fb[I] = f; wb[I] = w; } else { fc[I] = f; wc[I] = w; }
    used[I]++;
  };
  for (let f = 0; f < c0.length; f++) {
    put(c0[f], f, w0[f]);
    if (w1[f] !== 0) put(c1[f], f, w1[f]);
  }
  return { coarse, c0, w0, c1, w1, fineOf, coarsened, fa, wa, fb, wb, fc, wc };
}

/** The 1-D interpolation of one axis: coarsened (even nodes, plus the last one of an odd non-periodic axis) or kept. */
function axisTransfer(ax: AxisLevel, coarsen: boolean): AxisTransfer {
  const nf = ax.count;
  const c0 = new Int32Array(nf);
  const w0 = new Float64Array(nf);
  const c1 = new Int32Array(nf);
  const w1 = new Float64Array(nf);
  if (!coarsen) {
    for (let f = 0; f < nf; f++) {
      c0[f] = f;
      c1[f] = f;
      w0[f] = 1;
    }
    return withTranspose(ax, c0, w0, c1, w1, Int32Array.from(c0), false);
  }
  const fine: number[] = [];
  for (let f = 0; f < nf; f += 2) fine.push(f);
  if (!ax.periodic && (nf - 1) % 2 === 1) fine.push(nf - 1);
  const fineOf = Int32Array.from(fine);
  const coarseOf = new Int32Array(nf).fill(-1);
  fineOf.forEach((f, c) => { coarseOf[f] = c; });
  const pos = ax.pos;
  for (let f = 0; f < nf; f++) {
    if (coarseOf[f] >= 0) {
      c0[f] = coarseOf[f];
      c1[f] = coarseOf[f];
      w0[f] = 1;
      continue;
    }
    // f is odd and lies between two coarse nodes (its right one wraps round on a periodic axis)
    const wrap = f + 1 === nf;
    const xl = pos[f - 1];
    const xr = wrap ? pos[0] + ax.period : pos[f + 1];
    const wl = (xr - pos[f]) / (xr - xl);
    const wr = (pos[f] - xl) / (xr - xl);
    const cl = coarseOf[f - 1];
    const cr = coarseOf[wrap ? 0 : f + 1];
    if (cl < cr) {
      c0[f] = cl; w0[f] = wl; c1[f] = cr; w1[f] = wr;
    } else {
      c0[f] = cr; w0[f] = wr; c1[f] = cl; w1[f] = wl;
    }
  }
  const cpos = Float64Array.from(fineOf, (f) => pos[f]);
  return withTranspose({ count: fineOf.length, periodic: ax.periodic, pos: cpos, period: ax.period }, c0, w0, c1, w1, fineOf, true);
}

/** P as CSR from the three 1-D interpolations (x slowest), with the prescribed rows and columns zeroed. */
function interpolationMatrix(t: readonly AxisTransfer[], fineMask: Uint8Array, coarseMask: Uint8Array): CsrMatrix {
  const tx = t[0];
  const ty = t[1];
  const tz = t[2];
  const n0 = tx.c0.length;
  const n1 = ty.c0.length;
  const n2 = tz.c0.length;
  const N1 = ty.coarse.count;
  const N2 = tz.coarse.count;
  const len = (a: AxisTransfer): number => a.w1.reduce((s, w) => s + (w !== 0 ? 2 : 1), 0);
  const cap = len(tx) * len(ty) * len(tz);
  const rowPtr = new Int32Array(n0 * n1 * n2 + 1);
  const col = new Int32Array(cap);
  const val = new Float64Array(cap);
  const { c0: zc0, w0: zw0, c1: zc1, w1: zw1 } = tz;
  let nnz = 0;
  let row = 0;
  for (let i = 0; i < n0; i++) {
    const kx = tx.w1[i] !== 0 ? 2 : 1;
    for (let j = 0; j < n1; j++) {
      const ky = ty.w1[j] !== 0 ? 2 : 1;
      for (let k = 0; k < n2; k++) {
        if (fineMask[row] === 0) {
          const kz = zw1[k] !== 0 ? 2 : 1;
          for (let a = 0; a < kx; a++) {
            const ia = a === 0 ? tx.c0[i] : tx.c1[i];
            const wa = a === 0 ? tx.w0[i] : tx.w1[i];
            for (let b = 0; b < ky; b++) {
              const base = (ia * N1 + (b === 0 ? ty.c0[j] : ty.c1[j])) * N2;
              const wab = wa * (b === 0 ? ty.w0[j] : ty.w1[j]);
              for (let c = 0; c < kz; c++) {
                const J = base + (c === 0 ? zc0[k] : zc1[k]);
                const w = wab * (c === 0 ? zw0[k] : zw1[k]);
                if (coarseMask[J] === 1 || w === 0) continue;
                col[nnz] = J;
                val[nnz] = w;
                nnz++;
              }
            }
          }
        }
        row++;
        rowPtr[row] = nnz;
      }
    }
  }
  return { rows: row, cols: tx.coarse.count * N1 * N2, rowPtr, colIdx: col.slice(0, nnz), values: val.slice(0, nnz) };
}

/** Separable dilation of a 0/1 mask on an (n0, n1, n2) grid by radius[d] nodes along axis d. */
function dilate(src: Uint8Array, shape: readonly number[], radius: readonly number[]): Uint8Array {
  let cur = src;
  for (let d = 0; d < 3; d++) {
    const rad = radius[d];
    if (rad === 0) continue;
    const n = shape[d];
    const outer = prod(shape, 0, d);
    const inner = prod(shape, d + 1, 3);
    const out = new Uint8Array(cur.length);
    for (let o = 0; o < outer; o++) {
      for (let f = 0; f < n; f++) {
        const lo = Math.max(0, f - rad);
        const hi = Math.min(n - 1, f + rad);
        const di = (o * n + f) * inner;
        for (let g = lo; g <= hi; g++) {
          const si = (o * n + g) * inner;
          for (let t = 0; t < inner; t++) out[di + t] |= cur[si + t];
        }
      }
    }
    cur = out;
  }
  return cur;
}

/**
 * The coarse rows of Pᵀ A P that are shifted copies of one another: every
 * axis interpolates uniformly (weights ½) within two fine nodes of the
 * coarse node, the fine rows the row gathers are all rows of A's one
 * stencil (radius 1 along each axis), and no prescribed node is near
 * (fine within 2, coarse within 1). Undefined when A has no stencil rows.
 */
function regularRows(cur: Level, t: readonly AxisTransfer[], cmask: Uint8Array): Uint8Array | undefined {
  const m = cur.m;
  if (m.runCount === 0) return undefined;
  const sh = cur.axes.map((ax) => ax.count);
  const q = sh.map((c) => (c > 1 ? 1 : 0));
  // the stencil must reach only the 3^d neighbours; counts ≥ 3 make that decomposition unique
  if (sh.some((c) => c === 2)) return undefined;
  const reach = new Set<number>();
  for (let a = -q[0]; a <= q[0]; a++) for (let b = -q[1]; b <= q[1]; b++) for (let c = -q[2]; c <= q[2]; c++) reach.add((a * sh[1] + b) * sh[2] + c);
  for (let k = 0; k < m.offsets.length; k++) if (!reach.has(m.offsets[k])) return undefined;
  const n = cur.n;
  const notStencil = new Uint8Array(n).fill(1);
  for (let r = 0; r < m.runCount; r++) notStencil.fill(0, m.runStart[r], m.runEnd[r]);
  const badRow = dilate(notStencil, sh, t.map((x) => (x.coarsened ? 1 : 0)));
  const badFixed = dilate(cur.mask, sh, t.map((x, d) => (x.coarsened ? 2 : q[d])));
  const csh = t.map((x) => x.coarse.count);
  const badCoarse = dilate(cmask, csh, csh.map((c) => (c > 1 ? 1 : 0)));
  const ok1 = t.map((x, d) => {
    const N = x.coarse.count;
    const nf = sh[d];
    const ok = new Uint8Array(N);
    for (let I = 0; I < N; I++) {
      const F = x.fineOf[I];
      if (!x.coarsened) {
        ok[I] = nf === 1 || (F >= 1 && F <= nf - 2) ? 1 : 0;
        continue;
      }
      if (F < 2 || F > nf - 3 || I < 1 || I > N - 2) continue;
      const one = (f: number, c: number): boolean => x.c0[f] === c && x.w0[f] === 1 && x.w1[f] === 0;
      const half = (f: number, c: number): boolean => x.c0[f] === c && x.w0[f] === 0.5 && x.c1[f] === c + 1 && x.w1[f] === 0.5;
      if (one(F, I) && one(F - 2, I - 1) && one(F + 2, I + 1) && half(F - 1, I - 1) && half(F + 1, I)) ok[I] = 1;
    }
    return ok;
  });
  const out = new Uint8Array(cmask.length);
  const [f0, f1, f2] = [t[0].fineOf, t[1].fineOf, t[2].fineOf];
  let count = 0;
  for (let I = 0; I < csh[0]; I++) {
    if (ok1[0][I] === 0) continue;
    for (let J = 0; J < csh[1]; J++) {
      if (ok1[1][J] === 0) continue;
      for (let K = 0; K < csh[2]; K++) {
        if (ok1[2][K] === 0) continue;
        const c = (I * csh[1] + J) * csh[2] + K;
        const f = (f0[I] * sh[1] + f1[J]) * sh[2] + f2[K];
        if (badRow[f] === 0 && badFixed[f] === 0 && badCoarse[c] === 0) {
          out[c] = 1;
          count++;
        }
      }
    }
  }
  return count > 0 ? out : undefined;
}

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

function prod(a: readonly number[], from: number, to: number): number {
  let p = 1;
  for (let d = from; d < to; d++) p *= a[d];
  return p;
}

function wholeAtLeast(name: string, v: number, min: number, hint: string): number {
  if (!(Number.isSafeInteger(v) && v >= min)) throw new InvalidOptionError(name, `${v} is not a whole number ≥ ${min}; ${hint}`);
  return v;
}

function levelOf(a: CsrMatrix, axes: readonly AxisLevel[], mask: Uint8Array, what: string, x?: Float64Array): Level {
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
    n, a, m: levelMatrix(a, diagPtr, invDiag), axes, mask,
    x: x ?? new Float64Array(n), b: x === undefined ? new Float64Array(n) : empty, r: new Float64Array(n),
    fixed, saved: new Float64Array(count), down: [], up: [],
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
 * Set-up cost: O(nnz(A)) per level, dominated by the triple product
 * Pᵀ A P (about 0.15 s for the 1024² five-point matrix here), plus the
 * coarsest LU, kept small by construction.
 *
 * @param g - the grid of the unknowns
 * @param a - the square matrix (an Operator or a CSR matrix; not copied, do not change it afterwards)
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
 * mg.solve(rhs).iterations // about 10 cycles to 1e-8
 * ```
 */
export function createMultigrid(g: Grid, a: Operator | CsrMatrix, options: Readonly<MultigridOptions> = {}): Multigrid {
  const csr: CsrMatrix = 'matrix' in a ? a.matrix : a;
  checkCsr(csr);
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

  const lv: Level[] = [levelOf(csr, axes0, mask, 'the matrix', new Float64Array(0))];
  let temp = 0;
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
    const ac = (() => {
      // P and Pᵀ live only for the triple product; the cycles apply them axis by axis
      const p = interpolationMatrix(t, cur.mask, cmask);
      return galerkinProduct(csrTranspose(p), cur.a, p, cmask, regularRows(cur, t, cmask));
    })();
    const sh = cur.axes.map((ax) => ax.count);
    const down: Pass[] = [];
    for (let d = 0; d < 3; d++) {
      if (!t[d].coarsened) continue;
      down.push({ outer: prod(sh, 0, d), fine: sh[d], coarse: caxes[d].count, inner: prod(sh, d + 1, 3), t: t[d] });
      sh[d] = caxes[d].count;
    }
    const up: Pass[] = [];
    for (let d = 2; d >= 0; d--) {
      if (!t[d].coarsened) continue;
      sh[d] = cur.axes[d].count;
      up.push({ outer: prod(sh, 0, d), fine: sh[d], coarse: caxes[d].count, inner: prod(sh, d + 1, 3), t: t[d] });
    }
    cur.down = down;
    cur.up = up;
    // intermediate arrays: every pass output but the last of each direction
    for (let q = 0; q + 1 < down.length; q++) temp = Math.max(temp, down[q].outer * down[q].coarse * down[q].inner);
    for (let q = 0; q + 1 < up.length; q++) temp = Math.max(temp, up[q].outer * up[q].fine * up[q].inner);
    lv.push(levelOf(ac, caxes, cmask, `the coarse matrix of level ${lv.length}`));
  }
  const tmpA = new Float64Array(temp);
  const tmpB = new Float64Array(temp);
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
    const passes = L.down;
    let from = src;
    for (let q = 0; q < passes.length; q++) {
      const p = passes[q];
      const to = q === passes.length - 1 ? C.b : q % 2 === 0 ? tmpA : tmpB;
      const t = p.t;
      restrictAxis(p.outer, p.fine, p.coarse, p.inner, t.fa, t.wa, t.fb, t.wb, t.fc, t.wc, from, to);
      from = to;
    }
    const cx = C.fixed;
    for (let q = 0; q < cx.length; q++) C.b[cx[q]] = 0;
  }

  /** x_l (+)= P x_{l+1}, leaving level l's prescribed entries as they were (add) or 0 (not add). */
  function interpolateTo(l: number, add: boolean): void {
    const L = lv[l];
    const C = lv[l + 1];
    const fx = L.fixed;
    const keep = L.saved;
    const x = L.x;
    for (let q = 0; q < fx.length; q++) keep[q] = add ? x[fx[q]] : 0;
    const passes = L.up;
    let from = C.x;
    for (let q = 0; q < passes.length; q++) {
      const p = passes[q];
      const last = q === passes.length - 1;
      const to = last ? x : q % 2 === 0 ? tmpA : tmpB;
      const t = p.t;
      interpolateAxis(p.outer, p.coarse, p.fine, p.inner, t.c0, t.w0, t.c1, t.w1, from, to, last && add);
      from = to;
    }
    for (let q = 0; q < fx.length; q++) x[fx[q]] = keep[q];
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
    smoothPre(L, zero);
    // after a single zero-start Gauss–Seidel sweep, (L + D)x = b: the residual is −Ux, half a pass
    if (gs && zero && pre === 1) upperResidual(L.m, L.x, L.r);
    else residual(L.m, L.b, L.x, L.r);
    restrictFrom(l, L.r);
    run(l + 1, true);
    if (w && l + 1 < last) run(l + 1, false);
    interpolateTo(l, true);
    smoothPost(L);
  }

  /** Full multigrid on the correction: lv[0].r holds b − Ax on entry; adds the correction to x and cycles once on level 0. */
  function fullMultigrid(): void {
    if (last === 0) {
      solveBanded(lu, lv[0].b, lv[0].x);
      return;
    }
    restrictFrom(0, lv[0].r);
    for (let l = 1; l < last; l++) restrictFrom(l, lv[l].b);
    solveBanded(lu, lv[last].b, lv[last].x);
    for (let l = last - 1; l >= 1; l--) {
      interpolateTo(l, false);
      run(l, false);
    }
    interpolateTo(0, true);
    run(0, false);
  }

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
      const L0 = lv[0];
      L0.b = b;
      L0.x = x;
      residual(L0.m, b, x, L0.r);
      let rel = norm2(L0.r) / bn;
      history[0] = rel;
      let it = 0;
      while (rel > tol && it < maxIt) {
        if (fmg && it === 0) fullMultigrid();
        else run(0, false);
        it++;
        residual(L0.m, b, x, L0.r);
        rel = norm2(L0.r) / bn;
        history[it] = rel;
        if (!Number.isFinite(rel)) break;
      }
      const seconds = (performance.now() - t0) / 1000;
      if (!(rel <= tol)) {
        const why = Number.isFinite(rel)
          ? 'raise maxIterations, loosen the tolerance, or use the cycle as a CG preconditioner (anisotropic or nonsymmetric problems converge slowly)'
          : 'the iteration diverged; the matrix is probably not positive definite or not diagonally dominant enough for the smoother';
        throw new NotConvergedError(method, it, rel, tol, history.slice(0, it + 1), why);
      }
      return { solution: x, iterations: it, residual: rel, history: history.slice(0, it + 1), method, seconds };
    },
  };
  void NonFiniteValueError;
  return Object.freeze(mg);
}
