/**
 * Exact rational numbers over BigInt, always kept reduced with a positive
 * denominator. They carry the exact stencil weights and error constants, so
 * that a weight like −1/12 is stored as −1/12 and not as its float64 rounding.
 *
 * @module
 */
import { InvalidRationalError, NonFiniteValueError } from '../errors.js';

/** Anything {@link Rational.from} reads exactly. */
export type RationalInput = Rational | bigint | number | string;

function gcd(a: bigint, b: bigint): bigint {
  if (a < 0n) a = -a;
  if (b < 0n) b = -b;
  while (b !== 0n) {
    const t = a % b;
    a = b;
    b = t;
  }
  return a;
}

function bitLength(x: bigint): number {
  return x === 0n ? 0 : x.toString(2).length;
}

// sign, digits, optional fraction, optional exponent: "-12", "0.125", "1.5e-3", "+2E4"
const DECIMAL = /^([+-]?)(\d+)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$|^([+-]?)\.(\d+)(?:[eE]([+-]?\d+))?$/;

function parseDecimal(text: string, original: string): [bigint, bigint] {
  const m = DECIMAL.exec(text);
  if (m === null) throw new InvalidRationalError(original);
  const sign = (m[1] ?? m[5]) === '-' ? -1n : 1n;
  const whole = m[2] ?? '0';
  const frac = m[3] ?? m[6] ?? '';
  const exp = Number(m[4] ?? m[7] ?? '0');
  if (!Number.isSafeInteger(exp) || Math.abs(exp) > 100_000) throw new InvalidRationalError(original);
  let num = BigInt(whole + frac) * sign;
  let den = 10n ** BigInt(frac.length);
  if (exp > 0) num *= 10n ** BigInt(exp);
  else if (exp < 0) den *= 10n ** BigInt(-exp);
  return [num, den];
}

/**
 * An exact rational number `num / den` with `den > 0` and `gcd(num, den) = 1`.
 * Immutable: every operation returns a new value.
 *
 * @example Rational.from('2/-6').toString() // '-1/3'
 */
export class Rational {
  /** Numerator, carrying the sign. */
  readonly num: bigint;
  /** Denominator, always positive. */
  readonly den: bigint;

  private constructor(num: bigint, den: bigint) {
    this.num = num;
    this.den = den;
  }

  /**
   * The reduced fraction `num / den`.
   *
   * @param num - numerator
   * @param den - denominator, non-zero (default 1)
   * @returns the reduced value with a positive denominator
   */
  static of(num: bigint, den: bigint = 1n): Rational {
    if (den === 0n) throw new InvalidRationalError(`${num}/0`);
    if (den < 0n) {
      num = -num;
      den = -den;
    }
    const g = gcd(num, den);
    return g === 1n ? new Rational(num, den) : new Rational(num / g, den / g);
  }

  /** Zero. */
  static readonly ZERO: Rational = new Rational(0n, 1n);
  /** One. */
  static readonly ONE: Rational = new Rational(1n, 1n);

  /**
   * Reads a value exactly. Integers and bigints are taken as they are; other
   * numbers are read as the shortest decimal JavaScript prints for them
   * (`0.1` is 1/10, not the binary double nearest 0.1); strings may be
   * integers, decimals with an optional exponent, or fractions `"p/q"`.
   *
   * @param value - the number, bigint, string or Rational to read
   * @returns the exact rational value
   * @example Rational.from(0.1).toString() // '1/10'
   */
  static from(value: RationalInput): Rational {
    if (value instanceof Rational) return value;
    if (typeof value === 'bigint') return new Rational(value, 1n);
    if (typeof value === 'number') {
      if (!Number.isFinite(value)) throw new NonFiniteValueError('rational input', value);
      if (Number.isSafeInteger(value)) return new Rational(BigInt(value), 1n);
      const [n, d] = parseDecimal(String(value), String(value));
      return Rational.of(n, d);
    }
    if (typeof value !== 'string') throw new InvalidRationalError(String(value));
    const text = value.trim();
    const slash = text.indexOf('/');
    if (slash < 0) {
      const [n, d] = parseDecimal(text, value);
      return Rational.of(n, d);
    }
    const [pn, pd] = parseDecimal(text.slice(0, slash).trim(), value);
    const [qn, qd] = parseDecimal(text.slice(slash + 1).trim(), value);
    if (qn === 0n) throw new InvalidRationalError(value);
    return Rational.of(pn * qd, pd * qn);
  }

  /** @returns this + other */
  add(other: Rational): Rational {
    if (this.den === other.den) return Rational.of(this.num + other.num, this.den);
    return Rational.of(this.num * other.den + other.num * this.den, this.den * other.den);
  }

  /** @returns this − other */
  sub(other: Rational): Rational {
    if (this.den === other.den) return Rational.of(this.num - other.num, this.den);
    return Rational.of(this.num * other.den - other.num * this.den, this.den * other.den);
  }

  /** @returns this · other */
  mul(other: Rational): Rational {
    return Rational.of(this.num * other.num, this.den * other.den);
  }

  /** @returns this / other; other must be non-zero */
  div(other: Rational): Rational {
    if (other.num === 0n) throw new InvalidRationalError(`${this.toString()} / 0`);
    return Rational.of(this.num * other.den, this.den * other.num);
  }

  /** @returns −this */
  neg(): Rational {
    return new Rational(-this.num, this.den);
  }

  /** @returns whether this is exactly zero */
  isZero(): boolean {
    return this.num === 0n;
  }

  /** @returns whether this equals `other` exactly */
  equals(other: Rational): boolean {
    return this.num === other.num && this.den === other.den;
  }

  /** @returns −1, 0 or 1 as this is less than, equal to or greater than `other` */
  compare(other: Rational): -1 | 0 | 1 {
    const d = this.num * other.den - other.num * this.den;
    return d < 0n ? -1 : d > 0n ? 1 : 0;
  }

  /**
   * The reduced form: `"-1/12"`, `"2"` (no denominator when it is 1).
   *
   * @returns the text form
   */
  toString(): string {
    return this.den === 1n ? this.num.toString() : `${this.num}/${this.den}`;
  }

  /**
   * The nearest float64 (correctly rounded in the normal range, even when
   * numerator and denominator themselves exceed float64's range).
   *
   * @returns the value as a number; ±Infinity only if it is beyond float64
   */
  toNumber(): number {
    const { num, den } = this;
    if (num === 0n) return 0;
    const neg = num < 0n;
    const a = neg ? -num : num;
    // Both fit exactly in float64: one correctly rounded division.
    if (a <= 9007199254740992n && den <= 9007199254740992n) return Number(num) / Number(den);
    // Scale so the integer quotient carries ≥ 66 bits; a set low bit keeps the
    // remainder's information (sticky bit) so the single rounding in Number() is correct.
    const shift = 66 - (bitLength(a) - bitLength(den));
    const n = shift >= 0 ? a << BigInt(shift) : a;
    const d = shift >= 0 ? den : den << BigInt(-shift);
    let q = n / d;
    if (q * d !== n) q |= 1n;
    // Two power-of-two factors so that neither overflows nor underflows on its own.
    const s1 = Math.trunc(-shift / 2);
    const r = Number(q) * 2 ** s1 * 2 ** (-shift - s1);
    return neg ? -r : r;
  }
}
