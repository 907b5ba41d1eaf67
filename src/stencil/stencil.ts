/**
 * Named finite-difference stencils on integer offsets (unit spacing), with
 * their exact weights and leading truncation-error term.
 *
 * For a stencil with offsets oⱼ and unit-spacing weights wⱼ applied with
 * spacing h,
 *
 *   h⁻ᵐ Σⱼ wⱼ u(x + oⱼh) = Σₖ (Mₖ / k!) hᵏ⁻ᵐ u⁽ᵏ⁾(x),   Mₖ = Σⱼ wⱼ oⱼᵏ.
 *
 * The weights make Mₖ / k! = δₖₘ for k < N (N nodes); the first k ≥ N with
 * Mₖ ≠ 0 gives the accuracy p = k − m and the leading error coefficient
 * C = Mₖ / k!, so that approximation − exact = C hᵖ u⁽ᵐ⁺ᵖ⁾(x) + O(hᵖ⁺¹).
 * Source: the Taylor-series argument of any finite-difference text, e.g.
 * LeVeque, R. J. (2007). Finite Difference Methods for Ordinary and Partial
 * Differential Equations, SIAM, ch. 1; weights by Fornberg (1988).
 *
 * @module
 */
import { checkDerivative } from '../check.js';
import { InvalidAccuracyError, InvalidDerivativeError, InvalidOffsetsError, WeightOverflowError } from '../errors.js';
import { checkDistinctNumbers, exactTable } from './fornberg.js';
import { Rational } from './rational.js';

/** A finite-difference stencil for unit spacing; scale by h⁻ᵐ to use it. */
export interface Stencil {
  /** m, the order of the derivative approximated. */
  readonly derivative: number;
  /**
   * p, the order of the leading error term O(hᵖ). `Infinity` only for the
   * trivial derivative-0 stencil that samples its own node.
   */
  readonly accuracy: number;
  /** Integer node offsets, ascending. */
  readonly offsets: readonly number[];
  /** Unit-spacing weights, one per offset: the exact weights correctly rounded. */
  readonly weights: Readonly<Float64Array>;
  /** The exact rational weights, one per offset. */
  readonly exact: readonly Rational[];
  /**
   * C in approximation − exact = C·hᵖ·u⁽ᵐ⁺ᵖ⁾(x) + O(hᵖ⁺¹); zero when the
   * stencil is exact (accuracy `Infinity`).
   */
  readonly leadingError: Rational;
}

// Moments beyond N nodes searched for the leading error; symmetric stencils
// need one extra, and no node set of integers needs more than a handful.
const EXTRA_MOMENTS = 64;

function factorial(k: number): bigint {
  let f = 1n;
  for (let i = 2n; i <= BigInt(k); i++) f *= i;
  return f;
}

/** Named stencils approximate derivatives m ≥ 1; m = 0 (interpolation) goes through `stencil`. */
function checkNamedDerivative(m: number): void {
  checkDerivative(m);
  if (m === 0) {
    throw new InvalidDerivativeError(m, 'named stencils approximate derivatives ≥ 1; for interpolation use stencil(0, offsets)');
  }
}

function checkAccuracy(accuracy: number): void {
  if (!Number.isSafeInteger(accuracy) || accuracy < 1) {
    throw new InvalidAccuracyError(accuracy, 'use a whole number ≥ 1 (the order p of the error O(hᵖ))');
  }
}

/**
 * The stencil of the `derivative`-th derivative on the given integer offsets,
 * with the accuracy and leading error the offsets achieve.
 *
 * With N offsets the accuracy is at least N − m; it is the first k − m,
 * k ≥ N, whose moment Mₖ does not vanish (see the module formula), so a
 * symmetric set gains one order when N − m is odd. Source: Fornberg (1988)
 * for the weights; the moment argument is the textbook Taylor expansion.
 *
 * @param derivative - m ≥ 0
 * @param offsets - distinct whole numbers, more than m of them, any order (sorted in the result)
 * @returns the stencil
 * @example stencil(2, [-1, 0, 1]).leadingError.toString() // '1/12'
 */
export function stencil(derivative: number, offsets: readonly number[]): Stencil {
  checkDerivative(derivative);
  for (let j = 0; j < offsets.length; j++) {
    const o = offsets[j] as number;
    if (!Number.isSafeInteger(o)) {
      throw new InvalidOffsetsError(
        `offsets[${j}] = ${o} is not a whole number; stencil offsets count grid steps (…, -1, 0, 1, …)`,
      );
    }
  }
  if (offsets.length < derivative + 1) {
    throw new InvalidOffsetsError(
      `${offsets.length} offset(s) cannot approximate derivative ${derivative}; give at least ${derivative + 1}`,
    );
  }
  checkDistinctNumbers(offsets);
  const sorted = [...offsets].sort((a, b) => a - b);
  const x = sorted.map((o) => Rational.of(BigInt(o)));
  const exact = exactTable(derivative, x, Rational.ZERO)[derivative] as Rational[];
  const n = sorted.length;
  const weights = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const w = exact[j]!.toNumber();
    if (!Number.isFinite(w)) throw new WeightOverflowError(derivative, n);
    weights[j] = w;
  }
  // Moments Mₖ = Σ wⱼ oⱼᵏ for k ≥ N, over exact integer powers.
  const pow = x.map(() => Rational.ONE);
  for (let k = 1; k < n; k++) for (let j = 0; j < n; j++) pow[j] = pow[j]!.mul(x[j]!);
  let accuracy = Infinity;
  let leadingError = Rational.ZERO;
  for (let k = n; k < n + EXTRA_MOMENTS; k++) {
    let mk = Rational.ZERO;
    for (let j = 0; j < n; j++) {
      pow[j] = pow[j]!.mul(x[j]!);
      mk = mk.add(exact[j]!.mul(pow[j]!));
    }
    if (!mk.isZero()) {
      accuracy = k - derivative;
      leadingError = mk.div(Rational.of(factorial(k)));
      break;
    }
  }
  return { derivative, accuracy, offsets: sorted, weights, exact, leadingError };
}

function range(from: number, to: number): number[] {
  const r: number[] = [];
  for (let i = from; i <= to; i++) r.push(i);
  return r;
}

/**
 * The centred stencil of the `derivative`-th derivative with error O(hᵖ):
 * offsets −K…K with K = ⌊(m + 1)/2⌋ − 1 + p/2, i.e. 2⌊(m + 1)/2⌋ − 1 + p
 * nodes. Source: Fornberg (1988), Table 1 lists these for m ≤ 4, p ≤ 8.
 *
 * @param derivative - m ≥ 1
 * @param accuracy - p, even, ≥ 2
 * @returns the stencil, whose `accuracy` equals p
 * @example Array.from(centralStencil(2, 2).weights) // [1, -2, 1]
 */
export function centralStencil(derivative: number, accuracy: number): Stencil {
  checkNamedDerivative(derivative);
  checkAccuracy(accuracy);
  if (accuracy % 2 !== 0) {
    throw new InvalidAccuracyError(
      accuracy,
      `a centred stencil has even accuracy; use ${accuracy - 1 > 0 ? `${accuracy - 1} or ` : ''}${accuracy + 1}, or a forward/backward stencil for odd orders`,
    );
  }
  const k = Math.floor((derivative + 1) / 2) - 1 + accuracy / 2;
  return stencil(derivative, range(-k, k));
}

/**
 * The one-sided forward stencil of the `derivative`-th derivative with error
 * O(hᵖ): offsets 0…m + p − 1. Source: Fornberg (1988), Table 3.
 *
 * @param derivative - m ≥ 1
 * @param accuracy - p ≥ 1
 * @returns the stencil, whose `accuracy` equals p
 * @example forwardStencil(1, 1).leadingError.toString() // '1/2'
 */
export function forwardStencil(derivative: number, accuracy: number): Stencil {
  checkNamedDerivative(derivative);
  checkAccuracy(accuracy);
  return stencil(derivative, range(0, derivative + accuracy - 1));
}

/**
 * The one-sided backward stencil: offsets −(m + p − 1)…0, the mirror image
 * of {@link forwardStencil} (weights multiplied by (−1)ᵐ).
 *
 * @param derivative - m ≥ 1
 * @param accuracy - p ≥ 1
 * @returns the stencil, whose `accuracy` equals p
 * @example Array.from(backwardStencil(1, 1).weights) // [-1, 1]
 */
export function backwardStencil(derivative: number, accuracy: number): Stencil {
  checkNamedDerivative(derivative);
  checkAccuracy(accuracy);
  return stencil(derivative, range(-(derivative + accuracy - 1), 0));
}
