/**
 * Analytical solutions of transient conduction u_t = α∇²u for checking
 * discretisations: sine-mode decay in 1-D and 2-D, the plane wall cooled
 * by convection, and the semi-infinite solid.
 *
 * Sources: Carslaw, H. S. & Jaeger, J. C. (1959). Conduction of Heat in
 * Solids, 2nd ed., Oxford, §2.5, §2.7, §3.11; Incropera, F. P., DeWitt, D. P.,
 * Bergman, T. L. & Lavine, A. S. (2007). Fundamentals of Heat and Mass
 * Transfer, 6th ed., Wiley, §5.5 (eqs. 5.39–5.44, Table 5.1) and §5.7.
 *
 * @module
 */
import { InvalidOptionError } from '../errors.js';
import { erf, erfc, erfcx } from './erf.js';

function positive(name: string, v: number): void {
  if (!(Number.isFinite(v) && v > 0)) throw new InvalidOptionError(name, `${v}; give a finite number > 0`);
}
function finite(name: string, v: number): void {
  if (!Number.isFinite(v)) throw new InvalidOptionError(name, `${v}; give a finite number`);
}

/** A sine mode on [0, L] decaying by diffusion. */
export interface SineDecayOptions {
  /** L > 0 (default 1). */
  readonly length?: number;
  /** α > 0 (m²/s, default 1). */
  readonly diffusivity?: number;
  /** Mode number n ≥ 1 (default 1). */
  readonly mode?: number;
}

/**
 * u(x, t) = sin(nπx/L)·exp(−α(nπ/L)²t): the solution of u_t = αu_xx with
 * u = 0 at x = 0 and x = L and u(x, 0) = sin(nπx/L).
 *
 * Accuracy: round-off only. Source: Carslaw & Jaeger (1959), §3.3.
 * Valid for every x and t ≥ 0.
 *
 * @param x - position
 * @param t - time ≥ 0
 * @param options - length, diffusivity, mode
 * @returns u
 * @example sineDecay(0.5, 0) // 1
 */
export function sineDecay(x: number, t: number, options: Readonly<SineDecayOptions> = {}): number {
  const L = options.length ?? 1;
  const a = options.diffusivity ?? 1;
  const n = options.mode ?? 1;
  positive('length', L);
  positive('diffusivity', a);
  if (!(Number.isSafeInteger(n) && n >= 1)) throw new InvalidOptionError('mode', `${n}; give a whole number ≥ 1`);
  const k = (n * Math.PI) / L;
  return Math.sin(k * x) * Math.exp(-a * k * k * t);
}

/** A product of sine modes on [0, a] × [0, b]. */
export interface SeparableDecayOptions {
  /** Side a along x (default 1). */
  readonly width?: number;
  /** Side b along y (default 1). */
  readonly height?: number;
  /** α > 0 (default 1). */
  readonly diffusivity?: number;
  /** Mode numbers (m, n) ≥ 1 (default [1, 1]). */
  readonly modes?: readonly [number, number];
}

/**
 * u(x, y, t) = sin(mπx/a)·sin(nπy/b)·exp(−α((mπ/a)² + (nπ/b)²)t): u_t = αΔu
 * on the rectangle with u = 0 on its edges.
 *
 * Accuracy: round-off. Source: Carslaw & Jaeger (1959), §5.3 (product
 * solutions). Valid for every (x, y) and t ≥ 0.
 *
 * @param x - position along x
 * @param y - position along y
 * @param t - time ≥ 0
 * @param options - sides, diffusivity, modes
 * @returns u
 * @example separableDecay(0.5, 0.5, 0) // 1
 */
export function separableDecay(x: number, y: number, t: number, options: Readonly<SeparableDecayOptions> = {}): number {
  const a = options.width ?? 1;
  const b = options.height ?? 1;
  const al = options.diffusivity ?? 1;
  const [m, n] = options.modes ?? [1, 1];
  positive('width', a);
  positive('height', b);
  positive('diffusivity', al);
  if (!(Number.isSafeInteger(m) && m >= 1 && Number.isSafeInteger(n) && n >= 1)) throw new InvalidOptionError('modes', `(${m}, ${n}); give whole numbers ≥ 1`);
  const kx = (m * Math.PI) / a;
  const ky = (n * Math.PI) / b;
  return Math.sin(kx * x) * Math.sin(ky * y) * Math.exp(-al * (kx * kx + ky * ky) * t);
}

/**
 * The n-th positive root ζₙ of ζ tan ζ = Bi, the eigenvalue of the plane
 * wall with convection, in ((n − 1)π, (n − 1)π + π/2).
 *
 * Solved as g(ζ) = ζ sin ζ − Bi cos ζ = 0 (no poles), which changes sign
 * across that interval; Newton steps, replaced by bisection whenever they
 * leave the current bracket, until the bracket is a few ulps wide.
 * Accuracy: a few ulps. Source: Incropera et al. (2007), eq. 5.39c.
 *
 * @param biot - Bi = hL/k > 0
 * @param n - root index ≥ 1 (default 1)
 * @returns ζₙ
 * @throws InvalidOptionError for Bi not finite and > 0 or n not a whole number ≥ 1
 * @example planeWallRoot(1) // 0.86033358901938 (Incropera et al. 2007, Table 5.1: 0.8603)
 */
export function planeWallRoot(biot: number, n = 1): number {
  positive('biot', biot);
  if (!(Number.isSafeInteger(n) && n >= 1)) throw new InvalidOptionError('n', `${n}; give a whole number ≥ 1`);
  let a = (n - 1) * Math.PI;
  let b = a + Math.PI / 2;
  const g = (z: number): number => z * Math.sin(z) - biot * Math.cos(z);
  const ga = g(a);
  // sign of g at the left end; the root is where g changes from it
  const left = Math.sign(ga);
  let z = biot < 1 && n === 1 ? Math.min(Math.sqrt(biot), 0.5 * (a + b)) : 0.5 * (a + b);
  for (let it = 0; it < 200; it++) {
    const gz = g(z);
    if (gz === 0) return z;
    if (Math.sign(gz) === left) a = z;
    else b = z;
    if (b - a <= 4 * Number.EPSILON * Math.max(1, b)) return 0.5 * (a + b);
    const d = Math.sin(z) * (1 + biot) + z * Math.cos(z);
    let next = z - gz / d;
    if (!(next > a && next < b) || !Number.isFinite(next)) next = 0.5 * (a + b);
    if (Math.abs(next - z) <= 2 * Number.EPSILON * Math.abs(z)) return next;
    z = next;
  }
  return z;
}

/**
 * Cₙ = 4 sin ζₙ / (2ζₙ + sin 2ζₙ), the coefficient of mode n of the plane wall.
 *
 * Accuracy: a few ulps. Source: Incropera et al. (2007), eq. 5.39b.
 *
 * @param biot - Bi > 0
 * @param n - mode ≥ 1 (default 1)
 * @returns Cₙ
 * @example planeWallCoefficient(1) // 1.1191…
 */
export function planeWallCoefficient(biot: number, n = 1): number {
  const z = planeWallRoot(biot, n);
  return (4 * Math.sin(z)) / (2 * z + Math.sin(2 * z));
}

/** How {@link planeWallTemperature} sums its series. */
export interface PlaneWallOptions {
  /** A fixed number of terms; by default terms are added until one falls below 1e-17 (at most 100 000). */
  readonly terms?: number;
}

/**
 * θ* = (T − T∞)/(Tᵢ − T∞) in a plane wall of half-thickness L, initially at
 * Tᵢ, both faces convecting to T∞ (Bi = hL/k), at x* = x/L and Fo = αt/L²:
 *
 *   θ* = Σₙ Cₙ exp(−ζₙ² Fo) cos(ζₙ x*).
 *
 * Convergence: term n is at most |Cₙ|·e^{−((n−1)π)² Fo}, so the series
 * converges geometrically for Fo > 0 (about 1/(π√Fo) terms per decade);
 * at Fo = 0 it converges only pointwise and slowly, and is refused unless
 * `terms` is given. Source: Incropera et al. (2007), eq. 5.39a.
 *
 * @param xStar - x/L in [0, 1] (0 the midplane)
 * @param fourier - Fo ≥ 0
 * @param biot - Bi > 0
 * @param options - fixed term count
 * @returns θ*
 * @throws InvalidOptionError for x* outside [0, 1], Fo < 0, Fo = 0 without `terms`, or a bad Bi
 * @example planeWallTemperature(0, 1, 1) // 0.53386 (midplane, Bi = 1, Fo = 1)
 */
export function planeWallTemperature(xStar: number, fourier: number, biot: number, options: Readonly<PlaneWallOptions> = {}): number {
  if (!(xStar >= 0 && xStar <= 1)) throw new InvalidOptionError('xStar', `${xStar}; give x/L in [0, 1]`);
  if (!(Number.isFinite(fourier) && fourier >= 0)) throw new InvalidOptionError('fourier', `${fourier}; give Fo ≥ 0`);
  positive('biot', biot);
  const fixed = options.terms;
  if (fixed !== undefined && !(Number.isSafeInteger(fixed) && fixed >= 1)) throw new InvalidOptionError('terms', `${fixed}; give a whole number ≥ 1`);
  if (fixed === undefined && fourier === 0) {
    throw new InvalidOptionError('fourier', 'Fo = 0 makes the series converge only slowly; the answer is θ* = 1, or give `terms`');
  }
  const cap = fixed ?? 100_000;
  let s = 0;
  for (let n = 1; n <= cap; n++) {
    const z = planeWallRoot(biot, n);
    const c = (4 * Math.sin(z)) / (2 * z + Math.sin(2 * z));
    const decay = Math.exp(-z * z * fourier);
    s += c * decay * Math.cos(z * xStar);
    if (fixed === undefined && Math.abs(c) * decay < 1e-17) break;
  }
  return s;
}

/**
 * The one-term approximation θ* ≈ C₁ exp(−ζ₁² Fo) cos(ζ₁ x*) of
 * {@link planeWallTemperature}.
 *
 * Accuracy: within about 2 % of the series at the midplane for Fo ≥ 0.2
 * (Incropera et al. 2007, §5.5.2); nearer the surface the neglected terms
 * weigh more (measured: up to 3 % at x* = 1, Fo = 0.2, Bi = 10; below 1.5 %
 * everywhere for Fo ≥ 0.25, Bi ≤ 10), and they fall like e^{−(ζ₂² − ζ₁²)Fo}.
 *
 * @param xStar - x/L in [0, 1]
 * @param fourier - Fo ≥ 0
 * @param biot - Bi > 0
 * @returns θ*
 * @example planeWallOneTerm(0, 1, 1) // 0.53386 (C₁e^{−ζ₁²} at Bi = 1; the series differs by 1.2e-6)
 */
export function planeWallOneTerm(xStar: number, fourier: number, biot: number): number {
  if (!(xStar >= 0 && xStar <= 1)) throw new InvalidOptionError('xStar', `${xStar}; give x/L in [0, 1]`);
  if (!(Number.isFinite(fourier) && fourier >= 0)) throw new InvalidOptionError('fourier', `${fourier}; give Fo ≥ 0`);
  const z = planeWallRoot(biot, 1);
  const c = (4 * Math.sin(z)) / (2 * z + Math.sin(2 * z));
  return c * Math.exp(-z * z * fourier) * Math.cos(z * xStar);
}

/**
 * Semi-infinite solid x ≥ 0 initially at Tᵢ whose surface is set to Tₛ at
 * t = 0: (T − Tₛ)/(Tᵢ − Tₛ) = erf(x/(2√(αt))).
 *
 * Accuracy: that of {@link erf}, a few ulps. Source: Carslaw & Jaeger
 * (1959), §2.5; Incropera et al. (2007), eq. 5.57. Valid for x ≥ 0, t > 0.
 *
 * @param x - depth ≥ 0
 * @param t - time > 0
 * @param diffusivity - α > 0
 * @returns the dimensionless temperature in [0, 1]
 * @example semiInfiniteStep(0, 1, 1) // 0
 */
export function semiInfiniteStep(x: number, t: number, diffusivity: number): number {
  if (!(x >= 0 && Number.isFinite(x))) throw new InvalidOptionError('x', `${x}; give a depth ≥ 0`);
  positive('t', t);
  positive('diffusivity', diffusivity);
  return erf(x / (2 * Math.sqrt(diffusivity * t)));
}

/** Material and surface of {@link semiInfiniteConvection}. */
export interface SemiInfiniteConvectionOptions {
  /** α > 0 (m²/s). */
  readonly diffusivity: number;
  /** k > 0 (W/(m·K)). */
  readonly conductivity: number;
  /** h > 0 (W/(m²·K)). */
  readonly h: number;
}

/**
 * Semi-infinite solid initially at Tᵢ whose surface convects to T∞ from
 * t = 0: with η = x/(2√(αt)) and β = h√(αt)/k,
 *
 *   (T − Tᵢ)/(T∞ − Tᵢ) = erfc η − exp(hx/k + β²)·erfc(η + β)
 *                      = erfc η − exp(−η²)·erfcx(η + β),
 *
 * the second form (hx/k = 2ηβ) never overflows: the first's exponential
 * overflows for large β while erfc underflows.
 *
 * Accuracy: a few ulps of the larger term, except where the two terms
 * nearly cancel (deep inside, η ≫ 1, both tiny; relative accuracy of the
 * small difference is then lost, absolute accuracy stays ~ε). Source:
 * Carslaw & Jaeger (1959), §2.7, eq. (1); Incropera et al. (2007), eq. 5.63.
 *
 * @param x - depth ≥ 0
 * @param t - time > 0
 * @param options - α, k, h
 * @returns the dimensionless temperature rise in [0, 1]
 * @example semiInfiniteConvection(0, 1, { diffusivity: 1, conductivity: 1, h: 1 }) // 1 − e·erfc(1) = 0.57242
 */
export function semiInfiniteConvection(x: number, t: number, options: Readonly<SemiInfiniteConvectionOptions>): number {
  if (!(x >= 0 && Number.isFinite(x))) throw new InvalidOptionError('x', `${x}; give a depth ≥ 0`);
  positive('t', t);
  positive('diffusivity', options.diffusivity);
  positive('conductivity', options.conductivity);
  positive('h', options.h);
  finite('x', x);
  const s = Math.sqrt(options.diffusivity * t);
  const eta = x / (2 * s);
  const beta = (options.h * s) / options.conductivity;
  return erfc(eta) - Math.exp(-eta * eta) * erfcx(eta + beta);
}
