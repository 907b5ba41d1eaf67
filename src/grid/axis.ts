/**
 * One axis of a node-centred structured grid: how it is described
 * ({@link AxisSpec}) and the immutable value it becomes ({@link Axis}).
 *
 * Node-centred means every node sits on a cell boundary and both end nodes
 * are stored: a non-periodic axis of n cells has n + 1 nodes x₀ = from < x₁ <
 * … < xₙ = to. On a periodic axis the node at `to` is the node at `from`, so
 * it is stored once: n cells give n stored nodes x₀ … xₙ₋₁, and the last cell
 * runs from xₙ₋₁ back round to x₀ + (to − from).
 *
 * @module
 */
import { checkAllFinite, checkFinite, checkSpacing } from '../check.js';
import {
  InvalidAxisSpecError,
  InvalidCellsError,
  InvalidIntervalError,
  NonIncreasingNodesError,
  TooFewNodesError,
} from '../errors.js';

/**
 * The name of an axis; a grid of dimension d has the first d of x, y, z.
 *
 * @example grid({ x: { from: 0, to: 1, cells: 2 } }).x.name // 'x'
 */
export type AxisName = 'x' | 'y' | 'z';

/**
 * A uniform axis: `cells` equal cells of width (to − from) / cells between
 * `from` and `to`.
 *
 * Non-periodic: cells + 1 nodes, xᵢ = from + i·(to − from)/cells, with x at
 * i = cells set to `to` exactly. Periodic: `cells` stored nodes
 * xᵢ = from + i·(to − from)/cells, i = 0 … cells − 1; the period is to − from.
 *
 * @example grid({ x: { from: 0, to: 1, cells: 4, periodic: true } }).x.coordinates // Float64Array [0, 0.25, 0.5, 0.75]
 */
export interface UniformAxisSpec {
  /** Lower end (finite). */
  readonly from: number;
  /** Upper end (finite, > from). */
  readonly to: number;
  /** Number of cells, a whole number ≥ 1. */
  readonly cells: number;
  /** Whether the node at `to` is the node at `from` (stored once). Default false. */
  readonly periodic?: boolean;
  /** Not allowed on a uniform axis; listed so that a mixed description is refused at compile time. */
  readonly nodes?: undefined;
}

/**
 * A stretched axis: explicit node coordinates, strictly increasing and
 * finite, at least two of them; the first is `from`, the last is `to`.
 *
 * Periodic: give the closed list x₀ … xₙ including the end node xₙ = to; it
 * is identified with x₀ and not stored, so the axis stores n = nodes.length − 1
 * nodes and the period is xₙ − x₀.
 *
 * @example grid({ x: { nodes: [0, 1, 3], periodic: true } }).x.count // 2
 */
export interface StretchedAxisSpec {
  /** Node coordinates, strictly increasing and finite; copied, never kept or changed. */
  readonly nodes: readonly number[] | Readonly<Float64Array>;
  /** Whether the last node is the first node (stored once). Default false. */
  readonly periodic?: boolean;
  /** Not allowed on a stretched axis (the nodes give the ends). */
  readonly from?: undefined;
  /** Not allowed on a stretched axis (the nodes give the ends). */
  readonly to?: undefined;
  /** Not allowed on a stretched axis (the nodes give the count). */
  readonly cells?: undefined;
}

/**
 * How to build one axis: uniform from cells, or stretched from explicit nodes.
 *
 * @example grid({ x: { from: 0, to: 1, cells: 10 }, y: { nodes: [0, 0.5, 2] } }).shape // [11, 3]
 */
export type AxisSpec = UniformAxisSpec | StretchedAxisSpec;

/**
 * What uniform and stretched axes share.
 *
 * @example grid({ x: { nodes: [0, 1, 3] } }).x.widths // Float64Array [1, 2]
 */
export interface AxisBase {
  /** The axis name. */
  readonly name: AxisName;
  /** Stored node count: cells + 1, or cells if periodic. */
  readonly count: number;
  /** Number of cells. */
  readonly cells: number;
  /**
   * Stored node coordinates, ascending, length `count`. Shared by every user
   * of the axis: read it, copy it (`.slice()`) before changing anything.
   */
  readonly coordinates: Readonly<Float64Array>;
  /**
   * Cell widths hᵢ = xᵢ₊₁ − xᵢ, length `cells`; on a periodic axis the last is
   * the width of the wrap-around cell, to − xₙ₋₁. All equal to `spacing` on a
   * uniform axis. Shared: do not change.
   */
  readonly widths: Readonly<Float64Array>;
  /** Whether the end at `to` is identified with the end at `from`. */
  readonly periodic: boolean;
  /** Lower end, the first node. */
  readonly from: number;
  /** Upper end: the last node, or on a periodic axis the image of the first (not stored). */
  readonly to: number;
}

/**
 * An axis of equal cells.
 *
 * @example grid({ x: { from: 0, to: 1, cells: 4 } }).x.spacing // 0.25
 */
export interface UniformAxis extends AxisBase {
  /** Always true: the cells are equal. */
  readonly uniform: true;
  /** The cell width (to − from) / cells; called dx, dy or dz on the grid. */
  readonly spacing: number;
}

/**
 * An axis with node coordinates of its own.
 *
 * @example grid({ x: { nodes: [0, 1, 3] } }).x.uniform // false
 */
export interface StretchedAxis extends AxisBase {
  /** Always false: the cell widths are in `widths`. */
  readonly uniform: false;
  /** No single spacing; use `widths`. */
  readonly spacing: undefined;
}

/**
 * One axis of a grid; narrow on `uniform` to reach `spacing`.
 *
 * @example
 * ```ts
 * const a: Axis = grid({ x: { from: 0, to: 2, cells: 8 } }).x;
 * a.uniform ? a.spacing : a.widths[0] // 0.25
 * ```
 */
export type Axis = UniformAxis | StretchedAxis;

function checkIncreasing(x: Float64Array): void {
  for (let i = 1; i < x.length; i++) {
    if (!(x[i] > x[i - 1])) throw new NonIncreasingNodesError(i, x[i - 1], x[i]);
  }
}

function uniformAxis(name: AxisName, spec: UniformAxisSpec, periodic: boolean): UniformAxis {
  const where = `axis ${name}`;
  checkFinite(`${name}.from`, spec.from);
  checkFinite(`${name}.to`, spec.to);
  if (!(spec.to > spec.from)) throw new InvalidIntervalError(where, spec.from, spec.to);
  const n = spec.cells;
  if (!Number.isSafeInteger(n) || n < 1) throw new InvalidCellsError(where, n);
  const h = (spec.to - spec.from) / n;
  checkSpacing(`d${name}`, h);
  const count = periodic ? n : n + 1;
  const x = new Float64Array(count);
  x[0] = spec.from;
  for (let i = 1; i < count; i++) x[i] = spec.from + i * h;
  // the formula can miss `to` by an ulp; the end node is `to` by definition
  if (!periodic) x[n] = spec.to;
  checkIncreasing(x);
  return Object.freeze({
    name, count, cells: n, coordinates: x, widths: new Float64Array(n).fill(h),
    periodic, from: spec.from, to: spec.to, uniform: true as const, spacing: h,
  });
}

function stretchedAxis(name: AxisName, spec: StretchedAxisSpec, periodic: boolean): StretchedAxis {
  const given = spec.nodes;
  if (given === null || typeof given !== 'object' || typeof given.length !== 'number') {
    throw new InvalidAxisSpecError(name, 'nodes must be an array or Float64Array of coordinates');
  }
  const all = Float64Array.from(given as ArrayLike<number>);
  if (all.length < 2) {
    throw new TooFewNodesError(all.length, 2, `stretched axis ${name} (its two end nodes at least)`);
  }
  checkAllFinite(`${name}.nodes`, all);
  checkIncreasing(all);
  const n = all.length - 1;
  const widths = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    widths[i] = all[i + 1] - all[i];
    // x₀ = −1e308, x₁ = 1e308 are finite but 2e308 is not
    checkSpacing(`${name}.nodes[${i + 1}] − ${name}.nodes[${i}]`, widths[i]);
  }
  const x = periodic ? all.slice(0, n) : all;
  return Object.freeze({
    name, count: x.length, cells: n, coordinates: x, widths,
    periodic, from: all[0], to: all[n], uniform: false as const, spacing: undefined,
  });
}

/**
 * Builds the axis `name` from its description, checking everything.
 * Internal: `grid` is the public way in.
 *
 * @internal
 */
export function makeAxis(name: AxisName, spec: AxisSpec): Axis {
  if (spec === null || typeof spec !== 'object') {
    throw new InvalidAxisSpecError(name, 'give { from, to, cells } for a uniform axis or { nodes } for a stretched one');
  }
  const s = spec as unknown as Record<string, unknown>;
  const periodic = s['periodic'] ?? false;
  if (typeof periodic !== 'boolean') {
    throw new InvalidAxisSpecError(name, `periodic is ${String(periodic)}; use true or false`);
  }
  for (const key of Object.keys(s)) {
    if (!['from', 'to', 'cells', 'nodes', 'periodic'].includes(key)) {
      throw new InvalidAxisSpecError(name, `unknown option ${JSON.stringify(key)}; the options are from, to, cells, nodes, periodic`);
    }
  }
  const hasNodes = s['nodes'] !== undefined;
  const hasUniform = s['from'] !== undefined || s['to'] !== undefined || s['cells'] !== undefined;
  if (hasNodes && hasUniform) {
    throw new InvalidAxisSpecError(name, 'give either { from, to, cells } (uniform) or { nodes } (stretched), not both');
  }
  if (hasNodes) return stretchedAxis(name, spec as StretchedAxisSpec, periodic);
  if (s['from'] === undefined || s['to'] === undefined || s['cells'] === undefined) {
    throw new InvalidAxisSpecError(name, 'a uniform axis needs all of from, to and cells; a stretched one needs nodes');
  }
  for (const key of ['from', 'to', 'cells']) {
    if (typeof s[key] !== 'number') {
      throw new InvalidAxisSpecError(name, `${key} is ${typeof s[key]}; give a number`);
    }
  }
  return uniformAxis(name, spec as UniformAxisSpec, periodic);
}
