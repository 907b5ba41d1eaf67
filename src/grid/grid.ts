/**
 * Node-centred structured grids in one, two or three dimensions: the tensor
 * product of one {@link Axis} per dimension, named x, y, z in that order.
 *
 * Node (i, j, k) sits at (x.coordinates[i], y.coordinates[j],
 * z.coordinates[k]); fields on the grid have shape [nx], [nx, ny] or
 * [nx, ny, nz] with x slowest (see {@link Field}).
 *
 * @module
 */
import { MissingAxisError, UnknownAxisError } from '../errors.js';
import { type Axis, type AxisName, type AxisSpec, makeAxis } from './axis.js';

/**
 * Number of axes of a grid.
 *
 * @example grid({ x: { from: 0, to: 1, cells: 2 }, y: { from: 0, to: 1, cells: 2 } }).dimension // 2
 */
export type Dimension = 1 | 2 | 3;

/**
 * Description of a 1-D grid: axis x only.
 *
 * @example grid({ x: { from: 0, to: 1, cells: 2 } }).shape // [3]
 */
export interface GridSpec1 {
  /** The x axis. */
  readonly x: AxisSpec;
  /** Absent in 1-D. */
  readonly y?: undefined;
  /** Absent in 1-D. */
  readonly z?: undefined;
}

/**
 * Description of a 2-D grid: axes x and y.
 *
 * @example grid({ x: { from: 0, to: 1, cells: 2 }, y: { from: 0, to: 1, cells: 5 } }).shape // [3, 6]
 */
export interface GridSpec2 {
  /** The x axis (slowest in field layout). */
  readonly x: AxisSpec;
  /** The y axis (fastest in field layout). */
  readonly y: AxisSpec;
  /** Absent in 2-D. */
  readonly z?: undefined;
}

/**
 * Description of a 3-D grid: axes x, y and z.
 *
 * @example grid({ x: { from: 0, to: 1, cells: 1 }, y: { from: 0, to: 1, cells: 2 }, z: { from: 0, to: 1, cells: 3 } }).shape // [2, 3, 4]
 */
export interface GridSpec3 {
  /** The x axis (slowest in field layout). */
  readonly x: AxisSpec;
  /** The y axis. */
  readonly y: AxisSpec;
  /** The z axis (fastest in field layout). */
  readonly z: AxisSpec;
}

/**
 * Description of a grid of any dimension; the axes present give the dimension.
 *
 * @example grid({ x: { from: 0, to: 1, cells: 2 }, y: { from: 0, to: 1, cells: 2 } } as GridSpec).dimension // 2
 */
export type GridSpec = GridSpec1 | GridSpec2 | GridSpec3;

/**
 * Node counts per axis, x first: [nx], [nx, ny] or [nx, ny, nz].
 *
 * @example grid({ x: { from: 0, to: 1, cells: 2 }, y: { from: 0, to: 1, cells: 3, periodic: true } }).shape // [3, 3]
 */
export type GridShape<D extends Dimension = Dimension> = D extends 1
  ? readonly [number]
  : D extends 2
    ? readonly [number, number]
    : readonly [number, number, number];

/**
 * The axes of a grid in the order x, y, z.
 *
 * @example grid({ x: { from: 0, to: 1, cells: 2 }, y: { from: 0, to: 1, cells: 2 } }).axes.map((a) => a.name) // ['x', 'y']
 */
export type GridAxes<D extends Dimension = Dimension> = D extends 1
  ? readonly [Axis]
  : D extends 2
    ? readonly [Axis, Axis]
    : readonly [Axis, Axis, Axis];

/**
 * An immutable node-centred grid of dimension `D`.
 *
 * Counts and spacings follow the trade's names: `nx`, `ny`, `nz` are stored
 * node counts, `dx`, `dy`, `dz` the uniform spacings (undefined on a
 * stretched axis, where the cell widths are in `axis.widths`).
 *
 * @example
 * ```ts
 * const g = grid({ x: { from: 0, to: 1, cells: 4 }, y: { nodes: [0, 0.1, 1] } });
 * [g.nx, g.ny, g.size, g.dx, g.dy] // [5, 3, 15, 0.25, undefined]
 * ```
 */
export interface Grid<D extends Dimension = Dimension> {
  /** Number of axes. */
  readonly dimension: D;
  /** The axes, x first. */
  readonly axes: GridAxes<D>;
  /** Stored node counts per axis, x first: the shape of every field on the grid. */
  readonly shape: GridShape<D>;
  /** Total stored node count, nx·ny·nz. */
  readonly size: number;
  /** The x axis. */
  readonly x: Axis;
  /** The y axis; undefined in 1-D. */
  readonly y: D extends 1 ? undefined : Axis;
  /** The z axis; undefined below 3-D. */
  readonly z: D extends 3 ? Axis : undefined;
  /** Stored node count along x. */
  readonly nx: number;
  /** Stored node count along y; undefined in 1-D. */
  readonly ny: D extends 1 ? undefined : number;
  /** Stored node count along z; undefined below 3-D. */
  readonly nz: D extends 3 ? number : undefined;
  /** Spacing along x if uniform, else undefined. */
  readonly dx: number | undefined;
  /** Spacing along y if present and uniform, else undefined. */
  readonly dy: number | undefined;
  /** Spacing along z if present and uniform, else undefined. */
  readonly dz: number | undefined;
}

/** The axis names in grid order. */
export const AXIS_NAMES: readonly AxisName[] = Object.freeze(['x', 'y', 'z'] as const);

/**
 * A node-centred grid from one axis description per dimension.
 *
 * Give x for 1-D, x and y for 2-D, x, y and z for 3-D. Each axis is uniform
 * `{ from, to, cells }` (cells + 1 nodes, spacing (to − from)/cells) or
 * stretched `{ nodes }`, and either may be `periodic: true`, which stores the
 * node at `to` once, as the node at `from` (a periodic uniform axis of n cells
 * has n stored nodes). Node arrays are copied; the grid never changes.
 *
 * @param axes - one description per axis, keys x, y, z only, without gaps
 * @returns the grid
 * @throws UnknownAxisError for a key other than x, y, z; MissingAxisError for a
 *   gap (y without x, z without y); the axis errors of each description
 *   (InvalidAxisSpecError, InvalidCellsError, InvalidIntervalError,
 *   NonFiniteValueError, NonIncreasingNodesError, TooFewNodesError,
 *   InvalidSpacingError)
 * @example grid({ x: { from: 0, to: 1, cells: 4 }, y: { nodes: [0, 0.1, 0.5, 1] } }).shape // [5, 4]
 */
export function grid(axes: GridSpec1): Grid<1>;
export function grid(axes: GridSpec2): Grid<2>;
export function grid(axes: GridSpec3): Grid<3>;
export function grid(axes: GridSpec): Grid;
export function grid(axes: GridSpec): Grid {
  if (axes === null || typeof axes !== 'object') {
    throw new MissingAxisError('x', 'give the axes as an object, e.g. { x: { from: 0, to: 1, cells: 10 } }');
  }
  const spec = axes as unknown as Record<string, AxisSpec | undefined>;
  for (const key of Object.keys(spec)) {
    if (!(AXIS_NAMES as readonly string[]).includes(key)) throw new UnknownAxisError(key);
  }
  const present = AXIS_NAMES.filter((a) => spec[a] !== undefined);
  const dimension = present.length;
  for (let d = 0; d < dimension; d++) {
    const name = AXIS_NAMES[d];
    if (spec[name] === undefined) {
      throw new MissingAxisError(
        name,
        `a grid with axis ${present[present.length - 1]} needs every axis before it; name the axes x, then y, then z`,
      );
    }
  }
  if (dimension === 0) throw new MissingAxisError('x', 'a grid needs at least axis x');
  const list = present.map((a) => makeAxis(a, spec[a] as AxisSpec));
  const shape = Object.freeze(list.map((a) => a.count));
  const [x, y, z] = list;
  return Object.freeze({
    dimension: dimension as Dimension,
    axes: Object.freeze(list),
    shape,
    size: shape.reduce((p, c) => p * c, 1),
    x: x as Axis,
    y,
    z,
    nx: (x as Axis).count,
    ny: y?.count,
    nz: z?.count,
    dx: x?.spacing,
    dy: y?.spacing,
    dz: z?.spacing,
  }) as unknown as Grid;
}

/**
 * The axis of `g` called `name`.
 *
 * @param g - the grid
 * @param name - x, y or z
 * @returns the axis
 * @throws UnknownAxisError if `name` is not x, y or z; MissingAxisError if the grid has no such axis
 * @example axisOf(grid({ x: { from: 0, to: 2, cells: 4 } }), 'x').spacing // 0.5
 */
export function axisOf(g: Grid, name: AxisName): Axis {
  const d = (AXIS_NAMES as readonly string[]).indexOf(name);
  if (d < 0) throw new UnknownAxisError(String(name));
  if (d >= g.dimension) {
    throw new MissingAxisError(name, `this grid is ${g.dimension}-D with axes ${AXIS_NAMES.slice(0, g.dimension).join(', ')}`);
  }
  return g.axes[d] as Axis;
}
