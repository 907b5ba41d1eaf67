/**
 * Input checks shared by the public wrappers. Internal: not re-exported.
 *
 * @module
 */
import {
  InvalidDerivativeError,
  InvalidSpacingError,
  NonFiniteValueError,
} from './errors.js';

/** Throws unless `m` is a whole number ≥ 0. */
export function checkDerivative(m: number): void {
  if (!Number.isSafeInteger(m) || m < 0) throw new InvalidDerivativeError(m);
}

/** Throws unless `v` is finite. */
export function checkFinite(what: string, v: number): void {
  if (!Number.isFinite(v)) throw new NonFiniteValueError(what, v);
}

/** Throws unless the spacing `v` is finite and > 0. */
export function checkSpacing(name: string, v: number): void {
  if (!(Number.isFinite(v) && v > 0)) throw new InvalidSpacingError(name, v);
}

/** Throws at the first non-finite entry of `a` in [from, to) (all by default), naming its index. */
export function checkAllFinite(what: string, a: ArrayLike<number>, from = 0, to = a.length): void {
  for (let i = from; i < to; i++) {
    const v = a[i] as number;
    if (!Number.isFinite(v)) throw new NonFiniteValueError(`${what}[${i}]`, v);
  }
}
