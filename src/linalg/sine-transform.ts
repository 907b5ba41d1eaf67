/**
 * A fast direct solver for the constant-coefficient five-point systems of
 * 2-D plates with a prescribed value on every edge, by the discrete sine
 * transform.
 *
 * Such a system, on the nodes of an NX × NY grid with the boundary ring
 * prescribed (identity rows, columns eliminated), is on the interior the
 * Kronecker sum K = d·I + w_x·T_x + w_y·T_y, T the 0/1 neighbour matrices of
 * one axis. Its eigenvectors are the products sin(pπi/(N_x+1))·
 * sin(qπj/(N_y+1)) (N = interior count per axis) with eigenvalues
 *
 *   λ_pq = d + 2w_x cos(pπ/(N_x+1)) + 2w_y cos(qπ/(N_y+1)),
 *
 * so K u = f is solved by a 2-D DST-I of f, a division by λ_pq and a second
 * 2-D DST-I (scaled by 4/((N_x+1)(N_y+1))): O(N log N) work, no set-up
 * beyond the eigenvalue table, no iteration. Source: Hockney, R. W. (1965).
 * A fast direct solution of Poisson's equation using Fourier analysis.
 * J. ACM 12(1), 95–113; Buzbee, B. L., Golub, G. H. & Nielson, C. W.
 * (1970). On direct methods for solving Poisson's equations. SIAM J. Numer.
 * Anal. 7(4); the eigenpairs of the 1-D second difference are a fact of the
 * trade (e.g. LeVeque 2007, §2.10).
 *
 * Which matrices qualify: the grid is 2-D with N + 1 = cells a power of 2
 * on both axes (the FFT here is radix 2), exactly the boundary ring is
 * prescribed with identity rows, and every interior row holds the same
 * symmetric stencil d, w_x (±x), w_y (±y) up to 64ε·|d| (coordinates that
 * are not binary fractions differ in the last bits), with no entries in
 * prescribed columns. Those small differences, and round-off, are removed
 * by iterative refinement: after each transform solve the true residual
 * b − A x is computed with A itself and, while above the tolerance, solved
 * for again (at most 4 more solves), so the answer is the matrix's own to the
 * requested relative residual, as with the iterative solvers.
 *
 * @module
 */
import { NotConvergedError } from '../errors.js';
import { csrKernel, type CsrMatrix } from '../operator/matrix.js';
import { type DstPlan, dst2, dstPlan } from './base/fft.js';

/** The interior stencil of a qualifying matrix (module doc). @internal */
export interface SineStencil {
  readonly d: number;
  readonly wx: number;
  readonly wy: number;
}

function isPowerOfTwo(m: number): boolean {
  return m >= 2 && (m & (m - 1)) === 0;
}

/**
 * The stencil of `a` when the sine-transform solver applies to it (module
 * doc), else undefined. O(nnz).
 *
 * @internal
 */
export function sineStencil(shape: readonly number[], a: CsrMatrix, prescribed: Readonly<Uint8Array>): SineStencil | undefined {
  if (shape.length !== 2) return undefined;
  const [nx, ny] = shape as [number, number];
  if (nx < 3 || ny < 3 || !isPowerOfTwo(nx - 1) || !isPowerOfTwo(ny - 1) || a.rows !== nx * ny) return undefined;
  const { rowPtr, colIdx, values } = a;
  // the stencil of the middle interior row
  const mid = (nx >> 1) * ny + (ny >> 1);
  let d = NaN;
  let wx = NaN;
  let wy = NaN;
  for (let p = rowPtr[mid]; p < rowPtr[mid + 1]; p++) {
    const c = colIdx[p] - mid;
    if (c === 0) d = values[p];
    else if (c === ny) wx = values[p];
    else if (c === 1) wy = values[p];
  }
  // one interior node across an axis: no neighbour entries there, and cos(π/2) = 0 drops the weight anyway
  if (nx === 3) wx = 0;
  if (ny === 3) wy = 0;
  if (!(Number.isFinite(d) && Number.isFinite(wx) && Number.isFinite(wy)) || d === 0) return undefined;
  const tol = 64 * Number.EPSILON * Math.abs(d);
  const near = (v: number, w: number): boolean => Math.abs(v - w) <= tol;
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      const r = i * ny + j;
      const s = rowPtr[r];
      const e = rowPtr[r + 1];
      const ring = i === 0 || j === 0 || i === nx - 1 || j === ny - 1;
      if (ring) {
        if (prescribed[r] !== 1 || e - s !== 1 || colIdx[s] !== r || values[s] !== 1) return undefined;
        continue;
      }
      if (prescribed[r] !== 0) return undefined;
      // entries in ascending columns: −x, −y, 0, +y, +x, those on the ring absent
      let k = 0;
      for (let p = s; p < e; p++) {
        const c = colIdx[p] - r;
        const v = values[p];
        if (v === 0) continue;
        if (c === 0) {
          if (!near(v, d)) return undefined;
        } else if (c === ny || c === -ny) {
          if (!near(v, wx) || (c < 0 ? i === 1 : i === nx - 2)) return undefined;
        } else if (c === 1 || c === -1) {
          if (!near(v, wy) || (c < 0 ? j === 1 : j === ny - 2)) return undefined;
        } else {
          return undefined;
        }
        k++;
      }
      const expected = 1 + (i > 1 ? 1 : 0) + (i < nx - 2 ? 1 : 0) + (j > 1 ? 1 : 0) + (j < ny - 2 ? 1 : 0);
      if (k !== expected) return undefined;
    }
  }
  return { d, wx, wy };
}

/** What one sine-transform solve did. */
export interface SineTransformSolve {
  /** Transform solves done: 1, plus one per refinement step. */
  readonly solves: number;
  /** Final relative residual ‖b − Ax‖/‖b‖, computed with A itself. */
  readonly residual: number;
  /** Relative residual before the first solve (1, from x = 0) and after each; a view valid until the next solve. */
  readonly history: Float64Array;
}

/** A prepared sine-transform solve of one matrix. @internal */
export interface SineTransformSolver {
  /** `'sine-transform'`. */
  readonly name: string;
  /** Solves A x = b (full vectors, one entry per node) to ‖b − Ax‖ ≤ tol·‖b‖; x is overwritten. */
  solve(b: Float64Array, x: Float64Array): SineTransformSolve;
}

/**
 * Prepares the sine-transform solve (module doc) of a matrix for which
 * {@link sineStencil} returned `s`. Allocates its workspace once: the
 * interior, a residual, and two FFT buffers.
 *
 * @internal
 */
export function createSineTransformSolver(
  shape: readonly number[], a: CsrMatrix, s: SineStencil, tolerance: number,
): SineTransformSolver {
  const [nx, ny] = shape as [number, number];
  const mx = nx - 2;
  const my = ny - 2;
  const px: DstPlan = dstPlan(mx + 1);
  const py: DstPlan = my === mx ? px : dstPlan(my + 1);
  const len = Math.max(mx, my) + 1;
  const re = new Float64Array(len);
  const im = new Float64Array(len);
  const w = new Float64Array(mx * my);
  const spare = new Float64Array(Math.max(mx, my));
  // 1/λ_pq with the inverse transform's factor folded in
  const scale = 4 / ((mx + 1) * (my + 1));
  const inv = new Float64Array(mx * my);
  const cx = new Float64Array(mx);
  const cy = new Float64Array(my);
  for (let p = 0; p < mx; p++) cx[p] = 2 * s.wx * Math.cos(((p + 1) * Math.PI) / (mx + 1));
  for (let q = 0; q < my; q++) cy[q] = 2 * s.wy * Math.cos(((q + 1) * Math.PI) / (my + 1));
  for (let p = 0; p < mx; p++) for (let q = 0; q < my; q++) inv[p * my + q] = scale / (s.d + cx[p] + cy[q]);
  const multiply = csrKernel(a);
  const n = nx * ny;
  const r = new Float64Array(n);
  const dx = new Float64Array(n);
  const maxSolves = 5;
  const history = new Float64Array(maxSolves + 1);

  /** w ← DST-I along y then along x. */
  function transform(): void {
    for (let i = 0; i < mx; i += 2) {
      if (i + 1 < mx) dst2(py, re, im, w, i * my, 1, w, (i + 1) * my, 1);
      else dst2(py, re, im, w, i * my, 1, spare.fill(0), 0, 1);
    }
    for (let j = 0; j < my; j += 2) {
      if (j + 1 < my) dst2(px, re, im, w, j, my, w, j + 1, my);
      else dst2(px, re, im, w, j, my, spare.fill(0), 0, 1);
    }
  }

  /** out ← A⁻¹ src by the transforms (ring entries copied). */
  function direct(src: Float64Array, out: Float64Array): void {
    for (let i = 0; i < mx; i++) {
      const from = (i + 1) * ny + 1;
      for (let j = 0; j < my; j++) w[i * my + j] = src[from + j];
    }
    transform();
    for (let k = 0; k < w.length; k++) w[k] *= inv[k];
    transform();
    for (let i = 0; i < nx; i++) {
      for (let j = 0; j < ny; j++) {
        const k = i * ny + j;
        out[k] = i === 0 || j === 0 || i === nx - 1 || j === ny - 1 ? src[k] : w[(i - 1) * my + (j - 1)];
      }
    }
  }

  const norm = (v: Float64Array): number => {
    let t = 0;
    for (let i = 0; i < v.length; i++) t += v[i] * v[i];
    return Math.sqrt(t);
  };

  return {
    name: 'sine-transform',
    solve(b: Float64Array, x: Float64Array): SineTransformSolve {
      const bn = norm(b);
      if (bn === 0) {
        x.fill(0);
        history[0] = 0;
        return { solves: 0, residual: 0, history: history.subarray(0, 1) };
      }
      direct(b, x);
      history[0] = 1;
      for (let it = 1; ; it++) {
        multiply(x, r);
        for (let i = 0; i < n; i++) r[i] = b[i] - r[i];
        const rel = norm(r) / bn;
        history[it] = rel;
        if (rel <= tolerance) return { solves: it, residual: rel, history: history.subarray(0, it + 1) };
        if (!(rel < 1) || it === maxSolves) {
          throw new NotConvergedError('sine-transform', it, rel, tolerance, history.slice(0, it + 1),
            'the refinement did not reach the tolerance; the matrix is not the constant stencil the transform assumes, use cg');
        }
        direct(r, dx);
        for (let i = 0; i < n; i++) x[i] += dx[i];
      }
    },
  };
}
