/**
 * Manufactured solutions: the caller chooses u(x, y, z, t) (and, if it
 * varies, the conductivity k) written once with {@link HyperDual} arithmetic;
 * the exact forcing and boundary data that make u a solution follow from
 * exact derivatives, so a discretisation fed with them must converge to u.
 *
 * Heat equation  ρc ∂u/∂t = ∇·(k∇u) + f:
 *   f = ρc u_t − Σ_d (k ∂²u/∂x_d² + ∂k/∂x_d ∂u/∂x_d).
 * Damped wave equation  u_tt = c²Δu − γu_t + f:
 *   f = u_tt + γu_t − c² Σ_d ∂²u/∂x_d².
 * Boundary data (n the outward unit normal, the sign convention of the
 * boundary stage):
 *   value       u
 *   flux        q = −k ∂u/∂n
 *   convection  u∞ = u + (k/h) ∂u/∂n     (so that −k ∂u/∂n = h(u − u∞)).
 *
 * Each derivative comes from one hyper-dual evaluation per axis (seed
 * x_d + ε₁ + ε₂), exact to round-off. Source of the method: Roache, P. J.
 * (2002). Code verification by the method of manufactured solutions. J.
 * Fluids Eng. 124(1), 4–10; of the derivatives: Fike & Alonso (2011), AIAA
 * 2011-886.
 *
 * @module
 */
import type { Condition, BoundarySpec, FaceCoefficient } from '../boundary/index.js';
import { InvalidOptionError, NonFiniteValueError, UnknownFaceError } from '../errors.js';
import type { FaceName } from '../grid/index.js';
import { HyperDual, type HyperDualLike } from './hyperdual.js';

/** A function of (x, y, z, t) in hyper-dual arithmetic; unused coordinates arrive as constants 0. */
export type ManufacturedFunction = (x: HyperDual, y: HyperDual, z: HyperDual, t: HyperDual) => HyperDualLike;

/** What {@link manufacturedSolution} needs besides u. */
export interface ManufacturedOptions {
  /** Number of space coordinates the plain-number functions take: 1, 2 or 3. */
  readonly dimension: 1 | 2 | 3;
  /** k > 0: a constant or a function of (x, y, z, t) (default 1). */
  readonly conductivity?: number | ManufacturedFunction;
  /** ρc > 0 of the heat equation: a constant (default 1). */
  readonly capacity?: number;
}

/** A boundary condition kind for {@link ManufacturedSolution.condition}; the data are derived. */
export type ManufacturedFace = ManufacturedValueFace | ManufacturedFluxFace | ManufacturedConvectionFace;

/** A value face of a manufactured problem. */
export interface ManufacturedValueFace {
  /** Discriminant. */
  readonly kind: 'dirichlet';
}

/** A flux face of a manufactured problem. */
export interface ManufacturedFluxFace {
  /** Discriminant. */
  readonly kind: 'neumann';
}

/** A convection face of a manufactured problem, with its transfer coefficient. */
export interface ManufacturedConvectionFace {
  /** Discriminant. */
  readonly kind: 'robin';
  /** h > 0: constant or function of position. */
  readonly h: FaceCoefficient;
}

/** What {@link ManufacturedSolution.waveSource} needs. */
export interface WaveSourceOptions {
  /** Wave speed c > 0. */
  readonly speed: number;
  /** Damping γ ≥ 0 (default 0). */
  readonly damping?: number;
}

/** A plain-number function of the coordinates, then the time (default 0). */
export type CoordinatesThenTime = (...coordinatesThenTime: number[]) => number;

/** u with its exact derivatives, forcing and boundary data. */
export interface ManufacturedSolution {
  /** Number of space coordinates of the plain-number functions. */
  readonly dimension: 1 | 2 | 3;
  /** u at (coordinates…, t); t defaults to 0, so it also serves as a node function. */
  readonly value: CoordinatesThenTime;
  /** k at (coordinates…, t); t defaults to 0, so it can be passed as a conductivity. */
  readonly conductivity: CoordinatesThenTime;
  /** ∂u/∂t at (coordinates…, t). */
  readonly rate: CoordinatesThenTime;
  /**
   * ∂u/∂x_d at (coordinates…, t).
   *
   * @param axis - 0 for x, 1 for y, 2 for z
   * @returns the derivative as a function of (coordinates…, t)
   */
  gradient(axis: number): CoordinatesThenTime;
  /** f of ρc u_t = ∇·(k∇u) + f at (coordinates…, t); for a steady u, the source of −∇·(k∇u) = f. */
  readonly heatSource: CoordinatesThenTime;
  /**
   * f of u_tt = c²Δu − γu_t + f at (coordinates…, t).
   *
   * @param options - speed c and damping γ
   * @returns the forcing
   */
  waveSource(options: Readonly<WaveSourceOptions>): CoordinatesThenTime;
  /**
   * The exact condition of one face, as a condition object of the boundary stage.
   *
   * @param face - the face
   * @param kind - dirichlet, neumann, or robin with its h
   * @returns the condition with data as functions of (coordinates…, t)
   */
  condition(face: FaceName, kind: ManufacturedFace): Condition;
  /**
   * Exact conditions for several faces at once.
   *
   * @param faces - a kind per face
   * @returns a boundary spec for `discretize`
   */
  boundary(faces: Readonly<Partial<Record<FaceName, ManufacturedFace>>>): BoundarySpec;
}

const FACES: readonly FaceName[] = ['xmin', 'xmax', 'ymin', 'ymax', 'zmin', 'zmax'];

/**
 * Derives exact forcing and boundary data for a chosen solution u (module
 * formulas), with derivatives exact to round-off by hyper-dual evaluation.
 *
 * @param u - the solution, written once with HyperDual operations
 * @param options - dimension, conductivity k, capacity ρc
 * @returns the plain-number functions of the module formulas
 * @throws InvalidOptionError for a dimension other than 1–3, or a capacity that is not finite and > 0;
 *   NonFiniteValueError (when a returned function is called) if u or k is not finite there
 * @example
 * ```ts
 * const m = manufacturedSolution((x, y) => x.sin().mul(y.exp()), { dimension: 2 });
 * m.heatSource(0.3, 0.2) // 0: Δ(sin x·eʸ) = 0
 * ```
 */
export function manufacturedSolution(u: ManufacturedFunction, options: Readonly<ManufacturedOptions>): ManufacturedSolution {
  const dim = options.dimension;
  if (dim !== 1 && dim !== 2 && dim !== 3) {
    throw new InvalidOptionError('dimension', `${String(dim)} is not a dimension; use 1, 2 or 3`);
  }
  const rhoC = options.capacity ?? 1;
  if (!(Number.isFinite(rhoC) && rhoC > 0)) throw new InvalidOptionError('capacity', `ρc = ${rhoC}; give a finite number > 0`);
  const kSpec = options.conductivity ?? 1;
  if (typeof kSpec === 'number' && !(Number.isFinite(kSpec) && kSpec > 0)) {
    throw new InvalidOptionError('conductivity', `k = ${kSpec}; give a finite number > 0 or a function`);
  }

  /** (x, y, z, t) from (coordinates…, t), t = 0 when absent. */
  const point = (a: readonly number[]): [number, number, number, number] => {
    if (a.length < dim) {
      throw new InvalidOptionError('coordinates', `got ${a.length} argument(s); a ${dim}-D manufactured function takes ${dim} coordinate(s), then t`);
    }
    return [a[0]!, dim > 1 ? a[1]! : 0, dim > 2 ? a[2]! : 0, a.length > dim ? a[dim]! : 0];
  };
  /** Evaluates f with coordinate `seed` (0–3, 3 = t) seeded, or none (−1). */
  const evalAt = (f: ManufacturedFunction, p: readonly number[], seed: number, what: string): HyperDual => {
    const v = HyperDual.from(f(
      seed === 0 ? HyperDual.variable(p[0]!) : new HyperDual(p[0]!),
      seed === 1 ? HyperDual.variable(p[1]!) : new HyperDual(p[1]!),
      seed === 2 ? HyperDual.variable(p[2]!) : new HyperDual(p[2]!),
      seed === 3 ? HyperDual.variable(p[3]!) : new HyperDual(p[3]!),
    ));
    if (!(Number.isFinite(v.re) && Number.isFinite(v.e1) && Number.isFinite(v.e12))) {
      throw new NonFiniteValueError(`${what} or its derivatives at (x, y, z, t) = (${p.join(', ')})`, v.re);
    }
    return v;
  };
  const kAt = (p: readonly number[], seed: number): HyperDual =>
    typeof kSpec === 'number' ? new HyperDual(kSpec) : evalAt(kSpec, p, seed, 'k');

  const value: CoordinatesThenTime = (...a) => evalAt(u, point(a), -1, 'u').re;
  const conductivity: CoordinatesThenTime = (...a) => kAt(point(a), -1).re;
  const rate: CoordinatesThenTime = (...a) => evalAt(u, point(a), 3, 'u').e1;
  const gradient = (axis: number): CoordinatesThenTime => {
    if (!(Number.isInteger(axis) && axis >= 0 && axis < dim)) {
      throw new InvalidOptionError('axis', `${axis} is not an axis of this ${dim}-D solution; use 0 … ${dim - 1}`);
    }
    return (...a) => evalAt(u, point(a), axis, 'u').e1;
  };
  const divFlux = (p: readonly number[]): number => {
    let s = 0;
    for (let d = 0; d < dim; d++) {
      const ud = evalAt(u, p, d, 'u');
      const kd = kAt(p, d);
      s += kd.re * ud.e12 + kd.e1 * ud.e1;
    }
    return s;
  };
  const laplace = (p: readonly number[]): number => {
    let s = 0;
    for (let d = 0; d < dim; d++) s += evalAt(u, p, d, 'u').e12;
    return s;
  };
  const heatSource: CoordinatesThenTime = (...a) => {
    const p = point(a);
    return rhoC * evalAt(u, p, 3, 'u').e1 - divFlux(p);
  };
  const waveSource = (w: Readonly<WaveSourceOptions>): CoordinatesThenTime => {
    const c = w.speed;
    const g = w.damping ?? 0;
    if (!(Number.isFinite(c) && c > 0)) throw new InvalidOptionError('speed', `c = ${c}; give a finite number > 0`);
    if (!(Number.isFinite(g) && g >= 0)) throw new InvalidOptionError('damping', `γ = ${g}; give a finite number ≥ 0`);
    return (...a) => {
      const p = point(a);
      const ut = evalAt(u, p, 3, 'u');
      return ut.e12 + g * ut.e1 - c * c * laplace(p);
    };
  };
  const condition = (face: FaceName, kind: ManufacturedFace): Condition => {
    const f = FACES.indexOf(face);
    if (f < 0) throw new UnknownFaceError(String(face));
    const axis = f >> 1;
    if (axis >= dim) throw new InvalidOptionError(face, `a ${dim}-D solution has no face ${face}`);
    const sign = f % 2 === 0 ? -1 : 1; // outward normal along the axis
    /** ∂u/∂n and k at a boundary point. */
    const normal = (a: readonly number[]): [number, number, number] => {
      const p = point(a);
      const ud = evalAt(u, p, axis, 'u');
      return [ud.re, sign * ud.e1, kAt(p, -1).re];
    };
    switch (kind.kind) {
      case 'dirichlet':
        return { kind: 'dirichlet', value };
      case 'neumann':
        return {
          kind: 'neumann',
          flux: (...a: number[]) => {
            const [, dn, k] = normal(a);
            return -k * dn;
          },
        };
      case 'robin': {
        const h = kind.h;
        if (typeof h === 'number' && !(Number.isFinite(h) && h > 0)) {
          throw new InvalidOptionError(`h on ${face}`, `${h}; give a finite number > 0 or a function of position`);
        }
        return {
          kind: 'robin',
          h,
          ambient: (...a: number[]) => {
            const [uu, dn, k] = normal(a);
            const hv = typeof h === 'number' ? h : h(...a.slice(0, dim));
            return uu + (k / hv) * dn;
          },
        };
      }
      default: {
        const unreachable: never = kind;
        throw new InvalidOptionError(`kind on ${face}`, `${JSON.stringify((unreachable as { kind?: unknown }).kind)} is not a condition; use "dirichlet", "neumann" or "robin"`);
      }
    }
  };
  const boundary = (faces: Readonly<Partial<Record<FaceName, ManufacturedFace>>>): BoundarySpec => {
    const out: Partial<Record<FaceName, Condition>> = {};
    for (const [face, kind] of Object.entries(faces)) {
      if (kind !== undefined) out[face as FaceName] = condition(face as FaceName, kind);
    }
    return out;
  };
  return Object.freeze({ dimension: dim, value, conductivity, rate, gradient, heatSource, waveSource, condition, boundary });
}
