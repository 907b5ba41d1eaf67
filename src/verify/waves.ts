/**
 * Analytical solutions of the wave equation u_tt = c²∇²u with u = 0 on the
 * boundary: standing modes of a clamped string and of a rectangular
 * membrane, and the plucked string by d'Alembert's formula.
 *
 * Sources: Kreyszig, E. (2011). Advanced Engineering Mathematics, 10th ed.,
 * Wiley, §12.3–12.4 (string, d'Alembert) and §12.9 (rectangular membrane);
 * d'Alembert, J. le R. (1747), for the travelling-wave form.
 *
 * @module
 */
import { InvalidOptionError } from '../errors.js';

function positive(name: string, v: number): void {
  if (!(Number.isFinite(v) && v > 0)) throw new InvalidOptionError(name, `${v}; give a finite number > 0`);
}
function wholeMode(name: string, n: number): void {
  if (!(Number.isSafeInteger(n) && n >= 1)) throw new InvalidOptionError(name, `${n}; give a whole number ≥ 1`);
}

/** A clamped string of length L. */
export interface StringOptions {
  /** L > 0 (default 1). */
  readonly length?: number;
  /** Wave speed c > 0 (default 1). */
  readonly speed?: number;
}

/**
 * Standing mode n of a string clamped at 0 and L, released from rest:
 * u = sin(nπx/L)·cos(nπct/L).
 *
 * Accuracy: round-off. Valid for all x in [0, L] and all t. Source:
 * Kreyszig (2011), §12.3.
 *
 * @param x - position in [0, L]
 * @param t - time
 * @param n - mode ≥ 1 (default 1)
 * @param options - length and speed
 * @returns displacement
 * @example stringMode(0.5, 0) // 1
 */
export function stringMode(x: number, t: number, n = 1, options: Readonly<StringOptions> = {}): number {
  const L = options.length ?? 1;
  const c = options.speed ?? 1;
  positive('length', L);
  positive('speed', c);
  wholeMode('n', n);
  const k = (n * Math.PI) / L;
  return Math.sin(k * x) * Math.cos(k * c * t);
}

/** A string plucked at one point. */
export interface PluckOptions extends StringOptions {
  /** Where the string is pulled, 0 < a < L (default L/2). */
  readonly at?: number;
  /** Displacement there at t = 0 (default 1). */
  readonly height?: number;
}

/**
 * The plucked string released from rest, by d'Alembert's formula
 * u(x, t) = ½[F(x − ct) + F(x + ct)], F the odd, 2L-periodic extension of
 * the triangular initial shape f(x) = H·x/a (x ≤ a), H·(L − x)/(L − a) (x ≥ a).
 *
 * Accuracy: round-off (a few ulps of H): closed form, no series. The
 * solution has kinks that travel at speed c, so discretisations converge
 * to it at reduced order (at most 1 in L∞ for second-order schemes).
 * Source: Kreyszig (2011), §12.4.
 *
 * @param x - position in [0, L]
 * @param t - time
 * @param options - length, speed, pluck point, height
 * @returns displacement
 * @example pluckedString(0.5, 0.5) // 0 (half a period later the midpoint crosses zero)
 */
export function pluckedString(x: number, t: number, options: Readonly<PluckOptions> = {}): number {
  const L = options.length ?? 1;
  const c = options.speed ?? 1;
  const a = options.at ?? L / 2;
  const H = options.height ?? 1;
  positive('length', L);
  positive('speed', c);
  if (!(a > 0 && a < L)) throw new InvalidOptionError('at', `${a}; pluck inside the string, 0 < at < ${L}`);
  if (!Number.isFinite(H)) throw new InvalidOptionError('height', `${H}; give a finite number`);
  if (!Number.isFinite(x) || !Number.isFinite(t)) throw new InvalidOptionError('x, t', `(${x}, ${t}); give finite numbers`);
  const f = (s: number): number => (s <= a ? (H * s) / a : (H * (L - s)) / (L - a));
  const F = (s: number): number => {
    const P = 2 * L;
    const r = ((s % P) + P) % P;
    return r <= L ? f(r) : -f(P - r);
  };
  return 0.5 * (F(x - c * t) + F(x + c * t));
}

/** A rectangular membrane a × b. */
export interface MembraneOptions {
  /** Side a along x (default 1). */
  readonly width?: number;
  /** Side b along y (default 1). */
  readonly height?: number;
  /** Wave speed c > 0 (default 1). */
  readonly speed?: number;
}

/**
 * Mode (m, n) of a rectangular membrane clamped on its edges, released from
 * rest: u = sin(mπx/a)·sin(nπy/b)·cos(ωt), ω = cπ√((m/a)² + (n/b)²).
 *
 * Accuracy: round-off. Source: Kreyszig (2011), §12.9.
 *
 * @param x - position along x in [0, a]
 * @param y - position along y in [0, b]
 * @param t - time
 * @param modes - (m, n), whole numbers ≥ 1 (default [1, 1])
 * @param options - sides and speed
 * @returns displacement
 * @example membraneMode(0.5, 0.5, 0) // 1
 */
export function membraneMode(
  x: number, y: number, t: number, modes: readonly [number, number] = [1, 1], options: Readonly<MembraneOptions> = {},
): number {
  const a = options.width ?? 1;
  const b = options.height ?? 1;
  const c = options.speed ?? 1;
  positive('width', a);
  positive('height', b);
  positive('speed', c);
  const [m, n] = modes;
  wholeMode('m', m);
  wholeMode('n', n);
  const w = c * Math.PI * Math.sqrt((m / a) ** 2 + (n / b) ** 2);
  return Math.sin((m * Math.PI * x) / a) * Math.sin((n * Math.PI * y) / b) * Math.cos(w * t);
}
