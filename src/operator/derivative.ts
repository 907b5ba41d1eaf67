/**
 * Derivative operators along one axis of a grid, the Laplacian as their sum
 * over axes, and mixed derivatives as products.
 *
 * Every row is a stencil of the stencil stage: centred in the interior, one-
 * sided or biased near a boundary with the same accuracy (see the closure
 * rule in `lines.ts`, repeated in the TSDoc of {@link derivative}).
 *
 * @module
 */
import { checkDerivative } from '../check.js';
import { InvalidAccuracyError, InvalidDerivativeError, InvalidOptionError } from '../errors.js';
import { type AxisName, type Grid, axisOf } from '../grid/index.js';
import { CsrBuilder, type CsrMatrix } from './matrix.js';
import { type LineTable, checkAccuracyOrder, lineTable } from './lines.js';
import { type Operator, makeOperator } from './operator.js';
import { compose } from './algebra.js';
import { laplace5 } from './base/laplace2d.js';

/** What {@link derivative} builds. */
export interface DerivativeOptions {
  /** The axis to differentiate along. */
  readonly axis: AxisName;
  /** m in ∂ᵐ/∂xᵐ, ≥ 1. */
  readonly derivative: number;
  /** p in O(hᵖ), ≥ 1 (even p gives centred interior rows). */
  readonly accuracy: number;
}

/** Memory strides of a grid's fields, x slowest. @internal */
export function gridStrides(g: Grid): number[] {
  const s = new Array<number>(g.dimension).fill(1);
  for (let d = g.dimension - 2; d >= 0; d--) s[d] = s[d + 1]! * g.shape[d + 1]!;
  return s;
}

/** Axis index 0, 1, 2 of x, y, z. @internal */
export function axisIndex(g: Grid, name: AxisName): number {
  axisOf(g, name); // throws for a missing axis
  return name === 'x' ? 0 : name === 'y' ? 1 : 2;
}

/**
 * Adds the entries of one axis table at every node of row `r`, whose index
 * along the axis is `i`. @internal
 */
export function addLineRow(b: CsrBuilder, t: LineTable, r: number, i: number, stride: number, periodic: boolean, scale = 1): void {
  const n = t.n;
  for (let p = t.ptr[i]!; p < t.ptr[i + 1]!; p++) {
    let j = i + t.offsets[p]!;
    if (periodic) j = ((j % n) + n) % n;
    b.add(r + (j - i) * stride, scale * t.weights[p]!);
  }
}

/** CSR of Σ over the given axis tables (one per listed axis). @internal */
export function assembleAxes(g: Grid, axes: ReadonlyArray<{ d: number; t: LineTable; scale?: number }>): CsrMatrix {
  const size = g.size;
  const strides = gridStrides(g);
  const shape = g.shape;
  const width = axes.reduce((acc, a) => acc + (a.t.ptr[1]! - a.t.ptr[0]!) + 2, 0);
  const b = new CsrBuilder(size, size, size * width);
  const idx = [0, 0, 0];
  for (let r = 0; r < size; r++) {
    for (const a of axes) addLineRow(b, a.t, r, idx[a.d]!, strides[a.d]!, g.axes[a.d]!.periodic, a.scale ?? 1);
    b.endRow();
    for (let d = g.dimension - 1; d >= 0; d--) {
      if (++idx[d]! < shape[d]!) break;
      idx[d] = 0;
    }
  }
  return b.finish();
}

/**
 * ∂ᵐu/∂xᵐ along one axis at every node, with error O(hᵖ).
 *
 * Interior rows use the centred stencil (p even) or the nearly centred one of
 * m + p nodes (p odd); rows whose window would leave the axis use m + p
 * consecutive nodes from the boundary inward — one-sided at the boundary
 * node, biased next to it — which keeps accuracy p. A periodic axis wraps
 * the interior stencil. On stretched axes the weights come from Fornberg's
 * recursion on the actual coordinates. Source: Fornberg (1988), Math. Comp.
 * 51, 699–706; closure rule: common practice (e.g. LeVeque 2007, §1.5).
 *
 * @param g - the grid
 * @param options - axis, derivative and accuracy
 * @returns a square operator on the grid's nodes (not symmetric)
 * @example derivative(grid({ x: { from: 0, to: 1, cells: 4 } }), { axis: 'x', derivative: 1, accuracy: 2 }).apply(Float64Array.of(0, 0.25, 0.5, 0.75, 1)) // all 1
 */
export function derivative(g: Grid, options: Readonly<DerivativeOptions>): Operator {
  const { axis, derivative: m, accuracy: p } = options;
  checkDerivative(m);
  if (m === 0) throw new InvalidDerivativeError(m, 'derivative 0 is the identity; use identity(grid.size)');
  checkAccuracyOrder(p);
  const d = axisIndex(g, axis);
  const t = lineTable(g.axes[d]!, m, p);
  return makeOperator({
    rows: g.size,
    cols: g.size,
    shape: g.shape,
    symmetric: false,
    build: () => assembleAxes(g, [{ d, t }]),
  });
}

/** What {@link laplacian} builds. */
export interface LaplacianOptions {
  /** p in O(hᵖ): 2, 4 or 6 on uniform axes; 2 where any axis is stretched (default 2). */
  readonly accuracy?: number;
}

/**
 * The Laplacian Δu = Σ ∂²u/∂xᵢ² at every node (negative semi-definite in the
 * interior), error O(hᵖ).
 *
 * Each axis contributes the second-derivative rows of {@link derivative}; at
 * accuracy 2 on a uniform grid the interior is the classical 3-, 5- or
 * 7-point stencil (LeVeque 2007, ch. 3), symmetric where the rows are
 * interior. Boundary rows use one-sided closures and are for evaluating Δu
 * on given data; to solve with boundary conditions, build a
 * discretisation in the boundary stage, which replaces them.
 *
 * @param g - the grid
 * @param options - accuracy (default 2)
 * @returns a square operator on the grid's nodes; `symmetric` is true only
 *   for an all-periodic grid at accuracy 2 or more, where no closure rows exist
 * @example laplacian(grid({ x: { from: 0, to: 2, cells: 2 } })).apply(Float64Array.of(0, 1, 4))[1] // 2
 */
export function laplacian(g: Grid, options: Readonly<LaplacianOptions> = {}): Operator {
  const p = options.accuracy ?? 2;
  checkAccuracyOrder(p);
  if (![2, 4, 6].includes(p)) throw new InvalidAccuracyError(p, 'the Laplacian is built at accuracy 2, 4 or 6');
  const stretched = g.axes.filter((a) => !a.uniform).map((a) => a.name);
  if (p !== 2 && stretched.length > 0) {
    throw new InvalidAccuracyError(p, `axis ${stretched.join(', ')} is stretched, where the Laplacian is built at accuracy 2 only; use accuracy 2 or a uniform axis`);
  }
  const tables = g.axes.map((a, d) => ({ d, t: lineTable(a, 2, p) }));
  const symmetric = g.axes.every((a) => a.periodic && a.uniform);
  return makeOperator({
    rows: g.size,
    cols: g.size,
    shape: g.shape,
    symmetric,
    build: () => assembleAxes(g, tables),
    kernel: p === 2 && g.dimension === 2 && g.axes.every((a) => a.uniform && !a.periodic) ? fivePointKernel(g, tables) : undefined,
  });
}

/**
 * Matrix-free Δ on a uniform, non-periodic 2-D grid: the strided 5-point
 * kernel on the interior, and the boundary rows (one-sided closures) from a
 * small CSR of those rows only, built on first use.
 */
function fivePointKernel(g: Grid, tables: ReadonlyArray<{ d: number; t: LineTable }>): (x: Float64Array, y: Float64Array) => void {
  const nx = g.shape[0]!;
  const ny = g.shape[1]!;
  const cx = 1 / g.dx! ** 2;
  const cy = 1 / g.dy! ** 2;
  let rows: Int32Array | undefined;
  let m: CsrMatrix | undefined;
  const boundary = (): void => {
    const list: number[] = [];
    for (let i = 0; i < nx; i++) for (let j = 0; j < ny; j++) if (i === 0 || j === 0 || i === nx - 1 || j === ny - 1) list.push(i * ny + j);
    rows = Int32Array.from(list);
    const b = new CsrBuilder(list.length, g.size, list.length * 8);
    for (const r of list) {
      const i = Math.floor(r / ny);
      const j = r - i * ny;
      addLineRow(b, tables[0]!.t, r, i, ny, false);
      addLineRow(b, tables[1]!.t, r, j, 1, false);
      b.endRow();
    }
    m = b.finish();
  };
  return (x, y) => {
    laplace5(nx, ny, cx, cy, -2 * (cx + cy), x, ny, 1, 0, y, ny, 1, 0);
    if (m === undefined) boundary();
    const { rowPtr, colIdx, values } = m!;
    const rs = rows!;
    for (let q = 0; q < rs.length; q++) {
      let acc = 0;
      for (let k = rowPtr[q]!; k < rowPtr[q + 1]!; k++) acc += values[k]! * x[colIdx[k]!]!;
      y[rs[q]!] = acc;
    }
  };
}

/** What {@link mixedDerivative} builds. */
export interface MixedDerivativeOptions {
  /** The two distinct axes, e.g. ['x', 'y'] for ∂²/∂x∂y. */
  readonly axes: readonly [AxisName, AxisName];
  /** p in O(hᵖ) (default 2). */
  readonly accuracy?: number;
}

/**
 * The mixed derivative ∂²u/∂a∂b = ∂/∂a(∂u/∂b), the product of two first-
 * derivative operators of {@link derivative} (which commute on a tensor grid),
 * error O(hᵖ). In the interior at accuracy 2 this is the 9-point cross
 * product stencil (u₊₊ − u₊₋ − u₋₊ + u₋₋)/(4·da·db).
 *
 * @param g - a grid of dimension ≥ 2
 * @param options - the two axes and the accuracy
 * @returns a square operator on the grid's nodes (not symmetric)
 * @example mixedDerivative(grid({ x: { from: 0, to: 1, cells: 2 }, y: { from: 0, to: 1, cells: 2 } }), { axes: ['x', 'y'] }).rows // 9
 */
export function mixedDerivative(g: Grid, options: Readonly<MixedDerivativeOptions>): Operator {
  const [a, b] = options.axes;
  const p = options.accuracy ?? 2;
  if (a === b) {
    throw new InvalidOptionError('axes', `the mixed derivative needs two different axes, got ${a} twice; use derivative(grid, { axis: '${a}', derivative: 2, accuracy: ${p} })`);
  }
  return compose(derivative(g, { axis: a, derivative: 1, accuracy: p }), derivative(g, { axis: b, derivative: 1, accuracy: p }));
}
