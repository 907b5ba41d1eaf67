/**
 * A fast direct solver for the constant-coefficient five-point systems of
 * 2-D plates with a prescribed value on every edge (and the seven-point
 * systems of 3-D blocks with one on every face), by the discrete sine
 * transform along one axis (two in 3-D) and tridiagonal solves along the
 * other.
 *
 * Such a system, on the nodes of an NX × NY grid with the boundary ring
 * prescribed (identity rows, columns eliminated), is on the interior the
 * Kronecker sum K = d·I + w_x·T_x + w_y·T_y, T the 0/1 neighbour matrices of
 * one axis. The eigenvectors of T_y are sin(qπj/(N_y+1)) (N the interior
 * count of an axis) with eigenvalues 2cos(qπ/(N_y+1)), so a DST-I along y
 * splits K u = f into N_y independent tridiagonal systems along x,
 *
 *   (d + 2w_y cos(qπ/(N_y+1)))·û_{i,q} + w_x (û_{i−1,q} + û_{i+1,q}) = f̂_{i,q},
 *
 * each solved by the Thomas algorithm factored once, and a second DST-I
 * (scaled by 2/(N_y+1)) maps û back: O(N log N) work, no iteration. This is
 * the Fourier-analysis/cyclic-reduction method with no reduction step,
 * FACR(0). Source: Hockney, R. W. (1965). A fast direct solution of
 * Poisson's equation using Fourier analysis. J. ACM 12(1), 95–113; Swarztrauber,
 * P. N. (1977). The methods of cyclic reduction, Fourier analysis and the
 * FACR algorithm for the discrete solution of Poisson's equation on a
 * rectangle. SIAM Review 19(3), 490–501; the eigenpairs of the 1-D second
 * difference are a fact of the trade (e.g. LeVeque 2007, §2.10). The
 * transformed axis is y when its cell count suits the FFT (even, with no
 * prime factor but 2, 3 and 5: 2ᵏ, 10, 12, 100, 120, 240, …; y is the axis
 * contiguous in memory), else x, the interior then being held transposed.
 * In 3-D the same holds with a 2-D DST-I over y and z (both must suit) in
 * each x-plane and lines along x, diagonal d + 2w_y cos(qπ/(N_y+1)) +
 * 2w_z cos(rπ/(N_z+1)).
 *
 * Which matrices qualify: the grid is 2-D with N + 1 = cells such a count
 * on at least one axis (3-D: on y and z), exactly the boundary ring is prescribed with
 * identity rows, every interior row holds the same symmetric stencil d, w_x
 * (±x), w_y (±y) up to τ = 4ε·max(16, S)·|d|, S the largest over the axes
 * of cells·max(1, max|x|/L) (coordinates that are not binary fractions make
 * the spacings differ in the last bits, by about 0.1–0.3·ε·N·max|x|/L
 * relative), with no entries in prescribed columns, and the
 * stencil is diagonally dominant, |d| ≥ 2|w_x| + 2|w_y| − τ (every
 * conduction and implicit-step stencil is). Then each mode's line system
 * has |d + 2w_t cos(qπ/(N_t+1))| ≥ 2|w_l| + 2|w_t|(1 − cos(π/(N_t+1))) − τ,
 * dominant (strictly so unless w_t = 0, and nonsingular either way), and
 * Thomas without pivoting is stable for it (a fact of the trade for
 * diagonally dominant tridiagonal systems; e.g. Higham, N. J. (2002).
 * Accuracy and Stability of Numerical Algorithms, 2nd ed., SIAM, ch. 9,
 * from memory); in 3-D w_z joins the sums. Those small differences, and
 * round-off, are removed by iterative refinement: after each transform solve the true residual b − A x is
 * computed with A itself and, while above the tolerance, solved for again
 * (at most 4 more solves), so the answer is the matrix's own to the
 * requested relative residual, as with the iterative solvers.
 *
 * @module
 */
import { NotConvergedError } from '../errors.js';
import { csrKernel, type CsrMatrix } from '../operator/matrix.js';
import { type DstPlan, dst2, dstPlan, fftLength } from './base/fft.js';

/** The interior stencil of a qualifying matrix (module doc). @internal */
export interface SineStencil {
  /** The centre weight. */
  readonly d: number;
  /** The weight of either x neighbour. */
  readonly wx: number;
  /** The weight of either y neighbour. */
  readonly wy: number;
  /** 3-D: the weight of either z neighbour. */
  readonly wz?: number;
}

/** Whether an axis of `cells` cells can be transformed: even, with no prime factor other than 2, 3 and 5. */
function transformable(cells: number): boolean {
  return cells >= 2 && cells % 2 === 0 && fftLength(cells);
}

/**
 * How far the stencils of a uniform grid may differ by the rounding of its
 * coordinates, in units of ε·|d|/4: the largest over the axes of
 * cells·max(1, max(|from|, |to|)/(to − from)) (spacings are differences of
 * coordinates, whose rounding is ε·max|x|, against h = L/cells).
 *
 * @internal
 */
export function coordinateSpread(axes: readonly { readonly from: number; readonly to: number; readonly cells: number }[]): number {
  let s = 0;
  for (const a of axes) s = Math.max(s, a.cells * Math.max(1, Math.max(Math.abs(a.from), Math.abs(a.to)) / (a.to - a.from)));
  return s;
}

/**
 * The stencil of `a` when the sine-transform solver applies to it (module
 * doc), else undefined. O(nnz). `spread` is {@link coordinateSpread} of the
 * grid (default: the longest axis's node count, right for coordinates of
 * the order of the domain's length).
 *
 * @internal
 */
export function sineStencil(
  shape: readonly number[], a: CsrMatrix, prescribed: Readonly<Uint8Array>, spread = Math.max(...shape),
): SineStencil | undefined {
  const dim = shape.length;
  if (dim !== 2 && dim !== 3) return undefined;
  if (shape.some((m) => !(m >= 3))) return undefined;
  // 2-D: either axis transformed; 3-D: y and z (the two fastest in memory), lines along x
  const ok = dim === 2
    ? transformable(shape[0]! - 1) || transformable(shape[1]! - 1)
    : transformable(shape[1]! - 1) && transformable(shape[2]! - 1);
  const n = shape.reduce((p, m) => p * m, 1);
  if (!ok || a.rows !== n) return undefined;
  const stride = dim === 2 ? [shape[1]!, 1] : [shape[1]! * shape[2]!, shape[2]!, 1];
  const { rowPtr, colIdx, values } = a;
  // the stencil of the middle interior row
  let mid = 0;
  for (let e = 0; e < dim; e++) mid += (shape[e]! >> 1) * stride[e]!;
  let d = NaN;
  const w = new Array<number>(dim).fill(NaN);
  for (let p = rowPtr[mid]; p < rowPtr[mid + 1]; p++) {
    const c = colIdx[p] - mid;
    if (c === 0) d = values[p];
    // either side: with two interior nodes along an axis the middle one has a single neighbour there
    for (let e = 0; e < dim; e++) if (c === stride[e] || c === -stride[e]!) w[e] = values[p];
  }
  // one interior node across an axis: no neighbour entries there, and cos(π/2) = 0 drops the weight anyway
  for (let e = 0; e < dim; e++) if (shape[e] === 3) w[e] = 0;
  if (!(Number.isFinite(d) && w.every(Number.isFinite)) || d === 0) return undefined;
  // coordinates that are not binary fractions make the spacings, and so the stencils, differ by about
  // 0.1–0.3·ε·N·max|x|/L relative (measured up to N = 2000); refinement removes such differences
  const tol = 4 * Number.EPSILON * Math.abs(d) * Math.max(16, spread);
  if (Math.abs(d) < 2 * w.reduce((t, v) => t + Math.abs(v), 0) - tol) return undefined;
  // every row, nodes in storage order (2-D as one z layer, so no z neighbours and no z ring)
  const three = dim === 3;
  const nx = shape[0]!;
  const ny = shape[1]!;
  const nz = three ? shape[2]! : 1;
  const sx = ny * nz;
  const sy = nz;
  const wx = w[0]!;
  const wy = w[1]!;
  const wz = three ? w[2]! : 0;
  let r = 0;
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      for (let k = 0; k < nz; k++, r++) {
        const s = rowPtr[r];
        const end = rowPtr[r + 1];
        const ring = i === 0 || i === nx - 1 || j === 0 || j === ny - 1 || (three && (k === 0 || k === nz - 1));
        if (ring) {
          if (prescribed[r] !== 1 || end - s !== 1 || colIdx[s] !== r || values[s] !== 1) return undefined;
          continue;
        }
        if (prescribed[r] !== 0) return undefined;
        // the centre and the neighbours off the boundary ring, nothing else
        const expected = 1 + (i > 1 ? 1 : 0) + (i < nx - 2 ? 1 : 0) + (j > 1 ? 1 : 0) + (j < ny - 2 ? 1 : 0) +
          (three ? (k > 1 ? 1 : 0) + (k < nz - 2 ? 1 : 0) : 0);
        let count = 0;
        for (let p = s; p < end; p++) {
          const c = colIdx[p] - r;
          const v = values[p];
          if (v === 0) continue;
          if (c === 0) {
            if (!(Math.abs(v - d) <= tol)) return undefined;
          } else if (c === sx || c === -sx) {
            if (!(Math.abs(v - wx) <= tol) || (c < 0 ? i === 1 : i === nx - 2)) return undefined;
          } else if (c === sy || c === -sy) {
            if (!(Math.abs(v - wy) <= tol) || (c < 0 ? j === 1 : j === ny - 2)) return undefined;
          } else if (three && (c === 1 || c === -1)) {
            if (!(Math.abs(v - wz) <= tol) || (c < 0 ? k === 1 : k === nz - 2)) return undefined;
          } else {
            return undefined;
          }
          count++;
        }
        if (count !== expected) return undefined;
      }
    }
  }
  return dim === 2 ? { d, wx: w[0]!, wy: w[1]! } : { d, wx: w[0]!, wy: w[1]!, wz: w[2]! };
}

/** Σ vᵢ², in four partial sums (not one chain of dependent additions). */
function squares(v: Float64Array): number {
  const n = v.length;
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let i = 0;
  for (; i + 3 < n; i += 4) {
    s0 += v[i] * v[i];
    s1 += v[i + 1] * v[i + 1];
    s2 += v[i + 2] * v[i + 2];
    s3 += v[i + 3] * v[i + 3];
  }
  for (; i < n; i++) s0 += v[i] * v[i];
  return s0 + s1 + s2 + s3;
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
 * Inverse Thomas pivots of the line systems (diag_q on the diagonal, w_l off
 * it) of every mode q at every line position i, pivot[i·modes + q], kept
 * only while they change: from row `kept` on, every pivot equals row
 * kept − 1 bit for bit (the recurrence reached its fixed point in every mode).
 */
function linePivots(diag: Float64Array, wl: number, lines: number): { pivot: Float64Array; kept: number } {
  const modes = diag.length;
  const table = new Float64Array(lines * modes);
  for (let q = 0; q < modes; q++) table[q] = 1 / diag[q];
  let kept = 1;
  while (kept < lines) {
    const o = kept * modes;
    let same = true;
    for (let q = 0; q < modes; q++) {
      const m = 1 / (diag[q] - wl * wl * table[o - modes + q]);
      table[o + q] = m;
      if (m !== table[o - modes + q]) same = false;
    }
    if (same) break;
    kept++;
  }
  return { pivot: kept === lines ? table : table.slice(0, kept * modes), kept };
}

/** Forward elimination of line position l of w, all modes at once: ĝ_l = (f̂_l − w_l·ĝ_{l−1})·pivot_l. */
function eliminate(w: Float64Array, l: number, modes: number, wl: number, pivot: Float64Array, kept: number): void {
  const o = l * modes;
  const po = Math.min(l, kept - 1) * modes;
  if (l === 0) {
    for (let q = 0; q < modes; q++) w[q] *= pivot[q];
  } else {
    for (let q = 0; q < modes; q++) w[o + q] = (w[o + q] - wl * w[o - modes + q]) * pivot[po + q];
  }
}

/** Back substitution of line position l: û_l = ĝ_l − w_l·pivot_l·û_{l+1}, û_{l+1} at from[fo …]. */
function substitute(w: Float64Array, l: number, modes: number, wl: number, pivot: Float64Array, kept: number, from: Float64Array, fo: number): void {
  const o = l * modes;
  const po = Math.min(l, kept - 1) * modes;
  for (let q = 0; q < modes; q++) w[o + q] -= wl * pivot[po + q] * from[fo + q];
}

/** Copies the boundary ring (every node with an index 0 or last) of src into out. */
function copyRing(shape: readonly number[], src: Float64Array, out: Float64Array): void {
  const n = src.length;
  const last = shape[shape.length - 1]!;
  const inner = shape.length === 2 ? [shape[0]!] : [shape[0]!, shape[1]!];
  // rows along the last axis: whole rows on the ring, else their two ends
  for (let row = 0, r = 0; r < n; row++, r += last) {
    let onRing = false;
    let rest = row;
    for (let e = inner.length - 1; e >= 0; e--) {
      const i = rest % inner[e]!;
      rest = (rest - i) / inner[e]!;
      if (i === 0 || i === inner[e]! - 1) onRing = true;
    }
    if (onRing) {
      for (let k = 0; k < last; k++) out[r + k] = src[r + k];
    } else {
      out[r] = src[r];
      out[r + last - 1] = src[r + last - 1];
    }
  }
}

/**
 * Prepares the sine-transform solve (module doc) of a matrix for which
 * {@link sineStencil} returned `s`. Allocates its workspace once: the
 * interior, the Thomas pivots of every mode, a residual, a correction and
 * two FFT buffers.
 *
 * @internal
 */
export function createSineTransformSolver(
  shape: readonly number[], a: CsrMatrix, s: SineStencil, tolerance: number,
): SineTransformSolver {
  const direct = shape.length === 3 ? direct3(shape, s) : direct2(shape, s);
  const multiply = csrKernel(a);
  const n = a.rows;
  const r = new Float64Array(n);
  const dx = new Float64Array(n);
  const maxSolves = 5;
  const history = new Float64Array(maxSolves + 1);
  return {
    name: 'sine-transform',
    solve(b: Float64Array, x: Float64Array): SineTransformSolve {
      const bn = Math.sqrt(squares(b));
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
        const rel = Math.sqrt(squares(r)) / bn;
        history[it] = rel;
        if (rel <= tolerance) return { solves: it, residual: rel, history: history.subarray(0, it + 1) };
        if (!(rel < 1) || it === maxSolves) {
          throw new NotConvergedError('sine-transform', it, rel, tolerance, history.slice(0, it + 1),
            'the refinement did not reach the tolerance: the matrix is not the constant stencil the transform assumes (use cg), or the tolerance is below the round-off of b − Ax for this system');
        }
        direct(r, dx);
        for (let i = 0; i < n; i++) x[i] += dx[i];
      }
    },
  };
}

/** out ← A⁻¹ src by the transforms on a 2-D plate (ring entries copied). */
function direct2(shape: readonly number[], s: SineStencil): (src: Float64Array, out: Float64Array) => void {
  const [nx, ny] = shape as [number, number];
  const mx = nx - 2;
  const my = ny - 2;
  // t: the transformed axis, fastest in w; l: the axis of the tridiagonal lines
  const alongY = transformable(ny - 1);
  const mt = alongY ? my : mx;
  const ml = alongY ? mx : my;
  const wt = alongY ? s.wy : s.wx;
  const wl = alongY ? s.wx : s.wy;
  const plan: DstPlan = dstPlan(mt + 1);
  const re = new Float64Array(mt + 1);
  const im = new Float64Array(mt + 1);
  const w = new Float64Array(ml * mt);
  const spare = new Float64Array(mt);
  const keep = new Float64Array(mt);
  // the inverse transform's factor 2/(N_t+1), applied as the interior is read
  const scale = 2 / (mt + 1);
  const diag = new Float64Array(mt);
  for (let q = 0; q < mt; q++) diag[q] = s.d + 2 * wt * Math.cos(((q + 1) * Math.PI) / (mt + 1));
  const { pivot, kept } = linePivots(diag, wl, ml);

  /** Line l of w ← scale × line l of the interior of src (a row when alongY, else a column). */
  function load(src: Float64Array, l: number): void {
    const o = l * mt;
    if (alongY) {
      const from = (l + 1) * ny + 1;
      for (let t = 0; t < mt; t++) w[o + t] = scale * src[from + t];
    } else {
      for (let t = 0; t < mt; t++) w[o + t] = scale * src[(t + 1) * ny + 1 + l];
    }
  }

  /** Line l of the interior of out ← line l of w. */
  function store(out: Float64Array, l: number): void {
    const o = l * mt;
    if (alongY) {
      const to = (l + 1) * ny + 1;
      for (let t = 0; t < mt; t++) out[to + t] = w[o + t];
    } else {
      for (let t = 0; t < mt; t++) out[(t + 1) * ny + 1 + l] = w[o + t];
    }
  }

  /** Lines l and l + 1 of w ← their DST-I (one complex FFT for both; a zero line stands in past the end). */
  function transform(l: number): void {
    if (l + 1 < ml) dst2(plan, re, im, w, l * mt, 1, w, (l + 1) * mt, 1);
    else dst2(plan, re, im, w, l * mt, 1, spare.fill(0), 0, 1);
  }

  /**
   * Line pair by line pair, read, transform and eliminate; then in reverse,
   * substitute, transform back and write, so each pair is worked on while in
   * cache. The lower line of each pair is kept in its transformed form, for
   * the substitution of the pair below.
   */
  return (src: Float64Array, out: Float64Array): void => {
    for (let l = 0; l < ml; l += 2) {
      load(src, l);
      if (l + 1 < ml) load(src, l + 1);
      transform(l);
      eliminate(w, l, mt, wl, pivot, kept);
      if (l + 1 < ml) eliminate(w, l + 1, mt, wl, pivot, kept);
    }
    for (let l = (ml - 1) & ~1; l >= 0; l -= 2) {
      if (l + 1 < ml) {
        if (l + 2 < ml) substitute(w, l + 1, mt, wl, pivot, kept, keep, 0);
        substitute(w, l, mt, wl, pivot, kept, w, (l + 1) * mt);
      }
      keep.set(w.subarray(l * mt, l * mt + mt));
      transform(l);
      store(out, l);
      if (l + 1 < ml) store(out, l + 1);
    }
    copyRing(shape, src, out);
  };
}

/**
 * out ← A⁻¹ src by the transforms on a 3-D block (ring entries copied): each
 * x-plane of the interior (y rows of z values, contiguous) takes a 2-D DST-I
 * over (y, z), which leaves one tridiagonal system along x per mode pair
 * (q, r) with diagonal d + 2w_y cos(qπ/(N_y+1)) + 2w_z cos(rπ/(N_z+1));
 * plane by plane as in 2-D.
 */
function direct3(shape: readonly number[], s: SineStencil): (src: Float64Array, out: Float64Array) => void {
  const [nx, ny, nz] = shape as [number, number, number];
  const mx = nx - 2;
  const my = ny - 2;
  const mz = nz - 2;
  const modes = my * mz;
  const wz = s.wz ?? 0;
  const py: DstPlan = dstPlan(my + 1);
  const pz: DstPlan = mz === my ? py : dstPlan(mz + 1);
  const len = Math.max(my, mz) + 1;
  const re = new Float64Array(len);
  const im = new Float64Array(len);
  const w = new Float64Array(mx * modes);
  const spare = new Float64Array(len);
  const keep = new Float64Array(modes);
  const scale = (2 / (my + 1)) * (2 / (mz + 1));
  const cy = Float64Array.from({ length: my }, (_, q) => 2 * s.wy * Math.cos(((q + 1) * Math.PI) / (my + 1)));
  const cz = Float64Array.from({ length: mz }, (_, r) => 2 * wz * Math.cos(((r + 1) * Math.PI) / (mz + 1)));
  const diag = new Float64Array(modes);
  for (let q = 0; q < my; q++) for (let r = 0; r < mz; r++) diag[q * mz + r] = s.d + cy[q] + cz[r];
  const { pivot, kept } = linePivots(diag, s.wx, mx);
  const wl = s.wx;

  function load(src: Float64Array, i: number): void {
    const o = i * modes;
    for (let q = 0; q < my; q++) {
      const from = ((i + 1) * ny + q + 1) * nz + 1;
      const to = o + q * mz;
      for (let r = 0; r < mz; r++) w[to + r] = scale * src[from + r];
    }
  }

  function store(out: Float64Array, i: number): void {
    const o = i * modes;
    for (let q = 0; q < my; q++) {
      const to = ((i + 1) * ny + q + 1) * nz + 1;
      const from = o + q * mz;
      for (let r = 0; r < mz; r++) out[to + r] = w[from + r];
    }
  }

  /** Plane i of w ← its 2-D DST-I: rows along z in pairs, then columns along y (stride mz) in pairs. */
  function transform(i: number): void {
    const o = i * modes;
    for (let q = 0; q < my; q += 2) {
      if (q + 1 < my) dst2(pz, re, im, w, o + q * mz, 1, w, o + (q + 1) * mz, 1);
      else dst2(pz, re, im, w, o + q * mz, 1, spare.fill(0), 0, 1);
    }
    for (let r = 0; r < mz; r += 2) {
      if (r + 1 < mz) dst2(py, re, im, w, o + r, mz, w, o + r + 1, mz);
      else dst2(py, re, im, w, o + r, mz, spare.fill(0), 0, 1);
    }
  }

  return (src: Float64Array, out: Float64Array): void => {
    for (let i = 0; i < mx; i++) {
      load(src, i);
      transform(i);
      eliminate(w, i, modes, wl, pivot, kept);
    }
    for (let i = mx - 1; i >= 0; i--) {
      if (i + 1 < mx) substitute(w, i, modes, wl, pivot, kept, keep, 0);
      keep.set(w.subarray(i * modes, i * modes + modes));
      transform(i);
      store(out, i);
    }
    copyRing(shape, src, out);
  };
}
