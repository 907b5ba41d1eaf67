/**
 * Boundary conditions per face, and the data they carry.
 *
 * Sign convention, used everywhere in quadrille: n is the outward unit
 * normal of the face, and a flux is positive when heat leaves the body.
 *
 * - value (Dirichlet):      u = value
 * - flux (Neumann):         −k ∂u/∂n = flux            (W/m² leaving; 0 is insulated)
 * - convection (Robin):     −k ∂u/∂n = h (u − ambient)  (h > 0 in W/(m²·K))
 *
 * Data may be constants, functions of position, or functions of position and
 * time: a function is called with the node's coordinates (as many as the
 * grid has axes: (x), (x, y) or (x, y, z)) followed by the time t. The
 * convection coefficient h may depend on position but not on time (it enters
 * the matrix, which implicit steps factor once).
 *
 * Where faces meet (edges and corners), a node on any value face is a value
 * node; where two or more value faces meet it takes the mean of their values.
 * A node on several flux or convection faces takes each face's flux over that
 * face's share of its control-volume boundary (accuracy 2), or the condition
 * of the first of them in the order xmin, xmax, ymin, ymax, zmin, zmax
 * (higher accuracies, where the condition replaces the node's equation).
 *
 * @module
 */
import {
  DuplicateConditionError, InvalidCoefficientError, InvalidOptionError, MissingConditionError,
  NonFiniteValueError, PeriodicFaceError, UnknownFaceError,
} from '../errors.js';
import { type FaceName, type Grid, boundaryFaces } from '../grid/index.js';

/**
 * A boundary datum: a constant, or a function of the node's coordinates then
 * time, `(x, t)`, `(x, y, t)` or `(x, y, z, t)`.
 */
export type FaceData = number | ((...coordinatesThenTime: number[]) => number);

/** A function of the node's coordinates only: `(x)`, `(x, y)` or `(x, y, z)`, or a constant. */
export type FaceCoefficient = number | ((...coordinates: number[]) => number);

/** Prescribed value (Dirichlet): u = value. */
export interface ValueCondition {
  /** Discriminant. */
  readonly kind: 'dirichlet';
  /** The value of u on the face (K or °C for temperature). */
  readonly value: FaceData;
}

/** Prescribed outward flux (Neumann): −k ∂u/∂n = flux. */
export interface FluxCondition {
  /** Discriminant. */
  readonly kind: 'neumann';
  /** Heat leaving through the face per unit area (W/m²); 0 is insulated, negative heats the body. */
  readonly flux: FaceData;
}

/** Convection to surroundings (Robin): −k ∂u/∂n = h (u − ambient). */
export interface ConvectionCondition {
  /** Discriminant. */
  readonly kind: 'robin';
  /** Transfer coefficient h > 0 (W/(m²·K)); constant or a function of position. */
  readonly h: FaceCoefficient;
  /** Temperature of the surroundings u∞. */
  readonly ambient: FaceData;
}

/** The condition on one face (see the module's sign convention). */
export type Condition = ValueCondition | FluxCondition | ConvectionCondition;

/** Names the faces a condition of the list form of {@link BoundarySpec} applies to. */
export interface FaceSelection {
  /** One face, or several that share the condition. */
  readonly faces: FaceName | readonly FaceName[];
}

/** A condition for one or several faces, in the list form of {@link BoundarySpec}. */
export type ConditionEntry = Condition & FaceSelection;

/** One face of a grid with its condition. */
export interface FaceCondition {
  /** The face. */
  readonly face: FaceName;
  /** Its condition. */
  readonly condition: Condition;
}

/**
 * Conditions per face: an object keyed by face name, or a list of entries
 * that each name their faces (so one entry can cover several faces).
 * Every face of the grid's non-periodic axes needs exactly one condition.
 */
export type BoundarySpec = Readonly<Partial<Record<FaceName, Condition>>> | readonly ConditionEntry[];

/** Validated conditions on the faces of one grid. */
export interface BoundaryConditions {
  /** The grid the conditions belong to. */
  readonly grid: Grid;
  /** The condition of each face of the grid, in the order of {@link boundaryFaces}. */
  readonly faces: readonly FaceCondition[];
}

const ALL_FACES: readonly FaceName[] = ['xmin', 'xmax', 'ymin', 'ymax', 'zmin', 'zmax'];

function checkDatum(face: string, what: string, v: unknown, allowFunction: boolean): void {
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) throw new NonFiniteValueError(`${what} on ${face}`, v);
    return;
  }
  if (allowFunction && typeof v === 'function') return;
  throw new InvalidOptionError(`${what} on ${face}`, `got ${typeof v}; give a finite number${allowFunction ? ' or a function' : ''}`);
}

function checkCondition(face: FaceName, c: Condition): void {
  if (c === null || typeof c !== 'object') {
    throw new InvalidOptionError(face, 'give a condition object such as { kind: "dirichlet", value: 0 }');
  }
  switch (c.kind) {
    case 'dirichlet':
      checkDatum(face, 'value', c.value, true);
      break;
    case 'neumann':
      checkDatum(face, 'flux', c.flux, true);
      break;
    case 'robin':
      checkDatum(face, 'h', c.h, true);
      if (typeof c.h === 'number' && !(c.h > 0)) throw new InvalidCoefficientError(`convection coefficient h on ${face}`, c.h);
      checkDatum(face, 'ambient', c.ambient, true);
      break;
    default: {
      const unreachable: never = c;
      throw new InvalidOptionError(
        `kind on ${face}`,
        `${JSON.stringify((unreachable as { kind?: unknown }).kind)} is not a condition; use "dirichlet", "neumann" or "robin"`,
      );
    }
  }
}

/**
 * Checks conditions against a grid: known face names, faces the grid has
 * (not on a periodic axis, not beyond its dimension), one condition per
 * face, every face covered, finite constants, h > 0.
 *
 * @param g - the grid
 * @param spec - conditions keyed by face, or a list of entries with `faces`
 * @returns the validated conditions
 * @example boundaryConditions(grid({ x: { from: 0, to: 1, cells: 4 } }), { xmin: { kind: 'dirichlet', value: 1 }, xmax: { kind: 'neumann', flux: 0 } }).faces.length // 2
 */
export function boundaryConditions(g: Grid, spec: BoundarySpec): BoundaryConditions {
  const given = new Map<FaceName, Condition>();
  const put = (face: string, c: Condition): void => {
    if (!(ALL_FACES as readonly string[]).includes(face)) throw new UnknownFaceError(face);
    const f = face as FaceName;
    const d = ALL_FACES.indexOf(f) >> 1;
    if (d >= g.dimension) {
      throw new InvalidOptionError(face, `this grid is ${g.dimension}-D and has no face ${face}; its faces are ${boundaryFaces(g).join(', ') || 'none (all axes periodic)'}`);
    }
    if (g.axes[d]!.periodic) throw new PeriodicFaceError(face, g.axes[d]!.name);
    if (given.has(f)) throw new DuplicateConditionError(face);
    checkCondition(f, c);
    given.set(f, c);
  };
  if (Array.isArray(spec)) {
    for (const entry of spec as readonly ConditionEntry[]) {
      const faces = typeof entry.faces === 'string' ? [entry.faces] : entry.faces;
      if (!Array.isArray(faces) && typeof faces !== 'object') {
        throw new InvalidOptionError('faces', 'each entry names its faces: faces: "xmin" or faces: ["xmin", "ymax"]');
      }
      const { faces: _f, ...condition } = entry;
      for (const face of faces) put(face, condition as Condition);
    }
  } else {
    for (const [face, c] of Object.entries(spec)) if (c !== undefined) put(face, c as Condition);
  }
  const faces = boundaryFaces(g);
  const missing = faces.filter((f) => !given.has(f));
  if (missing.length > 0) throw new MissingConditionError(missing);
  return Object.freeze({ grid: g, faces: Object.freeze(faces.map((face) => Object.freeze({ face, condition: given.get(face)! }))) });
}

/** Evaluates a datum at a node (coordinates then t). @internal */
export function evalData(d: FaceData, coords: readonly number[], t: number, what: string): number {
  const v = typeof d === 'number' ? d : d(...coords, t);
  if (!Number.isFinite(v)) throw new NonFiniteValueError(`${what} at (${coords.join(', ')}), t = ${t}`, v);
  return v;
}

/** Evaluates a position-only coefficient, which must be > 0. @internal */
export function evalCoefficient(c: FaceCoefficient, coords: readonly number[], what: string): number {
  const v = typeof c === 'number' ? c : c(...coords);
  if (!(Number.isFinite(v) && v > 0)) throw new InvalidCoefficientError(`${what} at (${coords.join(', ')})`, v);
  return v;
}

/** Whether any datum of the conditions depends on time (is a function). @internal */
export function dependsOnTime(bc: BoundaryConditions): boolean {
  return bc.faces.some(({ condition: c }) =>
    (c.kind === 'dirichlet' && typeof c.value === 'function') ||
    (c.kind === 'neumann' && typeof c.flux === 'function') ||
    (c.kind === 'robin' && typeof c.ambient === 'function'));
}
