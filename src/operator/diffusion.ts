/**
 * The conservative variable-coefficient diffusion operator ∇·(k∇u) on a
 * node-centred grid, second order, in vertex-centred finite-volume form.
 *
 * Each node owns the control volume bounded by the midpoints to its
 * neighbours (half a cell at a boundary), of width Vᵢ along each axis (the
 * trapezoidal weights of the axis). Between neighbours i and i+1 the flux is
 * k_{i+½}(u_{i+1} − uᵢ)/(x_{i+1} − xᵢ), with the face conductivity the
 * harmonic mean k_{i+½} = 2kᵢk_{i+1}/(kᵢ + k_{i+1}) of the nodal values, and
 *
 *   (∇·(k∇u))ᵢ ≈ Σ_axes [F_{i+½} − F_{i−½}] / Vᵢ.
 *
 * The harmonic mean is the series resistance of two half-cells, so a layered
 * wall whose interfaces lie midway between nodes is reproduced exactly
 * (Patankar, S. V. (1980). Numerical Heat Transfer and Fluid Flow,
 * Hemisphere, §4.2-3). With constant k on a uniform grid this is the
 * classical 3/5/7-point Laplacian times k. diag(V)·A is symmetric, and the
 * fluxes telescope, so Σᵢ Vᵢ (Au)ᵢ equals the net flow through the boundary
 * to round-off. Accuracy 2 for smooth k on uniform and smoothly stretched
 * grids.
 *
 * Without boundary conditions the boundary faces carry no flux (insulated);
 * the boundary stage adds the face terms.
 *
 * @module
 */
import { InvalidCoefficientError, InvalidOptionError } from '../errors.js';
import { type Field, type Grid, trapezoidWeights } from '../grid/index.js';
import { checkField } from '../grid/field.js';
import { CsrBuilder, type CsrMatrix } from './matrix.js';
import { gridStrides } from './derivative.js';
import { type Operator, makeOperator } from './operator.js';

/**
 * A material coefficient: a constant, a function of the node's coordinates
 * ((x), (x, y) or (x, y, z)), or a field of nodal values on the grid.
 */
export type Coefficient = number | ((...coordinates: number[]) => number) | Field;

/** Calls `visit(r, i, j, k)` for every node in memory order. @internal */
export function forEachNode(g: Grid, visit: (r: number, i: number, j: number, k: number) => void): void {
  const [nx, ny = 1, nz = 1] = g.shape as readonly number[];
  let r = 0;
  for (let i = 0; i < nx; i++) for (let j = 0; j < ny; j++) for (let k = 0; k < nz; k++) visit(r++, i, j, k);
}

/** Coordinates of node (i, j, k), as many as the grid has axes. @internal */
export function nodeCoordinates(g: Grid, i: number, j: number, k: number): number[] {
  const c = [g.axes[0]!.coordinates[i]!];
  if (g.dimension > 1) c.push(g.axes[1]!.coordinates[j]!);
  if (g.dimension > 2) c.push(g.axes[2]!.coordinates[k]!);
  return c;
}

/** Where a sampled value came from, for error messages. @internal */
export type SampleKind = 'constant' | 'function' | 'field';

/**
 * Nodal values of a constant, a function of the node's coordinates (called
 * with `extra` appended, e.g. the time) or a field on the grid, each passed
 * to `check`, which throws the caller's own error for a bad value. The one
 * sampler behind coefficients, sources and initial fields. `check` is
 * called for every value that is not finite and positive (those pass every
 * check), with the place as a function, so that a message is built only
 * when it is needed.
 *
 * @internal
 */
export function sampleNodal(
  g: Grid, v: number | ((...args: number[]) => number) | Field, what: string,
  check: (value: number, kind: SampleKind, where: () => string) => void,
  extra: readonly number[] = [], out: Float64Array = new Float64Array(g.size),
): Float64Array {
  if (typeof v === 'number') {
    check(v, 'constant', () => '');
    return out.fill(v);
  }
  const [nx, ny = 1, nz = 1] = g.shape as readonly number[];
  const d = g.dimension;
  if (typeof v === 'function') {
    // a plain loop with the coordinates as arguments: no array or string per node (the message is built only on failure)
    const cx = g.axes[0]!.coordinates;
    const cy = d > 1 ? g.axes[1]!.coordinates : cx;
    const cz = d > 2 ? g.axes[2]!.coordinates : cx;
    const e = extra.length;
    const t = e > 0 ? extra[0]! : 0;
    let r = 0;
    for (let i = 0; i < nx; i++) {
      for (let j = 0; j < ny; j++) {
        for (let k = 0; k < nz; k++, r++) {
          let x: number;
          if (e > 1) x = v(...nodeCoordinates(g, i, j, k), ...extra);
          else if (d === 1) x = e === 0 ? v(cx[i]!) : v(cx[i]!, t);
          else if (d === 2) x = e === 0 ? v(cx[i]!, cy[j]!) : v(cx[i]!, cy[j]!, t);
          else x = e === 0 ? v(cx[i]!, cy[j]!, cz[k]!) : v(cx[i]!, cy[j]!, cz[k]!, t);
          if (!Number.isFinite(x) || x <= 0) {
            const at = nodeCoordinates(g, i, j, k);
            check(x, 'function', () => ` at (${at.join(', ')})`);
          }
          out[r] = x;
        }
      }
    }
    return out;
  }
  if (v === null || typeof v !== 'object') {
    throw new InvalidOptionError(what, 'give a number, a function of the coordinates, or a field on the grid');
  }
  checkField(g, v, what);
  const s = v.stride;
  const s0 = s[0]!;
  const s1 = d > 1 ? s[1]! : 0;
  const s2 = d > 2 ? s[2]! : 0;
  const data = v.data;
  let r = 0;
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      for (let k = 0; k < nz; k++, r++) {
        const x = data[v.offset + i * s0 + j * s1 + k * s2]!;
        if (!Number.isFinite(x) || x <= 0) check(x, 'field', () => ` at node (${[i, j, k].slice(0, d).join(', ')})`);
        out[r] = x;
      }
    }
  }
  return out;
}

/**
 * Nodal values of a coefficient, checked finite and > 0.
 *
 * @internal
 */
export function sampleCoefficient(g: Grid, c: Coefficient, what: string): Float64Array {
  return sampleNodal(g, c, what, (v, _kind, where) => {
    if (!(Number.isFinite(v) && v > 0)) throw new InvalidCoefficientError(`${what}${where()}`, v);
  });
}

/** Control volume of every node: the product of the axes' trapezoidal weights. @internal */
export function controlVolumes(g: Grid): Float64Array {
  const w = g.axes.map((a) => trapezoidWeights(a));
  const v = new Float64Array(g.size);
  forEachNode(g, (r, i, j, k) => {
    v[r] = w[0]![i]! * (g.dimension > 1 ? w[1]![j]! : 1) * (g.dimension > 2 ? w[2]![k]! : 1);
  });
  return v;
}

/** Options of {@link assembleConservative}. @internal */
export interface ConservativeAssembly {
  /** Added to the diagonal of the volume-scaled row (−h·area for convection). */
  scaledDiagonal?: Float64Array;
  /** Rows with 1 become identity rows. */
  constrained?: Uint8Array;
  /**
   * true: the volume-scaled form S = diag(V)·A, whose off-diagonal entries
   * are computed as (transverse area)·k_face/distance from either side, so
   * that S is symmetric exactly, not just to round-off. false: A itself.
   */
  scaled: boolean;
}

/**
 * CSR of the conservative operator (module formula).
 *
 * @internal
 */
export function assembleConservative(g: Grid, k: Float64Array, options: ConservativeAssembly): CsrMatrix {
  const { scaledDiagonal, constrained, scaled } = options;
  const strides = gridStrides(g);
  const widths = g.axes.map((a) => trapezoidWeights(a));
  const b = new CsrBuilder(g.size, g.size, g.size * (2 * g.dimension + 1));
  const idx = [0, 0, 0];
  forEachNode(g, (r, i, j, kk) => {
    idx[0] = i;
    idx[1] = j;
    idx[2] = kk;
    if (constrained !== undefined && constrained[r] === 1) {
      b.add(r, 1);
      b.endRow();
      return;
    }
    let volume = 1;
    for (let d = 0; d < g.dimension; d++) volume *= widths[d]![idx[d]!]!;
    const rowScale = scaled ? 1 : 1 / volume;
    let diag = scaledDiagonal === undefined ? 0 : scaledDiagonal[r]!;
    for (let d = 0; d < g.dimension; d++) {
      const axis = g.axes[d]!;
      const n = axis.count;
      const x = axis.coordinates;
      const p = idx[d]!;
      // area of the faces normal to axis d: the product of the other axes' widths, in axis order
      let area = 1;
      for (let e = 0; e < g.dimension; e++) if (e !== d) area *= widths[e]![idx[e]!]!;
      for (const side of [-1, 1]) {
        let q = p + side;
        let dist: number;
        if (q < 0 || q >= n) {
          if (!axis.periodic) continue; // boundary face: no flux here
          q = (q + n) % n;
          dist = side > 0 ? axis.to - x[p]! + (x[q]! - axis.from) : x[p]! - axis.from + (axis.to - x[q]!);
        } else {
          dist = Math.abs(x[q]! - x[p]!);
        }
        if (q === p) continue; // a one-node periodic axis couples a node to itself
        const nb = r + (q - p) * strides[d]!;
        const c = (area * ((2 * k[r]! * k[nb]!) / (k[r]! + k[nb]!))) / dist;
        b.add(nb, c * rowScale);
        diag -= c;
      }
    }
    b.add(r, diag * rowScale);
    b.endRow();
  });
  return b.finish();
}

/** What {@link diffusionOperator} builds. */
export interface DiffusionOptions {
  /** k > 0 (W/(m·K) for heat): constant, function of position, or nodal field (default 1). */
  readonly conductivity?: Coefficient;
}

/**
 * ∇·(k∇u) at every node, second order, conservative (see the module
 * formula), with insulated boundary faces. For the operator with boundary
 * conditions, use `discretize` of the boundary stage.
 *
 * @param g - the grid (uniform or stretched, periodic axes allowed)
 * @param options - the conductivity k
 * @returns the operator; `symmetric` is true only where every node has the
 *   same control volume (uniform all-periodic grids), since diag(V)·A, not A,
 *   is symmetric in general
 * @example diffusionOperator(grid({ x: { from: 0, to: 2, cells: 2 } }), { conductivity: 3 }).apply(Float64Array.of(0, 1, 4))[1] // 6
 */
export function diffusionOperator(g: Grid, options: Readonly<DiffusionOptions> = {}): Operator {
  const k = sampleCoefficient(g, options.conductivity ?? 1, 'conductivity');
  const uniformVolumes = g.axes.every((a) => a.periodic && a.uniform);
  return makeOperator({
    rows: g.size,
    cols: g.size,
    shape: g.shape,
    symmetric: uniformVolumes,
    build: () => assembleConservative(g, k, { scaled: false }),
  });
}
