/**
 * Richardson extrapolation of a quantity computed on two or three grids,
 * and the apparent order of three solutions.
 *
 * Grids are numbered fine first: φ₁ on the finest spacing h₁, then φ₂ on
 * h₂ > h₁, φ₃ on h₃ > h₂; r₂₁ = h₂/h₁, r₃₂ = h₃/h₂, ε₂₁ = φ₂ − φ₁,
 * ε₃₂ = φ₃ − φ₂, s = sign(ε₃₂/ε₂₁).
 *
 * Apparent order (fixed-point iteration from q = 0):
 *   p = |ln|ε₃₂/ε₂₁| + q(p)| / ln r₂₁,   q(p) = ln((r₂₁ᵖ − s)/(r₃₂ᵖ − s)),
 * which is exact for φ = φ_exact + C·hᵖ with any ratios (q = 0 when
 * r₂₁ = r₃₂, where no iteration is needed).
 *
 * Extrapolated value: φ_ext = (r₂₁ᵖ φ₁ − φ₂)/(r₂₁ᵖ − 1), which removes the
 * hᵖ term: for φ = φ_exact + C·hᵖ + O(h^q), q > p, the error of φ_ext is
 * O(h₁^q).
 *
 * Sources: Richardson, L. F. (1911). The approximate arithmetical solution
 * by finite differences of physical problems involving differential
 * equations. Phil. Trans. R. Soc. A 210, 307–357; Celik, I. B., Ghia, U.,
 * Roache, P. J., Freitas, C. J., Coleman, H. & Raad, P. E. (2008).
 * Procedure for estimation and reporting of uncertainty due to
 * discretization in CFD applications. J. Fluids Eng. 130(7), 078001.
 *
 * @module
 */
import { ApparentOrderError, InvalidOptionError, RefinementRatioError, TooFewLevelsError } from '../errors.js';
import { MIN_REFINEMENT_RATIO } from './study.js';

/** The apparent order of three solutions and how it was found. */
export interface ApparentOrder {
  /** p (module formula). */
  readonly order: number;
  /** Fixed-point iterations used (0 when r₂₁ = r₃₂). */
  readonly iterations: number;
  /** s = sign(ε₃₂/ε₂₁). */
  readonly sign: 1 | -1;
}

/** Checks values (finite) and spacings (fine first, ratio ≥ 1.1); returns the ratios. @internal */
export function checkLevels(values: readonly number[], spacings: readonly number[], need: number, most: number, what: string): number[] {
  if (!Array.isArray(values) || !Array.isArray(spacings)) throw new InvalidOptionError('values, spacings', 'give two arrays, fine grid first');
  if (values.length < need) throw new TooFewLevelsError(values.length, need, what);
  if (values.length > most) throw new InvalidOptionError('values', `${what} takes at most ${most} values, fine first; got ${values.length}`);
  if (spacings.length !== values.length) {
    throw new InvalidOptionError('spacings', `${spacings.length} spacings for ${values.length} values; give one spacing per value, fine first`);
  }
  values.forEach((v, i) => {
    if (!Number.isFinite(v)) throw new InvalidOptionError(`values[${i}]`, `${v} is not finite`);
  });
  const ratios: number[] = [];
  for (let i = 0; i < spacings.length; i++) {
    const h = spacings[i]!;
    if (!(Number.isFinite(h) && h > 0)) throw new RefinementRatioError(Math.max(i, 1), NaN, MIN_REFINEMENT_RATIO);
    if (i > 0) {
      const r = h / spacings[i - 1]!;
      if (!(r >= MIN_REFINEMENT_RATIO)) throw new RefinementRatioError(i, r, MIN_REFINEMENT_RATIO);
      ratios.push(r);
    }
  }
  return ratios;
}

/**
 * The apparent order p of three solutions, by the fixed-point iteration of
 * the module formula, stopped when successive iterates agree to 1e-14
 * relative (at most 500 iterations).
 *
 * Accuracy: p to about 1e-14 relative, when the iteration converges (it
 * does in the monotone and oscillatory cases met in practice: the map's
 * slope is |q′(p)|/ln r₂₁ < 1).
 *
 * @param values - φ₁, φ₂, φ₃, fine first
 * @param spacings - h₁ < h₂ < h₃ (ratio ≥ 1.1 each)
 * @returns the order, the iteration count and s
 * @throws TooFewLevelsError / InvalidOptionError / RefinementRatioError for bad input;
 *   ApparentOrderError if two successive values are equal or the iteration fails
 * @example apparentOrder([2, 5, 37], [1, 2, 6]).order // 2 (φ = 1 + h², r₂₁ = 2, r₃₂ = 3)
 */
export function apparentOrder(values: readonly number[], spacings: readonly number[]): ApparentOrder {
  const [r21, r32] = checkLevels(values, spacings, 3, 3, 'the apparent order') as [number, number];
  const e21 = values[1]! - values[0]!;
  const e32 = values[2]! - values[1]!;
  if (e21 === 0 || e32 === 0) {
    throw new ApparentOrderError(0, NaN, `ε₂₁ = ${e21}, ε₃₂ = ${e32}: two grids give the same value, so the order is undefined; report the spread of the values instead, or use finer grids`);
  }
  const s: 1 | -1 = e32 / e21 > 0 ? 1 : -1;
  const lnr = Math.log(r21);
  const base = Math.log(Math.abs(e32 / e21));
  let p = Math.abs(base) / lnr;
  if (Math.abs(r21 - r32) <= 4 * Number.EPSILON * r21) return { order: p, iterations: 0, sign: s };
  for (let it = 1; it <= 500; it++) {
    const a = r21 ** p - s;
    const b = r32 ** p - s;
    if (!(a > 0 && b > 0)) {
      throw new ApparentOrderError(it, p, 'the iterate reached p ≈ 0, where q(p) is undefined: the three values do not show convergence; use finer grids');
    }
    const next = Math.abs(base + Math.log(a / b)) / lnr;
    if (!Number.isFinite(next)) throw new ApparentOrderError(it, next, 'the iteration left the finite numbers; check the values');
    if (Math.abs(next - p) <= 1e-14 * Math.max(1, Math.abs(next))) return { order: next, iterations: it, sign: s };
    p = next;
  }
  throw new ApparentOrderError(500, p, 'the fixed-point iteration did not settle; the grids are probably outside the asymptotic range');
}

/** Richardson extrapolation of two or three values. */
export interface RichardsonResult {
  /** φ_ext = (r₂₁ᵖ φ₁ − φ₂)/(r₂₁ᵖ − 1). */
  readonly value: number;
  /** The order p used. */
  readonly order: number;
  /** Whether p was observed from three values (true) or given (false). */
  readonly observed: boolean;
  /** Estimated error of the finest value, φ_ext − φ₁. */
  readonly correction: number;
}

/**
 * Richardson extrapolation (module formula): from two values with a given
 * order p, or from three values with their observed (apparent) order,
 * unless an order is given.
 *
 * Accuracy: removes the hᵖ term; the result is as good as the assumption
 * that φ = φ_exact + C·hᵖ + higher-order terms on these grids.
 *
 * @param values - φ₁, φ₂ (, φ₃), fine first
 * @param spacings - h₁ < h₂ (< h₃), ratio ≥ 1.1 each
 * @param order - p (required for two values)
 * @returns the extrapolated value with the order used
 * @throws InvalidOptionError without an order for two values, or an order that is not finite and > 0;
 *   the errors of {@link apparentOrder}
 * @example richardsonExtrapolation([1.01, 1.04], [0.1, 0.2], 2).value // 1 (φ = 1 + h²)
 */
export function richardsonExtrapolation(values: readonly number[], spacings: readonly number[], order?: number): RichardsonResult {
  const ratios = checkLevels(values, spacings, 2, 3, 'Richardson extrapolation');
  let p: number;
  let observed = false;
  if (order !== undefined) {
    if (!(Number.isFinite(order) && order > 0)) throw new InvalidOptionError('order', `${order}; give a finite order > 0`);
    p = order;
  } else if (values.length === 3) {
    p = apparentOrder(values, spacings).order;
    observed = true;
  } else {
    throw new InvalidOptionError('order', 'two values need the order p of the scheme; give it, or a third, coarser value to observe it');
  }
  const rp = ratios[0]! ** p;
  const value = (rp * values[0]! - values[1]!) / (rp - 1);
  return { value, order: p, observed, correction: value - values[0]! };
}
