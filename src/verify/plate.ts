/**
 * Closed-form steady temperature of a rectangular plate with one edge held
 * at a temperature and the other three at zero, by separation of variables.
 *
 * On 0 ≤ x ≤ a, 0 ≤ y ≤ b with u = 1 on y = b and u = 0 on the other edges:
 *
 *   u(x, y) = Σ_{n odd} (4 / (nπ)) · sin(nπx/a) · sinh(nπy/a) / sinh(nπb/a).
 *
 * Source: Carslaw, H. S. & Jaeger, J. C. (1959). Conduction of Heat in
 * Solids, 2nd ed., Oxford, §5.2; Incropera, F. P. et al. (2007).
 * Fundamentals of Heat and Mass Transfer, 6th ed., Wiley, §4.2, eq. 4.19.
 *
 * Convergence: term n is bounded by (4/(nπ))·e^{−nπ(b−y)/a}, so inside the
 * plate the series converges geometrically; on the heated edge itself
 * (y = b) it converges only like 1/n and is not evaluated there.
 *
 * @module
 */
import { InvalidOptionError } from '../errors.js';

/**
 * u(x, y) of the plate with the edge y = b at 1 and the others at 0 (module
 * formula), summed until a term falls below 1e-17 of the sum (a relative
 * error of about 1e-16 inside the plate).
 *
 * @param x - position in [0, a]
 * @param y - position in [0, b)
 * @param a - plate width along x (default 1)
 * @param b - plate height along y (default 1)
 * @returns the dimensionless temperature in [0, 1]
 * @example plateWithHeatedEdge(0.5, 0.5) // 0.25 (four rotations of the problem add up to u = 1)
 */
export function plateWithHeatedEdge(x: number, y: number, a = 1, b = 1): number {
  if (!(a > 0 && b > 0 && Number.isFinite(a) && Number.isFinite(b))) {
    throw new InvalidOptionError('a, b', `plate sides ${a} × ${b} must be finite and > 0`);
  }
  if (!(x >= 0 && x <= a && y >= 0 && y < b)) {
    throw new InvalidOptionError('x, y', `(${x}, ${y}) is outside 0 ≤ x ≤ ${a}, 0 ≤ y < ${b} (the series does not converge on the heated edge)`);
  }
  let s = 0;
  for (let n = 1; n < 1_000_000; n += 2) {
    const k = (n * Math.PI) / a;
    // sinh(ky)/sinh(kb) without overflow: e^{k(y−b)}·(1 − e^{−2ky})/(1 − e^{−2kb})
    const ratio = (Math.exp(k * (y - b)) * -Math.expm1(-2 * k * y)) / -Math.expm1(-2 * k * b);
    const term = (4 / (n * Math.PI)) * Math.sin(k * x) * ratio;
    s += term;
    if (Math.abs((4 / (n * Math.PI)) * Math.exp(k * (y - b))) < 1e-17 * Math.max(Math.abs(s), 1e-300)) break;
  }
  return s;
}
