/**
 * A fast direct solver for the constant-coefficient five-point systems of
 * 2-D plates (and the seven-point systems of 3-D blocks) with prescribed
 * values across one axis (y and z in 3-D) and values or fluxes on the other
 * faces, by the discrete sine transform along the valued axis (two in 3-D)
 * and tridiagonal solves along the other.
 *
 * Such a system, on the nodes of an NX × NY grid with the value faces
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
 * Poisson's equation using Fourier analysis. J. ACM 12(1), 95–113;
 * Swarztrauber, P. N. (1977). The methods of cyclic reduction, Fourier
 * analysis and the FACR algorithm for the discrete solution of Poisson's
 * equation on a rectangle. SIAM Review 19(3), 490–501; the eigenpairs of the
 * 1-D second difference are a fact of the trade (e.g. LeVeque 2007, §2.10).
 * The transformed axis is y when it has values at both ends and a cell count
 * that suits the FFT (even, with no prime factor but 2, 3 and 5: 2ᵏ, 10,
 * 12, 100, 120, 240, …; y is the axis contiguous in memory), else x, the
 * interior then being held transposed. In 3-D the same holds with a 2-D
 * DST-I over y and z (both must suit) in each x-plane and lines along x,
 * diagonal d + 2w_y cos(qπ/(N_y+1)) + 2w_z cos(rπ/(N_z+1)).
 *
 * A flux face (insulated or with a given flux) at an end of the lines axis
 * keeps its nodes as unknowns. In the volume-scaled rows of the conservative
 * discretisation such a node has half the volume and half the transverse
 * face areas: its row is d/2 at the centre, w_l to its neighbour along the
 * lines and w_t/2 to the transverse ones. After the transform its line row
 * is therefore ½(d + 2w_t cos(qπ/(N_t+1)))·û_0 + w_l·û_1: half the
 * diagonal, the same off-diagonal, and the line systems stay symmetric and
 * dominant. (The flux itself only enters the right-hand side.)
 *
 * Which matrices qualify: the grid is 2-D with values on both faces of an
 * axis whose N + 1 = cells is such a count (3-D: y and z), values or fluxes
 * on the other faces (a convection face changes the diagonal and is
 * refused), value nodes with identity rows, and every other row the same
 * symmetric stencil d, w_x (±x), w_y (±y) (half weights on flux faces as
 * above) up to τ = 4ε·max(16, S)·|d|, S the largest over the axes of
 * cells·max(1, max|x|/L) (coordinates that are not binary fractions make the
 * spacings differ in the last bits, by about 0.1–0.3·ε·N·max|x|/L relative),
 * with no entries in prescribed columns, and the stencil diagonally
 * dominant, |d| ≥ 2|w_x| + 2|w_y| − τ (every conduction and implicit-step
 * stencil is). Then each mode's line system has |d + 2w_t cos(qπ/(N_t+1))|
 * ≥ 2|w_l| + 2|w_t|(1 − cos(π/(N_t+1))) − τ, dominant (strictly so unless
 * w_t = 0, and nonsingular either way; at a flux end ½|diag| ≥ |w_l|), and
 * Thomas without pivoting is stable for it (a fact of the trade for
 * diagonally dominant tridiagonal systems; e.g. Higham, N. J. (2002).
 * Accuracy and Stability of Numerical Algorithms, 2nd ed., SIAM, ch. 9,
 * from memory); in 3-D w_z joins the sums. Those small differences, and
 * round-off, are removed by iterative refinement: after each transform
 * solve the true residual b − A x is computed with A itself and, while above
 * the tolerance, solved for again (at most 4 more solves), so the answer is
 * the matrix's own to the requested relative residual, as with the
 * iterative solvers.
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
  /**
   * The axis of the tridiagonal lines (2-D: 0 for x, 1 for y; 3-D: always
   * 0); the others are transformed. {@link sineStencil} always sets it; the
   * default, for stencils made by hand without flux ends, is x when y's
   * cell count suits the transform, else y (3-D: x).
   */
  readonly lines?: number;
  /**
   * Whether the lines axis ends in a flux face (its nodes unknown, rows of
   * half weight: centre d/2, transverse neighbours w/2) at its low and high
   * end, instead of a value face. Default false.
   */
  readonly fluxEnds?: readonly [boolean, boolean];
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
  const n = shape.reduce((p, m) => p * m, 1);
  if (a.rows !== n) return undefined;
  const three = dim === 3;
  const nx = shape[0]!;
  const ny = shape[1]!;
  const nz = three ? shape[2]! : 1;
  const sx = ny * nz;
  const sy = nz;
  // what each face is, read at its middle node: value (prescribed) or flux (unknown)
  const mid3 = (i: number, j: number, k: number): number => (i * ny + j) * nz + k;
  const cx = nx >> 1;
  const cy = ny >> 1;
  const cz = three ? nz >> 1 : 0;
  const valueX = [prescribed[mid3(0, cy, cz)] === 1, prescribed[mid3(nx - 1, cy, cz)] === 1];
  const valueY = [prescribed[mid3(cx, 0, cz)] === 1, prescribed[mid3(cx, ny - 1, cz)] === 1];
  const valueZ = three ? [prescribed[mid3(cx, cy, 0)] === 1, prescribed[mid3(cx, cy, nz - 1)] === 1] : [true, true];
  // transformed axes: a value face at both ends and a cell count the FFT takes; lines: the other axis
  const suits = (value: boolean[], m: number): boolean => value[0]! && value[1]! && transformable(m - 1);
  let lines: number;
  if (three) {
    if (!(suits(valueY, ny) && suits(valueZ, nz))) return undefined;
    lines = 0;
  } else if (suits(valueY, ny)) {
    lines = 0;
  } else if (suits(valueX, nx)) {
    lines = 1;
  } else {
    return undefined;
  }
  const value = [valueX, valueY, valueZ];
  const lineValue = value[lines]!;
  const { rowPtr, colIdx, values } = a;
  // the stencil of the middle row (an interior node)
  const mid = mid3(cx, cy, cz);
  let d = NaN;
  const w = [NaN, NaN, three ? NaN : 0];
  const stride = [sx, sy, 1];
  for (let p = rowPtr[mid]; p < rowPtr[mid + 1]; p++) {
    const c = colIdx[p] - mid;
    if (c === 0) d = values[p];
    // either side: with two interior nodes along an axis the middle one has a single neighbour there
    for (let e = 0; e < dim; e++) if (c === stride[e] || c === -stride[e]!) w[e] = values[p];
  }
  // one unknown node across an axis: no neighbour entries there, and the weight drops out (cos(π/2) = 0 for a
  // transformed axis, a 1 × 1 line system for the lines axis)
  for (let e = 0; e < dim; e++) if (shape[e] === 3 && Number.isNaN(w[e]!)) w[e] = 0;
  if (!(Number.isFinite(d) && w.every(Number.isFinite)) || d === 0) return undefined;
  // coordinates that are not binary fractions make the spacings, and so the stencils, differ by about
  // 0.1–0.3·ε·N·max|x|/L relative (measured up to N = 2000); refinement removes such differences
  const tol = 4 * Number.EPSILON * Math.abs(d) * Math.max(16, spread);
  if (Math.abs(d) < 2 * (Math.abs(w[0]!) + Math.abs(w[1]!) + Math.abs(w[2]!)) - tol) return undefined;
  const [wx, wy, wz] = w as [number, number, number];
  // every row, nodes in storage order (2-D as one z layer, so no z neighbours and no z faces)
  const onValue = (e: number, i: number, m: number): boolean => (i === 0 && value[e]![0]!) || (i === m - 1 && value[e]![1]!);
  // the neighbours present: inside the grid and not on a value face (those columns are eliminated)
  const has = (e: number, idx: number, m: number, side: number): boolean => {
    const q = idx + side;
    return q >= 0 && q < m && !onValue(e, q, m);
  };
  let r = 0;
  for (let i = 0; i < nx; i++) {
    const vi = onValue(0, i, nx);
    for (let j = 0; j < ny; j++) {
      const vj = onValue(1, j, ny);
      for (let k = 0; k < nz; k++, r++) {
        const s = rowPtr[r];
        const end = rowPtr[r + 1];
        if (vi || vj || (three && onValue(2, k, nz))) {
          if (prescribed[r] !== 1 || end - s !== 1 || colIdx[s] !== r || values[s] !== 1) return undefined;
          continue;
        }
        if (prescribed[r] !== 0) return undefined;
        // a node on a flux end of the lines axis: its row has half weights except along the lines
        const li = lines === 0 ? i : j;
        const lm = lines === 0 ? nx : ny;
        const flux = li === 0 || li === lm - 1;
        const half = flux ? 0.5 : 1;
        const expected = 1 + (has(0, i, nx, -1) ? 1 : 0) + (has(0, i, nx, 1) ? 1 : 0) + (has(1, j, ny, -1) ? 1 : 0) + (has(1, j, ny, 1) ? 1 : 0) +
          (three ? (has(2, k, nz, -1) ? 1 : 0) + (has(2, k, nz, 1) ? 1 : 0) : 0);
        const fx = lines === 0 ? 1 : half;
        const fy = lines === 1 ? 1 : half;
        let count = 0;
        for (let p = s; p < end; p++) {
          const c = colIdx[p] - r;
          const v = values[p];
          if (v === 0) continue;
          if (c === 0) {
            if (!(Math.abs(v - half * d) <= tol)) return undefined;
          } else if (c === sx || c === -sx) {
            if (!(Math.abs(v - fx * wx) <= tol) || !has(0, i, nx, c < 0 ? -1 : 1)) return undefined;
          } else if (c === sy || c === -sy) {
            if (!(Math.abs(v - fy * wy) <= tol) || !has(1, j, ny, c < 0 ? -1 : 1)) return undefined;
          } else if (three && (c === 1 || c === -1)) {
            if (!(Math.abs(v - half * wz) <= tol) || !has(2, k, nz, c)) return undefined;
          } else {
            return undefined;
          }
          count++;
        }
        if (count !== expected) return undefined;
      }
    }
  }
  const fluxEnds: [boolean, boolean] = [!lineValue[0], !lineValue[1]];
  return three ? { d, wx, wy, wz, lines, fluxEnds } : { d, wx, wy, lines, fluxEnds };
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
 * The Thomas factors of the line systems of every mode q: diag_q on the
 * diagonal (half of it at a flux end), w_l off it. `pivot[i·modes + q]` is
 * the inverse pivot at line position i for i < kept; from row `kept` on
 * every pivot equals row kept − 1 bit for bit (the recurrence reached its
 * fixed point in every mode), except the last position of a line ending in
 * a flux face, whose own row is `last`.
 */
interface LineFactors {
  readonly modes: number;
  readonly lines: number;
  readonly wl: number;
  readonly pivot: Float64Array;
  readonly kept: number;
  readonly last: Float64Array | undefined;
}

function lineFactors(diag: Float64Array, wl: number, lines: number, fluxEnds: readonly [boolean, boolean]): LineFactors {
  const modes = diag.length;
  const table = new Float64Array(lines * modes);
  const first = fluxEnds[0] ? 0.5 : 1;
  for (let q = 0; q < modes; q++) table[q] = 1 / (first * diag[q]);
  // the positions before the last, or all of them when the line ends in a value face
  const regular = fluxEnds[1] ? lines - 1 : lines;
  let kept = 1;
  while (kept < regular) {
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
  let last: Float64Array | undefined;
  if (fluxEnds[1] && lines > 1) {
    last = new Float64Array(modes);
    const before = (Math.min(lines - 2, kept - 1)) * modes;
    for (let q = 0; q < modes; q++) last[q] = 1 / (0.5 * diag[q] - wl * wl * table[before + q]);
  }
  return { modes, lines, wl, pivot: kept === lines ? table : table.slice(0, kept * modes), kept, last };
}

/** Forward elimination of line position l of w, all modes at once: ĝ_l = (f̂_l − w_l·ĝ_{l−1})·pivot_l. */
function eliminate(w: Float64Array, l: number, f: LineFactors): void {
  const { modes, wl, pivot, kept, last } = f;
  const o = l * modes;
  if (l === 0) {
    for (let q = 0; q < modes; q++) w[q] *= pivot[q];
  } else if (last !== undefined && l === f.lines - 1) {
    for (let q = 0; q < modes; q++) w[o + q] = (w[o + q] - wl * w[o - modes + q]) * last[q];
  } else {
    const po = Math.min(l, kept - 1) * modes;
    for (let q = 0; q < modes; q++) w[o + q] = (w[o + q] - wl * w[o - modes + q]) * pivot[po + q];
  }
}

/** Back substitution of line position l < lines − 1: û_l = ĝ_l − w_l·pivot_l·û_{l+1}, û_{l+1} at from[fo …]. */
function substitute(w: Float64Array, l: number, f: LineFactors, from: Float64Array, fo: number): void {
  const { modes, wl, pivot, kept } = f;
  const o = l * modes;
  const po = Math.min(l, kept - 1) * modes;
  for (let q = 0; q < modes; q++) w[o + q] -= wl * pivot[po + q] * from[fo + q];
}

/** The nodes on value faces (prescribed, copied from src to out by every solve). */
function valueNodes(shape: readonly number[], s: SineStencil, lines: number): Int32Array {
  const three = shape.length === 3;
  const [nx, ny] = shape as [number, number];
  const nz = three ? shape[2]! : 1;
  const flux = s.fluxEnds ?? [false, false];
  const out: number[] = [];
  const onValue = (e: number, i: number, m: number): boolean =>
    (i === 0 || i === m - 1) && !(e === lines && (i === 0 ? flux[0] : flux[1]));
  for (let i = 0, r = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      for (let k = 0; k < nz; k++, r++) {
        if (onValue(0, i, nx) || onValue(1, j, ny) || (three && onValue(2, k, nz))) out.push(r);
      }
    }
  }
  return Int32Array.from(out);
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

/** out ← A⁻¹ src by the transforms on a 2-D plate (value-face entries copied). */
function direct2(shape: readonly number[], s: SineStencil): (src: Float64Array, out: Float64Array) => void {
  const [nx, ny] = shape as [number, number];
  // t: the transformed axis, fastest in w; l: the axis of the tridiagonal lines
  const lines = s.lines ?? (transformable(ny - 1) ? 0 : 1);
  const alongY = lines === 0;
  const flux = s.fluxEnds ?? [false, false];
  const nl = alongY ? nx : ny;
  const mt = (alongY ? ny : nx) - 2;
  // line position l is grid index l + first along the lines axis
  const first = flux[0] ? 0 : 1;
  const ml = nl - first - (flux[1] ? 0 : 1);
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
  const f = lineFactors(diag, wl, ml, flux);
  const fixed = valueNodes(shape, s, lines);

  /** Line l of w ← scale × line l of src inside the transformed axis's value ends (a row when alongY, else a column). */
  function load(src: Float64Array, l: number): void {
    const o = l * mt;
    const g = l + first;
    if (alongY) {
      const from = g * ny + 1;
      for (let t = 0; t < mt; t++) w[o + t] = scale * src[from + t];
    } else {
      for (let t = 0; t < mt; t++) w[o + t] = scale * src[(t + 1) * ny + g];
    }
  }

  /** Line l of out ← line l of w. */
  function store(out: Float64Array, l: number): void {
    const o = l * mt;
    const g = l + first;
    if (alongY) {
      const to = g * ny + 1;
      for (let t = 0; t < mt; t++) out[to + t] = w[o + t];
    } else {
      for (let t = 0; t < mt; t++) out[(t + 1) * ny + g] = w[o + t];
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
      eliminate(w, l, f);
      if (l + 1 < ml) eliminate(w, l + 1, f);
    }
    for (let l = (ml - 1) & ~1; l >= 0; l -= 2) {
      if (l + 1 < ml) {
        if (l + 2 < ml) substitute(w, l + 1, f, keep, 0);
        substitute(w, l, f, w, (l + 1) * mt);
      }
      for (let t = 0, o = l * mt; t < mt; t++) keep[t] = w[o + t];
      transform(l);
      store(out, l);
      if (l + 1 < ml) store(out, l + 1);
    }
    for (let q = 0; q < fixed.length; q++) out[fixed[q]!] = src[fixed[q]!]!;
  };
}

/**
 * out ← A⁻¹ src by the transforms on a 3-D block (value-face entries
 * copied): each x-plane inside the y and z value faces (y rows of z values,
 * contiguous) takes a 2-D DST-I over (y, z), which leaves one tridiagonal
 * system along x per mode pair (q, r) with diagonal d + 2w_y cos(qπ/(N_y+1))
 * + 2w_z cos(rπ/(N_z+1)) (half of it on a flux face); plane by plane as in
 * 2-D.
 */
function direct3(shape: readonly number[], s: SineStencil): (src: Float64Array, out: Float64Array) => void {
  const [nx, ny, nz] = shape as [number, number, number];
  const flux = s.fluxEnds ?? [false, false];
  const first = flux[0] ? 0 : 1;
  const mx = nx - first - (flux[1] ? 0 : 1);
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
  const f = lineFactors(diag, s.wx, mx, flux);
  const fixed = valueNodes(shape, s, 0);

  function load(src: Float64Array, i: number): void {
    const o = i * modes;
    for (let q = 0; q < my; q++) {
      const from = ((i + first) * ny + q + 1) * nz + 1;
      const to = o + q * mz;
      for (let r = 0; r < mz; r++) w[to + r] = scale * src[from + r];
    }
  }

  function store(out: Float64Array, i: number): void {
    const o = i * modes;
    for (let q = 0; q < my; q++) {
      const to = ((i + first) * ny + q + 1) * nz + 1;
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
      eliminate(w, i, f);
    }
    for (let i = mx - 1; i >= 0; i--) {
      if (i + 1 < mx) substitute(w, i, f, keep, 0);
      for (let q = 0, o = i * modes; q < modes; q++) keep[q] = w[o + q];
      transform(i);
      store(out, i);
    }
    for (let q = 0; q < fixed.length; q++) out[fixed[q]!] = src[fixed[q]!]!;
  };
}
