/**
 * Views of parts of a field that share its storage: each boundary face, and
 * the interior. Writing through a view writes the field.
 *
 * Faces are named after the axis and the end: `xmin` is the node plane
 * x = from (index 0 along x), `xmax` the plane x = to (index nx − 1), and so
 * on for y and z. A periodic axis has no boundary, so it has no faces.
 *
 * @module
 */
import { MissingAxisError, PeriodicFaceError, UnknownFaceError } from '../errors.js';
import type { Axis, AxisName } from './axis.js';
import { checkField, type Field } from './field.js';
import type { Grid } from './grid.js';

/**
 * A boundary face: the node plane at the `from` (min) or `to` (max) end of an axis.
 *
 * @example
 * ```ts
 * const g = grid({ x: { from: 0, to: 1, cells: 2 } });
 * faceView(g, sampleField(g, (x) => x + 1), 'xmax').get() // 2
 * ```
 */
export type FaceName = 'xmin' | 'xmax' | 'ymin' | 'ymax' | 'zmin' | 'zmax';

const FACES: readonly FaceName[] = ['xmin', 'xmax', 'ymin', 'ymax', 'zmin', 'zmax'];

/**
 * The boundary faces of `g`: two per non-periodic axis, in the order
 * xmin, xmax, ymin, ymax, zmin, zmax.
 *
 * @param g - the grid
 * @returns the face names, none for periodic axes
 * @example boundaryFaces(grid({ x: { from: 0, to: 1, cells: 4 }, y: { from: 0, to: 1, cells: 4, periodic: true } })) // ['xmin', 'xmax']
 */
export function boundaryFaces(g: Grid): FaceName[] {
  const out: FaceName[] = [];
  for (let d = 0; d < g.dimension; d++) {
    if (!(g.axes[d] as Axis).periodic) out.push(FACES[2 * d], FACES[2 * d + 1]);
  }
  return out;
}

/**
 * The face `face` of `field`, a view with one axis fewer sharing its data.
 *
 * The remaining axes keep their order: on a 3-D field of shape [nx, ny, nz],
 * `xmin` has shape [ny, nz], `ymax` [nx, nz], `zmin` [nx, ny]; on a 2-D field
 * `xmin` has shape [ny] and `ymin` [nx]; on a 1-D field a face is a 0-D view
 * (read it with `.get()`, write it with `.set(v)`). Nodes on edges and
 * corners belong to every face that meets there.
 *
 * @param g - the grid of the field
 * @param field - values on `g`, shape `g.shape`, any strides
 * @param face - which face
 * @returns the view; writes through it change `field`
 * @throws UnknownFaceError for a name not in {@link FaceName}; MissingAxisError if the
 *   grid has no such axis; PeriodicFaceError on a periodic axis; ShapeMismatchError /
 *   InvalidFieldError if `field` does not fit `g`
 * @example
 * ```ts
 * const g = grid({ x: { from: 0, to: 1, cells: 2 }, y: { from: 0, to: 1, cells: 5 } });
 * faceView(g, zeros(g), 'ymax').shape // [3]
 * faceView(g, zeros(g), 'xmin').shape // [6]
 * ```
 */
export function faceView(g: Grid, field: Field, face: FaceName): Field {
  const k = FACES.indexOf(face);
  if (k < 0) throw new UnknownFaceError(String(face));
  const d = k >> 1;
  const name = face[0] as AxisName;
  if (d >= g.dimension) {
    throw new MissingAxisError(name, `face ${face} needs a grid with axis ${name}; this grid is ${g.dimension}-D`);
  }
  const axis = g.axes[d] as Axis;
  if (axis.periodic) throw new PeriodicFaceError(face, name);
  checkField(g, field);
  const at: Array<number | null> = new Array<number | null>(g.dimension).fill(null);
  at[d] = k % 2 === 0 ? 0 : axis.count - 1;
  return field.pick(...at);
}

/**
 * The interior of `field`: a view without the boundary nodes, sharing its data.
 *
 * Along a non-periodic axis of n nodes it keeps indices 1 … n − 2 (n − 2 of
 * them, none when n = 2); along a periodic axis, which has no boundary, it
 * keeps all n. Index (i, j, k) of the view is node (i + 1, j + 1, k + 1) of
 * the field on non-periodic axes.
 *
 * @param g - the grid of the field
 * @param field - values on `g`, shape `g.shape`, any strides
 * @returns the view; writes through it change `field`
 * @throws ShapeMismatchError / InvalidFieldError if `field` does not fit `g`
 * @example
 * ```ts
 * const g = grid({ x: { from: 0, to: 1, cells: 4 }, y: { from: 0, to: 1, cells: 4, periodic: true } });
 * interiorView(g, zeros(g)).shape // [3, 4]
 * ```
 */
export function interiorView(g: Grid, field: Field): Field {
  checkField(g, field);
  const lo: number[] = [];
  const hi: number[] = [];
  for (let d = 0; d < g.dimension; d++) {
    const a = g.axes[d] as Axis;
    hi.push(a.periodic ? a.count : a.count - 1);
    lo.push(a.periodic ? 0 : 1);
  }
  return field.hi(...hi).lo(...lo);
}
