/**
 * Fields: values at the stored nodes of a grid, as `ndarray` views over a
 * `Float64Array`.
 *
 * Layout, the one convention every module follows: a field on a grid of
 * shape [nx], [nx, ny] or [nx, ny, nz] is an ndarray of that shape whose
 * element (i, j, k) is the value at node (xᵢ, yⱼ, z_k). Fields made here are
 * contiguous in C order — x slowest, the last axis fastest — so that
 * element (i, j, k) is `data[(i·ny + j)·nz + k]` and the strides are
 * [ny·nz, nz, 1]. Functions that take a field accept any strided view of the
 * right shape; only new fields are promised to be contiguous.
 *
 * @module
 */
import ndarray, { type NdArray } from 'ndarray';
import { InvalidFieldError, NonFiniteValueError, ShapeMismatchError } from '../errors.js';
import { copy1, copy2, copy3 } from './base/copy.js';
import type { Dimension, Grid } from './grid.js';

/**
 * Values at the stored nodes of a grid: an ndarray over a Float64Array of
 * shape [nx], [nx, ny] or [nx, ny, nz], x slowest (C order, last axis
 * fastest). Face views of a field have one axis fewer (0-D for a 1-D field).
 *
 * @example
 * ```ts
 * const g = grid({ x: { from: 0, to: 1, cells: 1 }, y: { from: 0, to: 2, cells: 2 } });
 * const f: Field = sampleField(g, (x, y) => 10 * x + y);
 * Array.from(f.data) // [0, 1, 2, 10, 11, 12]: x slowest
 * ```
 */
export type Field = NdArray<Float64Array>;

/**
 * A function of the node coordinates of a `D`-dimensional grid: (x), (x, y)
 * or (x, y, z). Returns a finite number.
 *
 * @example
 * ```ts
 * const fn: NodeFunction<2> = (x, y) => x * y;
 * sampleField(grid({ x: { from: 0, to: 1, cells: 1 }, y: { from: 0, to: 1, cells: 1 } }), fn).get(1, 1) // 1
 * ```
 */
export type NodeFunction<D extends Dimension = Dimension> = D extends 1
  ? (x: number) => number
  : D extends 2
    ? (x: number, y: number) => number
    : (x: number, y: number, z: number) => number;

function shapeText(shape: readonly number[]): string {
  return `[${shape.join(', ')}]`;
}

/**
 * Throws InvalidFieldError unless `f` is an ndarray view over a Float64Array.
 *
 * @internal
 */
export function checkNdarray(name: string, f: unknown): asserts f is Field {
  const a = f as Partial<Field> | null;
  if (a === null || typeof a !== 'object') {
    throw new InvalidFieldError(`${name} is ${String(f)}; give an ndarray over a Float64Array (zeros(g) or sampleField(g, fn) make one)`);
  }
  if (!(a.data instanceof Float64Array)) {
    throw new InvalidFieldError(
      `${name} is not an ndarray over a Float64Array; wrap the values with ndarray(new Float64Array(…), shape) or use zeros(g)`,
    );
  }
  if (!Array.isArray(a.shape) || !Array.isArray(a.stride) || typeof a.offset !== 'number') {
    throw new InvalidFieldError(`${name} has no shape, stride and offset; give an ndarray view, not a bare array`);
  }
}

/**
 * Throws unless `f` is a field with the grid's shape.
 *
 * @internal
 */
export function checkField(g: Grid, f: unknown, name = 'field'): asserts f is Field {
  checkNdarray(name, f);
  const s = f.shape;
  const want = g.shape as readonly number[];
  if (s.length !== want.length || s.some((n, d) => n !== want[d])) {
    throw new ShapeMismatchError(
      `${name} has shape ${shapeText(s)} but the grid's nodes need ${shapeText(want)} ` +
        `(${['nx', 'ny', 'nz'].slice(0, want.length).join(', ')}, x slowest)`,
    );
  }
}

/**
 * A new field of zeros on the nodes of `g`, contiguous, x slowest.
 *
 * @param g - the grid
 * @returns a field of shape `g.shape`, strides [ny·nz, nz, 1] (truncated to the dimension)
 * @example zeros(grid({ x: { from: 0, to: 1, cells: 2 }, y: { from: 0, to: 1, cells: 3 } })).stride // [4, 1]
 */
export function zeros(g: Grid): Field {
  return ndarray(new Float64Array(g.size), [...g.shape]);
}

/**
 * The function `fn` sampled at every stored node of `g`:
 * f[i, j, k] = fn(xᵢ, yⱼ, z_k), called with as many coordinates as the grid
 * has axes. Exact sampling; the only error is `fn`'s own.
 *
 * @param g - the grid
 * @param fn - (x), (x, y) or (x, y, z) ↦ a finite number
 * @param out - where to write, shape `g.shape`, any strides; a new contiguous field if absent
 * @returns `out`, or the new field
 * @throws NonFiniteValueError if `fn` returns NaN or ±Infinity at some node;
 *   ShapeMismatchError / InvalidFieldError for a bad `out`
 * @example Array.from(sampleField(grid({ x: { from: 0, to: 1, cells: 2 } }), (x) => 2 * x).data) // [0, 1, 2]
 */
export function sampleField<D extends Dimension>(g: Grid<D>, fn: NodeFunction<D>, out?: Field): Field;
export function sampleField(g: Grid, fn: (...coordinates: number[]) => number, out?: Field): Field {
  const f = out ?? zeros(g);
  if (out !== undefined) checkField(g, out, 'out');
  const d = f.data;
  const st = f.stride;
  const x = g.x.coordinates;
  const bad = (v: number, ...c: number[]): never => {
    throw new NonFiniteValueError(`fn(${c.join(', ')})`, v);
  };
  switch (g.dimension) {
    case 1:
      for (let i = 0; i < x.length; i++) {
        const v = fn(x[i]);
        if (!Number.isFinite(v)) bad(v, x[i]);
        d[f.offset + i * st[0]] = v;
      }
      break;
    case 2: {
      const y = (g.y as NonNullable<Grid['y']>).coordinates;
      for (let i = 0; i < x.length; i++) {
        for (let j = 0; j < y.length; j++) {
          const v = fn(x[i], y[j]);
          if (!Number.isFinite(v)) bad(v, x[i], y[j]);
          d[f.offset + i * st[0] + j * st[1]] = v;
        }
      }
      break;
    }
    case 3: {
      const y = (g.y as NonNullable<Grid['y']>).coordinates;
      const z = (g.z as NonNullable<Grid['z']>).coordinates;
      for (let i = 0; i < x.length; i++) {
        for (let j = 0; j < y.length; j++) {
          for (let k = 0; k < z.length; k++) {
            const v = fn(x[i], y[j], z[k]);
            if (!Number.isFinite(v)) bad(v, x[i], y[j], z[k]);
            d[f.offset + i * st[0] + j * st[1] + k * st[2]] = v;
          }
        }
      }
      break;
    }
    default: {
      const unreachable: never = g.dimension;
      throw new ShapeMismatchError(`grid dimension ${String(unreachable)} is not 1, 2 or 3`);
    }
  }
  return f;
}

/**
 * A copy of a 0-D to 3-D view (a field, a face view, an interior view) into
 * new contiguous storage, x slowest, or into `out`. The source is untouched.
 *
 * @param f - the view to copy
 * @param out - where to write, same shape, any strides; new contiguous storage if absent
 * @returns `out`, or the new array
 * @throws InvalidFieldError if `f` or `out` is not an ndarray over a Float64Array;
 *   ShapeMismatchError if the shapes differ or `f` has more than 3 axes
 * @example copyField(zeros(grid({ x: { from: 0, to: 1, cells: 4 } })).lo(1).hi(3)).shape // [3]
 */
export function copyField(f: Field, out?: Field): Field {
  checkNdarray('f', f);
  const s = f.shape;
  if (s.length > 3) throw new ShapeMismatchError(`f has ${s.length} axes; fields have 3 at most`);
  let y: Field;
  if (out === undefined) {
    y = ndarray(new Float64Array(s.reduce((p, c) => p * c, 1)), [...s]);
  } else {
    checkNdarray('out', out);
    if (out.shape.length !== s.length || out.shape.some((n, d) => n !== s[d])) {
      throw new ShapeMismatchError(`out has shape ${shapeText(out.shape)} but f has ${shapeText(s)}; give equal shapes`);
    }
    y = out;
  }
  const a = f.stride;
  const b = y.stride;
  switch (s.length) {
    case 0:
      y.data[y.offset] = f.data[f.offset];
      break;
    case 1:
      copy1(s[0], f.data, a[0], f.offset, y.data, b[0], y.offset);
      break;
    case 2:
      copy2(s[0], s[1], f.data, a[0], a[1], f.offset, y.data, b[0], b[1], y.offset);
      break;
    default:
      copy3(s[0], s[1], s[2], f.data, a[0], a[1], a[2], f.offset, y.data, b[0], b[1], b[2], y.offset);
  }
  return y;
}
